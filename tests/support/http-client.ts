/**
 * A small HTTP client that behaves like a script using the API: keeps the session cookie,
 * fetches the CSRF token from GET /api/auth/csrf and sends it in x-csrf-token.
 */
export interface Answer<T = any> {
  status: number;
  headers: Headers;
  body: T;
  text: string;
}

export class ApiClient {
  private cookies = new Map<string, string>();
  csrf: string | null = null;

  constructor(readonly base: string) {}

  get cookieHeader(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join("; ");
  }

  async request<T = any>(
    method: string,
    path: string,
    opts: { json?: unknown; body?: BodyInit; headers?: Record<string, string>; csrf?: boolean } = {},
  ): Promise<Answer<T>> {
    const headers: Record<string, string> = { ...opts.headers };
    if (this.cookies.size) headers.cookie = this.cookieHeader;
    const changes = !["GET", "HEAD", "OPTIONS"].includes(method);
    if (changes && opts.csrf !== false) {
      if (!this.csrf) await this.fetchCsrf();
      headers["x-csrf-token"] = this.csrf!;
      headers.cookie = this.cookieHeader;
    }
    let body = opts.body;
    if (opts.json !== undefined) {
      body = JSON.stringify(opts.json);
      headers["content-type"] = "application/json";
    }
    const res = await fetch(this.base + path, { method, headers, body, redirect: "manual" });
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(";");
      const i = pair.indexOf("=");
      this.cookies.set(pair.slice(0, i).trim(), pair.slice(i + 1).trim());
    }
    const text = await res.text();
    let parsed: unknown = text;
    const type = res.headers.get("content-type") ?? "";
    if (type.includes("json") && text) parsed = JSON.parse(text);
    return { status: res.status, headers: res.headers, body: parsed as T, text };
  }

  async fetchCsrf(): Promise<string> {
    const r = await this.request<{ token: string }>("GET", "/api/auth/csrf");
    this.csrf = r.body.token;
    return this.csrf;
  }

  get<T = any>(path: string) {
    return this.request<T>("GET", path);
  }
  post<T = any>(path: string, json?: unknown, opts: { csrf?: boolean } = {}) {
    return this.request<T>("POST", path, { json: json ?? {}, ...opts });
  }
  patch<T = any>(path: string, json?: unknown) {
    return this.request<T>("PATCH", path, { json: json ?? {} });
  }
  delete<T = any>(path: string) {
    return this.request<T>("DELETE", path);
  }

  async login(email: string, password: string): Promise<Answer> {
    return this.post("/api/auth/login", { email, password });
  }
}

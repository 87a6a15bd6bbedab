/**
 * Phasebook's one HTTP client: base /api, the session cookie, the CSRF header on every request
 * that changes state, and a typed `ApiError` built from the server's RFC 9457 problem JSON.
 * It does not redirect on 401; the QueryClient's cache handlers decide that (STYLE.md habit 5).
 */
import type { z } from "zod";
import type { Problem } from "@shared/schemas/common";

const BASE = "/api";
const UNSAFE_METHODS = new Set(["POST", "PUT", "PATCH", "DELETE"]);

export type FieldErrors = Record<string, string>;

export class ApiError extends Error {
  readonly status: number;
  readonly code: string | undefined;
  readonly title: string;
  /** Field path (e.g. "email", "roles.0") → first message the server gave for it. */
  readonly fieldErrors: FieldErrors;
  /** Seconds from a Retry-After header (429), when the server sent one. */
  readonly retryAfterSeconds: number | undefined;
  readonly problem: Partial<Problem>;

  constructor(problem: Partial<Problem> & { status: number }, retryAfterSeconds?: number) {
    super(problem.detail || problem.title || `Request failed with status ${problem.status}`);
    this.name = "ApiError";
    this.status = problem.status;
    this.code = problem.code;
    this.title = problem.title ?? "Error";
    this.problem = problem;
    this.retryAfterSeconds = retryAfterSeconds;
    this.fieldErrors = {};
    for (const e of problem.errors ?? []) {
      if (!(e.path in this.fieldErrors)) this.fieldErrors[e.path] = e.message;
    }
  }
}

export function isApiError(error: unknown, status?: number): error is ApiError {
  return error instanceof ApiError && (status === undefined || error.status === status);
}

// --- CSRF token -------------------------------------------------------------------------------
// The token is tied to the session, so it is cached until sign-in or sign-out replaces the session.

let csrfToken: string | null = null;
let csrfPending: Promise<string> | null = null;

const unreachable = () =>
  new ApiError({
    status: 0,
    title: "No connection",
    code: "network",
    detail: "Phasebook's server could not be reached. Check the connection and try again.",
  });

async function fetchCsrfToken(): Promise<string> {
  let res: Response;
  try {
    res = await fetch(`${BASE}/auth/csrf`, { credentials: "same-origin", headers: { accept: "application/json" } });
  } catch {
    throw unreachable();
  }
  if (!res.ok) throw await toApiError(res);
  const body = (await res.json()) as { token: string };
  csrfToken = body.token;
  return body.token;
}

function getCsrfToken(): Promise<string> {
  if (csrfToken) return Promise.resolve(csrfToken);
  csrfPending ??= fetchCsrfToken().finally(() => {
    csrfPending = null;
  });
  return csrfPending;
}

/** Drops the cached token and fetches the new session's one; call after sign-in and sign-out. */
export function refreshCsrfToken(): Promise<string | null> {
  csrfToken = null;
  csrfPending = null;
  return getCsrfToken().catch(() => null);
}

// --- requests ---------------------------------------------------------------------------------

export type QueryParams = Record<string, string | number | boolean | null | undefined>;

export interface RequestOptions {
  query?: QueryParams;
  signal?: AbortSignal;
}

function buildUrl(path: string, query?: QueryParams): string {
  const url = `${BASE}${path.startsWith("/") ? path : `/${path}`}`;
  if (!query) return url;
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) {
    if (value === undefined || value === null || value === "") continue;
    params.set(key, String(value));
  }
  const qs = params.toString();
  return qs ? `${url}?${qs}` : url;
}

async function toApiError(res: Response): Promise<ApiError> {
  const retryHeader = res.headers.get("retry-after");
  const retryAfter = retryHeader && /^\d+$/.test(retryHeader) ? Number(retryHeader) : undefined;
  const type = res.headers.get("content-type") ?? "";
  if (type.includes("json")) {
    try {
      const body = (await res.json()) as Partial<Problem>;
      return new ApiError({ ...body, status: res.status }, retryAfter);
    } catch {
      // Fall through: a proxy or crash answered with broken JSON.
    }
  }
  return new ApiError(
    {
      status: res.status,
      title: res.statusText || "Error",
      detail:
        res.status >= 500
          ? "Phasebook's server did not answer properly. Try again in a moment."
          : `The request failed (${res.status} ${res.statusText}).`,
    },
    retryAfter,
  );
}

async function send(method: string, url: string, body: unknown, signal: AbortSignal | undefined): Promise<Response> {
  const headers: Record<string, string> = { accept: "application/json, application/problem+json" };
  // A FormData body (a file upload) sets its own multipart boundary header.
  const form = typeof FormData !== "undefined" && body instanceof FormData;
  if (body !== undefined && !form) headers["content-type"] = "application/json";
  if (UNSAFE_METHODS.has(method)) headers["x-csrf-token"] = await getCsrfToken();
  try {
    return await fetch(url, {
      method,
      headers,
      credentials: "same-origin",
      body: body === undefined ? undefined : form ? (body as FormData) : JSON.stringify(body),
      signal,
    });
  } catch (err) {
    if (signal?.aborted) throw err;
    throw unreachable();
  }
}

async function request<T>(method: string, path: string, body?: unknown, options: RequestOptions = {}): Promise<T> {
  const url = buildUrl(path, options.query);
  let res = await send(method, url, body, options.signal);

  // A stale token (the session changed in another tab, or the server restarted): fetch a fresh one and retry once.
  if (res.status === 403 && UNSAFE_METHODS.has(method)) {
    const error = await toApiError(res);
    if (error.code !== "csrf_invalid") throw error;
    await refreshCsrfToken();
    res = await send(method, url, body, options.signal);
  }

  if (!res.ok) throw await toApiError(res);
  // 204 and some 202 answers have no body.
  const text = await res.text();
  return (text ? JSON.parse(text) : undefined) as T;
}

export const api = {
  get: <T>(path: string, options?: RequestOptions) => request<T>("GET", path, undefined, options),
  post: <T>(path: string, body?: unknown, options?: RequestOptions) => request<T>("POST", path, body, options),
  /** multipart/form-data, for file uploads. */
  postForm: <T>(path: string, form: FormData, options?: RequestOptions) => request<T>("POST", path, form, options),
  put: <T>(path: string, body?: unknown, options?: RequestOptions) => request<T>("PUT", path, body, options),
  patch: <T>(path: string, body?: unknown, options?: RequestOptions) => request<T>("PATCH", path, body, options),
  delete: <T>(path: string, options?: RequestOptions) => request<T>("DELETE", path, undefined, options),
};

/**
 * Checks an answer against the shared zod schema, so a drift between server and client shows
 * as a clear message naming the route and field instead of a blank screen further down.
 */
export function parseResponse<S extends z.ZodType>(schema: S, data: unknown, route: string): z.output<S> {
  const result = schema.safeParse(data);
  if (result.success) return result.data;
  const first = result.error.issues[0];
  const where = first ? `${first.path.join(".") || "(root)"}: ${first.message}` : "unknown field";
  throw new Error(`The server's answer to ${route} does not match the shared schema (${where}).`);
}

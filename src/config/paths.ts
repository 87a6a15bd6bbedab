/**
 * Every client URL pattern and its link builder, so no screen spells a path by hand.
 * `path` is what the router matches; `getHref` builds a concrete link.
 */

const enc = encodeURIComponent;

export const paths = {
  home: { path: "/", getHref: () => "/" },
  signIn: {
    path: "/sign-in",
    /** `next` is where to go after signing in; the home page needs no parameter. */
    getHref: (next?: string) => (next && next !== "/" ? `/sign-in?next=${enc(next)}` : "/sign-in"),
  },
  forgot: { path: "/forgot-password", getHref: () => "/forgot-password" },
  reset: { path: "/reset-password/:token", getHref: (token: string) => `/reset-password/${enc(token)}` },
  schedule: { path: "/schedule", getHref: () => "/schedule" },
  approvals: { path: "/schedule/approvals", getHref: () => "/schedule/approvals" },
  utilisation: { path: "/schedule/utilisation", getHref: () => "/schedule/utilisation" },
  scheduleSettings: { path: "/schedule/settings", getHref: () => "/schedule/settings" },
  myBookings: { path: "/bookings", getHref: () => "/bookings" },
  instruments: { path: "/instruments", getHref: () => "/instruments" },
  instrument: { path: "/instruments/:id", getHref: (id: number) => `/instruments/${id}` },
  training: { path: "/training", getHref: () => "/training" },
  /** The containers table, optionally opened on one status or sorted by expiry (start-page tiles link so). */
  stockroom: {
    path: "/stockroom",
    getHref: (view: { status?: string; sort?: "expiresAt" } = {}) => {
      const q = new URLSearchParams(Object.entries(view).filter((e): e is [string, string] => Boolean(e[1]))).toString();
      return q ? `/stockroom?${q}` : "/stockroom";
    },
  },
  stockroomChemicals: { path: "/stockroom/chemicals", getHref: () => "/stockroom/chemicals" },
  chemical: { path: "/stockroom/chemicals/:id", getHref: (id: number) => `/stockroom/chemicals/${id}` },
  container: { path: "/stockroom/containers/:id", getHref: (id: number) => `/stockroom/containers/${id}` },
  receive: { path: "/stockroom/receive", getHref: (chemicalId?: number) => (chemicalId ? `/stockroom/receive?chemicalId=${chemicalId}` : "/stockroom/receive") },
  prepareSolution: { path: "/stockroom/prepare", getHref: () => "/stockroom/prepare" },
  stockImport: { path: "/stockroom/import", getHref: () => "/stockroom/import" },
  runPlanNew: { path: "/run-plans/new", getHref: () => "/run-plans/new" },
  runPlan: { path: "/run-plans/:id", getHref: (id: number) => `/run-plans/${id}` },
  scan: { path: "/scan", getHref: () => "/scan" },
  scanToken: { path: "/s/:token", getHref: (token: string) => `/s/${enc(token)}` },
  recharge: { path: "/recharge", getHref: () => "/recharge" },
  myCharges: { path: "/charges", getHref: () => "/charges" },
  safety: { path: "/safety", getHref: () => "/safety" },
  safetyLocations: { path: "/safety/locations", getHref: () => "/safety/locations" },
  admin: {
    people: { path: "/admin/people", getHref: () => "/admin/people" },
    mailbox: { path: "/admin/mailbox", getHref: () => "/admin/mailbox" },
  },
  profile: { path: "/profile", getHref: () => "/profile" },
} as const;

/** Pages a signed-out visitor may open; a 401 there must not bounce back to sign-in. */
export const PUBLIC_PATH_PREFIXES = ["/sign-in", "/forgot-password", "/reset-password/"] as const;

export function isPublicPath(pathname: string): boolean {
  return PUBLIC_PATH_PREFIXES.some((p) => pathname === p || pathname.startsWith(p.endsWith("/") ? p : `${p}/`));
}

/**
 * Accepts a `next` parameter only when it is a path inside Phasebook, so a crafted sign-in link
 * cannot send someone to another site after they enter their password.
 */
export function safeNext(next: string | null | undefined): string {
  if (!next || !next.startsWith("/") || next.startsWith("//") || next.startsWith("/\\")) return paths.home.getHref();
  if (isPublicPath(next.split(/[?#]/)[0] ?? "")) return paths.home.getHref();
  return next;
}

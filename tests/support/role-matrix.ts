/**
 * Who may call each API route. PUBLIC: anyone, signed in or not. SIGNED_IN: every role.
 * Otherwise the roles allowed. Ownership rules (a member's own booking…) are tested beside
 * each feature; this table is about roles.
 */
import type { Role } from "@shared/schemas/auth";

export const PUBLIC = "public" as const;
export const SIGNED_IN = "signed-in" as const;
type Who = typeof PUBLIC | typeof SIGNED_IN | Role[];

export const ROLE_MATRIX: Record<string, Who> = {
  "GET /api/health": PUBLIC,
  "GET /api/auth/csrf": PUBLIC,
  "POST /api/auth/login": PUBLIC,
  "POST /api/auth/logout": SIGNED_IN,
  "GET /api/auth/me": SIGNED_IN,
  "POST /api/auth/password": SIGNED_IN,
  "POST /api/auth/password-reset/request": PUBLIC,
  "POST /api/auth/password-reset/confirm": PUBLIC,
  "GET /api/facility": PUBLIC,
  "GET /api/dashboard": SIGNED_IN,
  "GET /api/users": ["admin"],
  "POST /api/users": ["admin"],
  "PATCH /api/users/:id": ["admin"],
  "GET /api/departments": SIGNED_IN,
  "GET /api/groups": SIGNED_IN,
  "GET /api/instruments": SIGNED_IN,
  "GET /api/instruments/:id": SIGNED_IN,
  "POST /api/instruments": ["manager"],
  "PATCH /api/instruments/:id": ["manager"],
  "GET /api/bookings": SIGNED_IN,
  "POST /api/bookings": ["member", "manager"],
  "GET /api/bookings/policy": SIGNED_IN,
  "PUT /api/bookings/policy": ["manager"],
  "GET /api/bookings/:id.ics": SIGNED_IN,
  "GET /api/bookings/:id": SIGNED_IN,
  "PATCH /api/bookings/:id": SIGNED_IN,
  "POST /api/bookings/:id/approve": ["manager"],
  "POST /api/bookings/:id/decline": ["manager"],
  "POST /api/bookings/:id/cancel": SIGNED_IN,
  "POST /api/bookings/:id/check-in": SIGNED_IN,
  "POST /api/bookings/:id/check-out": SIGNED_IN,
  "POST /api/bookings/:id/no-show": ["manager"],
  "GET /api/setups": SIGNED_IN,
  "POST /api/setups": ["manager"],
  "PUT /api/setups/:id": ["manager"],
  "DELETE /api/setups/:id": ["manager"],
  "GET /api/training": SIGNED_IN,
  "POST /api/training": ["manager"],
  "POST /api/training/:id/revoke": ["manager"],
  "GET /api/training/people": ["manager"],
  "GET /api/training/requests": SIGNED_IN,
  "POST /api/training/requests": SIGNED_IN,
  "POST /api/training/requests/:id/close": ["manager"],
  "GET /api/calendar/me": SIGNED_IN,
  "POST /api/calendar/me/rotate": SIGNED_IN,
  "GET /api/calendar/:token.ics": PUBLIC,
  "GET /api/accounts": SIGNED_IN,
  "GET /api/reports/utilisation": ["manager"],
  "GET /api/reports/utilisation.csv": ["manager"],
  "GET /api/scan/:labelToken": SIGNED_IN,
  "GET /api/scan-actions/locations": SIGNED_IN,
  "POST /api/scan-actions/containers/:id/problem": SIGNED_IN,
  "POST /api/scan-actions/containers/:id/move": SIGNED_IN,
  "POST /api/scan-actions/containers/:id/empty": SIGNED_IN,
  "POST /api/scan-actions/containers/:id/dispose": SIGNED_IN,
  "POST /api/scan-actions/instruments/:id/cleaned": SIGNED_IN,
  "POST /api/scan-actions/instruments/:id/fault": SIGNED_IN,
  "GET /api/labels.pdf": ["manager", "safety_officer"],
  "GET /api/labels/stocks": ["manager", "safety_officer", "admin"],
  "POST /api/labels/stocks": ["manager", "admin"],
  "POST /api/labels/:type/:id/reissue": ["manager", "safety_officer"],
  "GET /api/labels/:type/:id/history": ["manager", "safety_officer"],
  "GET /api/audit": ["admin", "manager"],
  "GET /api/dev/mailbox": ["admin"],
};

/** A concrete path for a route pattern: ids that need not exist (404 still proves the role got through). */
export function examplePath(pattern: string): string {
  return pattern.replace(/:([A-Za-z]+)/g, (_m, name: string) => (/token/i.test(name) ? "no-such-token" : "999999"));
}

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
  "GET /api/audit": ["admin", "manager"],
  "GET /api/dev/mailbox": ["admin"],
  "GET /api/accounts": SIGNED_IN,
  "POST /api/accounts": ["manager"],
  "GET /api/accounts/:id": SIGNED_IN,
  "PATCH /api/accounts/:id": ["manager"],
  "GET /api/accounts/:id/members": ["group_lead", "manager"],
  "POST /api/accounts/:id/members": ["group_lead", "manager"],
  "PATCH /api/accounts/:id/members/:userId": ["group_lead", "manager"],
  "DELETE /api/accounts/:id/members/:userId": ["group_lead", "manager"],
  "GET /api/accounts/:id/adjustments": ["manager"],
  "POST /api/accounts/:id/adjustments": ["manager"],
  "GET /api/rates": SIGNED_IN,
  "POST /api/rates": ["manager"],
  "POST /api/rates/review": ["manager"],
  "POST /api/rates/apply": ["manager"],
  "PATCH /api/rates/:id": ["manager"],
  "DELETE /api/rates/:id": ["manager"],
  "GET /api/billing/policy": SIGNED_IN,
  "PUT /api/billing/policy": ["manager"],
  "GET /api/billing/preview": ["manager"],
  "GET /api/billing/runs": ["manager"],
  "POST /api/billing/runs": ["manager"],
  "GET /api/billing/runs/:id": ["manager"],
  "POST /api/billing/runs/:id/void": ["manager"],
  "GET /api/billing/runs/:id/journal.csv": ["manager"],
  "POST /api/billing/invoices/retry": ["manager"],
  "GET /api/billing/statements": SIGNED_IN,
  "GET /api/billing/statements/:id/statement.pdf": SIGNED_IN,
  "GET /api/billing/revenue": ["manager"],
  "GET /api/billing/spend": ["group_lead", "manager"],
  "GET /api/billing/my-charges": SIGNED_IN,
  "GET /api/billing/outstanding": ["manager"],
  "POST /api/webhooks/stripe": PUBLIC,
};

/** A concrete path for a route pattern: ids that need not exist (404 still proves the role got through). */
export function examplePath(pattern: string): string {
  return pattern.replace(/:([A-Za-z]+)/g, (_m, name: string) => (/token/i.test(name) ? "no-such-token" : "999999"));
}

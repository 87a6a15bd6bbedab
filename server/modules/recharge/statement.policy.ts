/**
 * Who may see (list, download) a statement, and pay its invoice. The rule is today's, moved here
 * unchanged: the manager sees every statement; an account's owner sees its statements; an
 * external customer's people (the members of the customer's account) see that account's. The
 * members of an internal account do not: their own charges are on "My charges".
 *
 * - download: those who see it; anyone else gets 404 (a statement one may not see is not known to exist).
 * - pay: those who see it, for an external account's invoice that is open (or whose payment was
 *   declined) on a final run.
 */
import type { InvoiceStatusName } from "@shared/schemas/recharge";
import { definePolicy, deny, type Denial } from "../../core/policy";
import { hasRole, type AuthUser } from "../../middleware/auth";

/** What the policy needs to know of a statement, its account and the actor's link to that account. */
export interface StatementFacts {
  id: number;
  accountKind: "internal" | "external";
  accountOwnerId: number | null;
  /** The actor is a member of the statement's account (may charge it). */
  actorIsMember: boolean;
  runStatus: "final" | "voided";
  invoiceStatus: InvoiceStatusName;
  invoiceUrl: string | null;
}

const download = (a: AuthUser, s: StatementFacts): Denial | null =>
  hasRole(a, "manager") || s.accountOwnerId === a.id || (s.accountKind === "external" && s.actorIsMember) ? null : deny(404, "not_found", "That statement was not found.");

export const statementPolicy = definePolicy<"download" | "pay", AuthUser, StatementFacts>({
  download,
  pay: (a, s) => {
    const hidden = download(a, s);
    if (hidden) return hidden;
    if (s.accountKind === "internal") return deny(422, "internal_statement", "Internal statements are settled by journal transfer; there is nothing to pay.");
    if (s.runStatus === "voided") return deny(409, "run_voided", `Statement ${s.id} belongs to a voided billing run; there is nothing to pay.`);
    if (s.invoiceStatus === "paid") return deny(409, "invoice_paid", `The invoice of statement ${s.id} has been paid.`);
    if ((s.invoiceStatus !== "open" && s.invoiceStatus !== "payment_failed") || !s.invoiceUrl) {
      return deny(409, "invoice_not_open", `The invoice of statement ${s.id} is not open for payment (${s.invoiceStatus}).`);
    }
    return null;
  },
});

export type StatementAction = (typeof statementPolicy.actions)[number];

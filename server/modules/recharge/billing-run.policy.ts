/**
 * Who may do what with a monthly billing run, and in which state. Billing is the manager's
 * (the routes' role gate says so too; the policy repeats it so the abilities stand on their own).
 *
 * - finalise a month: the manager, once: a month with a final run answers 409 until that run is voided.
 * - void a run: the manager; a voided run cannot be voided again, and a run one of whose
 *   invoices has been paid is not voided (a credit in a later month corrects it instead) — both 409.
 * - the finance journal: the manager, for any run (a voided run's file is marked VOID in its
 *   name, on its first line and on every row).
 * - the reversing journal: the manager, for a voided run only (409 for a final run: there is
 *   nothing to reverse while it stands).
 */
import { definePolicy, deny, type Denial } from "../../core/policy";
import { hasRole, type AuthUser } from "../../middleware/auth";

export interface BillingRunFacts {
  id: number;
  period: string;
  status: "final" | "voided";
  /** How many of the run's statements have a paid invoice. */
  paidInvoices: number;
}

/** A month about to be billed: the final run it already has, if any. */
export interface BillingPeriodFacts {
  period: string;
  finalRunId: number | null;
}

const managerOnly =
  (what: string) =>
  (a: AuthUser): Denial | null =>
    hasRole(a, "manager") ? null : deny(403, "manager_only", `Only the facility manager ${what}.`);

export const billingRunPolicy = definePolicy<"void" | "journal" | "reversal", AuthUser, BillingRunFacts>({
  void: (a, r) => {
    const who = managerOnly("voids billing runs")(a);
    if (who) return who;
    if (r.status === "voided") return deny(409, "already_void", `Billing run #${r.id} (${r.period}) is already void.`);
    if (r.paidInvoices > 0) return deny(409, "invoice_paid", "An invoice of this run has been paid; enter a credit in the next month instead of voiding the run.");
    return null;
  },
  journal: managerOnly("exports the finance journal"),
  reversal: (a, r) =>
    managerOnly("exports the finance journal")(a) ??
    (r.status === "voided" ? null : deny(409, "run_not_void", `Billing run #${r.id} (${r.period}) stands; a reversing journal is written for a voided run only.`)),
});

export const billingPeriodPolicy = definePolicy<"finalise", AuthUser, BillingPeriodFacts>({
  finalise: (a, p) => {
    const who = managerOnly("finalises billing runs")(a);
    if (who) return who;
    return p.finalRunId === null ? null : deny(409, "period_final", `${p.period} already has a final billing run (#${p.finalRunId}); void it first to run the month again.`);
  },
});

export type BillingRunAction = (typeof billingRunPolicy.actions)[number];

/**
 * Monthly billing runs. Finalising a month prices it page by page (month-stream.ts) and stores
 * its statements and lines as they are priced (statement-lines.commands.ts), in one transaction:
 * a month with charges that have no rate is refused whole. Invoices for external accounts are
 * queued and sent after the commit (invoice.commands.ts); statement PDFs are mailed by the
 * mail-statements job. The finance journal is written with the run (journal.commands.ts). Voiding
 * a run unlocks its month; its journal then has a reversal. Money is integer cents throughout.
 */
import type { EntityManager } from "typeorm";
import { BillingRun, Statement } from "../../entities";
import { Conflict, RuleBroken } from "../../errors";
import { serialTransaction } from "../../db/serial";
import { PolicyDenied } from "../../core/policy";
import type { AuthUser } from "../../middleware/auth";
import { audit } from "../../core/audit";
import { billingPeriodPolicy, billingRunPolicy } from "./billing-run.policy";
import { assertMonthEnded, findRun, finalRunOf, runFacts } from "./billing-run.queries";
import { streamMonth, type MonthSummary } from "./month-stream";
import { createRunWriter, type RunWriter } from "./statement-lines.commands";
import { writeRunJournal } from "./journal.commands";
import { processDueInvoices } from "./invoice.commands";
import { invoicingDeps, type RechargeDeps } from "./recharge-deps";

/** The run row first (its statements refer to it); its total is set once the month is priced. */
async function openRun(em: EntityManager, deps: RechargeDeps, actor: AuthUser, period: string, createdAt: string): Promise<BillingRun> {
  return em.save(BillingRun, {
    period,
    status: "final",
    currency: deps.config.CURRENCY,
    totalCents: 0,
    createdById: actor.id,
    createdAt,
    voidedAt: null,
    voidedById: null,
    voidReason: null,
  });
}

/** Throwing rolls back the run, its statements and the lines written so far. */
function refuseMissingRates(month: MonthSummary): void {
  if (month.missingRates.length === 0) return;
  throw new RuleBroken(
    "Some charges have no rate in effect; add the rates and run again.",
    month.missingRates.map((m) => ({ path: "rates", message: `No rate for ${m}` })),
    "missing_rates",
  );
}

/** The run's total, and each statement's total and invoice state (external ones with something to pay are queued). */
async function closeStatements(em: EntityManager, runId: number, month: MonthSummary, writer: RunWriter, nowIso: string): Promise<void> {
  await em.update(BillingRun, runId, { totalCents: month.totalCents });
  for (const s of month.accounts) {
    const invoiced = s.account.kind === "external" && s.totalCents > 0;
    await em.update(Statement, writer.statementId(s.account.id)!, {
      totalCents: s.totalCents,
      invoiceStatus: invoiced ? "queued" : "none",
      invoiceNextAttemptAt: invoiced ? nowIso : null,
    });
  }
}

/** POST /api/billing/runs: bills a month that is over, once (409 until its final run is voided). */
export async function finaliseRun(deps: RechargeDeps, actor: AuthUser, period: string): Promise<BillingRun> {
  assertMonthEnded(deps, period);
  const runId = await serialTransaction(deps.ds, async (em) => {
    const existing = await finalRunOf(em, period);
    const refused = billingPeriodPolicy.check(actor, "finalise", { period, finalRunId: existing?.id ?? null });
    // The existing run's id travels with the 409, as it always has, so a client can open it.
    if (refused) throw existing && refused.status === 409 ? new Conflict(refused.reason, refused.code, { runId: existing.id }) : new PolicyDenied(refused);
    const nowIso = deps.now().toISOString();
    const run = await openRun(em, deps, actor, period, nowIso);
    const writer = createRunWriter(em, { id: run.id, period, currency: run.currency, createdAt: nowIso });
    const month = await streamMonth(em, { period, tz: deps.config.FACILITY_TZ, ownRunId: run.id }, (lines) => writer.write(lines));
    refuseMissingRates(month);
    await closeStatements(em, run.id, month, writer, nowIso);
    // Checked to balance against the internal statements before it is stored; a journal that does not rolls the run back.
    await writeRunJournal(em, deps, run, month);
    await audit(em, deps.now(), actor.id, "billing.run_finalised", "billing_run", run.id, { period, totalCents: month.totalCents, statements: month.accounts.length });
    return run.id;
  });
  // After the commit: invoices go out outside the run's transaction, so an unreachable payment
  // service never undoes a finished run (send-invoices retries).
  await processDueInvoices(invoicingDeps(deps), { runId, force: true }).catch(() => undefined);
  return deps.ds.getRepository(BillingRun).findOneByOrFail({ id: runId });
}

/** POST /api/billing/runs/:id/void: unlocks the month; its open invoices are voided on the payment service. */
export async function voidRun(deps: RechargeDeps, actor: AuthUser, id: number, reason: string): Promise<BillingRun> {
  await serialTransaction(deps.ds, async (em) => {
    const run = await findRun(em, id);
    billingRunPolicy.authorize(actor, "void", await runFacts(em, run));
    await em.update(BillingRun, id, { status: "voided", voidedAt: deps.now().toISOString(), voidedById: actor.id, voidReason: reason });
    await audit(em, deps.now(), actor.id, "billing.run_voided", "billing_run", id, { period: run.period, reason });
  });
  await processDueInvoices(invoicingDeps(deps), { runId: id, force: true }).catch(() => undefined);
  return deps.ds.getRepository(BillingRun).findOneByOrFail({ id });
}

/** POST /api/billing/invoices/retry: every queued invoice now, whatever its retry time. */
export function retryInvoices(deps: RechargeDeps): Promise<{ done: number; failed: number }> {
  return processDueInvoices(invoicingDeps(deps), { force: true });
}

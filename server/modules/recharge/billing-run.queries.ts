/**
 * Reads of monthly billing: the preview (the month computed, nothing stored), the runs, one run
 * with its statements (the finance journal is journal.queries.ts). Each run carries what the billing-run policy
 * lets the caller do with it; each statement what the statement policy does.
 */
import type { EntityManager } from "typeorm";
import { monthRange } from "@shared/domain/utilisation";
import type { BillingPreviewDto, BillingRunDto, BillingRunSummaryDto } from "@shared/schemas/recharge";
import { Account, BillingRun, ChargeLine, Statement } from "../../entities";
import { NotFound, RuleBroken } from "../../errors";
import type { AuthUser } from "../../middleware/auth";
import { billingRunPolicy, type BillingRunFacts } from "./billing-run.policy";
import { statementPolicy } from "./statement.policy";
import { computeMonth } from "./month-stream";
import { presentComputedStatement, presentRun, presentRunSummary, presentStatement } from "./recharge.presenter";
import { memberAccountIds, statementFacts } from "./statement.queries";
import type { RechargeDeps } from "./recharge-deps";

/** A month is billed once it is over (422 otherwise). */
export function assertMonthEnded(deps: RechargeDeps, period: string): void {
  const { monthEnd } = monthRange(period, deps.config.FACILITY_TZ);
  if (monthEnd.getTime() > deps.now().getTime()) {
    throw new RuleBroken(`${period} has not ended yet; a month is billed once it is over.`, [{ path: "period", message: "This month has not ended" }], "period_not_ended");
  }
}

/** The final run a month already has, if any. */
export async function finalRunOf(em: EntityManager, period: string): Promise<BillingRun | null> {
  return em.findOne(BillingRun, { where: { period, status: "final" } });
}

/** The run as the billing-run policy sees it. */
export async function runFacts(em: EntityManager, run: BillingRun): Promise<BillingRunFacts> {
  const paidInvoices = await em.count(Statement, { where: { runId: run.id, invoiceStatus: "paid" } });
  return { id: run.id, period: run.period, status: run.status, paidInvoices };
}

/** The run (404 when there is none). */
export async function findRun(em: EntityManager, id: number): Promise<BillingRun> {
  const run = await em.findOneBy(BillingRun, { id });
  if (!run) throw new NotFound("That billing run");
  return run;
}

/** GET /api/billing/preview: the month as a run would bill it, computed and not stored. */
export async function previewMonth(deps: RechargeDeps, period: string): Promise<BillingPreviewDto> {
  assertMonthEnded(deps, period);
  const m = await deps.ds.transaction((em) => computeMonth(em, { period, tz: deps.config.FACILITY_TZ }));
  const currency = deps.config.CURRENCY;
  return {
    period,
    currency,
    total: m.totalCents,
    missingRates: m.missingRates,
    unbillableUsages: m.unbillableUsages,
    statements: m.statements.map((s) => presentComputedStatement(s, currency)),
  };
}

export async function listRuns(deps: RechargeDeps, actor: AuthUser, q: { limit: number; offset: number }): Promise<{ items: BillingRunSummaryDto[]; total: number }> {
  const [runs, total] = await deps.ds.getRepository(BillingRun).findAndCount({ order: { period: "DESC", id: "DESC" }, skip: q.offset, take: q.limit });
  const items: BillingRunSummaryDto[] = [];
  for (const r of runs) {
    const byStatus: { invoiceStatus: string; n: number }[] = await deps.ds.query(`SELECT invoiceStatus, COUNT(*) AS n FROM statements WHERE runId = ? GROUP BY invoiceStatus`, [r.id]);
    const paidInvoices = Number(byStatus.find((x) => x.invoiceStatus === "paid")?.n ?? 0);
    items.push(presentRunSummary(r, byStatus, billingRunPolicy.abilities(actor, { id: r.id, period: r.period, status: r.status, paidInvoices })));
  }
  return { items, total };
}

/** One run with its statements and their lines. */
export async function getRun(deps: RechargeDeps, actor: AuthUser, id: number): Promise<BillingRunDto> {
  const em = deps.ds.manager;
  const run = await findRun(em, id);
  const statements = await em.find(Statement, { where: { runId: id }, order: { accountId: "ASC" } });
  const lines = await em.find(ChargeLine, { where: { runId: id }, order: { at: "ASC", id: "ASC" } });
  const accounts = new Map((await em.find(Account)).map((a) => [a.id, a]));
  const mine = await memberAccountIds(em, actor.id);
  const byStatement = new Map<number, ChargeLine[]>();
  for (const l of lines) byStatement.set(l.statementId, [...(byStatement.get(l.statementId) ?? []), l]);
  const presented = statements.map((st) => {
    const account = accounts.get(st.accountId)!;
    const abilities = statementPolicy.abilities(actor, statementFacts(st, account, run.status, mine.has(account.id)));
    return presentStatement(st, account, byStatement.get(st.id) ?? [], abilities);
  });
  return presentRun(run, presented, billingRunPolicy.abilities(actor, await runFacts(em, run)));
}

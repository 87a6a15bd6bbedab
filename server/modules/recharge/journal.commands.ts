/**
 * The finance journal a finalising run writes, inside the run's transaction: per internal
 * statement a debit to the customer's account and an equal credit to the facility's recovery
 * account (shared/domain/journal.ts). It is checked before it is stored: debits equal credits,
 * and both equal the internal statements' total, or the whole run is rolled back. Stored as
 * written (journal_lines), so a later change of an account's code or of RECOVERY_ACCOUNT never
 * changes a journal already handed to the finance office, nor the reversal of a voided run.
 */
import type { EntityManager } from "typeorm";
import { buildJournal, checkJournal, decimalStringToCents, netChargedToCustomers, type JournalLine as JournalRow, type JournalStatement } from "@shared/domain/journal";
import { sumCents } from "@shared/domain/money";
import { BillingRun, JournalLine } from "../../entities";
import type { MonthSummary } from "./month-stream";
import type { RechargeDeps } from "./recharge-deps";

/** Rows per INSERT: a month has one pair of lines per internal statement, a few hundred at most. */
const CHUNK = 100;

/** Refuses (throws) a journal whose debits and credits differ, or whose customers' net is not the internal total. */
export function assertBalanced(lines: readonly JournalRow[], internalTotalCents: number, recoveryAccount: string, currency: string, runId: number): void {
  const check = checkJournal(lines);
  const net = netChargedToCustomers(lines, recoveryAccount).get(currency) ?? 0;
  const strays = check.byCurrency.filter((c) => c.currency !== currency);
  if (!check.balanced || net !== internalTotalCents || strays.length > 0) {
    throw new Error(
      `The journal of billing run #${runId} does not balance: ${JSON.stringify(check.byCurrency)}, customers' net ${net} against internal statements ${internalTotalCents} cents`,
    );
  }
}

/** The internal statements of a priced month as the journal's input, by account code. */
async function internalStatements(em: EntityManager, run: Pick<BillingRun, "period" | "currency">, month: MonthSummary): Promise<JournalStatement[]> {
  const departments = new Map<number, string>(
    ((await em.query(`SELECT id, code FROM departments`)) as { id: number; code: string }[]).map((d) => [Number(d.id), d.code]),
  );
  return month.accounts
    .filter((s) => s.account.kind === "internal")
    .map((s) => ({
      accountCode: s.account.code,
      accountName: s.account.name,
      totalCents: s.totalCents,
      currency: run.currency,
      period: run.period,
      department: s.account.departmentId == null ? null : (departments.get(s.account.departmentId) ?? null),
      lineCount: s.lineCount,
    }))
    .sort((a, b) => (a.accountCode < b.accountCode ? -1 : a.accountCode > b.accountCode ? 1 : 0));
}

/** Builds, checks and stores a finalising run's journal; the run remembers the recovery account it credited. */
export async function writeRunJournal(em: EntityManager, deps: RechargeDeps, run: Pick<BillingRun, "id" | "period" | "currency">, month: MonthSummary): Promise<JournalRow[]> {
  const recoveryAccount = deps.config.RECOVERY_ACCOUNT;
  const statements = await internalStatements(em, run, month);
  const lines = buildJournal(statements, { recoveryAccount, facilityName: deps.config.FACILITY_NAME });
  assertBalanced(lines, sumCents(statements.map((s) => s.totalCents)), recoveryAccount, run.currency, run.id);
  const rows = lines.map((l, position) => ({
    runId: run.id,
    position,
    period: l.period,
    account: l.account,
    department: l.department,
    debitCents: l.debit === "" ? null : decimalStringToCents(l.debit),
    creditCents: l.credit === "" ? null : decimalStringToCents(l.credit),
    currency: l.currency,
    description: l.description,
  }));
  for (let i = 0; i < rows.length; i += CHUNK) await em.insert(JournalLine, rows.slice(i, i + CHUNK));
  await em.update(BillingRun, run.id, { recoveryAccount });
  return lines;
}

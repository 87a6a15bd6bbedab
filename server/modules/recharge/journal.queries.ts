/**
 * A run's finance journal and, for a voided run, its reversal, as CSV files for the finance
 * office (columns JOURNAL_COLUMNS; debit and credit in the currency's units with two decimals,
 * written as numbers by the CSV writer). The lines are those the run stored when it was
 * finalised; a run finalised before journals were stored gets its journal built from its
 * statements with today's RECOVERY_ACCOUNT. Every file is checked to balance before it is sent.
 */
import { DateTime } from "luxon";
import { JOURNAL_COLUMNS, buildJournal, decimalStringToCents, journalFileName, reverseJournal, type JournalColumn, type JournalLine as JournalRow } from "@shared/domain/journal";
import { centsToDecimalString } from "@shared/domain/money";
import type { BillingRun } from "../../entities";
import type { AuthUser } from "../../middleware/auth";
import { toCsv, type CsvColumn } from "../../core/csv";
import { billingRunPolicy } from "./billing-run.policy";
import { findRun, runFacts } from "./billing-run.queries";
import { assertBalanced } from "./journal.commands";
import type { RechargeDeps } from "./recharge-deps";

const MONEY_COLUMNS: ReadonlySet<JournalColumn> = new Set(["debit", "credit"]);

/** The journal's columns: money columns as cents (a number in the file), the rest as guarded text. */
const COLUMNS: CsvColumn<JournalRow>[] = JOURNAL_COLUMNS.map((c) =>
  MONEY_COLUMNS.has(c)
    ? { header: c, kind: "money", value: (l: JournalRow) => (l[c] === "" ? null : decimalStringToCents(l[c])) }
    : { header: c, value: (l: JournalRow) => l[c] },
);

interface StoredLine {
  period: string;
  account: string;
  department: string;
  debitCents: number | null;
  creditCents: number | null;
  currency: string;
  description: string;
}

const side = (cents: number | null) => (cents == null ? "" : centsToDecimalString(cents));

/** The run's journal lines as stored, or (older runs) built from its internal statements now. */
async function journalOf(deps: RechargeDeps, run: BillingRun): Promise<{ lines: JournalRow[]; recoveryAccount: string; internalTotal: number }> {
  const em = deps.ds.manager;
  const internal: { code: string; name: string; totalCents: number; lines: number; department: string | null }[] = await em.query(
    `SELECT a.code, a.name, s.totalCents, (SELECT COUNT(*) FROM charge_lines cl WHERE cl.statementId = s.id) AS lines, d.code AS department
     FROM statements s JOIN accounts a ON a.id = s.accountId LEFT JOIN departments d ON d.id = a.departmentId
     WHERE s.runId = ? AND a.kind = 'internal' ORDER BY a.code`,
    [run.id],
  );
  const internalTotal = internal.reduce((a, r) => a + Number(r.totalCents), 0);
  if (run.recoveryAccount != null) {
    const stored: StoredLine[] = await em.query(
      `SELECT period, account, department, debitCents, creditCents, currency, description FROM journal_lines WHERE runId = ? ORDER BY position`,
      [run.id],
    );
    const lines = stored.map((l) => ({
      period: l.period,
      account: l.account,
      department: l.department,
      debit: side(l.debitCents),
      credit: side(l.creditCents),
      currency: l.currency,
      description: l.description,
    }));
    return { lines, recoveryAccount: run.recoveryAccount, internalTotal };
  }
  const recoveryAccount = deps.config.RECOVERY_ACCOUNT;
  const lines = buildJournal(
    internal.map((r) => ({
      accountCode: r.code,
      accountName: r.name,
      totalCents: Number(r.totalCents),
      currency: run.currency,
      period: run.period,
      department: r.department,
      lineCount: Number(r.lines),
    })),
    { recoveryAccount, facilityName: deps.config.FACILITY_NAME },
  );
  return { lines, recoveryAccount, internalTotal };
}

/** GET /api/billing/runs/:id/journal.csv and /reversal.csv (the billing-run policy's `journal` and `reversal`). */
export async function journalCsv(deps: RechargeDeps, actor: AuthUser, id: number, kind: "journal" | "reversal"): Promise<{ csv: string; filename: string }> {
  const run = await findRun(deps.ds.manager, id);
  billingRunPolicy.authorize(actor, kind, await runFacts(deps.ds.manager, run));
  const { lines, recoveryAccount, internalTotal } = await journalOf(deps, run);
  assertBalanced(lines, internalTotal, recoveryAccount, run.currency, run.id);
  const voided = run.status === "voided";
  const voidDate = run.voidedAt ? DateTime.fromISO(run.voidedAt, { zone: deps.config.FACILITY_TZ }).toISODate() : null;
  if (kind === "reversal") {
    const reversal = reverseJournal(lines, `Reversal of billing run #${run.id} (voided ${voidDate})`);
    return { csv: toCsv(reversal, COLUMNS), filename: journalFileName(run.period, "reversal") };
  }
  if (!voided) return { csv: toCsv(lines, COLUMNS), filename: journalFileName(run.period, "journal") };
  const warning =
    `VOID: billing run #${run.id} for ${run.period} was voided on ${voidDate} (${run.voidReason ?? "no reason given"}). ` +
    `Do not post these lines; if they were posted, post ${journalFileName(run.period, "reversal")} to undo them.`;
  const marked = lines.map((l) => ({ ...l, description: `${l.description} [VOID RUN]` }));
  return { csv: toCsv(marked, COLUMNS, { preamble: [warning] }), filename: journalFileName(run.period, "journal", true) };
}

/**
 * The demo's billed month, so the Recharge pages show a real month on first open: the month
 * before last, finalised by the manager on the 3rd of last month, with its statements and lines,
 * its balanced finance journal, and the two external customers' invoices — Northcape
 * University's paid, Tidewater's open.
 *
 * The month before last, not last month: the month that has just ended stays for the manager to
 * run (and for any script that bills last month on a new demo, as the published contract does).
 *
 * Invoices: a seed cannot run the payment service (it runs before the server and the fakes'
 * clients exist, and a public demo may have a real payment key). Northcape's paid invoice is
 * recorded as the fake payment service leaves a paid one (an `in_…` id, a number, paid, a payment
 * date); Tidewater's is queued, so the server's send-invoices job puts it on the payment service
 * (the fake, in the demo) within a minute of the start, where it becomes open with a page to pay.
 * Statements are recorded as mailed when the run was made, so the first start sends no mail.
 */
import crypto from "node:crypto";
import type { EntityManager } from "typeorm";
import { DateTime } from "luxon";
import { usageCost, lineAmountCents } from "@shared/domain/charges";
import { buildJournal, checkJournal, decimalStringToCents, netChargedToCustomers } from "@shared/domain/journal";
import { sumCents } from "@shared/domain/money";
import { BillingRun, ChargeLine, ContainerUsage, JournalLine, Statement } from "../../entities";
import { audit } from "../../core/audit";
import { DEMO_BILLING_POLICY, seedSessions, type DemoSession } from "./demo-rates";
import { priceDemoMonth, type DemoLine } from "./demo-month-pricing";

export interface DemoBillingOptions {
  now: Date;
  tz: string;
  currency: string;
  facilityName: string;
  recoveryAccount: string;
  managerId: number;
  /** The id of a demo container of a chemical (an opened bottle: usages draw from it). */
  containerOf: (chemical: string) => number | undefined;
  personId: (email: string) => number | undefined;
  accountId: (code: string) => number | undefined;
}

/** The month's sessions, for accounts the Schedule's demo timetable left without any that month. */
const SESSIONS: readonly DemoSession[] = [
  ["EXT-0001-TMR", "buyer@tidewater.example", 6, 9, 3, ["potentiostat", "interface_cell"], "completed"],
  ["EXT-0001-TMR", "buyer@tidewater.example", 20, 13, 2, ["potentiostat"], "completed"],
  // Full-service work: the manager ran Northcape's shipped samples.
  ["EXT-0002-NCU", "manager@kestrelbay.example", 14, 10, 2, ["potentiostat", "interface_cell"], "completed"],
  ["CHEM-4410-SIG", "member@kestrelbay.example", 8, 9, 2, ["potentiostat", "interface_cell"], "completed"],
  ["CHEM-7720-ITG", "kofi.mensah@kestrelbay.example", 15, 13, 3, ["potentiostat", "interface_cell"], "completed"],
  ["CPE-5102-RSG", "hana.kurosawa@kestrelbay.example", 21, 9, 2, ["potentiostat", "interface_cell"], "completed"],
];

/** Salts and solvents drawn that month, on the 25th (the bottles were all opened before then): [chemical, amount, unit, person, account]. */
const USAGES: readonly [string, number, string, string, string][] = [
  ["tbacl", 0.35, "g", "member@kestrelbay.example", "CHEM-4410-SIG"],
  ["ppncl", 0.42, "g", "kofi.mensah@kestrelbay.example", "CHEM-7720-ITG"],
  ["nacl", 0.7, "g", "member@kestrelbay.example", "CHEM-4410-SIG"],
  ["kcl", 2.5, "g", "hana.kurosawa@kestrelbay.example", "CPE-5102-RSG"],
];

const BASE62 = "0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz";
const randomText = (alphabet: string, n: number) => Array.from({ length: n }, () => alphabet[crypto.randomInt(alphabet.length)]).join("");

async function seedUsages(em: EntityManager, opts: DemoBillingOptions, day: DateTime): Promise<void> {
  for (const [chemical, amount, unit, email, code] of USAGES) {
    const containerId = opts.containerOf(chemical);
    const userId = opts.personId(email);
    const accountId = opts.accountId(code);
    if (containerId === undefined || userId === undefined || accountId === undefined) continue;
    const [chem]: { densityGPerMl: number | null; molarMass: number | null; unitCostCents: number | null; costUnit: string | null }[] = await em.query(
      `SELECT ch.densityGPerMl, ch.molarMass, ch.unitCostCents, ch.costUnit FROM containers c JOIN chemicals ch ON ch.id = c.chemicalId WHERE c.id = ?`,
      [containerId],
    );
    // The cost kept unrounded at the time of use, as logging a usage keeps it.
    const cost = usageCost(amount, unit, chem);
    await em.insert(ContainerUsage, {
      containerId,
      userId,
      bookingId: null,
      accountId,
      amount,
      unit,
      amountInContainerUnit: amount,
      costCents: cost === null ? null : lineAmountCents(cost.quantity, cost.unitCostCents),
      costQuantity: cost?.quantity ?? null,
      costUnit: cost?.unit ?? null,
      unitCostCents: cost?.unitCostCents ?? null,
      note: "interface run",
      at: day.plus({ hours: 11 }).toUTC().toISO()!,
    });
  }
}

async function writeLines(em: EntityManager, lines: DemoLine[], runId: number, statementOf: Map<number, number>): Promise<void> {
  const rows = lines.map((l) => ({ ...l, runId, statementId: statementOf.get(l.accountId)!, adjustmentId: null }));
  for (let i = 0; i < rows.length; i += 50) await em.insert(ChargeLine, rows.slice(i, i + 50));
}

/** Seeds the billed month; answers its run's id. */
export async function seedBilledMonth(em: EntityManager, opts: DemoBillingOptions): Promise<number> {
  const local = DateTime.fromJSDate(opts.now, { zone: opts.tz });
  const month = local.minus({ months: 2 }).startOf("month");
  const period = month.toFormat("yyyy-MM");
  // Finalised on the 3rd of last month at 10:00; every booking of the month had ended by then.
  const runAt = month.plus({ months: 1, days: 2, hours: 10 });
  await seedSessions(em, month, SESSIONS, (end) => end.toUTC().toISO()!);
  await seedUsages(em, opts, month.set({ day: 25 }));

  const lines = await priceDemoMonth(em, { start: month, tz: opts.tz, settings: DEMO_BILLING_POLICY });
  const byAccount = new Map<number, DemoLine[]>();
  for (const l of lines) byAccount.set(l.accountId, [...(byAccount.get(l.accountId) ?? []), l]);
  const totalCents = sumCents(lines.map((l) => l.amountCents));
  const runIso = runAt.toUTC().toISO()!;

  const run = await em.insert(BillingRun, {
    period,
    status: "final",
    currency: opts.currency,
    totalCents,
    createdById: opts.managerId,
    createdAt: runIso,
    voidedAt: null,
    voidedById: null,
    voidReason: null,
    recoveryAccount: opts.recoveryAccount,
  });
  const runId = run.identifiers[0].id as number;

  const accounts: { id: number; code: string; name: string; kind: string; departmentCode: string | null }[] = await em.query(
    `SELECT a.id, a.code, a.name, a.kind, d.code AS departmentCode FROM accounts a LEFT JOIN departments d ON d.id = a.departmentId ORDER BY a.id`,
  );
  const statementOf = new Map<number, number>();
  let invoiceSeq = 0;
  const prefix = randomText("ABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789", 8);
  for (const a of accounts.filter((x) => byAccount.has(x.id))) {
    const total = sumCents(byAccount.get(a.id)!.map((l) => l.amountCents));
    const external = a.kind === "external" && total > 0;
    const paid = external && a.code === "EXT-0002-NCU";
    const res = await em.insert(Statement, {
      runId,
      accountId: a.id,
      period,
      totalCents: total,
      currency: opts.currency,
      invoiceStatus: !external ? "none" : paid ? "paid" : "queued",
      invoiceId: paid ? `in_${randomText(BASE62, 24)}` : null,
      invoiceNumber: paid ? `${prefix}-${String(++invoiceSeq).padStart(4, "0")}` : null,
      invoiceUrl: null,
      invoiceAttempts: 0,
      invoiceNextAttemptAt: external && !paid ? opts.now.toISOString() : null,
      invoiceLastError: null,
      paidAt: paid ? runAt.plus({ days: 11, hours: 4 }).toUTC().toISO()! : null,
      mailedAt: runIso,
      createdAt: runIso,
    });
    statementOf.set(a.id, res.identifiers[0].id as number);
  }
  await writeLines(em, lines, runId, statementOf);

  // The journal: per internal statement a debit to its account and a credit to the recovery account, checked before it is stored.
  const internal = accounts
    .filter((a) => a.kind === "internal" && byAccount.has(a.id))
    .map((a) => ({
      accountCode: a.code,
      accountName: a.name,
      totalCents: sumCents(byAccount.get(a.id)!.map((l) => l.amountCents)),
      currency: opts.currency,
      period,
      department: a.departmentCode,
      lineCount: byAccount.get(a.id)!.length,
    }))
    .sort((x, y) => (x.accountCode < y.accountCode ? -1 : 1));
  const journal = buildJournal(internal, { recoveryAccount: opts.recoveryAccount, facilityName: opts.facilityName });
  const internalTotal = sumCents(internal.map((s) => s.totalCents));
  if (!checkJournal(journal).balanced || (netChargedToCustomers(journal, opts.recoveryAccount).get(opts.currency) ?? 0) !== internalTotal) {
    throw new Error(`The demo's journal for ${period} does not balance`);
  }
  if (journal.length > 0) await em.insert(
    JournalLine,
    journal.map((l, position) => ({
      runId,
      position,
      period: l.period,
      account: l.account,
      department: l.department,
      debitCents: l.debit === "" ? null : decimalStringToCents(l.debit),
      creditCents: l.credit === "" ? null : decimalStringToCents(l.credit),
      currency: l.currency,
      description: l.description,
    })),
  );
  await audit(em, runAt.toJSDate(), opts.managerId, "billing.run_finalised", "billing_run", runId, { period, totalCents, statements: statementOf.size });
  return runId;
}

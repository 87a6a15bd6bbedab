/**
 * Computes one month's statements from the bookings, usages and adjustments in the database,
 * with the pure pricing functions of shared/domain/billing.ts. Used by the preview (nothing
 * stored) and by the finalising run (stored as is), so the two always agree.
 *
 * What a run for month P bills:
 * - every billable booking that starts in P (local facility time) on each of its instruments;
 * - every container usage logged in P: its quantity in the chemical's cost unit at the unit cost
 *   × (1 + mark-up), kept unrounded with the usage and rounded once, at the line (charges.ts);
 * - every adjustment for P or an earlier month not yet on a final statement;
 * - for bookings and usages of an earlier month that is already final (locked): anything
 *   added or changed since, as a correction line, so a final statement is never altered;
 * - one cap credit per member and account whose month passes the member's monthly cap.
 *
 * `streamMonth` runs these as named steps over one `MonthLedger`, which keeps the running totals
 * and hands the priced lines to a sink a page at a time, so a month never sits in memory whole.
 */
import type { EntityManager } from "typeorm";
import { NoRateError, applyMonthlyCap, statementTotal } from "@shared/domain/billing";
import { consumableChargeLine, eachChargeLine, type UsageCost } from "@shared/domain/charges";
import { sumCents } from "@shared/domain/money";
import { monthRange } from "@shared/domain/utilisation";
import type { ChargeKind } from "../../entities/charge-line.entity";
import type { Account } from "../../entities";
import { readBillingSettings, type BillingSettings } from "./billing-settings";
import { type BookingRow, type ComputedLine, type InstrumentInfo, MonthPricer, localClock, toRateEntry } from "./month-pricer";
import {
  billedBookingTotals,
  bookingIdPage,
  bookingRows,
  bookingsChangedSince,
  loadAccounts,
  loadInstruments,
  loadRates,
  memberCaps,
  openAdjustments,
  otherFinalRuns,
  unbilledEarlierUsages,
  usagePage,
  type UsageRow,
} from "./month.queries";

export type { ComputedLine } from "./month-pricer";

export interface ComputedStatement {
  account: Account;
  lines: ComputedLine[];
  totalCents: number;
  warnings: string[];
}

export interface ComputedMonth {
  period: string;
  statements: ComputedStatement[];
  totalCents: number;
  /** Charges that could not be priced (no rate in effect): a run refuses to finalise over them. */
  missingRates: string[];
  /** Usages with no account to charge or no unit cost: shown to the manager, not billed. */
  unbillableUsages: number;
}

/** Bookings per page: a month is read in pages so only one page of rows is ever in memory. */
const BOOKING_PAGE = 2_000;
/** Usages per page, for the same reason. */
const USAGE_PAGE = 5_000;

function validityWarning(account: Account, day: string): string | null {
  if (account.validFrom && day < account.validFrom) return `Charges dated ${day} fall before the account opened (${account.validFrom}).`;
  if (account.validTo && day > account.validTo) return `Charges dated ${day} fall after the account closed (${account.validTo}).`;
  return null;
}

/**
 * Where priced lines go, a page at a time, in the order they are priced: the preview keeps them,
 * the finalising run writes them to the database at once, so a month never sits in memory whole.
 */
export type LineSink = (lines: ComputedLine[]) => void | Promise<void>;

/** One account's month as a running tally: its statement without the lines. */
export interface AccountTally {
  account: Account;
  totalCents: number;
  lineCount: number;
  warnings: string[];
}

export interface MonthSummary {
  period: string;
  /** Every account with at least one line, by id. */
  accounts: AccountTally[];
  totalCents: number;
  missingRates: string[];
  unbillableUsages: number;
}

export interface MonthOptions {
  period: string;
  tz: string;
  /** The run being written: its own lines are not "billed earlier". */
  ownRunId?: number;
  /** Rows per page (bookings, usages); small pages let a test cross page edges with a few rows. */
  pageSize?: { bookings: number; usages: number };
}

/** What every step of a month's pricing reads: the month's bounds and the reference data. */
interface Month {
  em: EntityManager;
  period: string;
  ownRun: number;
  bookingPage: number;
  usagePage: number;
  startMs: number;
  endMs: number;
  startIso: string;
  endIso: string;
  clock: ReturnType<typeof localClock>;
  settings: BillingSettings;
  instruments: Map<number, InstrumentInfo>;
  pricer: MonthPricer;
  accounts: Map<number, Account>;
  /** Months with a final run (other than this one): changes to them become corrections. */
  locked: Set<string>;
  /** When the first of those runs was made: older bookings changed after it may need correcting. */
  earliestFinal: string | null;
}

async function openMonth(em: EntityManager, opts: MonthOptions): Promise<Month> {
  const { period, tz } = opts;
  const ownRun = opts.ownRunId ?? -1;
  const { monthStart, monthEnd } = monthRange(period, tz);
  const settings = await readBillingSettings(em);
  const instruments = await loadInstruments(em);
  const rates = (await loadRates(em)).map((r) => toRateEntry(r, tz));
  const finalRuns = await otherFinalRuns(em, ownRun);
  return {
    em,
    period,
    ownRun,
    bookingPage: opts.pageSize?.bookings ?? BOOKING_PAGE,
    usagePage: opts.pageSize?.usages ?? USAGE_PAGE,
    startMs: monthStart.getTime(),
    endMs: monthEnd.getTime(),
    startIso: monthStart.toISOString(),
    endIso: monthEnd.toISOString(),
    clock: localClock(tz),
    settings,
    instruments,
    pricer: new MonthPricer(tz, settings, rates, instruments),
    accounts: await loadAccounts(em),
    locked: new Set(finalRuns.map((r) => r.period)),
    earliestFinal: finalRuns.reduce<string | null>((m, r) => (m === null || r.createdAt < m ? r.createdAt : m), null),
  };
}

type LineFields = Omit<ComputedLine, "kind" | "accountId">;

/**
 * The month's running totals per account and per member (for the monthly caps), kept as the
 * lines pass, and the page of lines not yet handed to the sink.
 */
class MonthLedger {
  readonly missing = new Set<string>();
  unpricedUsages = 0;
  readonly tallies = new Map<number, { totalCents: number; lineCount: number; outsideDays: Set<string> }>();
  /** This month's own charges (instrument time and consumables) per account|member, for the caps. */
  readonly memberTotals = new Map<string, number>();
  private page: ComputedLine[] = [];

  constructor(
    private readonly month: Month,
    private readonly sink: LineSink,
  ) {}

  push(accountId: number, kind: ChargeKind, l: LineFields): void {
    const line = l as ComputedLine;
    line.kind = kind;
    line.accountId = accountId;
    let tally = this.tallies.get(accountId);
    if (!tally) this.tallies.set(accountId, (tally = { totalCents: 0, lineCount: 0, outsideDays: new Set() }));
    tally.totalCents = sumCents([tally.totalCents, line.amountCents]);
    tally.lineCount++;
    if (kind === "instrument" || kind === "consumable") {
      const account = this.month.accounts.get(accountId)!;
      if (account.validFrom || account.validTo) {
        const day = this.month.clock.date(line.at);
        if (validityWarning(account, day)) tally.outsideDays.add(day);
      }
      if (line.userId != null) {
        const key = `${accountId}|${line.userId}`;
        this.memberTotals.set(key, (this.memberTotals.get(key) ?? 0) + line.amountCents);
      }
    }
    this.page.push(line);
  }

  async flush(): Promise<void> {
    if (this.page.length === 0) return;
    const out = this.page;
    this.page = [];
    await this.sink(out);
  }
}

/** A booking's instrument lines, or null (and the missing rate noted) when no rate was in effect. */
function priceOrNote(m: Month, ledger: MonthLedger, b: BookingRow, account: Account, instrumentLabel: string): LineFields[] | null {
  try {
    return m.pricer.price(b, account.customerClass);
  } catch (e) {
    if (!(e instanceof NoRateError)) throw e;
    ledger.missing.add(`${instrumentLabel} (${account.customerClass}) on ${m.clock.date(b.startsAt)}`);
    return null;
  }
}

/** This month's bookings, a page of bookings (with all their instruments) at a time. */
async function priceBookings(m: Month, ledger: MonthLedger): Promise<void> {
  let after: { startMs: number; id: number } | null = null;
  for (;;) {
    const ids = await bookingIdPage(m.em, m, after, m.bookingPage);
    if (ids.length === 0) break;
    for (const b of await bookingRows(m.em, ids.map((r) => r.id))) {
      const account = m.accounts.get(b.accountId);
      if (!account) continue;
      const lines = priceOrNote(m, ledger, b, account, m.instruments.get(b.instrumentId)?.name ?? `instrument ${b.instrumentId}`);
      if (lines) for (const l of lines) ledger.push(account.id, "instrument", l);
    }
    await ledger.flush();
    if (ids.length < m.bookingPage) break;
    const last = ids[ids.length - 1];
    after = { startMs: Number(last.startMs), id: Number(last.id) };
  }
}

/** Bookings of locked months changed since they were billed: the difference as a correction. */
async function correctChangedBookings(m: Month, ledger: MonthLedger): Promise<void> {
  if (!m.earliestFinal) return;
  const older = await bookingsChangedSince(m.em, m.startMs, m.earliestFinal);
  const candidates = older.filter((b) => m.locked.has(m.clock.period(b.startsAt)));
  if (candidates.length === 0) return;
  const billed = await billedBookingTotals(m.em, m.ownRun);
  for (const b of candidates) {
    const account = m.accounts.get(b.accountId);
    if (!account) continue;
    const lines = priceOrNote(m, ledger, b, account, `${m.instruments.get(b.instrumentId)?.name ?? b.instrumentId}`);
    if (!lines) continue;
    const now = statementTotal(lines);
    const was = billed.get(`${b.id}|${b.instrumentId}`) ?? 0;
    if (now === was) continue;
    ledger.push(account.id, "correction", {
      bookingId: b.id,
      instrumentId: b.instrumentId,
      usageId: null,
      adjustmentId: null,
      userId: b.userId,
      rateId: null,
      description: `Correction for booking #${b.id} of ${m.clock.period(b.startsAt)} (${m.instruments.get(b.instrumentId)?.name ?? ""}): billed ${was} cents, now ${now} cents`,
      ...eachChargeLine(now - was),
      at: b.startsAt,
    });
  }
  await ledger.flush();
}

/**
 * What a usage cost, as kept with it at the time of use (unrounded); a usage logged before
 * usages kept their cost exactly has only its rounded cost in cents, which becomes 1 each.
 */
function usageCostOf(u: UsageRow): Pick<UsageCost, "quantity" | "unit" | "unitCostCents"> | null {
  if (u.costQuantity != null && u.costUnit != null && u.unitCostCents != null) return { quantity: u.costQuantity, unit: u.costUnit, unitCostCents: u.unitCostCents };
  return u.costCents == null ? null : { quantity: "1", unit: "each", unitCostCents: String(u.costCents) };
}

/** One usage at cost plus mark-up, rounded once; a late-logged one (of a locked month) as a correction. */
function chargeUsage(m: Month, ledger: MonthLedger, u: UsageRow, late: boolean): void {
  const account = u.accountId == null ? undefined : m.accounts.get(u.accountId);
  const cost = usageCostOf(u);
  if (!account || !cost) {
    ledger.unpricedUsages++;
    return;
  }
  const markup = m.settings.consumableMarkupPercent;
  const figures = consumableChargeLine(cost, markup);
  const costText = cost.unit === "each" ? `${cost.unitCostCents} ¢` : `${cost.unitCostCents} ¢/${cost.unit}`;
  ledger.push(account.id, late ? "correction" : "consumable", {
    bookingId: null,
    instrumentId: null,
    usageId: u.id,
    adjustmentId: null,
    userId: u.userId,
    rateId: null,
    description:
      `${late ? `Late-logged (${m.clock.period(u.at)}): ` : ""}${u.chemicalName}, ${round6(u.amount)} ${u.unit} used; ` +
      `cost ${costText}${markup !== 0 ? ` + ${markup}% mark-up` : " (at cost)"}`,
    ...figures,
    at: u.at,
  });
}

/** This month's usages a page at a time, then late-logged usages of locked months. */
async function chargeUsages(m: Month, ledger: MonthLedger): Promise<void> {
  let after: { at: string; id: number } | null = null;
  for (;;) {
    const rows = await usagePage(m.em, m, after, m.usagePage);
    for (const u of rows) chargeUsage(m, ledger, u, false);
    await ledger.flush();
    if (rows.length < m.usagePage) break;
    const last = rows[rows.length - 1];
    after = { at: last.at, id: Number(last.id) };
  }
  if (m.locked.size === 0) return;
  for (const u of await unbilledEarlierUsages(m.em, m.startIso, m.ownRun)) if (m.locked.has(m.clock.period(u.at))) chargeUsage(m, ledger, u, true);
  await ledger.flush();
}

/** One credit per member and account over the member's monthly cap (this month's own charges). */
async function creditCaps(m: Month, ledger: MonthLedger): Promise<void> {
  for (const cap of await memberCaps(m.em)) {
    const own = ledger.memberTotals.get(`${cap.accountId}|${cap.userId}`);
    if (own === undefined) continue;
    // The member's month as one amount: the cap compares totals, so the credit is the same.
    const capped = applyMonthlyCap([{ amountCents: own }], cap.monthlyCapCents);
    const credit = capped.length > 1 ? capped[capped.length - 1] : null;
    if (!credit) continue;
    ledger.push(cap.accountId, "cap_credit", {
      bookingId: null,
      instrumentId: null,
      usageId: null,
      adjustmentId: null,
      userId: cap.userId,
      rateId: null,
      description: `Monthly cap of ${cap.monthlyCapCents} cents for this member reached`,
      ...eachChargeLine(credit.amountCents),
      at: new Date(m.endMs - 1).toISOString(),
    });
  }
}

/** Adjustments for this month or earlier not yet on a final statement. */
async function addAdjustments(m: Month, ledger: MonthLedger): Promise<void> {
  for (const a of await openAdjustments(m.em, m.period, m.ownRun)) {
    ledger.push(a.accountId, "adjustment", {
      bookingId: null,
      instrumentId: null,
      usageId: null,
      adjustmentId: a.id,
      userId: null,
      rateId: null,
      description: `${a.amountCents < 0 ? "Credit" : "Adjustment"}: ${a.reason}`,
      ...eachChargeLine(a.amountCents),
      at: a.createdAt,
    });
  }
  await ledger.flush();
}

/** Per-account tallies; warnings in date order, as the lines read on the statement. */
function summarise(m: Month, ledger: MonthLedger): MonthSummary {
  const summaries: AccountTally[] = [];
  for (const [accountId, tally] of [...ledger.tallies.entries()].sort((a, b) => a[0] - b[0])) {
    const account = m.accounts.get(accountId)!;
    const warnings = [...tally.outsideDays].sort().map((day) => validityWarning(account, day)!);
    if (!account.active) warnings.push("The account is no longer active.");
    summaries.push({ account, totalCents: tally.totalCents, lineCount: tally.lineCount, warnings: [...new Set(warnings)] });
  }
  return {
    period: m.period,
    accounts: summaries,
    totalCents: statementTotal(summaries.map((s) => ({ amountCents: s.totalCents }))),
    missingRates: [...ledger.missing].sort(),
    unbillableUsages: ledger.unpricedUsages,
  };
}

/**
 * Prices one month and hands the lines to `sink` page by page. Running totals per account and per
 * member (for the monthly caps) are kept as the lines pass, so nothing needs them all at once.
 */
export async function streamMonth(em: EntityManager, opts: MonthOptions, sink: LineSink): Promise<MonthSummary> {
  const m = await openMonth(em, opts);
  const ledger = new MonthLedger(m, sink);
  await priceBookings(m, ledger);
  await correctChangedBookings(m, ledger);
  await chargeUsages(m, ledger);
  await creditCaps(m, ledger);
  await addAdjustments(m, ledger);
  return summarise(m, ledger);
}

/** The whole month in memory, statement by statement (the preview shows every line). */
export async function computeMonth(em: EntityManager, opts: MonthOptions): Promise<ComputedMonth> {
  const byAccount = new Map<number, ComputedLine[]>();
  const summary = await streamMonth(em, opts, (lines) => {
    for (const l of lines) {
      const list = byAccount.get(l.accountId);
      if (list) list.push(l);
      else byAccount.set(l.accountId, [l]);
    }
  });
  const statements: ComputedStatement[] = summary.accounts.map((s) => {
    const lines = byAccount.get(s.account.id) ?? [];
    lines.sort((a, b) => (a.at < b.at ? -1 : a.at > b.at ? 1 : 0));
    return { account: s.account, lines, totalCents: statementTotal(lines), warnings: s.warnings };
  });
  return {
    period: summary.period,
    statements,
    totalCents: summary.totalCents,
    missingRates: summary.missingRates,
    unbillableUsages: summary.unbillableUsages,
  };
}

function round6(n: number): number {
  return Math.round(n * 1e6) / 1e6;
}

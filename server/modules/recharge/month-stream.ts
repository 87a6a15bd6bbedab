/**
 * Computes one month's statements from the bookings, usages and adjustments in the database,
 * with the pure pricing functions of shared/domain/billing.ts. Used by the preview (nothing
 * stored) and by the finalising run (stored as is), so the two always agree.
 *
 * What a run for month P bills:
 * - every billable booking that starts in P (local facility time) on each of its instruments;
 * - every container usage logged in P, at unit cost × (1 + mark-up);
 * - every adjustment for P or an earlier month not yet on a final statement;
 * - for bookings and usages of an earlier month that is already final (locked): anything
 *   added or changed since, as a correction line, so a final statement is never altered;
 * - one cap credit per member and account whose month passes the member's monthly cap.
 */
import type { EntityManager } from "typeorm";
import { DateTime } from "luxon";
import {
  type BillableBooking,
  type BillingPolicy,
  type CustomerClass,
  type InstrumentKind,
  type RateEntry,
  NoRateError,
  applyMonthlyCap,
  consumableCharge,
  priceBooking,
  rateFor,
  statementTotal,
} from "@shared/domain/billing";
import { sumCents } from "@shared/domain/money";
import type { BookableHours } from "@shared/domain/booking-rules";
import { monthRange } from "@shared/domain/utilisation";
import type { BillingPolicyDto } from "@shared/schemas/recharge";
import type { ChargeKind } from "../../entities/charge-line.entity";
import { Account, Rate } from "../../entities";
import { readBillingPolicy } from "./billing-settings";

export interface ComputedLine {
  kind: ChargeKind;
  accountId: number;
  bookingId: number | null;
  instrumentId: number | null;
  usageId: number | null;
  adjustmentId: number | null;
  userId: number | null;
  rateId: number | null;
  description: string;
  quantity: number;
  unit: string;
  unitPriceCents: number;
  amountCents: number;
  at: string;
}

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

interface BookingRow {
  id: number;
  userId: number;
  accountId: number;
  status: BillableBooking["status"];
  startsAt: string;
  endsAt: string;
  checkedInAt: string | null;
  checkedOutAt: string | null;
  cancelledAt: string | null;
  lateCancel: number | boolean;
  instrumentId: number;
}

interface InstrumentInfo {
  name: string;
  kind: InstrumentKind;
  bookableHours: BookableHours | null;
}

/** A local calendar date (YYYY-MM-DD) as the instant of its first local midnight. */
export function localDateStart(date: string, tz: string): number {
  return DateTime.fromISO(date, { zone: tz }).startOf("day").toMillis();
}

/**
 * Local calendar text for many instants in one zone. Zone offsets only change on quarter-hour
 * boundaries, so one luxon offset lookup per quarter hour serves every instant in it; a month of
 * tens of thousands of lines would otherwise spend seconds in Intl look-ups.
 */
export function localClock(tz: string) {
  const offsets = new Map<number, number>();
  const QUARTER = 15 * 60_000;
  const shifted = (instant: string | number | Date) => {
    const ms = typeof instant === "number" ? instant : new Date(instant).getTime();
    const bucket = Math.floor(ms / QUARTER);
    let offset = offsets.get(bucket);
    if (offset === undefined) {
      offset = DateTime.fromMillis(bucket * QUARTER, { zone: tz }).offset;
      offsets.set(bucket, offset);
    }
    return new Date(ms + offset * 60_000).toISOString();
  };
  return {
    /** YYYY-MM-DD */
    date: (i: string | number | Date) => shifted(i).slice(0, 10),
    /** YYYY-MM-DD HH:mm */
    dateTime: (i: string | number | Date) => shifted(i).slice(0, 16).replace("T", " "),
    /** YYYY-MM */
    period: (i: string | number | Date) => shifted(i).slice(0, 7),
  };
}

export function periodOf(instant: string | number | Date, tz: string): string {
  const dt = typeof instant === "string" ? DateTime.fromISO(instant, { zone: tz }) : DateTime.fromMillis(new Date(instant).getTime(), { zone: tz });
  return dt.toFormat("yyyy-MM");
}

export function toRateEntry(r: Rate, tz: string): RateEntry & { row: Rate } {
  return {
    id: r.id,
    instrumentId: r.instrumentId,
    instrumentKind: r.instrumentKind,
    customerClass: r.customerClass,
    hourlyRateCents: r.hourlyRateCents,
    effectiveFrom: localDateStart(r.effectiveFrom, tz),
    effectiveTo: r.effectiveTo == null ? null : localDateStart(r.effectiveTo, tz),
    row: r,
  };
}

function parseHours(json: string): BookableHours | null {
  try {
    const h = JSON.parse(json) as BookableHours;
    return Object.values(h).some((w) => Array.isArray(w) && w.length > 0) ? h : null;
  } catch {
    return null;
  }
}

function toPolicy(p: BillingPolicyDto, rate: Rate | undefined): BillingPolicy {
  return {
    roundingIncrementMinutes: rate?.roundingIncrementMinutes ?? p.roundingIncrementMinutes,
    minimumMinutes: rate?.minimumMinutes ?? p.minimumMinutes,
    noShowShare: p.noShowShare,
    lateCancelShare: p.lateCancelShare,
    // The booking's own lateCancel flag (set by the Schedule with the instrument's window when it
    // was cancelled) decides; the window here only makes the domain function agree with it.
    cancellationWindowMinutes: 1_000_000_000,
  };
}

const BASIS_NOTE: Record<string, string> = {
  checked_in: "checked-in time",
  booked: "booked time",
  no_show: "no-show",
  late_cancel: "late cancellation",
};

export class MonthPricer {
  private rateCache = new Map<string, (RateEntry & { row: Rate })[]>();
  private readonly clock: ReturnType<typeof localClock>;

  constructor(
    private readonly tz: string,
    private readonly policy: BillingPolicyDto,
    private readonly rates: (RateEntry & { row: Rate })[],
    private readonly instruments: Map<number, InstrumentInfo>,
  ) {
    this.clock = localClock(tz);
  }

  private ratesFor(instrumentId: number, cls: CustomerClass): (RateEntry & { row: Rate })[] {
    const key = `${instrumentId}|${cls}`;
    let list = this.rateCache.get(key);
    if (!list) {
      const kind = this.instruments.get(instrumentId)?.kind;
      list = this.rates.filter(
        (r) => r.customerClass === cls && (r.instrumentId === instrumentId || (r.instrumentId == null && r.instrumentKind === kind)),
      );
      this.rateCache.set(key, list);
    }
    return list;
  }

  /** The instrument-time lines of one booking on one instrument (none when nothing is billed). */
  price(b: BookingRow, cls: CustomerClass): Omit<ComputedLine, "kind" | "accountId">[] {
    const inst = this.instruments.get(b.instrumentId);
    if (!inst) return [];
    const late = b.status === "cancelled" && Boolean(b.lateCancel);
    const booking: BillableBooking = {
      start: new Date(b.startsAt),
      end: new Date(b.endsAt),
      status: b.status,
      checkedInAt: b.checkedInAt ? new Date(b.checkedInAt) : null,
      checkedOutAt: b.checkedOutAt ? new Date(b.checkedOutAt) : null,
      cancelledAt: late ? new Date(b.cancelledAt ?? b.startsAt) : null,
    };
    if (b.status === "requested" || b.status === "declined" || (b.status === "cancelled" && !late)) return [];
    const rates = this.ratesFor(b.instrumentId, cls);
    const q = { instrumentId: b.instrumentId, instrumentKind: inst.kind, customerClass: cls };
    const opening = rateFor({ ...q, rates, at: booking.start }) as (RateEntry & { row: Rate }) | null;
    if (!opening) throw new NoRateError(new Date(b.startsAt), b.instrumentId, cls);
    const factor = opening.row.afterHoursFactor;
    const afterHours = factor != null && factor > 1 && inst.bookableHours ? { tz: this.tz, bookableHours: inst.bookableHours, factor } : undefined;
    const { time, lines } = priceBooking({ ...q, rates, booking, policy: toPolicy(this.policy, opening.row), afterHours });
    const when = this.clock.dateTime(b.startsAt);
    return lines.map((l) => ({
      bookingId: b.id,
      instrumentId: b.instrumentId,
      usageId: null,
      adjustmentId: null,
      userId: b.userId,
      rateId: l.rateId == null ? null : Number(l.rateId),
      description:
        `${inst.name}, booking #${b.id} on ${when}: ${l.minutes} min ${BASIS_NOTE[time.basis] ?? ""}` +
        `${time.minimumApplied ? " (minimum charge)" : ""}${l.afterHours ? " after hours" : ""}`,
      quantity: l.minutes,
      unit: "min",
      unitPriceCents: l.hourlyRateCents,
      amountCents: l.amountCents,
      at: l.start.toISOString(),
    }));
  }
}

async function loadInstruments(em: EntityManager): Promise<Map<number, InstrumentInfo>> {
  const rows: { id: number; name: string; kind: InstrumentKind; bookableHours: string }[] = await em.query(
    `SELECT id, name, kind, bookableHours FROM instruments`,
  );
  return new Map(rows.map((r) => [r.id, { name: r.name, kind: r.kind, bookableHours: parseHours(r.bookableHours) }]));
}

const BOOKING_COLUMNS = `b.id, b.userId, b.accountId, b.status, b.startsAt, b.endsAt, b.checkedInAt, b.checkedOutAt, b.cancelledAt, b.lateCancel, bi.instrumentId`;

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

/**
 * Prices one month and hands the lines to `sink` page by page. Running totals per account and per
 * member (for the monthly caps) are kept as the lines pass, so nothing needs them all at once.
 */
export async function streamMonth(
  em: EntityManager,
  opts: {
    period: string;
    tz: string;
    /** The run being written: its own lines are not "billed earlier". */
    ownRunId?: number;
    /** Rows per page (bookings, usages); small pages let a test cross page edges with a few rows. */
    pageSize?: { bookings: number; usages: number };
  },
  sink: LineSink,
): Promise<MonthSummary> {
  const { period, tz } = opts;
  const ownRun = opts.ownRunId ?? -1;
  const bookingPage = opts.pageSize?.bookings ?? BOOKING_PAGE;
  const usagePage = opts.pageSize?.usages ?? USAGE_PAGE;
  const { monthStart, monthEnd } = monthRange(period, tz);
  const startMs = monthStart.getTime();
  const endMs = monthEnd.getTime();
  const startIso = monthStart.toISOString();
  const endIso = monthEnd.toISOString();

  const clock = localClock(tz);
  const policy = await readBillingPolicy(em);
  const instruments = await loadInstruments(em);
  const rates = (await em.find(Rate)).map((r) => toRateEntry(r, tz));
  const pricer = new MonthPricer(tz, policy, rates, instruments);
  const accounts = new Map((await em.find(Account)).map((a) => [a.id, a]));

  const finalRuns: { period: string; createdAt: string }[] = await em.query(`SELECT period, createdAt FROM billing_runs WHERE status = 'final' AND id <> ?`, [ownRun]);
  const locked = new Set(finalRuns.map((r) => r.period));
  const earliestFinal = finalRuns.reduce<string | null>((m, r) => (m === null || r.createdAt < m ? r.createdAt : m), null);

  const missing = new Set<string>();
  const tallies = new Map<number, { totalCents: number; lineCount: number; outsideDays: Set<string> }>();
  /** This month's own charges (instrument time and consumables) per account|member, for the caps. */
  const memberTotals = new Map<string, number>();
  let page: ComputedLine[] = [];

  const push = (accountId: number, kind: ChargeKind, l: Omit<ComputedLine, "kind" | "accountId">) => {
    const line = l as ComputedLine;
    line.kind = kind;
    line.accountId = accountId;
    let tally = tallies.get(accountId);
    if (!tally) tallies.set(accountId, (tally = { totalCents: 0, lineCount: 0, outsideDays: new Set() }));
    tally.totalCents = sumCents([tally.totalCents, line.amountCents]);
    tally.lineCount++;
    if (kind === "instrument" || kind === "consumable") {
      const account = accounts.get(accountId)!;
      if (account.validFrom || account.validTo) {
        const day = clock.date(line.at);
        if (validityWarning(account, day)) tally.outsideDays.add(day);
      }
      if (line.userId != null) {
        const key = `${accountId}|${line.userId}`;
        memberTotals.set(key, (memberTotals.get(key) ?? 0) + line.amountCents);
      }
    }
    page.push(line);
  };
  const flush = async () => {
    if (page.length === 0) return;
    const out = page;
    page = [];
    await sink(out);
  };

  // ---- this month's bookings, a page of bookings (with all their instruments) at a time
  let after: { startMs: number; id: number } | null = null;
  for (;;) {
    const ids: { id: number; startMs: number }[] = await em.query(
      `SELECT id, startMs FROM bookings
       WHERE startMs >= ? AND startMs < ? AND status IN ('confirmed', 'in_progress', 'completed', 'no_show', 'cancelled')
         ${after ? "AND (startMs > ? OR (startMs = ? AND id > ?))" : ""}
       ORDER BY startMs, id LIMIT ?`,
      after ? [startMs, endMs, after.startMs, after.startMs, after.id, bookingPage] : [startMs, endMs, bookingPage],
    );
    if (ids.length === 0) break;
    const rows: BookingRow[] = await em.query(
      `SELECT ${BOOKING_COLUMNS} FROM bookings b JOIN booking_instruments bi ON bi.bookingId = b.id
       WHERE b.id IN (${ids.map(() => "?").join(",")}) ORDER BY b.startMs, b.id, bi.instrumentId`,
      ids.map((r) => r.id),
    );
    for (const b of rows) {
      const account = accounts.get(b.accountId);
      if (!account) continue;
      try {
        for (const l of pricer.price(b, account.customerClass)) push(account.id, "instrument", l);
      } catch (e) {
        if (!(e instanceof NoRateError)) throw e;
        missing.add(`${instruments.get(b.instrumentId)?.name ?? `instrument ${b.instrumentId}`} (${account.customerClass}) on ${clock.date(b.startsAt)}`);
      }
    }
    await flush();
    if (ids.length < bookingPage) break;
    const last = ids[ids.length - 1];
    after = { startMs: Number(last.startMs), id: Number(last.id) };
  }

  // ---- bookings of locked months changed since they were billed
  if (earliestFinal) {
    const older: (BookingRow & { updatedAt: string })[] = await em.query(
      `SELECT ${BOOKING_COLUMNS}, b.updatedAt FROM bookings b JOIN booking_instruments bi ON bi.bookingId = b.id
       WHERE b.startMs < ? AND b.updatedAt > ? ORDER BY b.startMs, b.id, bi.instrumentId`,
      [startMs, earliestFinal],
    );
    const candidates = older.filter((b) => locked.has(clock.period(b.startsAt)));
    if (candidates.length > 0) {
      const billedRows: { bookingId: number; instrumentId: number; total: number }[] = await em.query(
        `SELECT cl.bookingId, cl.instrumentId, SUM(cl.amountCents) AS total FROM charge_lines cl JOIN billing_runs r ON r.id = cl.runId
         WHERE r.status = 'final' AND r.id <> ? AND cl.bookingId IS NOT NULL AND cl.kind IN ('instrument', 'correction') GROUP BY cl.bookingId, cl.instrumentId`,
        [ownRun],
      );
      const billed = new Map(billedRows.map((r) => [`${r.bookingId}|${r.instrumentId}`, Number(r.total)]));
      for (const b of candidates) {
        const account = accounts.get(b.accountId);
        if (!account) continue;
        let now = 0;
        try {
          now = statementTotal(pricer.price(b, account.customerClass));
        } catch (e) {
          if (!(e instanceof NoRateError)) throw e;
          missing.add(`${instruments.get(b.instrumentId)?.name ?? b.instrumentId} (${account.customerClass}) on ${clock.date(b.startsAt)}`);
          continue;
        }
        const was = billed.get(`${b.id}|${b.instrumentId}`) ?? 0;
        if (now === was) continue;
        push(account.id, "correction", {
          bookingId: b.id,
          instrumentId: b.instrumentId,
          usageId: null,
          adjustmentId: null,
          userId: b.userId,
          rateId: null,
          description: `Correction for booking #${b.id} of ${clock.period(b.startsAt)} (${instruments.get(b.instrumentId)?.name ?? ""}): billed ${was} cents, now ${now} cents`,
          quantity: 1,
          unit: "each",
          unitPriceCents: now - was,
          amountCents: now - was,
          at: b.startsAt,
        });
      }
      await flush();
    }
  }

  // ---- consumables: this month's usages a page at a time, then late-logged usages of locked months
  type UsageRow = { id: number; userId: number; accountId: number | null; amount: number; unit: string; costCents: number | null; at: string; chemicalName: string };
  const usageSql = `SELECT u.id, u.userId, COALESCE(u.accountId, b.accountId) AS accountId, u.amount, u.unit, u.costCents, u.at, ch.name AS chemicalName
    FROM container_usages u LEFT JOIN bookings b ON b.id = u.bookingId
    JOIN containers c ON c.id = u.containerId JOIN chemicals ch ON ch.id = c.chemicalId`;
  let unpricedUsages = 0;
  const chargeUsage = (u: UsageRow, late: boolean) => {
    const account = u.accountId == null ? undefined : accounts.get(u.accountId);
    if (!account || u.costCents == null) {
      unpricedUsages++;
      return;
    }
    const c = consumableCharge({ quantityUsed: 1, unitCostCents: u.costCents, markupPercent: policy.consumableMarkupPercent });
    push(account.id, late ? "correction" : "consumable", {
      bookingId: null,
      instrumentId: null,
      usageId: u.id,
      adjustmentId: null,
      userId: u.userId,
      rateId: null,
      description: `${late ? `Late-logged (${clock.period(u.at)}): ` : ""}${u.chemicalName}, ${round6(u.amount)} ${u.unit}` +
        (c.markupCents !== 0 ? ` (cost ${u.costCents} cents + ${policy.consumableMarkupPercent}% mark-up)` : " at cost"),
      quantity: u.amount,
      unit: u.unit,
      unitPriceCents: c.costCents,
      amountCents: c.amountCents,
      at: u.at,
    });
  };
  let usageAfter: { at: string; id: number } | null = null;
  for (;;) {
    const rows: UsageRow[] = await em.query(
      `${usageSql} WHERE u.at >= ? AND u.at < ? ${usageAfter ? "AND (u.at > ? OR (u.at = ? AND u.id > ?))" : ""} ORDER BY u.at, u.id LIMIT ?`,
      usageAfter ? [startIso, endIso, usageAfter.at, usageAfter.at, usageAfter.id, usagePage] : [startIso, endIso, usagePage],
    );
    for (const u of rows) chargeUsage(u, false);
    await flush();
    if (rows.length < usagePage) break;
    const last = rows[rows.length - 1];
    usageAfter = { at: last.at, id: Number(last.id) };
  }
  if (locked.size > 0) {
    const lateRows: UsageRow[] = await em.query(
      `${usageSql} WHERE u.at < ? AND u.id NOT IN (SELECT cl.usageId FROM charge_lines cl JOIN billing_runs r ON r.id = cl.runId
        WHERE r.status = 'final' AND r.id <> ? AND cl.usageId IS NOT NULL) ORDER BY u.at, u.id`,
      [startIso, ownRun],
    );
    for (const u of lateRows) if (locked.has(clock.period(u.at))) chargeUsage(u, true);
    await flush();
  }

  // ---- monthly caps: one credit per member and account over the cap (this month's own charges)
  const caps: { accountId: number; userId: number; monthlyCapCents: number }[] = await em.query(
    `SELECT accountId, userId, monthlyCapCents FROM account_members WHERE monthlyCapCents IS NOT NULL`,
  );
  for (const cap of caps) {
    const own = memberTotals.get(`${cap.accountId}|${cap.userId}`);
    if (own === undefined) continue;
    // The member's month as one amount: the cap compares totals, so the credit is the same.
    const capped = applyMonthlyCap([{ amountCents: own }], cap.monthlyCapCents);
    const credit = capped.length > 1 ? capped[capped.length - 1] : null;
    if (credit) {
      push(cap.accountId, "cap_credit", {
        bookingId: null,
        instrumentId: null,
        usageId: null,
        adjustmentId: null,
        userId: cap.userId,
        rateId: null,
        description: `Monthly cap of ${cap.monthlyCapCents} cents for this member reached`,
        quantity: 1,
        unit: "each",
        unitPriceCents: credit.amountCents,
        amountCents: credit.amountCents,
        at: new Date(endMs - 1).toISOString(),
      });
    }
  }

  // ---- adjustments not yet on a final statement
  const adjustments: { id: number; accountId: number; amountCents: number; reason: string; period: string; createdAt: string }[] = await em.query(
    `SELECT a.id, a.accountId, a.amountCents, a.reason, a.period, a.createdAt FROM billing_adjustments a
     WHERE a.period <= ? AND a.id NOT IN (SELECT cl.adjustmentId FROM charge_lines cl JOIN billing_runs r ON r.id = cl.runId
       WHERE r.status = 'final' AND r.id <> ? AND cl.adjustmentId IS NOT NULL) ORDER BY a.id`,
    [period, ownRun],
  );
  for (const a of adjustments) {
    push(a.accountId, "adjustment", {
      bookingId: null,
      instrumentId: null,
      usageId: null,
      adjustmentId: a.id,
      userId: null,
      rateId: null,
      description: `${a.amountCents < 0 ? "Credit" : "Adjustment"}: ${a.reason}`,
      quantity: 1,
      unit: "each",
      unitPriceCents: a.amountCents,
      amountCents: a.amountCents,
      at: a.createdAt,
    });
  }
  await flush();

  // ---- per-account tallies; warnings in date order, as the lines read on the statement
  const summaries: AccountTally[] = [];
  for (const [accountId, tally] of [...tallies.entries()].sort((a, b) => a[0] - b[0])) {
    const account = accounts.get(accountId)!;
    const warnings = [...tally.outsideDays].sort().map((day) => validityWarning(account, day)!);
    if (!account.active) warnings.push("The account is no longer active.");
    summaries.push({ account, totalCents: tally.totalCents, lineCount: tally.lineCount, warnings: [...new Set(warnings)] });
  }
  return {
    period,
    accounts: summaries,
    totalCents: statementTotal(summaries.map((s) => ({ amountCents: s.totalCents }))),
    missingRates: [...missing].sort(),
    unbillableUsages: unpricedUsages,
  };
}

/** The whole month in memory, statement by statement (the preview shows every line). */
export async function computeMonth(em: EntityManager, opts: Parameters<typeof streamMonth>[1]): Promise<ComputedMonth> {
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

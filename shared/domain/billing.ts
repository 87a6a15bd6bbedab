/**
 * Phasebook's recharge billing policy as pure functions: which minutes of a booking are billed,
 * which effective-dated rate applies, how a session is split into priced lines, consumables,
 * the monthly cap and statement totals. Amounts are integer cents (see money.ts for the one
 * rounding rule); minutes are whole minutes.
 *
 * Policy decisions, stated once here:
 * - Billed time is checked-in time (check-in → check-out) when both are recorded, else the
 *   booked time. Seconds are dropped so a few seconds of clicking never cross an increment.
 * - Cleaning buffers are never billed: the buffer lies outside [start, end) by construction.
 * - No-shows and late cancellations pay a share of the booked minutes, rounded up to the whole
 *   minute and then to the increment. The minimum charge does NOT apply to them: the minimum
 *   covers set-up and hand-over of a session that ran, while the share already is the penalty
 *   the facility chose for an unused slot.
 * - A session is split at rate changes (and, when asked, at the edges of the bookable hours for
 *   an after-hours factor); the billed minutes are spread over the pieces in proportion to
 *   their real length, so the pieces always add up to the billed minutes.
 */
import { type BookableHours, type RuleViolation, bookableWindows } from "./booking-rules";
import { type BookingStatus, type Instant, type Interval, MINUTE_MS, toMs } from "./intervals";
import { type Cents, allocateProportionally, divideRounded, factorToBasisPoints, multiplyRate, scaleCents, sumCents } from "./money";

export type Id = number | string;
export type CustomerClass = "internal" | "external_academic" | "commercial";
export type InstrumentKind = "potentiostat" | "interface_cell" | "support";

export interface BillingPolicy {
  /** Billed minutes are rounded UP to a multiple of this; 0 or 1 bills whole minutes. */
  roundingIncrementMinutes: number;
  /** Minimum charge in minutes for a session that ran (not for no-shows or late cancellations). */
  minimumMinutes: number;
  /** Share (0..1) of the booked minutes billed for a no-show. */
  noShowShare: number;
  /** Share (0..1) of the booked minutes billed for a late cancellation. */
  lateCancelShare: number;
  /** A cancellation less than this many minutes before the start is late. */
  cancellationWindowMinutes: number;
}

export interface BillableBooking {
  start: Instant;
  end: Instant;
  status: BookingStatus;
  checkedInAt?: Instant | null;
  checkedOutAt?: Instant | null;
  cancelledAt?: Instant | null;
}

export type BillingBasis = "checked_in" | "booked" | "no_show" | "late_cancel" | "not_billed";

export interface BillableTime {
  basis: BillingBasis;
  /** The real span the minutes come from (checked-in or booked time); null when not billed. */
  span: Interval | null;
  /** Minutes before rounding and minimum. */
  rawMinutes: number;
  minutes: number;
  minimumApplied: boolean;
}

export function validateBillingPolicy(policy: BillingPolicy): RuleViolation[] {
  const problems: RuleViolation[] = [];
  const wholeMinutes = ["roundingIncrementMinutes", "minimumMinutes", "cancellationWindowMinutes"] as const;
  for (const key of wholeMinutes) {
    if (!Number.isSafeInteger(policy[key]) || policy[key] < 0) {
      problems.push({ code: "bad_minutes", path: key, message: "Give a whole number of minutes, zero or more" });
    }
  }
  for (const key of ["noShowShare", "lateCancelShare"] as const) {
    if (!(policy[key] >= 0 && policy[key] <= 1)) {
      problems.push({ code: "bad_share", path: key, message: "Give a share between 0 and 1 (0.5 is half)" });
    }
  }
  return problems;
}

function assertPolicy(policy: BillingPolicy): void {
  const problems = validateBillingPolicy(policy);
  if (problems.length > 0) throw new RangeError(`Invalid billing policy: ${problems.map((p) => p.path).join(", ")}`);
}

export function roundUpToIncrement(minutes: number, incrementMinutes: number): number {
  if (incrementMinutes <= 1) return Math.ceil(minutes);
  return Math.ceil(minutes / incrementMinutes) * incrementMinutes;
}

/** share × minutes rounded up to a whole minute, exactly (0.55 × 100 is 55, not 56). */
function shareOfMinutes(minutes: number, share: number): number {
  return ceilDiv(BigInt(minutes) * factorToBasisPoints(share), 10_000n);
}

function ceilDiv(n: bigint, d: bigint): number {
  return Number((n + d - 1n) / d);
}

function wholeMinutesBetween(span: Interval): number {
  return Math.floor((span.end - span.start) / MINUTE_MS);
}

export function isLateCancellation(booking: BillableBooking, cancellationWindowMinutes: number): boolean {
  if (booking.status !== "cancelled" || booking.cancelledAt == null) return false;
  return toMs(booking.cancelledAt) > toMs(booking.start) - cancellationWindowMinutes * MINUTE_MS;
}

function rawTime(booking: BillableBooking, policy: BillingPolicy): Omit<BillableTime, "minutes" | "minimumApplied"> {
  const booked = { start: toMs(booking.start), end: toMs(booking.end) };
  const bookedMinutes = Math.max(0, wholeMinutesBetween(booked));
  switch (booking.status) {
    case "requested":
    case "declined":
      return { basis: "not_billed", span: null, rawMinutes: 0 };
    case "cancelled":
      return isLateCancellation(booking, policy.cancellationWindowMinutes)
        ? { basis: "late_cancel", span: booked, rawMinutes: shareOfMinutes(bookedMinutes, policy.lateCancelShare) }
        : { basis: "not_billed", span: null, rawMinutes: 0 };
    case "no_show":
      return { basis: "no_show", span: booked, rawMinutes: shareOfMinutes(bookedMinutes, policy.noShowShare) };
    default: {
      if (booking.checkedInAt != null && booking.checkedOutAt != null) {
        const used = { start: toMs(booking.checkedInAt), end: toMs(booking.checkedOutAt) };
        return { basis: "checked_in", span: used, rawMinutes: Math.max(0, wholeMinutesBetween(used)) };
      }
      return { basis: "booked", span: booked, rawMinutes: bookedMinutes };
    }
  }
}

/** The billed minutes of one booking with how they were reached, for statement lines. */
export function billableTime({ booking, policy }: { booking: BillableBooking; policy: BillingPolicy }): BillableTime {
  assertPolicy(policy);
  const raw = rawTime(booking, policy);
  const rounded = roundUpToIncrement(raw.rawMinutes, policy.roundingIncrementMinutes);
  const sessionRan = raw.basis === "checked_in" || raw.basis === "booked";
  const minimumApplied = sessionRan && rounded > 0 && rounded < policy.minimumMinutes;
  return { ...raw, minutes: minimumApplied ? policy.minimumMinutes : rounded, minimumApplied };
}

export function billableMinutes(input: { booking: BillableBooking; policy: BillingPolicy }): number {
  return billableTime(input).minutes;
}

// ---- rates ----------------------------------------------------------------------------------

/**
 * One row of the rate schedule: an hourly rate for one instrument (instrumentId set) or for
 * every instrument of a kind (instrumentId null), for one customer class, valid on
 * [effectiveFrom, effectiveTo); effectiveTo null means until further notice.
 */
export interface RateEntry {
  id?: Id;
  instrumentId?: Id | null;
  instrumentKind?: InstrumentKind | null;
  customerClass: CustomerClass;
  hourlyRateCents: Cents;
  effectiveFrom: Instant;
  effectiveTo?: Instant | null;
}

export interface RateQuery {
  rates: readonly RateEntry[];
  instrumentId: Id;
  instrumentKind: InstrumentKind;
  customerClass: CustomerClass;
  at: Instant;
}

type Scope = "instrument" | "kind" | null;

function scopeFor(rate: RateEntry, q: Omit<RateQuery, "rates" | "at">): Scope {
  if (rate.customerClass !== q.customerClass) return null;
  if (rate.instrumentId != null) return rate.instrumentId === q.instrumentId ? "instrument" : null;
  return rate.instrumentKind != null && rate.instrumentKind === q.instrumentKind ? "kind" : null;
}

function inEffect(rate: RateEntry, at: number): boolean {
  return toMs(rate.effectiveFrom) <= at && (rate.effectiveTo == null || at < toMs(rate.effectiveTo));
}

/** The latest-starting of several rates (only reachable in a table `validateRateTable` rejects). */
function latest(rates: RateEntry[]): RateEntry | null {
  return rates.reduce<RateEntry | null>((best, r) => (!best || toMs(r.effectiveFrom) > toMs(best.effectiveFrom) ? r : best), null);
}

/** The rate in effect at `at`; an instrument's own rate wins over its kind's. */
export function rateFor(q: RateQuery): RateEntry | null {
  const at = toMs(q.at);
  const live = q.rates.filter((r) => inEffect(r, at));
  const own = live.filter((r) => scopeFor(r, q) === "instrument");
  if (own.length > 0) return latest(own);
  return latest(live.filter((r) => scopeFor(r, q) === "kind"));
}

function scopeKey(rate: RateEntry): string {
  const target = rate.instrumentId != null ? `instrument:${rate.instrumentId}` : `kind:${rate.instrumentKind}`;
  return `${target}|${rate.customerClass}`;
}

function periodsOverlap(a: RateEntry, b: RateEntry): boolean {
  const aEnd = a.effectiveTo == null ? Infinity : toMs(a.effectiveTo);
  const bEnd = b.effectiveTo == null ? Infinity : toMs(b.effectiveTo);
  return toMs(a.effectiveFrom) < bEnd && toMs(b.effectiveFrom) < aEnd;
}

function rowProblems(rate: RateEntry, i: number): RuleViolation[] {
  const problems: RuleViolation[] = [];
  if (rate.instrumentId == null && rate.instrumentKind == null) {
    problems.push({ code: "no_scope", path: `rates.${i}.instrumentId`, message: "Give an instrument or an instrument kind" });
  }
  if (!Number.isSafeInteger(rate.hourlyRateCents) || rate.hourlyRateCents < 0) {
    problems.push({ code: "bad_rate", path: `rates.${i}.hourlyRateCents`, message: "Give the rate as whole cents, zero or more" });
  }
  if (rate.effectiveTo != null && toMs(rate.effectiveTo) <= toMs(rate.effectiveFrom)) {
    problems.push({ code: "bad_dates", path: `rates.${i}.effectiveTo`, message: "A rate must end after it takes effect" });
  }
  return problems;
}

/** Rows that cannot be used, and pairs of rows for the same target and class whose periods overlap. */
export function validateRateTable(rates: readonly RateEntry[]): RuleViolation[] {
  const problems = rates.flatMap(rowProblems);
  for (let j = 0; j < rates.length; j++) {
    for (let i = 0; i < j; i++) {
      if (scopeKey(rates[i]) === scopeKey(rates[j]) && periodsOverlap(rates[i], rates[j])) {
        problems.push({
          code: "overlap",
          path: `rates.${j}.effectiveFrom`,
          message: `Overlaps row ${i + 1}: the same instrument (or kind) and class would have two rates at once`,
        });
      }
    }
  }
  return problems;
}

// ---- pricing a session ------------------------------------------------------------------------

export class NoRateError extends Error {
  constructor(
    readonly at: Date,
    readonly instrumentId: Id,
    readonly customerClass: CustomerClass,
  ) {
    super(`No ${customerClass} rate for instrument ${instrumentId} on ${at.toISOString()}`);
    this.name = "NoRateError";
  }
}

export interface AfterHoursPricing {
  tz: string;
  bookableHours: BookableHours;
  /** Multiplies the hourly rate outside the bookable hours, e.g. 1.5; rounded to the cent. */
  factor: number;
}

export interface PriceSessionInput {
  start: Instant;
  end: Instant;
  billableMinutes: number;
  rates: readonly RateEntry[];
  instrumentId: Id;
  instrumentKind: InstrumentKind;
  customerClass: CustomerClass;
  afterHours?: AfterHoursPricing;
}

export interface PriceLine {
  start: Date;
  end: Date;
  minutes: number;
  /** The rate charged, after any after-hours factor. */
  hourlyRateCents: Cents;
  /** The schedule's rate before the factor. */
  baseRateCents: Cents;
  rateId?: Id;
  afterHours: boolean;
  amountCents: Cents;
}

interface Piece extends Interval {
  rate: RateEntry;
  afterHours: boolean;
}

function cutPoints(span: Interval, input: PriceSessionInput, windows: Interval[] | null): number[] {
  const cuts = new Set([span.start, span.end]);
  const inside = (t: number) => t > span.start && t < span.end;
  for (const r of input.rates) {
    if (!scopeFor(r, input)) continue;
    for (const t of [toMs(r.effectiveFrom), r.effectiveTo == null ? NaN : toMs(r.effectiveTo)]) if (inside(t)) cuts.add(t);
  }
  for (const w of windows ?? []) for (const t of [w.start, w.end]) if (inside(t)) cuts.add(t);
  return [...cuts].sort((a, b) => a - b);
}

function pieces(span: Interval, input: PriceSessionInput): Piece[] {
  const windows = input.afterHours ? bookableWindows(span, input.afterHours.tz, input.afterHours.bookableHours) : null;
  const cuts = cutPoints(span, input, windows);
  const result: Piece[] = [];
  for (let k = 1; k < cuts.length; k++) {
    const start = cuts[k - 1];
    const end = cuts[k];
    const rate = rateFor({ ...input, at: start });
    if (!rate) throw new NoRateError(new Date(start), input.instrumentId, input.customerClass);
    const afterHours = windows !== null && !windows.some((w) => w.start <= start && end <= w.end);
    const last = result[result.length - 1];
    if (last && last.rate === rate && last.afterHours === afterHours) last.end = end;
    else result.push({ start, end, rate, afterHours });
  }
  return result;
}

/** Priced lines for one session; their minutes add up to `billableMinutes`. */
export function priceSession(input: PriceSessionInput): PriceLine[] {
  if (!Number.isSafeInteger(input.billableMinutes) || input.billableMinutes < 0) {
    throw new RangeError(`billableMinutes must be a whole number, zero or more, got ${input.billableMinutes}`);
  }
  if (input.billableMinutes === 0) return [];
  const span = { start: toMs(input.start), end: toMs(input.end) };
  if (!(span.start < span.end)) throw new RangeError("The session must end after it starts");
  const parts = pieces(span, input);
  const minutes = allocateProportionally(input.billableMinutes, parts.map((p) => p.end - p.start));
  return parts
    .map((p, k) => {
      const hourly = p.afterHours ? scaleCents(p.rate.hourlyRateCents, input.afterHours!.factor) : p.rate.hourlyRateCents;
      return {
        start: new Date(p.start),
        end: new Date(p.end),
        minutes: minutes[k],
        hourlyRateCents: hourly,
        baseRateCents: p.rate.hourlyRateCents,
        ...(p.rate.id !== undefined ? { rateId: p.rate.id } : {}),
        afterHours: p.afterHours,
        amountCents: multiplyRate(hourly, minutes[k]),
      };
    })
    .filter((line) => line.minutes > 0);
}

export interface PriceBookingInput extends Omit<PriceSessionInput, "start" | "end" | "billableMinutes"> {
  booking: BillableBooking;
  policy: BillingPolicy;
}

/** billableTime and priceSession together: what one booking costs and why. */
export function priceBooking(input: PriceBookingInput): { time: BillableTime; lines: PriceLine[] } {
  const time = billableTime(input);
  if (!time.span || time.minutes === 0) return { time, lines: [] };
  // A checked-in span can be empty (out at the same minute as in) while a minimum still bills it.
  const span = time.span.end > time.span.start ? time.span : { start: time.span.start, end: time.span.start + MINUTE_MS };
  const lines = priceSession({ ...input, start: span.start, end: span.end, billableMinutes: time.minutes });
  return { time, lines };
}

// ---- consumables, cap, totals -----------------------------------------------------------------

export interface ConsumableInput {
  /** In the unit the cost is quoted in (g, mL, each); fractions to a millionth. */
  quantityUsed: number;
  unitCostCents: Cents;
  /** Mark-up over cost in percent (0 = at cost), to a hundredth of a percent. */
  markupPercent?: number;
}

export interface ConsumableCharge {
  costCents: Cents;
  markupCents: Cents;
  amountCents: Cents;
}

/**
 * quantity × unit cost × (1 + mark-up), each amount rounded half away from zero to the cent.
 * Whole-cent unit costs only; charges.ts chargeLine/consumableChargeLine take exact fractional
 * unit prices and return the line's quantity, unit and unit price too.
 */
export function consumableCharge({ quantityUsed, unitCostCents, markupPercent = 0 }: ConsumableInput): ConsumableCharge {
  if (!(quantityUsed >= 0) || !Number.isFinite(quantityUsed)) throw new RangeError("quantityUsed must be zero or more");
  if (!Number.isSafeInteger(unitCostCents) || unitCostCents < 0) throw new RangeError("unitCostCents must be whole cents, zero or more");
  if (!(markupPercent >= 0) || !Number.isFinite(markupPercent)) throw new RangeError("markupPercent must be zero or more");
  const micro = BigInt(Math.round(quantityUsed * 1_000_000));
  const base = micro * BigInt(unitCostCents);
  const cost = Number(divideRounded(base, 1_000_000n));
  const factor = 10_000n + BigInt(Math.round(markupPercent * 100));
  const amount = Number(divideRounded(base * factor, 1_000_000n * 10_000n));
  return { costCents: cost, markupCents: amount - cost, amountCents: amount };
}

export interface CapCreditLine {
  kind: "cap_credit";
  description: string;
  amountCents: Cents;
}

/**
 * Lines with, when their total passes the cap, one credit line that brings the total down to
 * the cap. A single visible credit keeps every usage line at its true price. The caller passes
 * the lines the cap covers (for example one account's instrument time in one month).
 */
export function applyMonthlyCap<T extends { amountCents: Cents }>(lines: readonly T[], capCents: Cents | null): (T | CapCreditLine)[] {
  if (capCents === null) return [...lines];
  if (!Number.isSafeInteger(capCents) || capCents < 0) throw new RangeError("capCents must be whole cents, zero or more");
  const total = statementTotal(lines);
  if (total <= capCents) return [...lines];
  return [...lines, { kind: "cap_credit", description: "Monthly cap", amountCents: capCents - total }];
}

/** The statement total is the sum of its lines' amounts, so it reconciles to the cent. */
export function statementTotal(lines: readonly { amountCents: Cents }[]): Cents {
  return sumCents(lines.map((l) => l.amountCents));
}

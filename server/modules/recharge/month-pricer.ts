/**
 * Prices the instrument time of one booking under the rates and the billing settings, with the
 * pure functions of shared/domain/billing.ts, and the calendar helpers a month's pricing needs
 * (local dates for many instants at little cost). Part of the monthly computation (month-stream.ts).
 */
import { DateTime } from "luxon";
import {
  type BillableBooking,
  type BillingPolicy,
  type CustomerClass,
  type InstrumentKind,
  type RateEntry,
  NoRateError,
  priceBooking,
  rateFor,
} from "@shared/domain/billing";
import type { BookableHours } from "@shared/domain/booking-rules";
import { timeChargeLine } from "@shared/domain/charges";
import type { BillingPolicyDto } from "@shared/schemas/recharge";
import type { ChargeKind } from "../../entities/charge-line.entity";
import type { Rate } from "../../entities";

/** One priced line, as the preview shows it and the run stores it. */
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
  /** Exact text (charges.ts): hours, the amount in a cost unit, or 1. */
  quantity: string;
  /** h, mL, g, each… */
  unit: string;
  /** Price of one unit in cents, mark-up included, exact text; quantity × unit price rounds to amountCents. */
  unitPriceCents: string;
  amountCents: number;
  at: string;
}

export interface BookingRow {
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

export interface InstrumentInfo {
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

export function parseHours(json: string): BookableHours | null {
  try {
    const h = JSON.parse(json) as BookableHours;
    return Object.values(h).some((w) => Array.isArray(w) && w.length > 0) ? h : null;
  } catch {
    return null;
  }
}

/** The domain's pricing rules for one rate: the facility's billing settings, the rate's own increment and minimum first. */
function pricingRules(settings: BillingPolicyDto, rate: Rate | undefined): BillingPolicy {
  return {
    roundingIncrementMinutes: rate?.roundingIncrementMinutes ?? settings.roundingIncrementMinutes,
    minimumMinutes: rate?.minimumMinutes ?? settings.minimumMinutes,
    noShowShare: settings.noShowShare,
    lateCancelShare: settings.lateCancelShare,
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
    private readonly settings: BillingPolicyDto,
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
    const { time, lines } = priceBooking({ ...q, rates, booking, policy: pricingRules(this.settings, opening.row), afterHours });
    const when = this.clock.dateTime(b.startsAt);
    return lines.map((l) => {
      // Hours at the hourly rate (after any after-hours factor), rounded once: the same amount as priceSession's.
      const figures = timeChargeLine(l.minutes, l.hourlyRateCents);
      return {
        bookingId: b.id,
        instrumentId: b.instrumentId,
        usageId: null,
        adjustmentId: null,
        userId: b.userId,
        rateId: l.rateId == null ? null : Number(l.rateId),
        description:
          `${inst.name}, booking #${b.id} on ${when}: ${l.minutes} min ${BASIS_NOTE[time.basis] ?? ""}` +
          `${time.minimumApplied ? " (minimum charge)" : ""}${l.afterHours ? " after hours" : ""}`,
        quantity: figures.quantity,
        unit: figures.unit,
        unitPriceCents: figures.unitPriceCents,
        amountCents: figures.amountCents,
        at: l.start.toISOString(),
      };
    });
  }
}

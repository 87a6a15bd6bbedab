/**
 * Prices one past month of the demo the way Recharge's billing run does (its month-stream and
 * month-pricer), with the same pure functions of shared/domain: each billable booking on each
 * instrument at the rate in effect (after-hours factor, the rate's increment and minimum, no-show
 * and late-cancellation shares), each usage at its unrounded cost × (1 + mark-up) rounded once,
 * and one credit per member over their monthly cap. Seeds import no area code, so this is the
 * seed's own reading of those rules for a month with no earlier final run (no corrections, no
 * adjustments); tests/api/recharge-demo.test.ts holds it to the run's own preview of the month,
 * line by line.
 */
import type { EntityManager } from "typeorm";
import { DateTime } from "luxon";
import { type BillableBooking, type CustomerClass, type InstrumentKind, type RateEntry, applyMonthlyCap, priceBooking, rateFor } from "@shared/domain/billing";
import type { BookableHours } from "@shared/domain/booking-rules";
import { consumableChargeLine, eachChargeLine, timeChargeLine, type ChargeLineFigures } from "@shared/domain/charges";
import type { BillingPolicyDto } from "@shared/schemas/recharge";
import type { ChargeKind } from "../../entities/charge-line.entity";

export interface DemoLine extends ChargeLineFigures {
  kind: ChargeKind;
  accountId: number;
  bookingId: number | null;
  instrumentId: number | null;
  usageId: number | null;
  userId: number | null;
  rateId: number | null;
  description: string;
  at: string;
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
  lateCancel: number;
  instrumentId: number;
}

interface RateRow {
  id: number;
  instrumentId: number | null;
  instrumentKind: InstrumentKind | null;
  customerClass: CustomerClass;
  hourlyRateCents: number;
  effectiveFrom: string;
  effectiveTo: string | null;
  minimumMinutes: number | null;
  roundingIncrementMinutes: number | null;
  afterHoursFactor: number | null;
}

const BASIS_NOTE: Record<string, string> = { checked_in: "checked-in time", booked: "booked time", no_show: "no-show", late_cancel: "late cancellation" };

function hoursOf(json: string): BookableHours | null {
  const h = JSON.parse(json) as BookableHours;
  return Object.values(h).some((w) => Array.isArray(w) && w.length > 0) ? h : null;
}

/** The month's lines in the order a run writes them: bookings, usages, then cap credits. */
export async function priceDemoMonth(em: EntityManager, month: { start: DateTime; tz: string; settings: BillingPolicyDto }): Promise<DemoLine[]> {
  const { tz, settings } = month;
  const from = month.start.toMillis();
  const to = month.start.plus({ months: 1 }).toMillis();
  const localStart = (date: string) => DateTime.fromISO(date, { zone: tz }).startOf("day").toMillis();
  const accounts = new Map<number, CustomerClass>(
    ((await em.query(`SELECT id, customerClass FROM accounts`)) as { id: number; customerClass: CustomerClass }[]).map((a) => [a.id, a.customerClass]),
  );
  const instruments = new Map(
    ((await em.query(`SELECT id, name, kind, bookableHours FROM instruments`)) as { id: number; name: string; kind: InstrumentKind; bookableHours: string }[]).map((i) => [
      i.id,
      { name: i.name, kind: i.kind, hours: hoursOf(i.bookableHours) },
    ]),
  );
  const rates = ((await em.query(`SELECT * FROM rates`)) as RateRow[]).map((r) => ({
    id: r.id,
    instrumentId: r.instrumentId,
    instrumentKind: r.instrumentKind,
    customerClass: r.customerClass,
    hourlyRateCents: r.hourlyRateCents,
    effectiveFrom: localStart(r.effectiveFrom),
    effectiveTo: r.effectiveTo == null ? null : localStart(r.effectiveTo),
    row: r,
  }));
  const lines: DemoLine[] = [];

  const bookings: BookingRow[] = await em.query(
    `SELECT b.id, b.userId, b.accountId, b.status, b.startsAt, b.endsAt, b.checkedInAt, b.checkedOutAt, b.cancelledAt, b.lateCancel, bi.instrumentId
     FROM bookings b JOIN booking_instruments bi ON bi.bookingId = b.id
     WHERE b.startMs >= ? AND b.startMs < ? AND b.status IN ('confirmed', 'in_progress', 'completed', 'no_show', 'cancelled')
     ORDER BY b.startMs, b.id, bi.instrumentId`,
    [from, to],
  );
  for (const b of bookings) {
    const late = b.status === "cancelled" && Boolean(b.lateCancel);
    if (b.status === "cancelled" && !late) continue;
    const inst = instruments.get(b.instrumentId)!;
    const cls = accounts.get(b.accountId)!;
    const own = rates.filter((r) => r.customerClass === cls && (r.instrumentId === b.instrumentId || (r.instrumentId == null && r.instrumentKind === inst.kind)));
    const q = { instrumentId: b.instrumentId, instrumentKind: inst.kind, customerClass: cls };
    const opening = rateFor({ ...q, rates: own, at: new Date(b.startsAt) }) as (RateEntry & { row: RateRow }) | null;
    if (!opening) throw new Error(`The demo has no ${cls} rate for ${inst.name} on ${b.startsAt}`);
    const factor = opening.row.afterHoursFactor;
    const booking: BillableBooking = {
      start: new Date(b.startsAt),
      end: new Date(b.endsAt),
      status: b.status,
      checkedInAt: b.checkedInAt ? new Date(b.checkedInAt) : null,
      checkedOutAt: b.checkedOutAt ? new Date(b.checkedOutAt) : null,
      cancelledAt: late ? new Date(b.cancelledAt ?? b.startsAt) : null,
    };
    const policy = {
      roundingIncrementMinutes: opening.row.roundingIncrementMinutes ?? settings.roundingIncrementMinutes,
      minimumMinutes: opening.row.minimumMinutes ?? settings.minimumMinutes,
      noShowShare: settings.noShowShare,
      lateCancelShare: settings.lateCancelShare,
      // The booking's own lateCancel flag decides, as in a run.
      cancellationWindowMinutes: 1_000_000_000,
    };
    const afterHours = factor != null && factor > 1 && inst.hours ? { tz, bookableHours: inst.hours, factor } : undefined;
    const { time, lines: priced } = priceBooking({ ...q, rates: own, booking, policy, afterHours });
    const when = DateTime.fromISO(b.startsAt, { zone: tz }).toFormat("yyyy-MM-dd HH:mm");
    for (const l of priced) {
      lines.push({
        kind: "instrument",
        accountId: b.accountId,
        bookingId: b.id,
        instrumentId: b.instrumentId,
        usageId: null,
        userId: b.userId,
        rateId: l.rateId == null ? null : Number(l.rateId),
        description:
          `${inst.name}, booking #${b.id} on ${when}: ${l.minutes} min ${BASIS_NOTE[time.basis] ?? ""}` +
          `${time.minimumApplied ? " (minimum charge)" : ""}${l.afterHours ? " after hours" : ""}`,
        ...timeChargeLine(l.minutes, l.hourlyRateCents),
        at: l.start.toISOString(),
      });
    }
  }

  const usages: { id: number; userId: number; accountId: number | null; amount: number; unit: string; costQuantity: string | null; costUnit: string | null; unitCostCents: string | null; at: string; chemicalName: string }[] =
    await em.query(
      `SELECT u.id, u.userId, COALESCE(u.accountId, b.accountId) AS accountId, u.amount, u.unit, u.costQuantity, u.costUnit, u.unitCostCents, u.at, ch.name AS chemicalName
       FROM container_usages u LEFT JOIN bookings b ON b.id = u.bookingId JOIN containers c ON c.id = u.containerId JOIN chemicals ch ON ch.id = c.chemicalId
       WHERE u.at >= ? AND u.at < ? ORDER BY u.at, u.id`,
      [new Date(from).toISOString(), new Date(to).toISOString()],
    );
  const markup = settings.consumableMarkupPercent;
  for (const u of usages) {
    if (u.accountId == null || u.costQuantity == null || u.costUnit == null || u.unitCostCents == null) continue;
    const costText = u.costUnit === "each" ? `${u.unitCostCents} ¢` : `${u.unitCostCents} ¢/${u.costUnit}`;
    lines.push({
      kind: "consumable",
      accountId: u.accountId,
      bookingId: null,
      instrumentId: null,
      usageId: u.id,
      userId: u.userId,
      rateId: null,
      description: `${u.chemicalName}, ${Math.round(u.amount * 1e6) / 1e6} ${u.unit} used; cost ${costText}${markup !== 0 ? ` + ${markup}% mark-up` : " (at cost)"}`,
      ...consumableChargeLine({ quantity: u.costQuantity, unit: u.costUnit, unitCostCents: u.unitCostCents }, markup),
      at: u.at,
    });
  }

  const memberTotals = new Map<string, number>();
  for (const l of lines) if (l.userId != null) memberTotals.set(`${l.accountId}|${l.userId}`, (memberTotals.get(`${l.accountId}|${l.userId}`) ?? 0) + l.amountCents);
  const caps: { accountId: number; userId: number; monthlyCapCents: number }[] = await em.query(
    `SELECT accountId, userId, monthlyCapCents FROM account_members WHERE monthlyCapCents IS NOT NULL`,
  );
  for (const cap of caps) {
    const own = memberTotals.get(`${cap.accountId}|${cap.userId}`);
    if (own === undefined) continue;
    const capped = applyMonthlyCap([{ amountCents: own }], cap.monthlyCapCents);
    if (capped.length < 2) continue;
    lines.push({
      kind: "cap_credit",
      accountId: cap.accountId,
      bookingId: null,
      instrumentId: null,
      usageId: null,
      userId: cap.userId,
      rateId: null,
      description: `Monthly cap of ${cap.monthlyCapCents} cents for this member reached`,
      ...eachChargeLine(capped[capped.length - 1].amountCents),
      at: new Date(to - 1).toISOString(),
    });
  }
  return lines;
}

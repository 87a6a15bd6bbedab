/**
 * The demo's recharge set-up: a rate for every instrument kind × customer class (CAD, invented
 * figures in the range a small university core might charge), the billing policy, and a few
 * completed sessions last month for the Tidewater customer and the Soft Interfaces Group accounts
 * that the schedule's demo left without any, on instruments free at the time, so a billing run
 * has something to bill for each kind of customer.
 */
import type { EntityManager } from "typeorm";
import { DateTime } from "luxon";
import type { CustomerClass } from "../../entities/account.entity";
import type { InstrumentKind } from "../../entities/instrument.entity";
import { Account, Booking, BookingInstrument, Instrument, Rate, Setting, User } from "../../entities";
import { UNTOUCHED_BOOKING } from "../../entities/booking.entity";
import type { BillingPolicyDto } from "@shared/schemas/recharge";

interface DemoRate {
  kind: InstrumentKind;
  rates: Record<CustomerClass, number>;
  minimumMinutes: number | null;
  roundingIncrementMinutes: number | null;
  afterHoursFactor: number | null;
}

/** External classes at 1.5× and about 2.7× the internal rate (common practice; the institution decides). */
export const DEMO_RATES: readonly DemoRate[] = [
  { kind: "potentiostat", rates: { internal: 3500, external_academic: 5250, commercial: 9500 }, minimumMinutes: 30, roundingIncrementMinutes: 15, afterHoursFactor: 1.25 },
  { kind: "interface_cell", rates: { internal: 1500, external_academic: 2250, commercial: 4000 }, minimumMinutes: 60, roundingIncrementMinutes: 15, afterHoursFactor: null },
  { kind: "support", rates: { internal: 1000, external_academic: 1500, commercial: 3000 }, minimumMinutes: null, roundingIncrementMinutes: null, afterHoursFactor: null },
];

/**
 * The settings row Recharge reads its billing settings from (server/modules/recharge/
 * billing-settings.ts). Seeds import no area code, so the key is written here too;
 * tests/api/recharge-demo.test.ts checks that the area reads back what the demo wrote.
 */
const BILLING_SETTINGS_KEY = "billing_policy";

export const DEMO_BILLING_POLICY: BillingPolicyDto = {
  roundingIncrementMinutes: 15,
  minimumMinutes: 30,
  noShowShare: 0.5,
  lateCancelShare: 0.5,
  cancellationWindowMinutes: 24 * 60,
  consumableMarkupPercent: 8,
};

/** A past session: [account code, person e-mail, day of month, local start hour, hours, instrument kinds, status]. */
export type DemoSession = readonly [string, string, number, number, number, InstrumentKind[], "completed" | "no_show"];

/** Last month's sessions. */
const HISTORY: readonly DemoSession[] = [
  ["EXT-0001-TMR", "buyer@tidewater.example", 4, 9, 3, ["potentiostat", "interface_cell"], "completed"],
  ["EXT-0001-TMR", "buyer@tidewater.example", 11, 13, 2, ["potentiostat", "interface_cell"], "completed"],
  ["EXT-0001-TMR", "buyer@tidewater.example", 18, 10, 1.5, ["potentiostat"], "completed"],
  ["CHEM-4410-SIG", "member@kestrelbay.example", 5, 9, 2, ["potentiostat", "interface_cell"], "completed"],
  ["CHEM-4410-SIG", "member@kestrelbay.example", 12, 14, 3, ["potentiostat", "interface_cell"], "completed"],
  ["CHEM-4410-SIG", "member@kestrelbay.example", 19, 9, 1, ["potentiostat"], "no_show"],
  ["CHEM-7720-ITG", "member@kestrelbay.example", 20, 10, 4, ["potentiostat", "interface_cell"], "completed"],
];

export async function seedDemoRates(em: EntityManager, opts: { now: Date; tz?: string }): Promise<void> {
  const tz = opts.tz ?? "America/Halifax";
  const nowIso = opts.now.toISOString();
  const local = DateTime.fromJSDate(opts.now, { zone: tz });
  // From the first of the month 13 months back, so last year's statements are priced too.
  const effectiveFrom = local.minus({ months: 13 }).startOf("month").toISODate()!;
  for (const r of DEMO_RATES) {
    for (const [customerClass, hourlyRateCents] of Object.entries(r.rates) as [CustomerClass, number][]) {
      await em.insert(Rate, {
        instrumentId: null,
        instrumentKind: r.kind,
        customerClass,
        hourlyRateCents,
        effectiveFrom,
        effectiveTo: null,
        minimumMinutes: r.minimumMinutes,
        roundingIncrementMinutes: r.roundingIncrementMinutes,
        afterHoursFactor: r.afterHoursFactor,
        note: "Demo schedule",
        createdById: null,
        createdAt: nowIso,
      });
    }
  }
  await em.save(Setting, { key: BILLING_SETTINGS_KEY, value: JSON.stringify(DEMO_BILLING_POLICY) });
  await seedSessions(em, local.minus({ months: 1 }).startOf("month"), HISTORY, () => nowIso);
}

/**
 * Sessions in one past month, for the accounts with nothing billed in it yet, on instruments of
 * the kind free an hour either side; `updatedAt` says when each booking was last changed.
 */
export async function seedSessions(em: EntityManager, month: DateTime, sessions: readonly DemoSession[], updatedAt: (end: DateTime) => string): Promise<void> {
  const from = month.toMillis();
  const to = month.plus({ months: 1 }).toMillis();
  const instruments = await em.find(Instrument, { where: { status: "in_service" }, order: { id: "ASC" } });
  // An instrument of the kind that is free an hour either side (the schedule's demo may have booked it).
  const freeOf = async (kind: InstrumentKind, startMs: number, endMs: number) => {
    for (const i of instruments.filter((x) => x.kind === kind)) {
      const clash = await em.query(
        `SELECT 1 FROM bookings b JOIN booking_instruments bi ON bi.bookingId = b.id
         WHERE bi.instrumentId = ? AND b.startMs < ? AND b.endMs > ? LIMIT 1`,
        [i.id, endMs + 3_600_000, startMs - 3_600_000],
      );
      if (clash.length === 0) return i;
    }
    return undefined;
  };
  // Only accounts with nothing billed last month get these sessions.
  const billedAccounts = new Set(
    (await em.query(`SELECT DISTINCT accountId FROM bookings WHERE startMs >= ? AND startMs < ?`, [from, to])).map(
      (r: { accountId: number }) => r.accountId,
    ),
  );
  for (const [code, email, day, hour, hours, kinds, status] of sessions) {
    const account = await em.findOne(Account, { where: { code } });
    const user = await em.findOne(User, { where: { email } });
    if (!account || !user || billedAccounts.has(account.id)) continue;
    const startAt = month.set({ day, hour });
    const endAt = startAt.plus({ minutes: hours * 60 });
    const picked: Instrument[] = [];
    for (const kind of kinds) {
      const free = await freeOf(kind, startAt.toMillis(), endAt.toMillis());
      if (free) picked.push(free);
    }
    if (picked.length !== kinds.length) continue;
    const start = month.set({ day, hour });
    const end = start.plus({ minutes: hours * 60 });
    // Checked in five minutes late and out ten minutes early, as people do.
    const checkedIn = status === "completed" ? start.plus({ minutes: 5 }).toUTC().toISO() : null;
    const checkedOut = status === "completed" ? end.minus({ minutes: 10 }).toUTC().toISO() : null;
    const res = await em.insert(Booking, {
      userId: user.id,
      accountId: account.id,
      purpose: "Ion-transfer voltammetry at the water | 1,2-dichloroethane interface",
      status,
      startsAt: start.toUTC().toISO()!,
      endsAt: end.toUTC().toISO()!,
      startMs: start.toMillis(),
      endMs: end.toMillis(),
      ...UNTOUCHED_BOOKING,
      checkedInAt: checkedIn,
      checkedOutAt: checkedOut,
      createdAt: start.minus({ days: 7 }).toUTC().toISO()!,
      updatedAt: updatedAt(end),
    });
    const bookingId = res.identifiers[0].id as number;
    await em.insert(BookingInstrument, picked.map((i) => ({ bookingId, instrumentId: i.id })));
  }
}

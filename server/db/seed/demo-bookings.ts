/**
 * The demo's Schedule: two setups and about two months of past bookings (completed with check-in
 * and check-out, a no-show, a late cancellation, an ordinary cancellation) plus three weeks of
 * upcoming ones (confirmed, and two requests waiting for the manager). Sessions follow a weekly
 * timetable in the facility's local time and fit each instrument's rules: office hours, the
 * cleaning buffers, and the booker's training at the time.
 */
import type { EntityManager } from "typeorm";
import { DateTime } from "luxon";
import { Booking, BookingInstrument, Setup, SetupInstrument } from "../../entities";
import { UNTOUCHED_BOOKING, type BookingStatus } from "../../entities/booking.entity";
import { audit } from "../../core/audit";
import type { InstrumentKey } from "./demo-instruments";
import type { PersonKey } from "./demo-people";

export interface DemoBookingRefs {
  now: Date;
  tz: string;
  people: Map<PersonKey, number>;
  instruments: Map<InstrumentKey, number>;
  accounts: Map<string, number>;
  managerId: number;
}

export const DEMO_SETUPS: ReadonlyArray<{ name: string; description: string; instruments: InstrumentKey[] }> = [
  { name: "Tern + cell A", description: "Four-electrode potentiostat with the 1.53 cm² cell; the usual water | DCE rig.", instruments: ["tern", "cellA"] },
  { name: "Plover + cell C", description: "Four-electrode potentiostat with the small 0.50 cm² cell.", instruments: ["plover", "cellC"] },
  { name: "Plover + cell B", description: "Four-electrode potentiostat with the second 1.53 cm² cell.", instruments: ["plover", "cellB"] },
];

interface Slot {
  /** ISO weekday: 1 = Monday. */
  weekday: number;
  from: string;
  to: string;
  instruments: InstrumentKey[];
  /** Who books it in even and odd weeks. */
  people: [PersonKey, PersonKey];
  purpose: string;
}

/** The weekly timetable; no two slots share an instrument within its cleaning buffer. */
const TIMETABLE: readonly Slot[] = [
  { weekday: 1, from: "09:00", to: "12:00", instruments: ["tern", "cellA"], people: ["member", "lead"], purpose: "Ion transfer of TBA⁺ across water | DCE, scan-rate series" },
  { weekday: 1, from: "13:00", to: "15:00", instruments: ["glovebox"], people: ["postdoc", "postdoc"], purpose: "Weighing TBA TPFB for the organic phase" },
  { weekday: 2, from: "09:00", to: "11:00", instruments: ["plover", "cellC"], people: ["member", "member"], purpose: "Small-interface control runs" },
  { weekday: 2, from: "13:00", to: "16:00", instruments: ["plover", "cellB"], people: ["expiringStudent", "eesStudent"], purpose: "Metal-ligand facilitated transfer" },
  { weekday: 3, from: "09:00", to: "12:00", instruments: ["tern", "cellA"], people: ["lead", "member"], purpose: "Potential window of LiCl | BTPPA TPFB" },
  { weekday: 3, from: "14:00", to: "15:30", instruments: ["uvVis"], people: ["eesStudent", "eesStudent"], purpose: "Partition coefficients by UV-vis" },
  { weekday: 4, from: "10:00", to: "12:00", instruments: ["shaker"], people: ["member", "member"], purpose: "Two-phase equilibration before the cell run" },
  { weekday: 4, from: "13:00", to: "16:00", instruments: ["plover", "cellB"], people: ["eesStudent", "expiringStudent"], purpose: "Facilitated transfer, second ligand" },
  { weekday: 5, from: "09:00", to: "11:30", instruments: ["tern", "cellA"], people: ["member", "lead"], purpose: "Repeat of Monday's series at 25 °C" },
];

const ACCOUNT_OF: Partial<Record<PersonKey, string>> = {
  member: "CHEM-4410-SIG",
  lead: "CHEM-4410-SIG",
  postdoc: "CHEM-7720-ITG",
  expiringStudent: "CPE-5102-RSG",
  eesStudent: "EES-2207-AQG",
};

/** How far the story reaches: the member was trained 65 days before seeding. */
const PAST_DAYS = 60;
const FUTURE_DAYS = 21;

function need<K extends string>(map: Map<K, number>, key: K): number {
  const v = map.get(key);
  if (v === undefined) throw new Error(`Demo bookings refer to unknown key "${key}"`);
  return v;
}

export async function seedDemoBookings(em: EntityManager, refs: DemoBookingRefs): Promise<number> {
  const { now, tz } = refs;
  const nowMs = now.getTime();
  const iso = (ms: number) => new Date(ms).toISOString();

  for (const s of DEMO_SETUPS) {
    const res = await em.insert(Setup, { name: s.name, description: s.description, createdAt: iso(nowMs - 400 * 86_400_000) });
    const setupId = res.identifiers[0].id as number;
    await em.insert(SetupInstrument, s.instruments.map((k, position) => ({ setupId, instrumentId: need(refs.instruments, k), position })));
  }

  const today = DateTime.fromMillis(nowMs, { zone: tz }).startOf("day");
  let count = 0;
  let pastIndex = 0;
  const insert = async (row: {
    person: PersonKey;
    instruments: InstrumentKey[];
    start: number;
    end: number;
    status: BookingStatus;
    purpose: string;
    extra?: Partial<Omit<Booking, "user" | "account">>;
  }) => {
    const res = await em.insert(Booking, {
      userId: need(refs.people, row.person),
      accountId: need(refs.accounts, ACCOUNT_OF[row.person]!),
      purpose: row.purpose,
      status: row.status,
      startsAt: iso(row.start),
      endsAt: iso(row.end),
      startMs: row.start,
      endMs: row.end,
      ...UNTOUCHED_BOOKING,
      createdAt: iso(Math.min(row.start, nowMs) - 5 * 86_400_000),
      updatedAt: iso(Math.min(row.end, nowMs)),
      ...row.extra,
    });
    const id = res.identifiers[0].id as number;
    await em.insert(BookingInstrument, row.instruments.map((k) => ({ bookingId: id, instrumentId: need(refs.instruments, k) })));
    count++;
    return id;
  };

  for (let d = -PAST_DAYS; d <= FUTURE_DAYS; d++) {
    const day = today.plus({ days: d });
    // Training of the expiring student ends 12 days after seeding, the EES account 20 days after.
    for (const slot of TIMETABLE.filter((s) => s.weekday === day.weekday)) {
      const week = Math.floor(day.toMillis() / (7 * 86_400_000));
      const person = slot.people[week % 2];
      const [fh, fm] = slot.from.split(":").map(Number);
      const [th, tm] = slot.to.split(":").map(Number);
      const start = day.set({ hour: fh, minute: fm }).toMillis();
      const end = day.set({ hour: th, minute: tm }).toMillis();
      if (start <= nowMs + 2 * 3_600_000 && end > nowMs - 3_600_000) continue; // keep today's near slots free to book
      if (start > nowMs && person === "expiringStudent" && d >= 10) continue;
      if (start > nowMs && person === "eesStudent" && d >= 18) continue;

      if (end <= nowMs) {
        pastIndex++;
        const story = pastIndex % 23 === 7 ? "no_show" : pastIndex % 29 === 11 ? "late_cancel" : pastIndex % 31 === 5 ? "cancel" : "completed";
        if (story === "completed") {
          // Arrive a few minutes late, finish a little early: billing uses these real times.
          await insert({
            person,
            instruments: slot.instruments,
            start,
            end,
            status: "completed",
            purpose: slot.purpose,
            extra: { checkedInAt: iso(start + ((pastIndex % 4) + 2) * 60_000), checkedOutAt: iso(end - ((pastIndex % 3) * 5) * 60_000) },
          });
        } else if (story === "no_show") {
          const id = await insert({ person, instruments: slot.instruments, start, end, status: "no_show", purpose: slot.purpose });
          await audit(em, new Date(start + 30 * 60_000), null, "booking.no_show", "booking", id, { automatic: true });
        } else {
          const late = story === "late_cancel";
          const cancelledAt = start - (late ? 3 : 72) * 3_600_000;
          const id = await insert({
            person,
            instruments: slot.instruments,
            start,
            end,
            status: "cancelled",
            purpose: slot.purpose,
            extra: { cancelledAt: iso(cancelledAt), cancelledById: need(refs.people, person), lateCancel: late, updatedAt: iso(cancelledAt) },
          });
          await audit(em, new Date(cancelledAt), need(refs.people, person), "booking.cancelled", "booking", id, { lateCancel: late });
        }
      } else {
        await insert({ person, instruments: slot.instruments, start, end, status: "confirmed", purpose: slot.purpose });
      }
    }
  }

  // Two requests waiting in the manager's queue, next week.
  const nextWeek = today.plus({ weeks: 1 }).startOf("week");
  const tue = nextWeek.plus({ days: 1 });
  const id1 = await insert({
    person: "lead",
    instruments: ["microCell"],
    start: tue.set({ hour: 13, minute: 0 }).toMillis(),
    end: tue.set({ hour: 15, minute: 0 }).toMillis(),
    status: "requested",
    purpose: "Steady-state ion-transfer voltammetry at the 25 µm interface",
  });
  await audit(em, now, need(refs.people, "lead"), "booking.requested", "booking", id1, {});
  const wed = nextWeek.plus({ days: 2 });
  const id2 = await insert({
    person: "postdoc",
    instruments: ["glovebox"],
    start: wed.set({ hour: 10, minute: 0 }).toMillis(),
    end: wed.set({ hour: 12, minute: 0 }).toMillis(),
    status: "requested",
    purpose: "Metathesis work-up of BTPPA TPFB",
  });
  await audit(em, now, need(refs.people, "postdoc"), "booking.requested", "booking", id2, {});
  return count;
}

/**
 * The Schedule's part of `npm run bench`: years of bookings over many instruments (20 at 1×, 200
 * with BENCH_SCALE=10), a bench member trained on every instrument, and the scenarios: the week of
 * one instrument and a booking create. Seeded with prepared statements straight into the
 * migrated database; bench/run.ts starts the app on it.
 */
import type { DataSource } from "typeorm";
import type autocannon from "autocannon";

const DAY_MS = 86_400_000;
export const YEARS = 5;
/** Instruments at 1×. */
export const INSTRUMENTS = 20;

export interface ScheduleSeed {
  ids: number[];
  bookings: number;
  accountId: number;
  weekStart: number;
}

/** Five years up to today; on each instrument two 3-hour sessions a day on most days. */
export async function seedScheduleBench(ds: DataSource, instruments: number, hash: string, token: () => string): Promise<ScheduleSeed> {
  const db = (ds.driver as unknown as { databaseConnection: import("better-sqlite3").Database }).databaseConnection;
  const now = new Date().toISOString();
  const allHours = JSON.stringify(Object.fromEntries(["mon", "tue", "wed", "thu", "fri", "sat", "sun"].map((d) => [d, [{ from: "00:00", to: "24:00" }]])));
  const ids: number[] = [];
  let bookings = 0;
  db.transaction(() => {
    const user = db
      .prepare(`INSERT INTO users (email, name, passwordHash, active, calendarToken, createdAt, updatedAt) VALUES (?, ?, ?, 1, ?, ?, ?)`)
      .run("bench@kestrelbay.example", "Bench Member", hash, token(), now, now);
    const userId = Number(user.lastInsertRowid);
    db.prepare(`INSERT INTO user_roles (userId, role) VALUES (?, 'member')`).run(userId);
    const other = db
      .prepare(`INSERT INTO users (email, name, passwordHash, active, calendarToken, createdAt, updatedAt) VALUES (?, ?, ?, 1, ?, ?, ?)`)
      .run("other@kestrelbay.example", "Other Member", hash, token(), now, now);
    const otherId = Number(other.lastInsertRowid);
    const acct = db
      .prepare(`INSERT INTO accounts (code, name, kind, customerClass, active, createdAt) VALUES ('BENCH-1', 'Bench account', 'internal', 'internal', 1, ?)`)
      .run(now);
    const accountId = Number(acct.lastInsertRowid);
    db.prepare(`INSERT INTO account_members (accountId, userId) VALUES (?, ?), (?, ?)`).run(accountId, userId, accountId, otherId);
    const inst = db.prepare(
      `INSERT INTO instruments (name, kind, status, trainingRequired, requiresApproval, cleaningBufferMinutes, minLeadMinutes, maxLengthMinutes, bookableHours, afterHoursAllowed, labelToken, createdAt)
       VALUES (?, ?, 'in_service', 1, 0, ?, 0, 600, ?, 0, ?, ?)`,
    );
    const train = db.prepare(`INSERT INTO training_records (userId, instrumentId, grantedAt, expiresAt, afterHours, notes) VALUES (?, ?, ?, NULL, 0, '')`);
    for (let i = 0; i < instruments; i++) {
      const r = inst.run(`Bench instrument ${i + 1}`, i % 2 ? "interface_cell" : "potentiostat", i % 2 ? 30 : 0, allHours, token(), now);
      ids.push(Number(r.lastInsertRowid));
      train.run(userId, ids[i], now);
    }
    const book = db.prepare(
      `INSERT INTO bookings (userId, accountId, purpose, status, startsAt, endsAt, startMs, endMs, lateCancel, createdAt, updatedAt)
       VALUES (?, ?, '', 'completed', ?, ?, ?, ?, 0, ?, ?)`,
    );
    const link = db.prepare(`INSERT INTO booking_instruments (bookingId, instrumentId) VALUES (?, ?)`);
    const end = Date.UTC(new Date().getUTCFullYear(), new Date().getUTCMonth(), new Date().getUTCDate());
    const start = end - YEARS * 365 * DAY_MS;
    for (let day = start; day < end; day += DAY_MS) {
      for (let i = 0; i < instruments; i++) {
        for (const hour of [9, 13]) {
          if ((day / DAY_MS + i + hour) % 7 === 0) continue;
          const s = day + hour * 3_600_000;
          const e = s + 3 * 3_600_000;
          const r = book.run(i % 3 ? userId : otherId, accountId, new Date(s).toISOString(), new Date(e).toISOString(), s, e, now, now);
          link.run(Number(r.lastInsertRowid), ids[i]);
          bookings++;
        }
      }
    }
  })();
  const weekStart = Date.UTC(new Date().getUTCFullYear() - 2, 2, 1);
  const accountId = (db.prepare(`SELECT id FROM accounts WHERE code = 'BENCH-1'`).get() as { id: number }).id;
  return { ids, bookings, accountId, weekStart };
}

export interface ScheduleContext {
  seed: ScheduleSeed;
  session: { cookie: string; csrf: string };
}

/** The week of the first instrument, two years back, as the member sees it. */
export function weekRequests({ seed, session }: ScheduleContext): autocannon.Request[] {
  const from = new Date(seed.weekStart).toISOString();
  const to = new Date(seed.weekStart + 7 * DAY_MS).toISOString();
  return [{ method: "GET", path: `/api/bookings?instrumentId=${seed.ids[0]}&from=${encodeURIComponent(from)}&to=${encodeURIComponent(to)}`, headers: { cookie: session.cookie } }];
}

/** Across runs, so a later run does not ask for an earlier run's slots. */
let createCount = 0;

/** Each create takes the next free hour on one of the instruments, far from the seeded history. */
export function createRequests({ seed, session }: ScheduleContext): autocannon.Request[] {
  const base = Date.UTC(2031, 0, 6, 0, 0, 0);
  return [
    {
      method: "POST",
      path: "/api/bookings",
      headers: { "content-type": "application/json", cookie: session.cookie, "x-csrf-token": session.csrf },
      setupRequest: (req) => {
        const k = createCount++;
        const instrumentId = seed.ids[k % seed.ids.length];
        // Two hours apart and one hour long: the 30-minute cleaning buffer of the cells always fits.
        const start = base + Math.floor(k / seed.ids.length) * 2 * 3_600_000;
        return {
          ...req,
          body: JSON.stringify({
            instrumentIds: [instrumentId],
            start: new Date(start).toISOString(),
            end: new Date(start + 60 * 60_000).toISOString(),
            accountId: seed.accountId,
            purpose: "bench",
          }),
        };
      },
    },
  ];
}

/**
 * Benchmark scenario for Recharge: seeds one month with 10,000 bookings and 50,000 container
 * usages into a migrated data source, then times one finalising billing run (statements, lines,
 * PDFs mailed through the outbox) and samples its memory. Goal on the reference machine: under
 * 5 s and 300 MB. Run alone with `npx tsx --expose-gc bench/recharge.ts` (BENCH_SCALE=10 for ten
 * times the month, BENCH_PROFILE=dir for a CPU profile of the run); bench/run.ts imports
 * `benchRechargeRun`.
 */
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import type { DataSource } from "typeorm";
import { DateTime } from "luxon";
// The run's own files, not the area's public entry: the entry also loads the route table (Express,
// the payment SDK, every schema), which would add to the memory this bench measures.
import { finaliseRun } from "../server/modules/recharge/billing-run.commands";
import { mailDueStatements } from "../server/modules/recharge/statement.commands";
import type { RechargeDeps } from "../server/modules/recharge/recharge-deps";
import { startProfiler, writeProfile } from "./support";

export interface RechargeBenchOptions {
  period?: string;
  tz?: string;
  bookings?: number;
  usages?: number;
  accounts?: number;
  /** BENCH_PROFILE: CPU profiles of the finalising run and of the mailing, each alone. */
  profile?: { start(): Promise<() => Promise<object>>; write(part: "run" | "mail", profile: object): void };
}

export interface RechargeBenchResult {
  name: string;
  bookings: number;
  usages: number;
  statements: number;
  lines: number;
  totalCents: number;
  seedMs: number;
  /** Finalising: computing, storing statements and lines, queueing invoices. */
  runMs: number;
  /** Rendering every statement PDF and queueing the mails (after the run, outside its transaction). */
  mailMs: number;
  /** Highest resident set size sampled during the run, in MB (the process, seeded data included). */
  peakRssMb: number;
  /** The same, through the mailing of the PDFs. */
  peakRssWithMailMb: number;
  /** Highest V8 heap in use sampled during the run, in MB. */
  peakHeapMb: number;
  goal: { ms: number; mb: number };
  met: boolean;
}

type Db = { prepare(sql: string): { run(...a: unknown[]): { lastInsertRowid: number | bigint } }; transaction<T>(fn: () => T): () => T };

function rawDb(ds: DataSource): Db {
  return (ds.driver as unknown as { databaseConnection: Db }).databaseConnection;
}

/** A small deterministic generator, so every bench run bills the same month. */
function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

export function seedRechargeMonth(ds: DataSource, opts: Required<Pick<RechargeBenchOptions, "period" | "tz" | "bookings" | "usages" | "accounts">>): void {
  const db = rawDb(ds);
  const rnd = lcg(42);
  const pick = <T>(xs: T[]) => xs[Math.floor(rnd() * xs.length)];
  const stamp = "2026-01-01T00:00:00.000Z";
  const month = DateTime.fromFormat(opts.period, "yyyy-MM", { zone: opts.tz });
  const days = month.daysInMonth!;

  db.transaction(() => {
    const user = db.prepare(`INSERT INTO users (email, name, passwordHash, active, calendarToken, createdAt, updatedAt) VALUES (?, ?, 'x', 1, ?, ?, ?)`);
    const users: number[] = [];
    for (let i = 0; i < 200; i++) users.push(Number(user.run(`bench${i}@kestrelbay.example`, `Bench Person ${i}`, `bench-cal-${i}`, stamp, stamp).lastInsertRowid));

    const account = db.prepare(
      `INSERT INTO accounts (code, name, kind, customerClass, ownerId, billingEmail, active, createdAt) VALUES (?, ?, ?, ?, ?, ?, 1, ?)`,
    );
    const member = db.prepare(`INSERT INTO account_members (accountId, userId, monthlyCapCents) VALUES (?, ?, ?)`);
    const accounts: number[] = [];
    for (let i = 0; i < opts.accounts; i++) {
      const external = i % 10 === 9;
      const id = Number(
        account.run(`BENCH-${i}`, `Bench account ${i}`, external ? "external" : "internal", external ? (i % 20 === 9 ? "external_academic" : "commercial") : "internal", users[i % users.length], external ? `ap${i}@bench.example` : null, stamp).lastInsertRowid,
      );
      accounts.push(id);
      for (let k = 0; k < 4; k++) member.run(id, users[(i * 4 + k) % users.length], k === 0 ? 150_000 : null);
    }

    const instrument = db.prepare(`INSERT INTO instruments (name, kind, bookableHours, labelToken, createdAt) VALUES (?, ?, ?, ?, ?)`);
    const hours = JSON.stringify({ mon: [{ from: "08:00", to: "18:00" }], tue: [{ from: "08:00", to: "18:00" }], wed: [{ from: "08:00", to: "18:00" }], thu: [{ from: "08:00", to: "18:00" }], fri: [{ from: "08:00", to: "18:00" }] });
    const potentiostats: number[] = [];
    const cells: number[] = [];
    for (let i = 0; i < 12; i++) potentiostats.push(Number(instrument.run(`Bench PS-${i}`, "potentiostat", hours, `bench-ps-${i}`, stamp).lastInsertRowid));
    for (let i = 0; i < 12; i++) cells.push(Number(instrument.run(`Bench cell ${i}`, "interface_cell", hours, `bench-cell-${i}`, stamp).lastInsertRowid));

    const rate = db.prepare(
      `INSERT INTO rates (instrumentKind, customerClass, hourlyRateCents, effectiveFrom, minimumMinutes, roundingIncrementMinutes, afterHoursFactor, note, createdAt) VALUES (?, ?, ?, '2020-01-01', ?, 15, ?, '', ?)`,
    );
    for (const [kind, base] of [["potentiostat", 3500], ["interface_cell", 1500]] as const) {
      rate.run(kind, "internal", base, 30, null, stamp);
      rate.run(kind, "external_academic", Math.round(base * 1.5), 30, null, stamp);
      rate.run(kind, "commercial", Math.round(base * 2.7), 30, 1.25, stamp);
    }
    // A mid-month rate change on one potentiostat splits its sessions at the boundary.
    db.prepare(`INSERT INTO rates (instrumentId, customerClass, hourlyRateCents, effectiveFrom, effectiveTo, note, createdAt) VALUES (?, 'internal', 3000, '2020-01-01', ?, '', ?)`).run(potentiostats[0], month.set({ day: 15 }).toISODate(), stamp);
    db.prepare(`INSERT INTO rates (instrumentId, customerClass, hourlyRateCents, effectiveFrom, note, createdAt) VALUES (?, 'internal', 4000, ?, '', ?)`).run(potentiostats[0], month.set({ day: 15 }).toISODate(), stamp);

    const chem = db.prepare(`INSERT INTO chemicals (name, casNumber, createdAt) VALUES (?, '107-06-2', ?)`);
    const container = db.prepare(`INSERT INTO containers (chemicalId, quantity, initialQuantity, unit, labelToken, createdAt) VALUES (?, 1000, 1000, 'mL', ?, ?)`);
    const containers: number[] = [];
    for (let i = 0; i < 30; i++) {
      const c = Number(chem.run(`Bench solvent ${i}`, stamp).lastInsertRowid);
      containers.push(Number(container.run(c, `bench-c-${i}`, stamp).lastInsertRowid));
    }

    const booking = db.prepare(
      `INSERT INTO bookings (userId, accountId, status, startsAt, endsAt, startMs, endMs, checkedInAt, checkedOutAt, cancelledAt, lateCancel, createdAt, updatedAt)
       VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
    );
    const held = db.prepare(`INSERT INTO booking_instruments (bookingId, instrumentId) VALUES (?, ?)`);
    const statuses = ["completed", "completed", "completed", "completed", "completed", "completed", "confirmed", "no_show", "cancelled", "requested"];
    const bookingIds: number[] = [];
    const bookingAccount: number[] = [];
    for (let i = 0; i < opts.bookings; i++) {
      const start = month.set({ day: 1 + Math.floor(rnd() * days), hour: 6 + Math.floor(rnd() * 14), minute: pick([0, 15, 30, 45]) });
      const end = start.plus({ minutes: 30 + Math.floor(rnd() * 16) * 15 });
      const status = pick(statuses);
      const inAt = status === "completed" ? start.plus({ minutes: Math.floor(rnd() * 10) }) : null;
      const outAt = status === "completed" ? end.minus({ minutes: Math.floor(rnd() * 20) }) : null;
      const acc = pick(accounts);
      const id = Number(
        booking.run(
          pick(users), acc, status, start.toUTC().toISO(), end.toUTC().toISO(), start.toMillis(), end.toMillis(),
          inAt?.toUTC().toISO() ?? null, outAt?.toUTC().toISO() ?? null, status === "cancelled" ? start.minus({ hours: 3 }).toUTC().toISO() : null,
          status === "cancelled" && rnd() < 0.5 ? 1 : 0, stamp, stamp,
        ).lastInsertRowid,
      );
      bookingIds.push(id);
      bookingAccount.push(acc);
      held.run(id, pick(potentiostats));
      if (rnd() < 0.6) held.run(id, pick(cells));
    }

    const usage = db.prepare(
      // As a usage is logged: the cost kept unrounded (amount in the cost unit, price of one unit) besides its rounded figure.
      `INSERT INTO container_usages (containerId, userId, bookingId, accountId, amount, unit, amountInContainerUnit, costCents, costQuantity, costUnit, unitCostCents, at) VALUES (?, ?, ?, ?, ?, 'mL', ?, ?, ?, 'mL', '37', ?)`,
    );
    for (let i = 0; i < opts.usages; i++) {
      const k = Math.floor(rnd() * bookingIds.length);
      const withBooking = rnd() < 0.7;
      const amount = Math.round((0.5 + rnd() * 20) * 100) / 100;
      const at = month.set({ day: 1 + Math.floor(rnd() * days), hour: 8 + Math.floor(rnd() * 10), minute: Math.floor(rnd() * 60) });
      usage.run(pick(containers), pick(users), withBooking ? bookingIds[k] : null, withBooking ? null : pick(accounts), amount, amount, Math.round(amount * 37), String(amount), at.toUTC().toISO());
    }
  })();
}

export async function benchRechargeRun(ds: DataSource, options: RechargeBenchOptions = {}): Promise<RechargeBenchResult> {
  const { profile, ...rest } = options;
  const opts = { period: "2026-11", tz: "America/Halifax", bookings: 10_000, usages: 50_000, accounts: 60, ...rest };
  const t0 = performance.now();
  seedRechargeMonth(ds, opts);
  const seedMs = performance.now() - t0;
  const now = () => DateTime.fromFormat(opts.period, "yyyy-MM", { zone: opts.tz }).plus({ months: 1, days: 2 }).toJSDate();
  // Statement PDFs go to the outbox after the run's commit (mail-statements job); timed apart.
  const deps: RechargeDeps = { ds, now, config: { FACILITY_TZ: opts.tz, CURRENCY: "CAD", FACILITY_NAME: "Liquid Interfaces Core", RECOVERY_ACCOUNT: "4510-LIC-RECOVERY" } };

  global.gc?.();
  let peakRss = process.memoryUsage().rss;
  let peakHeap = process.memoryUsage().heapUsed;
  const sample = () => {
    const m = process.memoryUsage();
    peakRss = Math.max(peakRss, m.rss);
    peakHeap = Math.max(peakHeap, m.heapUsed);
  };
  const timer = setInterval(sample, 5);
  const stopProfile = profile ? await profile.start() : null;
  const start = performance.now();
  const run = await finaliseRun(deps, { id: 1, email: "bench@kestrelbay.example", name: "Bench", roles: ["manager"], groupId: null, leadOf: [], organisation: null }, opts.period);
  const runMs = performance.now() - start;
  if (stopProfile) profile!.write("run", await stopProfile());
  sample();
  const runPeakRss = peakRss;
  const stopMailProfile = profile ? await profile.start() : null;
  const mailStart = performance.now();
  await mailDueStatements(ds, now, { runId: run.id, limit: 10_000 });
  const mailMs = performance.now() - mailStart;
  if (stopMailProfile) profile!.write("mail", await stopMailProfile());
  clearInterval(timer);
  sample();

  const [{ n: lines }] = await ds.query(`SELECT COUNT(*) AS n FROM charge_lines WHERE runId = ?`, [run.id]);
  const [{ n: statements }] = await ds.query(`SELECT COUNT(*) AS n FROM statements WHERE runId = ?`, [run.id]);
  const mb = (b: number) => Math.round((b / 1024 / 1024) * 10) / 10;
  const goal = { ms: 5000, mb: 300 };
  return {
    name: `recharge: billing run over ${opts.bookings.toLocaleString("en")} bookings and ${opts.usages.toLocaleString("en")} usages`,
    bookings: opts.bookings,
    usages: opts.usages,
    statements: Number(statements),
    lines: Number(lines),
    totalCents: run.totalCents,
    seedMs: Math.round(seedMs),
    runMs: Math.round(runMs),
    mailMs: Math.round(mailMs),
    peakRssMb: mb(runPeakRss),
    peakRssWithMailMb: mb(peakRss),
    peakHeapMb: mb(peakHeap),
    goal,
    met: runMs < goal.ms && mb(runPeakRss) < goal.mb,
  };
}

/** The billing figures alone, as bench/run.ts measures them at one scale. */
async function main(): Promise<void> {
  const { openDatabase } = await import("../server/db/data-source");
  const scale = Number(process.env.BENCH_SCALE ?? 1);
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "phasebook-bench-recharge-"));
  const ds = await openDatabase(path.join(dir, "bench.sqlite"));
  try {
    const profile = process.env.BENCH_PROFILE ? { start: startProfiler, write: (part: string, p: object) => writeProfile(process.env.BENCH_PROFILE!, `recharge-${part}-${scale}x`, p) } : undefined;
    console.log(JSON.stringify(await benchRechargeRun(ds, { bookings: 10_000 * scale, usages: 50_000 * scale, accounts: 60 * scale, profile }), null, 2));
  } finally {
    await ds.destroy();
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) await main();

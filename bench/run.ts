/**
 * `npm run bench`: Phasebook's speed goals (Schedule, Stockroom, Recharge) in one run, against a
 * bare Express route on the same machine.
 *
 * The parent process forks a server process that builds a temporary database (five years of
 * bookings over 20 instruments, and the Stockroom's 20,000 containers from bench/stockroom.ts),
 * starts the real app and a bare Express route on loopback ports, and reports them over IPC.
 * The parent drives each HTTP scenario with autocannon, so the load generator does not share an
 * event loop with the servers: a bounded time at 50 connections (throughput, as a ratio to the
 * bare route) and at 10 connections (p99 latency). Then, with the server gone, a second child
 * times the Recharge billing run (bench/recharge.ts) in a fresh database of its own, so its
 * peak memory is the run's and not the server's. One table lists every figure, its goal and
 * whether it was met.
 *
 * BENCH_SECONDS (default 5) sets the time per load run; BENCH_ONLY=word,word runs only the
 * scenarios whose names contain one of the words (the bare route always runs); BENCH_PROFILE=dir
 * writes a V8 CPU profile of the
 * server process (its requests, not its seeding) there.
 */
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { fork, type ChildProcess } from "node:child_process";
import { fileURLToPath } from "node:url";
import type { AddressInfo } from "node:net";
import autocannon from "autocannon";
import type { BenchScenario } from "./stockroom";
import type { RechargeBenchResult } from "./recharge";

const SECONDS = Number(process.env.BENCH_SECONDS ?? 5);
const ONLY = (process.env.BENCH_ONLY ?? "").split(",").map((w) => w.trim().toLowerCase()).filter(Boolean);
const INSTRUMENTS = 20;
const YEARS = 5;
const DAY_MS = 86_400_000;

interface Ports {
  app: string;
  bare: string;
  /** A week inside the seeded history, and an instrument to read. */
  week: { from: string; to: string; instrumentId: number };
  bookings: number;
  instrumentIds: number[];
  accountId: number;
  stockroom: { signIn: { email: string; password: string }; containerCount: number; scenarios: BenchScenario[] };
}

interface Session {
  cookie: string;
  csrf: string;
}

interface ScenarioContext {
  ports: Ports;
  /** The Schedule's bench member. */
  session: Session;
  /** The Stockroom's bench member. */
  stockSession: Session;
}

interface Goal {
  /** Requests/s at 50 connections at least this share of the bare route's. */
  ratio?: number;
  /** p99 latency at 10 connections below this many ms. */
  p99Ms?: number;
}

interface Scenario {
  area: "—" | "Schedule" | "Stockroom";
  name: string;
  target: "app" | "bare";
  /** Goals from the issues, for the table. */
  goal?: Goal;
  requests(ctx: ScenarioContext): autocannon.Request[];
}

/** Across runs, so the second run does not ask for the first run's slots. */
let createCount = 0;

/** Each create takes the next free hour on one of the instruments, far from the seeded history. */
function createRequests(ctx: ScenarioContext): autocannon.Request[] {
  const base = Date.UTC(2031, 0, 6, 0, 0, 0);
  return [
    {
      method: "POST",
      path: "/api/bookings",
      headers: { "content-type": "application/json", cookie: ctx.session.cookie, "x-csrf-token": ctx.session.csrf },
      setupRequest: (req) => {
        const k = createCount++;
        const instrumentId = ctx.ports.instrumentIds[k % ctx.ports.instrumentIds.length];
        // Two hours apart and one hour long: the 30-minute cleaning buffer of the cells always fits.
        const start = base + Math.floor(k / ctx.ports.instrumentIds.length) * 2 * 3_600_000;
        return {
          ...req,
          body: JSON.stringify({
            instrumentIds: [instrumentId],
            start: new Date(start).toISOString(),
            end: new Date(start + 60 * 60_000).toISOString(),
            accountId: ctx.ports.accountId,
            purpose: "bench",
          }),
        };
      },
    },
  ];
}

const SCHEDULE_SCENARIOS: Scenario[] = [
  { area: "—", name: "bare Express route", target: "bare", requests: () => [{ method: "GET", path: "/bare" }] },
  {
    // The cost of the signed-in stack alone (session, CSRF, user lookup), to read the others against.
    area: "—",
    name: "signed-in baseline (GET /api/auth/me)",
    target: "app",
    requests: ({ session }) => [{ method: "GET", path: "/api/auth/me", headers: { cookie: session.cookie } }],
  },
  {
    area: "Schedule",
    name: "week of one instrument's bookings (member)",
    target: "app",
    goal: { ratio: 0.5, p99Ms: 15 },
    requests: ({ ports, session }) => [
      {
        method: "GET",
        path: `/api/bookings?instrumentId=${ports.week.instrumentId}&from=${encodeURIComponent(ports.week.from)}&to=${encodeURIComponent(ports.week.to)}`,
        headers: { cookie: session.cookie },
      },
    ],
  },
  { area: "Schedule", name: "create a booking (member)", target: "app", goal: { ratio: 0.2, p99Ms: 25 }, requests: createRequests },
];

/**
 * bench/stockroom.ts describes its routes one connection count at a time; the same method and
 * path at 50 and at 10 connections become one scenario carrying both goals.
 */
function stockroomScenarios(list: BenchScenario[]): Scenario[] {
  const merged = new Map<string, { name: string; s: BenchScenario; goal: Goal }>();
  for (const s of list) {
    const key = `${s.method} ${s.path}`;
    const entry = merged.get(key) ?? { name: s.name.replace(/\s*×\d+$/, ""), s, goal: {} };
    if (s.goal.ratioToBare !== undefined) entry.goal.ratio = s.goal.ratioToBare;
    if (s.goal.p99MsBelow !== undefined) entry.goal.p99Ms = s.goal.p99MsBelow;
    merged.set(key, entry);
  }
  return [...merged.values()].map(({ name, s, goal }) => ({
    area: "Stockroom" as const,
    name,
    target: "app" as const,
    goal,
    requests: ({ stockSession }: ScenarioContext) => [
      {
        method: s.method,
        path: s.path,
        headers: {
          cookie: stockSession.cookie,
          ...(s.method === "GET" ? {} : { "x-csrf-token": stockSession.csrf, "content-type": "application/json" }),
        },
        ...(s.body === undefined ? {} : { body: JSON.stringify(s.body) }),
      },
    ],
  }));
}

// --- server process ----------------------------------------------------------------------------

async function seedBench(dir: string) {
  const { openDatabase } = await import("../server/db/data-source");
  const { hashPassword } = await import("../server/modules/people");
  const { newToken } = await import("../server/core/tokens");
  const ds = await openDatabase(path.join(dir, "bench.sqlite"));
  const db = (ds.driver as unknown as { databaseConnection: import("better-sqlite3").Database }).databaseConnection;
  const now = new Date().toISOString();
  const hash = await hashPassword("bench-password-1", 10);
  const allHours = JSON.stringify(Object.fromEntries(["mon", "tue", "wed", "thu", "fri", "sat", "sun"].map((d) => [d, [{ from: "00:00", to: "24:00" }]])));
  const ids: number[] = [];
  let bookings = 0;
  db.transaction(() => {
    const user = db
      .prepare(`INSERT INTO users (email, name, passwordHash, active, calendarToken, createdAt, updatedAt) VALUES (?, ?, ?, 1, ?, ?, ?)`)
      .run("bench@kestrelbay.example", "Bench Member", hash, newToken(24), now, now);
    const userId = Number(user.lastInsertRowid);
    db.prepare(`INSERT INTO user_roles (userId, role) VALUES (?, 'member')`).run(userId);
    const other = db
      .prepare(`INSERT INTO users (email, name, passwordHash, active, calendarToken, createdAt, updatedAt) VALUES (?, ?, ?, 1, ?, ?, ?)`)
      .run("other@kestrelbay.example", "Other Member", hash, newToken(24), now, now);
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
    for (let i = 0; i < INSTRUMENTS; i++) {
      const r = inst.run(`Bench instrument ${i + 1}`, i % 2 ? "interface_cell" : "potentiostat", i % 2 ? 30 : 0, allHours, newToken(24), now);
      ids.push(Number(r.lastInsertRowid));
      train.run(userId, ids[i], now);
    }
    const book = db.prepare(
      `INSERT INTO bookings (userId, accountId, purpose, status, startsAt, endsAt, startMs, endMs, lateCancel, createdAt, updatedAt)
       VALUES (?, ?, '', 'completed', ?, ?, ?, ?, 0, ?, ?)`,
    );
    const link = db.prepare(`INSERT INTO booking_instruments (bookingId, instrumentId) VALUES (?, ?)`);
    // Five years up to today; on each instrument two 3-hour sessions a day on most days.
    const end = Date.UTC(new Date().getUTCFullYear(), new Date().getUTCMonth(), new Date().getUTCDate());
    const start = end - YEARS * 365 * DAY_MS;
    for (let day = start; day < end; day += DAY_MS) {
      for (let i = 0; i < INSTRUMENTS; i++) {
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
  return { ds, ids, bookings, accountId, weekStart };
}

async function serve(): Promise<void> {
  const express = (await import("express")).default;
  const { createApp } = await import("../server/app");
  const { loadConfig } = await import("../server/config");
  const { systemClock } = await import("../server/clock");
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "phasebook-bench-"));
  const seeded = await seedBench(dir);
  const { seedStockroomBench } = await import("./stockroom");
  const stock = await seedStockroomBench(seeded.ds);
  const config = loadConfig({ DATABASE_PATH: path.join(dir, "bench.sqlite"), NODE_ENV: "production", PUBLIC_URL: "http://127.0.0.1", LOG_LEVEL: "silent" });
  const { app } = createApp({
    ds: seeded.ds,
    config,
    clock: systemClock,
    mailer: { async send() {}, close() {} },
    quiet: true,
    staticDir: null,
    rateLimits: { login: { windowMs: 60_000, limit: 1000 } },
    // The bench's people are hashed at 10 (seeding speed); the app compares at the same cost.
    bcryptCost: 10,
  });
  const bare = express();
  bare.get("/bare", (_req, res) => {
    res.json({ items: [], total: 0 });
  });
  const listen = (a: ReturnType<typeof express>) =>
    new Promise<string>((resolve) => {
      const s = a.listen(0, "127.0.0.1", () => resolve(`http://127.0.0.1:${(s.address() as AddressInfo).port}`));
    });
  const ports: Ports = {
    app: await listen(app),
    bare: await listen(bare),
    week: { from: new Date(seeded.weekStart).toISOString(), to: new Date(seeded.weekStart + 7 * DAY_MS).toISOString(), instrumentId: seeded.ids[0] },
    bookings: seeded.bookings,
    instrumentIds: seeded.ids,
    accountId: seeded.accountId,
    stockroom: { signIn: stock.signIn, containerCount: stock.containerCount, scenarios: stock.scenarios },
  };
  // Profiling starts after the seeding, so the profile shows the requests only.
  const profiler = process.env.BENCH_PROFILE ? await startProfiler() : null;
  process.send!({ ports, dir });
  process.on("disconnect", () => {
    void (async () => {
      if (profiler) {
        const out = path.resolve(process.env.BENCH_PROFILE!, `server-${Date.now()}.cpuprofile`);
        fs.mkdirSync(path.dirname(out), { recursive: true });
        fs.writeFileSync(out, JSON.stringify(await profiler()));
      }
      fs.rmSync(dir, { recursive: true, force: true });
      process.exit(0);
    })();
  });
}

/** Starts V8's CPU profiler in this process; the returned function stops it and gives the profile. */
async function startProfiler(): Promise<() => Promise<object>> {
  const { Session } = await import("node:inspector/promises");
  const session = new Session();
  session.connect();
  await session.post("Profiler.enable");
  await session.post("Profiler.start");
  return async () => (await session.post("Profiler.stop")).profile;
}

/** The Recharge billing run, alone in this process and its own database. */
async function recharge(): Promise<void> {
  const { openDatabase } = await import("../server/db/data-source");
  const { benchRechargeRun } = await import("./recharge");
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "phasebook-bench-recharge-"));
  const ds = await openDatabase(path.join(dir, "bench.sqlite"));
  try {
    const result = await benchRechargeRun(ds);
    process.send!({ result });
  } catch (e) {
    process.send!({ error: String((e as Error).stack ?? e) });
  } finally {
    await ds.destroy();
    fs.rmSync(dir, { recursive: true, force: true });
  }
  process.disconnect();
}

// --- load generator ----------------------------------------------------------------------------

async function signIn(base: string, who: { email: string; password: string }): Promise<Session> {
  const cookies = new Map<string, string>();
  const keep = (res: Response) => {
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(";");
      const i = pair.indexOf("=");
      cookies.set(pair.slice(0, i), pair.slice(i + 1));
    }
  };
  const header = () => [...cookies].map(([k, v]) => `${k}=${v}`).join("; ");
  let r = await fetch(`${base}/api/auth/csrf`);
  keep(r);
  let csrf = ((await r.json()) as { token: string }).token;
  r = await fetch(`${base}/api/auth/login`, {
    method: "POST",
    headers: { "content-type": "application/json", "x-csrf-token": csrf, cookie: header() },
    body: JSON.stringify(who),
  });
  if (r.status !== 200) throw new Error(`bench sign-in failed: ${r.status} ${await r.text()}`);
  keep(r);
  r = await fetch(`${base}/api/auth/csrf`, { headers: { cookie: header() } });
  keep(r);
  csrf = ((await r.json()) as { token: string }).token;
  return { cookie: header(), csrf };
}

async function load(url: string, connections: number, requests: autocannon.Request[]) {
  const result = await autocannon({ url, connections, duration: SECONDS, requests, pipelining: 1 });
  // A run in which no request completed has no latency to report: count it as failed.
  return { rps: result.requests.average, p99: result.latency.p99, bad: result.non2xx + result.errors + (result.requests.total === 0 ? 1 : 0) };
}

function child(role: string, execArgv: string[] = []): ChildProcess {
  return fork(fileURLToPath(import.meta.url), [], { env: { ...process.env, BENCH_ROLE: role }, execArgv: ["--import", "tsx", ...execArgv] });
}

function firstMessage<T>(c: ChildProcess): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    c.once("message", (m) => resolve(m as T));
    c.once("exit", (code) => reject(new Error(`bench child exited with ${code}`)));
  });
}

interface Row {
  area: string;
  scenario: string;
  figure: string;
  measured: string;
  goal: string;
  met: "met" | "not met" | "";
}

const fmt = (n: number) => Math.round(n).toLocaleString("en");

function printTable(rows: Row[]): void {
  const head: (keyof Row)[] = ["area", "scenario", "figure", "measured", "goal", "met"];
  const width = head.map((h) => Math.max(h.length, ...rows.map((r) => r[h].length)));
  const line = (cells: string[]) => `| ${cells.map((c, i) => c.padEnd(width[i])).join(" | ")} |`;
  console.log(line(head));
  console.log(`| ${width.map((w) => "-".repeat(w)).join(" | ")} |`);
  for (const r of rows) console.log(line(head.map((h) => r[h])));
}

async function main(): Promise<void> {
  const server = child("server");
  const { ports } = await firstMessage<{ ports: Ports; dir: string }>(server);
  console.log(
    `Phasebook bench, ${new Date().toISOString().slice(0, 10)}, ${os.cpus().length} cores, load average ${os.loadavg().map((l) => l.toFixed(2)).join(" ")}.\n` +
      `Seeded ${fmt(ports.bookings)} bookings over ${INSTRUMENTS} instruments (${YEARS} years) and ${fmt(ports.stockroom.containerCount)} containers; ` +
      `${SECONDS} s per load run at 50 and at 10 connections, loopback only.\n`,
  );
  const ctx: ScenarioContext = {
    ports,
    session: await signIn(ports.app, { email: "bench@kestrelbay.example", password: "bench-password-1" }),
    stockSession: await signIn(ports.app, ports.stockroom.signIn),
  };

  const scenarios = [...SCHEDULE_SCENARIOS, ...stockroomScenarios(ports.stockroom.scenarios)].filter(
    (s) => s.target === "bare" || ONLY.length === 0 || ONLY.some((w) => s.name.toLowerCase().includes(w)),
  );
  const rows: Row[] = [];
  let bareRps = 0;
  for (const s of scenarios) {
    const url = s.target === "app" ? ports.app : ports.bare;
    const at50 = await load(url, 50, s.requests(ctx));
    const at10 = await load(url, 10, s.requests(ctx));
    if (s.target === "bare") bareRps = at50.rps;
    const ratio = at50.rps / bareRps;
    // A run with failed requests measured something else than the route; it never meets a goal.
    const clean = at50.bad + at10.bad === 0;
    const failed = clean ? "" : ` (${fmt(at50.bad + at10.bad)} failed)`;
    const verdict = (ok: boolean | undefined): Row["met"] => (ok === undefined ? "" : ok && clean ? "met" : "not met");
    rows.push({
      area: s.area,
      scenario: s.name,
      figure: "req/s @50",
      measured: `${fmt(at50.rps)} = ${ratio.toFixed(2)} × bare${failed}`,
      goal: s.goal?.ratio === undefined ? "" : `≥ ${s.goal.ratio} × bare`,
      met: verdict(s.goal?.ratio === undefined ? undefined : ratio >= s.goal.ratio),
    });
    rows.push({
      area: s.area,
      scenario: s.name,
      figure: "p99 @10",
      measured: `${at10.p99} ms${failed}`,
      goal: s.goal?.p99Ms === undefined ? "" : `< ${s.goal.p99Ms} ms`,
      met: verdict(s.goal?.p99Ms === undefined ? undefined : at10.p99 < s.goal.p99Ms),
    });
  }
  server.disconnect();
  await new Promise((resolve) => server.once("exit", resolve));

  if (ONLY.length === 0 || ONLY.some((w) => "recharge billing run".includes(w))) {
    const r = child("recharge", ["--expose-gc"]);
    const got = await firstMessage<{ result?: RechargeBenchResult; error?: string }>(r);
    await new Promise((resolve) => r.once("exit", resolve));
    if (got.error || !got.result) throw new Error(`recharge bench failed: ${got.error}`);
    const res = got.result;
    const name = `billing run, one month: ${fmt(res.bookings)} bookings, ${fmt(res.usages)} usages → ${res.statements} statements, ${fmt(res.lines)} lines`;
    rows.push({ area: "Recharge", scenario: name, figure: "time", measured: `${(res.runMs / 1000).toFixed(2)} s`, goal: `< ${res.goal.ms / 1000} s`, met: res.runMs < res.goal.ms ? "met" : "not met" });
    rows.push({
      area: "Recharge",
      scenario: name,
      figure: "peak RSS",
      measured: `${res.peakRssMb} MB (heap ${res.peakHeapMb} MB)`,
      goal: `< ${res.goal.mb} MB`,
      met: res.peakRssMb < res.goal.mb ? "met" : "not met",
    });
    rows.push({
      area: "Recharge",
      scenario: "mailing the run's statement PDFs (after the run)",
      figure: "time, peak RSS",
      measured: `${(res.mailMs / 1000).toFixed(2)} s, ${res.peakRssWithMailMb} MB`,
      goal: "",
      met: "",
    });
  }

  console.log("");
  printTable(rows);
  console.log(`\nLoad average at the end: ${os.loadavg().map((l) => l.toFixed(2)).join(" ")}.`);
}

if (process.env.BENCH_ROLE === "server") await serve();
else if (process.env.BENCH_ROLE === "recharge") await recharge();
else await main();

/**
 * `npm run bench`: Phasebook's speed against a bare Express route on the same machine.
 *
 * The parent process forks a server process that builds a temporary database (five years of
 * bookings over 20 instruments), starts the real app and a bare Express route on loopback
 * ports, and reports them over IPC. The parent then drives each scenario with autocannon, so
 * the load generator does not share an event loop with the servers. Each scenario runs a
 * bounded time at 50 connections (throughput, as a ratio to the bare route) and at 10
 * connections (p99 latency), and a table is printed.
 *
 * Other areas add their scenarios to SCENARIOS (and any data they need to seedBench).
 */
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { fork } from "node:child_process";
import { fileURLToPath } from "node:url";
import type { AddressInfo } from "node:net";
import autocannon from "autocannon";

const SECONDS = Number(process.env.BENCH_SECONDS ?? 5);
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
}

interface Session {
  cookie: string;
  csrf: string;
}

interface ScenarioContext {
  ports: Ports;
  session: Session;
}

interface Scenario {
  name: string;
  target: "app" | "bare";
  /** Goals from the issue, for the table. */
  goal?: { ratio?: number; p99Ms?: number };
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

export const SCENARIOS: Scenario[] = [
  { name: "bare Express route", target: "bare", requests: () => [{ method: "GET", path: "/bare" }] },
  {
    // The cost of the signed-in stack alone (session, CSRF, user lookup), to read the others against.
    name: "signed-in baseline (GET /api/auth/me)",
    target: "app",
    requests: ({ session }) => [{ method: "GET", path: "/api/auth/me", headers: { cookie: session.cookie } }],
  },
  {
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
  { name: "create a booking (member)", target: "app", goal: { ratio: 0.2, p99Ms: 25 }, requests: createRequests },
];

// --- server process ----------------------------------------------------------------------------

async function seedBench(dir: string) {
  const { openDatabase } = await import("../server/db/data-source");
  const { hashPassword, newToken } = await import("../server/services/user.service");
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
  const config = loadConfig({ DATABASE_PATH: path.join(dir, "bench.sqlite"), NODE_ENV: "production", PUBLIC_URL: "http://127.0.0.1", LOG_LEVEL: "silent" });
  const { app } = createApp({
    ds: seeded.ds,
    config,
    clock: systemClock,
    mailer: { async send() {}, close() {} },
    quiet: true,
    staticDir: null,
    loginRateLimit: { windowMs: 60_000, limit: 1000 },
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
  };
  process.send!({ ports, dir });
  process.on("disconnect", () => {
    fs.rmSync(dir, { recursive: true, force: true });
    process.exit(0);
  });
}

// --- load generator ----------------------------------------------------------------------------

async function signIn(base: string): Promise<Session> {
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
    body: JSON.stringify({ email: "bench@kestrelbay.example", password: "bench-password-1" }),
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
  return { rps: result.requests.average, p99: result.latency.p99, non2xx: result.non2xx, errors: result.errors };
}

async function main(): Promise<void> {
  const child = fork(fileURLToPath(import.meta.url), [], { env: { ...process.env, BENCH_ROLE: "server" }, execArgv: ["--import", "tsx"] });
  const { ports } = await new Promise<{ ports: Ports; dir: string }>((resolve, reject) => {
    child.once("message", (m) => resolve(m as { ports: Ports; dir: string }));
    child.once("exit", (code) => reject(new Error(`bench server exited with ${code}`)));
  });
  console.log(`Seeded ${ports.bookings.toLocaleString("en")} bookings over ${INSTRUMENTS} instruments (${YEARS} years); ${SECONDS} s per run, loopback only.\n`);
  const session = await signIn(ports.app);
  const ctx: ScenarioContext = { ports, session };

  const rows: { name: string; rps50: number; p99at10: number; non2xx: number; ratio: number | null; goal?: Scenario["goal"] }[] = [];
  let bareRps = 0;
  for (const s of SCENARIOS) {
    const url = s.target === "app" ? ports.app : ports.bare;
    const at50 = await load(url, 50, s.requests(ctx));
    const at10 = await load(url, 10, s.requests(ctx));
    if (s.target === "bare") bareRps = at50.rps;
    rows.push({ name: s.name, rps50: at50.rps, p99at10: at10.p99, non2xx: at50.non2xx + at10.non2xx + at50.errors + at10.errors, ratio: s.target === "bare" ? null : at50.rps / bareRps, goal: s.goal });
  }

  const table = rows.map((r) => ({
    scenario: r.name,
    "req/s @50": Math.round(r.rps50),
    "ratio to bare @50": r.ratio === null ? "1.00" : r.ratio.toFixed(2),
    "p99 ms @10": r.p99at10,
    "non-2xx/errors": r.non2xx,
    goal: r.goal ? `ratio ≥ ${r.goal.ratio}, p99 < ${r.goal.p99Ms} ms` : "",
    met: r.goal ? ((r.ratio ?? 1) >= (r.goal.ratio ?? 0) && r.p99at10 < (r.goal.p99Ms ?? Infinity) ? "yes" : "no") : "",
  }));
  console.table(table);
  child.disconnect();
}

if (process.env.BENCH_ROLE === "server") await serve();
else await main();

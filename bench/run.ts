/**
 * `npm run bench`: Phasebook's speed goals (Schedule, Stockroom, Recharge) in one run, against a
 * bare Express route and the signed-in baseline (GET /api/auth/me) on the same machine.
 *
 * The parent process forks a server process that builds a temporary database (five years of
 * bookings over 20 instruments, bench/schedule.ts; the Stockroom's 20,000 containers,
 * bench/stockroom.ts), starts the real app and a bare Express route on loopback ports, and
 * reports them over IPC. The parent drives each HTTP scenario with autocannon, so the load
 * generator does not share an event loop with the servers: a bounded time at 50 connections
 * (throughput, as a ratio to the signed-in baseline) and at 10 connections (p99 latency). Then,
 * with the server gone, a second child times the Recharge billing run (bench/recharge.ts) in a
 * fresh database of its own, so its peak memory is the run's and not the server's.
 *
 * BENCH_SCALE=10 runs everything twice, at 1× and with ten times the data (200 instruments,
 * 200,001 containers, a month of 100,000 bookings and 500,000 usages over 600 accounts), and prints
 * each figure beside its 1× value with the growth factor (bench/report.ts).
 *
 * BENCH_SECONDS (default 5) sets the time per load run; BENCH_ONLY=word,word runs only the
 * scenarios whose names contain one of the words (the bare route and the baseline always run);
 * BENCH_PROFILE=dir writes V8 CPU profiles there: the server's requests, the billing run and the mailing of its statements.
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
import { benchSignIn, startProfiler, writeProfile, type BenchSession } from "./support";
import { createRequests, INSTRUMENTS, weekRequests, YEARS, type ScheduleSeed } from "./schedule";
import { fmt, printScaled, printSingle, type Figure } from "./report";

const SECONDS = Number(process.env.BENCH_SECONDS ?? 5);
const ONLY = (process.env.BENCH_ONLY ?? "").split(",").map((w) => w.trim().toLowerCase()).filter(Boolean);
const SCALE = Number(process.env.BENCH_SCALE ?? 1);

interface Ports {
  app: string;
  bare: string;
  schedule: ScheduleSeed;
  stockroom: { signIn: { email: string; password: string }; containerCount: number; scenarios: BenchScenario[] };
}

type Session = BenchSession;

interface Scenario {
  id: string;
  area: "—" | "Schedule" | "Stockroom";
  name: string;
  target: "app" | "bare";
  /** Requests/s at 50 connections at least this share of the signed-in baseline's; p99 at 10 below this. */
  goal?: { ratio?: number; p99Ms?: number };
  requests(ctx: { ports: Ports; session: Session; stockSession: Session }): autocannon.Request[];
}

const SCENARIOS: Scenario[] = [
  { id: "bare", area: "—", name: "bare Express route", target: "bare", requests: () => [{ method: "GET", path: "/bare" }] },
  {
    // The cost of the signed-in stack alone (session, CSRF, user lookup): the throughput goals are shares of it.
    id: "baseline",
    area: "—",
    name: "signed-in baseline (GET /api/auth/me)",
    target: "app",
    requests: ({ session }) => [{ method: "GET", path: "/api/auth/me", headers: { cookie: session.cookie } }],
  },
  {
    id: "week",
    area: "Schedule",
    name: "week of one instrument's bookings (member)",
    target: "app",
    goal: { ratio: 0.6, p99Ms: 15 },
    requests: ({ ports, session }) => weekRequests({ seed: ports.schedule, session }),
  },
  {
    id: "create",
    area: "Schedule",
    name: "create a booking (member)",
    target: "app",
    goal: { ratio: 0.25, p99Ms: 25 },
    requests: ({ ports, session }) => createRequests({ seed: ports.schedule, session }),
  },
];

/** bench/stockroom.ts describes its routes one connection count at a time; the same route at 50 and 10 becomes one scenario. */
function stockroomScenarios(list: BenchScenario[]): Scenario[] {
  const merged = new Map<string, Scenario>();
  for (const s of list) {
    const key = `${s.method} ${s.path}`;
    const entry: Scenario = merged.get(key) ?? {
      id: s.method === "GET" ? "search" : "usage",
      area: "Stockroom",
      name: s.name.replace(/\s*×\d+$/, ""),
      target: "app",
      goal: {},
      requests: ({ stockSession }) => [
        {
          method: s.method,
          path: s.path,
          headers: { cookie: stockSession.cookie, ...(s.method === "GET" ? {} : { "x-csrf-token": stockSession.csrf, "content-type": "application/json" }) },
          ...(s.body === undefined ? {} : { body: JSON.stringify(s.body) }),
        },
      ],
    };
    if (s.goal.ratioToSignedIn !== undefined) entry.goal!.ratio = s.goal.ratioToSignedIn;
    if (s.goal.p99MsBelow !== undefined) entry.goal!.p99Ms = s.goal.p99MsBelow;
    merged.set(key, entry);
  }
  return [...merged.values()];
}

// --- server process ----------------------------------------------------------------------------

async function serve(scale: number): Promise<void> {
  const express = (await import("express")).default;
  const { openDatabase } = await import("../server/db/data-source");
  const { hashPassword } = await import("../server/modules/people");
  const { newToken } = await import("../server/core/tokens");
  const { createApp } = await import("../server/app");
  const { loadConfig } = await import("../server/config");
  const { systemClock } = await import("../server/clock");
  const { seedScheduleBench } = await import("./schedule");
  const { seedStockroomBench, BENCH_CONTAINERS } = await import("./stockroom");
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "phasebook-bench-"));
  const ds = await openDatabase(path.join(dir, "bench.sqlite"));
  const schedule = await seedScheduleBench(ds, INSTRUMENTS * scale, await hashPassword("bench-password-1", 10), () => newToken(24));
  const stock = await seedStockroomBench(ds, { count: BENCH_CONTAINERS * scale });
  // As server/main.ts runs it: WAL checkpoints in their own thread.
  const { startCheckpointer } = await import("../server/db/checkpointer");
  await startCheckpointer(ds);
  const config = loadConfig({ DATABASE_PATH: path.join(dir, "bench.sqlite"), NODE_ENV: "production", PUBLIC_URL: "http://127.0.0.1", LOG_LEVEL: "silent" });
  const { app } = createApp({
    ds,
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
    schedule,
    stockroom: { signIn: stock.signIn, containerCount: stock.containerCount, scenarios: stock.scenarios },
  };
  // Profiling starts after the seeding, so the profile shows the requests only.
  const profiler = process.env.BENCH_PROFILE ? await startProfiler() : null;
  process.send!({ ports });
  process.on("disconnect", () => {
    void (async () => {
      if (profiler) writeProfile(process.env.BENCH_PROFILE!, `server-${scale}x`, await profiler());
      fs.rmSync(dir, { recursive: true, force: true });
      process.exit(0);
    })();
  });
}

/** The Recharge billing run, alone in this process and its own database. */
async function recharge(scale: number): Promise<void> {
  const { openDatabase } = await import("../server/db/data-source");
  const { benchRechargeRun } = await import("./recharge");
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "phasebook-bench-recharge-"));
  const ds = await openDatabase(path.join(dir, "bench.sqlite"));
  try {
    const profile = process.env.BENCH_PROFILE ? { start: startProfiler, write: (part: string, p: object) => writeProfile(process.env.BENCH_PROFILE!, `recharge-${part}-${scale}x`, p) } : undefined;
    const result = await benchRechargeRun(ds, { bookings: 10_000 * scale, usages: 50_000 * scale, accounts: 60 * scale, profile });
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

async function load(url: string, connections: number, requests: autocannon.Request[]) {
  const result = await autocannon({ url, connections, duration: SECONDS, requests, pipelining: 1 });
  // A run in which no request completed has no latency to report: count it as failed.
  return { rps: result.requests.average, p99: result.latency.p99, bad: result.non2xx + result.errors + (result.requests.total === 0 ? 1 : 0) };
}

function child(role: string, scale: number, execArgv: string[] = []): ChildProcess {
  return fork(fileURLToPath(import.meta.url), [], { env: { ...process.env, BENCH_ROLE: role, BENCH_RUN_SCALE: String(scale) }, execArgv: ["--import", "tsx", ...execArgv] });
}

function firstMessage<T>(c: ChildProcess): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    c.once("message", (m) => resolve(m as T));
    c.once("exit", (code) => reject(new Error(`bench child exited with ${code}`)));
  });
}

const wanted = (name: string) => ONLY.length === 0 || ONLY.some((w) => name.toLowerCase().includes(w));

/** Every figure at one scale. */
async function runAt(scale: number): Promise<Figure[]> {
  const server = child("server", scale);
  const { ports } = await firstMessage<{ ports: Ports }>(server);
  console.log(
    `${scale}×: ${fmt(ports.schedule.bookings)} bookings over ${fmt(ports.schedule.ids.length)} instruments (${YEARS} years) and ${fmt(ports.stockroom.containerCount)} containers; ` +
      `${SECONDS} s per load run at 50 and at 10 connections, loopback only; load average ${os.loadavg().map((l) => l.toFixed(2)).join(" ")}.`,
  );
  const ctx = {
    ports,
    session: await benchSignIn(ports.app, "bench@kestrelbay.example", "bench-password-1"),
    stockSession: await benchSignIn(ports.app, ports.stockroom.signIn.email, ports.stockroom.signIn.password),
  };
  const figures: Figure[] = [];
  const rps: Record<string, number> = {};
  for (const s of [...SCENARIOS, ...stockroomScenarios(ports.stockroom.scenarios)].filter((s) => s.area === "—" || wanted(s.name))) {
    const url = s.target === "app" ? ports.app : ports.bare;
    const at50 = await load(url, 50, s.requests(ctx));
    const at10 = await load(url, 10, s.requests(ctx));
    rps[s.id] = at50.rps;
    // A run with failed requests measured something else than the route; it never meets a goal.
    const clean = at50.bad + at10.bad === 0;
    const failed = clean ? "" : ` (${fmt(at50.bad + at10.bad)} failed)`;
    const reference = s.area === "—";
    const ratio = s.id === "bare" ? 1 : at50.rps / (s.id === "baseline" ? rps.bare : rps.baseline);
    const of = s.id === "baseline" ? "bare" : "signed-in";
    figures.push({
      key: `${s.id}.rps`,
      area: s.area,
      scenario: s.name,
      figure: "req/s @50",
      value: reference ? at50.rps : ratio,
      text: `${fmt(at50.rps)}${s.id === "bare" ? "" : ` = ${ratio.toFixed(2)} × ${of}`}${failed}`,
      better: "higher",
      goal: s.goal?.ratio === undefined ? undefined : { text: `≥ ${s.goal.ratio} × signed-in`, ok: clean && ratio >= s.goal.ratio },
      holds: !reference,
    });
    figures.push({
      key: `${s.id}.p99`,
      area: s.area,
      scenario: s.name,
      figure: "p99 @10",
      value: at10.p99,
      text: `${at10.p99} ms${failed}`,
      better: "lower",
      goal: s.goal?.p99Ms === undefined ? undefined : { text: `< ${s.goal.p99Ms} ms`, ok: clean && at10.p99 < s.goal.p99Ms },
      holds: !reference,
    });
  }
  server.disconnect();
  await new Promise((resolve) => server.once("exit", resolve));
  if (wanted("recharge billing run")) figures.push(...(await rechargeFigures(scale)));
  return figures;
}

async function rechargeFigures(scale: number): Promise<Figure[]> {
  const r = child("recharge", scale, ["--expose-gc"]);
  const got = await firstMessage<{ result?: RechargeBenchResult; error?: string }>(r);
  await new Promise((resolve) => r.once("exit", resolve));
  if (got.error || !got.result) throw new Error(`recharge bench failed: ${got.error}`);
  const res = got.result;
  // Named by the 1× month, so the scale mode's rows read right beside both columns.
  const name = `billing run, one month (at 1×: ${fmt(res.bookings / scale)} bookings, ${fmt(res.usages / scale)} usages → ${fmt(res.statements / scale)} statements)`;
  const runGoalMs = scale === 1 ? 5_000 : 10_000;
  const perRow = (res.runMs * 1000) / (res.bookings + res.usages);
  const mail = `mailing the run's statement PDFs after the run (${fmt(res.statements / scale)} at 1×)`;
  return [
    { key: "billing.time", area: "Recharge", scenario: name, figure: "time", value: res.runMs, text: `${(res.runMs / 1000).toFixed(2)} s`, better: "lower", goal: { text: `< ${runGoalMs / 1000} s`, ok: res.runMs < runGoalMs }, holds: false },
    { key: "billing.perRow", area: "Recharge", scenario: name, figure: "time per booking or usage", value: perRow, text: `${perRow.toFixed(1)} µs`, better: "lower", holds: true },
    { key: "billing.rss", area: "Recharge", scenario: name, figure: "peak RSS", value: res.peakRssMb, text: `${res.peakRssMb} MB (heap ${res.peakHeapMb} MB)`, better: "lower", goal: { text: "< 300 MB", ok: res.peakRssMb < 300 }, holds: true },
    { key: "mail.time", area: "Recharge", scenario: mail, figure: "time", value: res.mailMs, text: `${(res.mailMs / 1000).toFixed(2)} s`, better: "lower", goal: { text: "< 20 s", ok: res.mailMs < 20_000 }, holds: false },
    { key: "mail.perStatement", area: "Recharge", scenario: mail, figure: "time per statement", value: res.mailMs / Math.max(1, res.statements), text: `${(res.mailMs / Math.max(1, res.statements)).toFixed(0)} ms`, better: "lower", holds: true },
    { key: "mail.rss", area: "Recharge", scenario: mail, figure: "peak RSS", value: res.peakRssWithMailMb, text: `${res.peakRssWithMailMb} MB`, better: "lower", holds: true },
  ];
}

async function main(): Promise<void> {
  console.log(`Phasebook bench, ${new Date().toISOString().slice(0, 10)}, ${os.cpus().length} cores.`);
  const one = await runAt(1);
  if (SCALE === 1) {
    console.log("");
    printSingle(one);
  } else {
    const scaled = await runAt(SCALE);
    console.log("");
    printScaled(SCALE, one, scaled);
  }
  console.log(`\nLoad average at the end: ${os.loadavg().map((l) => l.toFixed(2)).join(" ")}.`);
}

const RUN_SCALE = Number(process.env.BENCH_RUN_SCALE ?? 1);
if (process.env.BENCH_ROLE === "server") await serve(RUN_SCALE);
else if (process.env.BENCH_ROLE === "recharge") await recharge(RUN_SCALE);
else await main();

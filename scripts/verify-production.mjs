/* global console, process, fetch, setTimeout */
// Checks that a built checkout runs in production with the runtime dependencies only, as a
// deployment would: copies this checkout (after `npm run build`) to a temporary folder, runs
// `npm ci --omit=dev` there, starts `npm run start:prod` with DEMO_SEED=1 on a free port and a
// new data folder, and fetches /, /api/health, /api/facility, a hashed asset and a missing
// asset; then creates a person, takes a backup and renders a statement PDF (through the worker
// pool) with the compiled command-line tools.
// Slow (npm ci compiles better-sqlite3): `npm run verify:production`, not part of `npm test`.
import fs from "node:fs";
import os from "node:os";
import net from "node:net";
import path from "node:path";
import { execFileSync, spawn } from "node:child_process";

const KEEP = process.argv.includes("--keep");
const npm = process.platform === "win32" ? "npm.cmd" : "npm";

class Failed extends Error {}

function fail(sentence) {
  throw new Failed(sentence);
}

function check(ok, what) {
  if (!ok) fail(`FAILED: ${what}`);
  console.log(`  ok  ${what}`);
}

async function freePort() {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once("error", reject);
    s.listen(0, "127.0.0.1", () => {
      const { port } = s.address();
      s.close(() => resolve(port));
    });
  });
}

for (const f of ["dist/index.html", "dist-server/main.js"]) {
  if (!fs.existsSync(f)) {
    console.error(`verify-production: ${f} is missing; run npm run build first.`);
    process.exit(1);
  }
}

const root = fs.mkdtempSync(path.join(os.tmpdir(), "phasebook-prod-"));
const app = path.join(root, "app");
const data = path.join(root, "data");
console.log(`Copying the built checkout to ${app} …`);
const skip = new Set(["node_modules", ".git", "data", "coverage", ".tmp"]);
fs.cpSync(".", app, { recursive: true, filter: (src) => !skip.has(path.relative(".", src).split(path.sep)[0]) });


const port = await freePort();
const url = `http://127.0.0.1:${port}`;
const env = {
  ...process.env,
  NODE_ENV: "production",
  DEMO_SEED: "1",
  PUBLIC_URL: url,
  PORT: String(port),
  HOST: "127.0.0.1",
  DATABASE_PATH: path.join(data, "phasebook.sqlite"),
  LOG_LEVEL: "warn",
};
for (const k of ["SMTP_URL", "STRIPE_SECRET_KEY", "STRIPE_API_BASE", "START_FAKES", "BACKUP_DIR"]) delete env[k];

let server = null;
let out = "";
const stop = () => {
  try {
    // The group started below: npm, its shell and the server.
    if (server) process.kill(-server.pid, "SIGTERM");
  } catch {
    /* already gone */
  }
};

try {
  console.log("npm ci --omit=dev (compiles better-sqlite3; a few minutes) …");
  execFileSync(npm, ["ci", "--omit=dev", "--no-audit", "--no-fund"], { cwd: app, stdio: ["ignore", "inherit", "inherit"] });
  check(!fs.existsSync(path.join(app, "node_modules/tsx")) && !fs.existsSync(path.join(app, "node_modules/vite")), "no dev dependencies installed (tsx and vite absent)");

  console.log(`npm run start:prod on ${url} …`);
  server = spawn(npm, ["run", "--silent", "start:prod"], { cwd: app, env, stdio: ["ignore", "pipe", "pipe"], detached: true });
  server.stdout.on("data", (d) => (out += d));
  server.stderr.on("data", (d) => (out += d));
  const deadline = Date.now() + 120_000;
  for (;;) {
    if (server.exitCode !== null) fail(`the production server exited early:\n${out}`);
    const ok = await fetch(`${url}/api/health`).then((r) => r.ok, () => false);
    if (ok && /Phasebook is running/.test(out)) break;
    if (Date.now() > deadline) fail(`the production server did not answer in time:\n${out}`);
    await new Promise((r) => setTimeout(r, 500));
  }
  check(/mode: production, PUBLIC DEMO/.test(out), "the start-up log says it is a public demo");
  check(/mail: NOT CONFIGURED/.test(out), "the start-up log says mail waits in the outbox");

  const health = await fetch(`${url}/api/health`);
  check(health.status === 200 && (await health.json()).status === "ok", "GET /api/health answers ok");
  const facility = await (await fetch(`${url}/api/facility`)).json();
  check(facility.publicDemo === true, "GET /api/facility says publicDemo: true");

  const page = await fetch(`${url}/`, { headers: { accept: "text/html" } });
  const html = await page.text();
  check(page.status === 200 && /text\/html/.test(page.headers.get("content-type") ?? "") && html.includes('id="root"'), "GET / serves the client's page");
  const deep = await fetch(`${url}/schedule`, { headers: { accept: "text/html,application/xhtml+xml" } });
  check(deep.status === 200 && (await deep.text()).includes('id="root"'), "a page load of /schedule gets the client's page");

  const asset = /(?:src|href)="(\/assets\/[^"]+\.js)"/.exec(html)?.[1];
  check(Boolean(asset), `the page names a hashed script (${asset})`);
  const js = await fetch(`${url}${asset}`);
  check(js.status === 200 && /javascript/.test(js.headers.get("content-type") ?? "") && /immutable/.test(js.headers.get("cache-control") ?? ""), `GET ${asset} serves JavaScript, cached as immutable`);
  await js.arrayBuffer();
  const missing = await fetch(`${url}/assets/nonexistent-0000.js`);
  check(missing.status === 404, "GET /assets/nonexistent-0000.js is 404, not the page");

  const made = execFileSync(npm, ["run", "--silent", "user:create", "--", "--email", "first.admin@facility.example", "--name", "First Administrator", "--role", "admin"], {
    cwd: app,
    env,
    encoding: "utf8",
  });
  check(new RegExp(`${url}/reset-password/[A-Za-z0-9_-]{20,}`).test(made), "npm run user:create prints a link to choose a password");

  const backupDir = path.join(root, "backup");
  execFileSync(npm, ["run", "--silent", "backup", "--", backupDir], { cwd: app, env, stdio: ["ignore", "ignore", "inherit"] });
  const manifest = JSON.parse(fs.readFileSync(path.join(backupDir, "manifest.json"), "utf8"));
  check(manifest.tables.users >= 8, `npm run backup wrote a backup of the running server (${manifest.tables.users} people)`);

  // The demo's billed month has statements; the bundle's worker thread (dist-server/statement-pdf-worker.js) renders them.
  const pdfFile = path.join(root, "statement-1.pdf");
  const wrote = execFileSync(npm, ["run", "--silent", "statement:pdf", "--", "1", pdfFile], { cwd: app, env, encoding: "utf8" });
  check(
    /rendered in a worker thread/.test(wrote) && fs.readFileSync(pdfFile).subarray(0, 5).toString() === "%PDF-",
    "npm run statement:pdf renders a statement of the demo's billed month in the statement PDF pool's worker thread",
  );

  console.log("The built checkout runs in production with the runtime dependencies only.");
} catch (e) {
  console.error(`verify-production: ${e instanceof Failed ? e.message : (e?.message ?? String(e))}`);
  process.exitCode = 1;
} finally {
  stop();
  await new Promise((r) => setTimeout(r, 1500));
  if (KEEP) console.log(`Left in ${root}.`);
  else fs.rmSync(root, { recursive: true, force: true });
}

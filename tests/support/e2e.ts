/**
 * Browser tests' harness: starts Phasebook as `npm start` would (server/main.ts with the demo
 * seed and the local fakes on ephemeral ports) against a temporary database, and Debian's
 * Chromium through playwright-core.
 */
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import net from "node:net";
import { spawn, type ChildProcess } from "node:child_process";
import { chromium, type Browser, type Page } from "playwright-core";

export const CHROMIUM = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";
export const DEMO_PASSWORD = "phasebook-demo";

export interface RunningServer {
  url: string;
  mailboxUrl: string;
  paymentsUrl: string;
  dir: string;
  output: () => string;
  stop(): Promise<void>;
}

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once("error", reject);
    s.listen(0, "127.0.0.1", () => {
      const port = (s.address() as net.AddressInfo).port;
      s.close(() => resolve(port));
    });
  });
}

export async function startServer(opts: { dir?: string; env?: Record<string, string> } = {}): Promise<RunningServer> {
  if (!fs.existsSync("dist/index.html")) throw new Error("Build the client first: npm run build");
  const dir = opts.dir ?? fs.mkdtempSync(path.join(os.tmpdir(), "phasebook-e2e-"));
  const port = await freePort();
  const url = `http://127.0.0.1:${port}`;
  let out = "";
  const child: ChildProcess = spawn(process.execPath, ["--import", "tsx", "server/main.ts"], {
    env: {
      ...process.env,
      NODE_ENV: "development",
      PORT: String(port),
      HOST: "127.0.0.1",
      PUBLIC_URL: url,
      DATABASE_PATH: path.join(dir, "phasebook.sqlite"),
      FAKE_SMTP_PORT: "0",
      FAKE_MAILBOX_HTTP_PORT: "0",
      FAKE_PAYMENTS_PORT: "0",
      LOG_LEVEL: "warn",
      ...opts.env,
    },
    stdio: ["ignore", "pipe", "pipe"],
  });
  child.stdout!.on("data", (d) => (out += d));
  child.stderr!.on("data", (d) => (out += d));
  // Generous: a cold start compiles the server with tsx and seeds the demo (bcrypt), slow on a busy 2-core machine.
  const deadline = Date.now() + 150_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`Phasebook exited early:\n${out}`);
    try {
      const r = await fetch(`${url}/api/health`);
      if (r.ok && /Phasebook is running/.test(out)) break;
    } catch {
      /* not up yet */
    }
    if (Date.now() > deadline) throw new Error(`Phasebook did not start in time:\n${out}`);
    await new Promise((r) => setTimeout(r, 250));
  }
  const mailboxUrl = /fake mailbox (http:\/\/[^/\s]+)/.exec(out)?.[1] ?? "";
  const paymentsUrl = /fake payment API (http:\/\/[^/\s]+)/.exec(out)?.[1] ?? "";
  return {
    url,
    mailboxUrl,
    paymentsUrl,
    dir,
    output: () => out,
    async stop() {
      if (child.exitCode !== null) return;
      const exited = new Promise((r) => child.once("exit", r));
      child.kill("SIGTERM");
      await Promise.race([exited, new Promise((r) => setTimeout(r, 5000))]);
      if (child.exitCode === null) child.kill("SIGKILL");
    },
  };
}

export async function launchBrowser(): Promise<Browser> {
  if (!fs.existsSync(CHROMIUM)) throw new Error(`Chromium not found at ${CHROMIUM}: apt-get install -y chromium`);
  return chromium.launch({
    executablePath: CHROMIUM,
    headless: true,
    args: [
      "--no-sandbox",
      "--disable-gpu",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
      "--no-first-run",
      "--disable-quic",
    ],
  });
}

export async function signIn(page: Page, base: string, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto(`${base}/sign-in`);
  await page.fill('input[name="email"]', email);
  await page.fill('input[name="password"]', password);
  await page.click('[data-testid="sign-in-submit"]');
  await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"), { timeout: 15_000 });
}

/**
 * The only file that listens. Loads configuration, checks its ports, starts the local fakes
 * when asked and no real mail or payment endpoints are configured, migrates, seeds the demo
 * facility when asked, refuses production while an account has the demo password, serves the
 * API and the built client, and runs the timed jobs.
 *
 * A refusal at start-up is one sentence on stderr and exit code 1 (2 for bad configuration),
 * never a stack trace.
 */
import fs from "node:fs";
import path from "node:path";
import crypto from "node:crypto";
import { createServer, type Server } from "node:http";
import type { AddressInfo } from "node:net";
import { loadConfig, ConfigError, type Config } from "./config";
import { openDatabase } from "./db/data-source";
import { startCheckpointer } from "./db/checkpointer";
import { seedDemo } from "./db/seed/demo";
import { DEMO_PASSWORD } from "./db/seed/demo-people";
import { createApp, MAX_HEADER_BYTES } from "./app";
import { systemClock } from "./clock";
import { createSmtpMailer, type Mailer } from "./integrations/mailer";
import { createPaymentsClient } from "./integrations/payments";
import { jobs, startScheduler } from "./jobs/scheduler";
import { startFakes, FakePortInUse, type Fakes } from "../fakes/start";
import { busyPorts, isAddressInUse, portsInUseSentence, type WantedPort } from "./ops/ports";
import { accountsWithDemoPassword, demoPasswordRefusal } from "./ops/demo-passwords";
import { writePidFile } from "./ops/pid-file";
import { Refusal } from "./ops/cli";
import { closeStatementPdfPool } from "./modules/recharge";

/** Fake ports as fakes/start.ts reads them; 0 lets the system choose. */
function fakePort(name: string, fallback: number): number {
  const v = process.env[name];
  return v === undefined || v === "" ? fallback : Number(v);
}

/** Without SMTP_URL (and no fake) mail stays in the outbox; the deliver-mail job is not run at all. */
const noMailServer: Mailer = {
  async send() {
    throw new Error("No mail server is configured (SMTP_URL)");
  },
  close() {},
};

async function main(): Promise<void> {
  const config = loadConfig();
  const production = config.NODE_ENV === "production";
  const needMailFake = !config.SMTP_URL && config.START_FAKES;
  const needPayFake = !config.STRIPE_API_BASE && !config.STRIPE_SECRET_KEY && config.START_FAKES;

  // Every port this start needs, checked before anything is opened, so a second `npm start` on
  // the same machine names all the variables to change at once.
  const fakeHost = process.env.FAKE_HOST ?? "127.0.0.1";
  const wanted: WantedPort[] = [{ port: config.PORT, host: config.HOST, variable: "PORT" }];
  if (needMailFake) {
    wanted.push({ port: fakePort("FAKE_SMTP_PORT", 2525), host: fakeHost, variable: "FAKE_SMTP_PORT" });
    wanted.push({ port: fakePort("FAKE_MAILBOX_HTTP_PORT", 2580), host: fakeHost, variable: "FAKE_MAILBOX_HTTP_PORT" });
  }
  if (needPayFake) wanted.push({ port: fakePort("FAKE_PAYMENTS_PORT", 12111), host: fakeHost, variable: "FAKE_PAYMENTS_PORT" });
  const busy = await busyPorts(wanted);
  if (busy.length) throw new Refusal(portsInUseSentence(busy));

  const webhookSecret = config.STRIPE_WEBHOOK_SECRET ?? persistentWebhookSecret(config.dataDir);
  let fakes: Fakes | null = null;
  if (needMailFake || needPayFake) {
    try {
      fakes = await startFakes({
        dataDir: path.join(config.dataDir, "fakes"),
        webhookSecret,
        webhookUrl: `http://127.0.0.1:${config.PORT}/api/webhooks/stripe`,
      });
    } catch (e) {
      if (e instanceof FakePortInUse) throw new Refusal(portsInUseSentence([{ port: e.port, host: fakeHost, variable: e.variable }]));
      throw e;
    }
  }
  const smtpUrl = config.SMTP_URL ?? (needMailFake ? fakes?.mailbox.smtpUrl : undefined);
  const apiBase = config.STRIPE_API_BASE ?? (needPayFake ? fakes?.payments.url : undefined);
  const payments =
    config.STRIPE_SECRET_KEY || apiBase
      ? createPaymentsClient({ secretKey: config.STRIPE_SECRET_KEY ?? "sk_test_phasebook_local", apiBase, webhookSecret })
      : undefined;

  const ds = await openDatabase(config.DATABASE_PATH);
  // WAL checkpoints in a thread of their own, never inside a request's COMMIT (db/checkpointer.ts).
  const checkpointer = await startCheckpointer(ds);
  const closeAll = async () => {
    await fakes?.close();
    await checkpointer.stop();
    await closeStatementPdfPool();
    await ds.destroy();
  };
  let seeded = false;
  try {
    if (config.DEMO_SEED) seeded = (await seedDemo(ds, {
        now: systemClock.now(),
        tz: config.FACILITY_TZ,
        currency: config.CURRENCY,
        facilityName: config.FACILITY_NAME,
        recoveryAccount: config.RECOVERY_ACCOUNT,
      })).seeded;
    if (production && !config.DEMO_SEED) {
      const demo = await accountsWithDemoPassword(ds, DEMO_PASSWORD);
      if (demo.length) throw new Refusal(demoPasswordRefusal(demo));
    }
  } catch (e) {
    await closeAll();
    throw e;
  }

  const mailer = smtpUrl ? createSmtpMailer(smtpUrl) : noMailServer;
  const { app, sessionStore } = createApp({
    ds,
    config: { ...config, STRIPE_WEBHOOK_SECRET: webhookSecret },
    clock: systemClock,
    mailer,
    payments,
    mailboxUrl: needMailFake ? fakes?.mailbox.httpUrl : undefined,
  });

  let server: Server;
  try {
    server = await new Promise<Server>((resolve, reject) => {
      const s = createServer({ maxHeaderSize: MAX_HEADER_BYTES }, app);
      s.once("error", reject);
      s.listen(config.PORT, config.HOST, () => resolve(s));
    });
  } catch (e) {
    await closeAll();
    if (isAddressInUse(e)) throw new Refusal(portsInUseSentence([{ port: config.PORT, host: config.HOST, variable: "PORT" }]));
    throw e;
  }
  sessionStore.startSweeping();
  const scheduler = startScheduler(
    { ds, mailer, clock: systemClock, config, payments },
    jobs.filter((j) => smtpUrl || j.name !== "deliver-mail"),
  );
  const pidFile = writePidFile(config.dataDir);

  const port = (server.address() as AddressInfo).port;
  console.log(startupReport(config, { port, seeded, smtpUrl, needMailFake, needPayFake, fakes, paymentsConfigured: Boolean(payments) }));

  const stop = async () => {
    scheduler.stop();
    sessionStore.stopSweeping();
    server.close();
    mailer.close();
    fs.rmSync(pidFile, { force: true });
    await closeAll();
    process.exit(0);
  };
  // A Ctrl-C reaches both this process and the launcher that forwards it (scripts/start.mjs):
  // the second signal must not cut the first one's clean stop short.
  let stopping = false;
  const onSignal = () => {
    if (stopping) return;
    stopping = true;
    void stop();
  };
  process.on("SIGINT", onSignal);
  process.on("SIGTERM", onSignal);
}

function startupReport(
  config: Config,
  s: { port: number; seeded: boolean; smtpUrl?: string; needMailFake: boolean; needPayFake: boolean; fakes: Fakes | null; paymentsConfigured: boolean },
): string {
  const production = config.NODE_ENV === "production";
  const mail =
    s.needMailFake && s.fakes
      ? `fake mailbox ${s.fakes.mailbox.httpUrl}/messages (also Admin › System)`
      : s.smtpUrl
        ? `SMTP server ${smtpHost(s.smtpUrl)}`
        : "NOT CONFIGURED: mail waits in the outbox until SMTP_URL is set (Admin › System counts it)";
  const payments =
    s.needPayFake && s.fakes
      ? `fake payment API ${s.fakes.payments.url}`
      : s.paymentsConfigured
        ? config.STRIPE_SECRET_KEY
          ? "payment service (STRIPE_SECRET_KEY)"
          : "configured endpoint"
        : "NOT CONFIGURED: card invoices wait until STRIPE_SECRET_KEY is set";
  const backups = config.BACKUP_DIR
    ? production
      ? `nightly into ${path.resolve(config.BACKUP_DIR)}, keeping ${config.BACKUP_KEEP} days`
      : "nightly backups run in production only"
    : production
      ? "NOT CONFIGURED: set BACKUP_DIR for nightly backups (npm run backup -- DIR takes one by hand)"
      : "none (development)";
  const lines = [
    "",
    `Phasebook is running at ${config.PUBLIC_URL}${String(config.PORT) === String(s.port) ? "" : ` (port ${s.port})`}`,
    `  mode: ${production ? (config.publicDemo ? "production, PUBLIC DEMO (DEMO_SEED): every page says the data is invented" : "production") : "demo / development"}`,
    `  database: ${path.resolve(config.DATABASE_PATH)}${s.seeded ? " (demo scenario seeded)" : ""}`,
    `  mail: ${mail}`,
    `  payments: ${payments}`,
    `  backups: ${backups}`,
  ];
  if (config.DEMO_SEED) {
    lines.push(
      "",
      `Demo sign-ins (password: ${DEMO_PASSWORD}):`,
      "  member@kestrelbay.example     researcher",
      "  member2@kestrelbay.example    researcher, trained on nothing",
      "  lead@kestrelbay.example       group lead",
      "  manager@kestrelbay.example    facility manager",
      "  safety@kestrelbay.example     safety officer",
      "  admin@kestrelbay.example      administrator",
      "  buyer@tidewater.example       external customer",
    );
  }
  return lines.join("\n");
}

/** The mail server's host and port, without the credentials SMTP_URL may carry. */
function smtpHost(url: string): string {
  try {
    const u = new URL(url);
    return `${u.hostname}${u.port ? `:${u.port}` : ""}`;
  } catch {
    return "(SMTP_URL)";
  }
}

/** The fake payment API and the app must agree on the webhook secret across restarts. */
function persistentWebhookSecret(dataDir: string): string {
  const file = path.join(dataDir, "webhook-secret");
  fs.mkdirSync(dataDir, { recursive: true });
  if (fs.existsSync(file)) return fs.readFileSync(file, "utf8").trim();
  const secret = `whsec_${crypto.randomBytes(24).toString("base64url")}`;
  fs.writeFileSync(file, secret + "\n", { mode: 0o600 });
  return secret;
}

try {
  await main();
} catch (e) {
  if (e instanceof Refusal || e instanceof ConfigError) {
    console.error(e.message);
    process.exit(e instanceof ConfigError ? 2 : 1);
  }
  // Anything else: its message, not its stack (LOG_LEVEL=debug prints the stack too).
  console.error(`Phasebook could not start: ${(e as Error)?.message ?? String(e)}`);
  if (process.env.LOG_LEVEL === "debug" || process.env.LOG_LEVEL === "trace") console.error((e as Error)?.stack);
  process.exit(1);
}

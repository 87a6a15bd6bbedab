/**
 * The only file that listens. Loads configuration, starts the local fakes when no real mail or
 * payment endpoints are configured, migrates, seeds the demo facility on a new database, serves
 * the API and the built client, and runs the timed jobs.
 */
import fs from "node:fs";
import path from "node:path";
import crypto from "node:crypto";
import type { Server } from "node:http";
import { loadConfig, ConfigError } from "./config";
import { openDatabase } from "./db/data-source";
import { seedDemo } from "./db/seed/demo";
import { createApp } from "./app";
import { systemClock } from "./clock";
import { createSmtpMailer } from "./integrations/mailer";
import { createPaymentsClient } from "./integrations/payments";
import { startScheduler } from "./jobs/scheduler";
import { startFakes } from "../fakes/start";

async function main(): Promise<void> {
  let config;
  try {
    config = loadConfig();
  } catch (e) {
    if (e instanceof ConfigError) {
      console.error(e.message);
      process.exit(2);
    }
    throw e;
  }

  const needMailFake = !config.SMTP_URL && config.START_FAKES;
  const needPayFake = !config.STRIPE_API_BASE && !config.STRIPE_SECRET_KEY && config.START_FAKES;
  const webhookSecret = config.STRIPE_WEBHOOK_SECRET ?? persistentWebhookSecret(config.dataDir);
  const fakes =
    needMailFake || needPayFake
      ? await startFakes({
          dataDir: path.join(config.dataDir, "fakes"),
          webhookSecret,
          webhookUrl: `http://127.0.0.1:${config.PORT}/api/webhooks/stripe`,
        })
      : null;
  const smtpUrl = config.SMTP_URL ?? (needMailFake ? fakes?.mailbox.smtpUrl : undefined);
  if (!smtpUrl) {
    console.error("SMTP_URL is not set and the fake mailbox is off (START_FAKES=false): set SMTP_URL.");
    process.exit(2);
  }
  const apiBase = config.STRIPE_API_BASE ?? (needPayFake ? fakes?.payments.url : undefined);
  const payments =
    config.STRIPE_SECRET_KEY || apiBase
      ? createPaymentsClient({ secretKey: config.STRIPE_SECRET_KEY ?? "sk_test_phasebook_local", apiBase, webhookSecret })
      : undefined;

  const ds = await openDatabase(config.DATABASE_PATH);
  let seeded = false;
  if (config.DEMO_SEED) seeded = (await seedDemo(ds, { now: systemClock.now(), tz: config.FACILITY_TZ })).seeded;

  const mailer = createSmtpMailer(smtpUrl);
  const { app, sessionStore } = createApp({
    ds,
    config: { ...config, STRIPE_WEBHOOK_SECRET: webhookSecret },
    clock: systemClock,
    mailer,
    payments,
    mailboxUrl: needMailFake ? fakes?.mailbox.httpUrl : undefined,
  });
  sessionStore.startSweeping();
  const scheduler = startScheduler({ ds, mailer, clock: systemClock, config, payments });

  const server: Server = app.listen(config.PORT, config.HOST, () => {
    const lines = [
      "",
      `Phasebook is running at ${config.PUBLIC_URL}`,
      `  database: ${path.resolve(config.DATABASE_PATH)}${seeded ? " (demo scenario seeded)" : ""}`,
      `  mail: ${needMailFake && fakes ? `fake mailbox ${fakes.mailbox.httpUrl}/messages (also Admin › Mailbox)` : "SMTP_URL"}`,
      `  payments: ${needPayFake && fakes ? `fake payment API ${fakes.payments.url}` : payments ? "configured endpoint" : "not configured"}`,
    ];
    if (config.DEMO_SEED) {
      lines.push(
        "",
        "Demo sign-ins (password: phasebook-demo):",
        "  member@kestrelbay.example     researcher",
        "  member2@kestrelbay.example    researcher, trained on nothing",
        "  lead@kestrelbay.example       group lead",
        "  manager@kestrelbay.example    facility manager",
        "  safety@kestrelbay.example     safety officer",
        "  admin@kestrelbay.example      administrator",
        "  buyer@tidewater.example       external customer",
      );
    }
    console.log(lines.join("\n"));
  });

  const stop = async () => {
    scheduler.stop();
    sessionStore.stopSweeping();
    server.close();
    mailer.close();
    await fakes?.close();
    await ds.destroy();
    process.exit(0);
  };
  process.once("SIGINT", () => void stop());
  process.once("SIGTERM", () => void stop());
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

await main();

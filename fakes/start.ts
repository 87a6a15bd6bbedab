/**
 * Starts the local fakes together: the mailbox (SMTP + HTTP) and the payment service. Run it on
 * its own with `tsx fakes/start.ts`, or call startFakes() from Phasebook's start script so a
 * fresh checkout works with no outside accounts. Ports and paths come from the environment.
 */
import path from "node:path";
import { fileURLToPath } from "node:url";
import { startFakeMailbox, type FakeMailbox } from "./mailbox/server";
import { startFakePayments, type FakePayments } from "./payments/server";

export interface StartFakesOptions {
  host?: string;
  /** Folder for the fakes' state files; default ./data/fakes. */
  dataDir?: string;
  smtpPort?: number;
  mailboxHttpPort?: number;
  paymentsPort?: number;
  /** Where payment events are posted; default Phasebook's own webhook route on API_PORT/PORT. */
  webhookUrl?: string;
  webhookSecret?: string;
  /** Base URL for hosted invoice links, when people reach the fake by another name. */
  paymentsPublicUrl?: string;
  defaultCurrency?: string;
  log?: (line: string) => void;
  env?: NodeJS.ProcessEnv;
}

export interface Fakes {
  mailbox: FakeMailbox;
  payments: FakePayments;
  /** The webhook secret in use, so the app can verify what the fake signs. */
  webhookSecret: string;
  close(): Promise<void>;
}

/** Used when no secret is configured; it only ever signs events from this local fake. */
export const LOCAL_WEBHOOK_SECRET = "whsec_phasebook_local_fake_payments_secret";

/** A fake could not listen because its port is taken; names the variable that moves it. */
export class FakePortInUse extends Error {
  constructor(
    readonly port: number,
    readonly variable: "FAKE_SMTP_PORT" | "FAKE_MAILBOX_HTTP_PORT" | "FAKE_PAYMENTS_PORT",
  ) {
    super(`Port ${port} (${variable}) is already in use; set ${variable} to a free port or stop the program that holds it.`);
  }
}

const inUse = (e: unknown) => (e as NodeJS.ErrnoException | undefined)?.code === "EADDRINUSE";

function portFrom(value: string | undefined, fallback: number, name: string): number {
  if (value === undefined || value === "") return fallback;
  const n = Number(value);
  if (!Number.isInteger(n) || n < 0 || n > 65535) throw new Error(`${name} must be a port number, got "${value}"`);
  return n;
}

export async function startFakes(opts: StartFakesOptions = {}): Promise<Fakes> {
  const env = opts.env ?? process.env;
  const dataDir = path.resolve(opts.dataDir ?? env.FAKE_DATA_DIR ?? "./data/fakes");
  const host = opts.host ?? env.FAKE_HOST ?? "127.0.0.1";
  const appPort = env.API_PORT ?? env.PORT ?? "3000";
  const webhookSecret = opts.webhookSecret ?? env.STRIPE_WEBHOOK_SECRET ?? LOCAL_WEBHOOK_SECRET;

  const smtpPort = opts.smtpPort ?? portFrom(env.FAKE_SMTP_PORT, 2525, "FAKE_SMTP_PORT");
  const mailboxHttpPort = opts.mailboxHttpPort ?? portFrom(env.FAKE_MAILBOX_HTTP_PORT, 2580, "FAKE_MAILBOX_HTTP_PORT");
  const paymentsPort = opts.paymentsPort ?? portFrom(env.FAKE_PAYMENTS_PORT, 12111, "FAKE_PAYMENTS_PORT");
  let mailbox: FakeMailbox;
  try {
    mailbox = await startFakeMailbox({ host, smtpPort, httpPort: mailboxHttpPort, storePath: path.join(dataDir, "mailbox.json") });
  } catch (err) {
    if (!inUse(err)) throw err;
    const port = (err as { port?: number }).port;
    throw port === mailboxHttpPort && port !== smtpPort ? new FakePortInUse(mailboxHttpPort, "FAKE_MAILBOX_HTTP_PORT") : new FakePortInUse(smtpPort, "FAKE_SMTP_PORT");
  }
  let payments: FakePayments;
  try {
    payments = await startFakePayments({
      host,
      port: paymentsPort,
      dataPath: path.join(dataDir, "payments.json"),
      webhookUrl: opts.webhookUrl ?? env.FAKE_PAYMENTS_WEBHOOK_URL ?? `http://127.0.0.1:${appPort}/api/webhooks/stripe`,
      webhookSecret,
      publicUrl: opts.paymentsPublicUrl ?? env.FAKE_PAYMENTS_PUBLIC_URL,
      defaultCurrency: opts.defaultCurrency ?? env.CURRENCY ?? "cad",
      log: opts.log,
    });
  } catch (err) {
    await mailbox.close();
    throw inUse(err) ? new FakePortInUse(paymentsPort, "FAKE_PAYMENTS_PORT") : err;
  }
  return {
    mailbox,
    payments,
    webhookSecret,
    async close() {
      await Promise.all([mailbox.close(), payments.close()]);
    },
  };
}

async function main(): Promise<void> {
  const fakes = await startFakes({ log: (line) => console.log(line) });
  console.log(`Fake mailbox   SMTP ${fakes.mailbox.smtpUrl}   messages ${fakes.mailbox.httpUrl}/messages`);
  console.log(`Fake payments  API  ${fakes.payments.url}/v1   controls ${fakes.payments.url}/_control/`);
  const stop = () => {
    fakes.close().then(
      () => process.exit(0),
      () => process.exit(1),
    );
  };
  process.once("SIGINT", stop);
  process.once("SIGTERM", stop);
}

// Run on its own only as fakes/start.ts itself: bundled into the compiled server, import.meta.url
// is the bundle's, which is also the program being run, and the fakes must not start from that.
const self = fileURLToPath(import.meta.url);
if (process.argv[1] && path.resolve(process.argv[1]) === self && self.endsWith(path.join("fakes", "start.ts"))) {
  main().catch((err: Error) => {
    console.error(err.message);
    process.exit(1);
  });
}

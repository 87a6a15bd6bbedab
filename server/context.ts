/** What the areas share: data source, configuration, clock and integrations. */
import type { DataSource } from "typeorm";
import type Stripe from "stripe";
import type { Config } from "./config";
import type { Clock } from "./clock";
import type { Mailer } from "./integrations/mailer";
import type { RateLimits, SignIn } from "./modules/people";

export interface AppDeps {
  ds: DataSource;
  config: Config;
  clock: Clock;
  mailer: Mailer;
  payments?: Stripe;
  /** HTTP address of the local fake mailbox, shown to admins in development. */
  mailboxUrl?: string;
  /** The sign-in, reset and password-change rate limits (modules/people/sign-in.ts); tests lower or lift them. */
  rateLimits?: Partial<RateLimits>;
  /** bcrypt cost; tests may lower it for speed, never below 10. */
  bcryptCost?: number;
  /** Folder of the built client; null to serve the API only. */
  staticDir?: string | null;
  /** Silence request logs (tests). */
  quiet?: boolean;
  /** The app's version, shown in the API description. */
  version?: string;
  /** Parse every JSON answer with its route's declared output schema (tests). */
  checkResponses?: boolean;
}

/** What every route handler, command and query gets: the app's dependencies and the clock's now(). */
export interface Ctx extends AppDeps {
  now: () => Date;
  /** Passport, the CSRF token and the sign-in rate limits, for the session routes (People). */
  signIn: SignIn;
}

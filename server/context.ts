/** What routers and jobs share: data source, configuration, clock, services and integrations. */
import type { DataSource } from "typeorm";
import type Stripe from "stripe";
import type { Config } from "./config";
import type { Clock } from "./clock";
import type { Mailer } from "./integrations/mailer";
import { createUserService } from "./services/user.service";
import { createTrainingService } from "./services/training.service";
import { createAccountsService } from "./services/accounts.service";
import { createBillingService } from "./services/billing.service";
import { createRatesService } from "./services/rates.service";

export interface AppDeps {
  ds: DataSource;
  config: Config;
  clock: Clock;
  mailer: Mailer;
  payments?: Stripe;
  /** HTTP address of the local fake mailbox, shown to admins in development. */
  mailboxUrl?: string;
  /** Sign-in attempts allowed per address and e-mail in the window (tests lower the window). */
  loginRateLimit?: { windowMs: number; limit: number };
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

export function createServices(deps: AppDeps) {
  const now = () => deps.clock.now();
  return {
    users: createUserService({ ds: deps.ds, now, publicUrl: deps.config.PUBLIC_URL, facilityName: deps.config.FACILITY_NAME, bcryptCost: deps.bcryptCost }),
    training: createTrainingService({ ds: deps.ds, now, publicUrl: deps.config.PUBLIC_URL }),
    accounts: createAccountsService({ ds: deps.ds, tz: deps.config.FACILITY_TZ, now }),
    rates: createRatesService({ ds: deps.ds, tz: deps.config.FACILITY_TZ, now }),
    billing: createBillingService({ ds: deps.ds, tz: deps.config.FACILITY_TZ, currency: deps.config.CURRENCY, now, payments: deps.payments, facilityName: deps.config.FACILITY_NAME }),
  };
}

export type Services = ReturnType<typeof createServices>;

export interface Ctx extends AppDeps {
  services: Services;
  now: () => Date;
}

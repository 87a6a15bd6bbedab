/**
 * What Recharge's commands and queries need of the app: the database and the clock (Deps), the
 * facility's time zone, currency and name, and the payment service when one is configured. The
 * app's Ctx is one; the bench builds a narrow one.
 */
import { DateTime } from "luxon";
import type Stripe from "stripe";
import type { Config } from "../../config";
import type { Deps } from "../../core/deps";
import type { InvoicingDeps } from "./invoice.commands";

/** The facility's name where none is passed in (the bench); FACILITY_NAME sets it. */
export const DEFAULT_FACILITY_NAME = "Liquid Interfaces Core";

export interface RechargeDeps extends Deps {
  config: Pick<Config, "FACILITY_TZ" | "CURRENCY" | "FACILITY_NAME" | "RECOVERY_ACCOUNT">;
  payments?: Stripe;
}

/** Today's date (YYYY-MM-DD) in the facility's time zone: accounts open and close on local dates. */
export function facilityToday(deps: RechargeDeps): string {
  return DateTime.fromJSDate(deps.now(), { zone: deps.config.FACILITY_TZ }).toISODate()!;
}

/** This month (YYYY-MM) in the facility's time zone. */
export function facilityMonth(deps: RechargeDeps): string {
  return DateTime.fromJSDate(deps.now(), { zone: deps.config.FACILITY_TZ }).toFormat("yyyy-MM");
}

export function invoicingDeps(deps: RechargeDeps): InvoicingDeps {
  return { ds: deps.ds, payments: deps.payments, now: deps.now, facilityName: deps.config.FACILITY_NAME };
}

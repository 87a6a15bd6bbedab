/**
 * Recharge's timed jobs, run by server/jobs/scheduler.ts: invoices the payment service did not
 * take when a run was finalised (or voided), retried with backoff; and statement PDFs of final
 * runs not yet in the outbox (a large month, or a crash mid-way).
 */
import type { DataSource } from "typeorm";
import type Stripe from "stripe";
import type { Clock } from "../../clock";
import type { Config } from "../../config";
import { processDueInvoices } from "./invoice.commands";
import { mailDueStatements } from "./statement.commands";

/** What the jobs need of the scheduler's deps. */
export interface RechargeJobDeps {
  ds: DataSource;
  clock: Clock;
  config: Pick<Config, "FACILITY_TZ" | "FACILITY_NAME">;
  payments?: Stripe;
}

export interface RechargeJob {
  name: string;
  everyMs: number;
  run(deps: RechargeJobDeps): Promise<unknown>;
}

export const sendInvoicesJob: RechargeJob = {
  name: "send-invoices",
  everyMs: 30_000,
  run: (d) => processDueInvoices({ ds: d.ds, payments: d.payments, now: () => d.clock.now(), facilityName: d.config.FACILITY_NAME }),
};

export const mailStatementsJob: RechargeJob = {
  name: "mail-statements",
  everyMs: 15_000,
  run: (d) => mailDueStatements(d.ds, () => d.clock.now(), { limit: 20, tz: d.config.FACILITY_TZ, facility: d.config.FACILITY_NAME }),
};

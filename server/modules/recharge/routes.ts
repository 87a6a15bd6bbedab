/** Recharge's route table: accounts, rates, monthly billing and the payment service's events. */
import type { RouteTable } from "../../http/route-table";
import { accountRoutes } from "./account.routes";
import { billingRoutes } from "./billing.routes";
import { rateRoutes } from "./rate.routes";
import { webhookRoutes } from "./webhook.routes";

export const rechargeTable: RouteTable = {
  module: "recharge",
  description: "Billing accounts and who may charge them, rates and the rate review, monthly billing runs with statements, the finance journal and invoices, and the spend views.",
  routes: [...accountRoutes, ...rateRoutes, ...billingRoutes, ...webhookRoutes],
};

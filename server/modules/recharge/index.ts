/**
 * Recharge's public entry: what other areas (the Schedule's booking checks, the start page), the
 * app, the scheduler and the bench may use. Nothing else of this folder is imported from outside
 * it (seeds read the billing settings' key from billing-settings.ts, which holds no route code).
 */
export { rechargeTable } from "./routes";
export { accountPolicy, organisationMismatch, admitMember, listsAccount, type AccountFacts, type AccountWithMembership, type Newcomer } from "./account.policy";
export { statementPolicy, type StatementFacts } from "./statement.policy";
export { billingRunPolicy, billingPeriodPolicy, type BillingRunFacts, type BillingPeriodFacts } from "./billing-run.policy";
export { isChargeable } from "./account.queries";
export { finaliseRun, voidRun } from "./billing-run.commands";
export { mailDueStatements } from "./statement.commands";
export { statementPdfInputById } from "./statement.queries";
export { statementPdfPool, closeStatementPdfPool } from "./statement-pdf-pool";
export { processDueInvoices } from "./invoice.commands";
export { sendInvoicesJob, mailStatementsJob, type RechargeJob, type RechargeJobDeps } from "./jobs";
export { readBillingSettings, type BillingSettings } from "./billing-settings";
export type { RechargeDeps } from "./recharge-deps";

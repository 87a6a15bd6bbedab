/**
 * Monthly billing: the billing settings (the API's "policy"), the preview, runs (finalise,
 * void), the finance journal, invoice retries, statements and their PDFs, and the spend and
 * revenue views. What may be done with a run is the billing-run policy's to say, with a
 * statement the statement policy's.
 */
import { idParam, pageQuery } from "@shared/schemas/common";
import {
  billingPolicyInput,
  billingPreviewResponse,
  billingRunPage,
  billingRunResponse,
  invoiceRetryResult,
  myChargesDto,
  outstandingDto,
  policyResponse,
  previewQuery,
  reportQuery,
  revenueReportDto,
  runInput,
  spendReportDto,
  statementPage,
  voidInput,
} from "@shared/schemas/recharge";
import { route, WRITTEN } from "../../http/route-table";
import { billingSettings } from "./rate.queries";
import { saveBillingSettings } from "./rate.commands";
import { getRun, listRuns, previewMonth } from "./billing-run.queries";
import { journalCsv } from "./journal.queries";
import { finaliseRun, retryInvoices, voidRun } from "./billing-run.commands";
import { listStatements, statementPdf } from "./statement.queries";
import { myCharges, outstanding, revenue, spend } from "./billing-views.queries";

const MANAGER = ["manager"] as const;
const pagedReport = pageQuery.extend(reportQuery.shape);

export const billingRoutes = [
  route({
    method: "get",
    path: "/billing/policy",
    summary: "The facility's billing settings: rounding increment, minimum charge, no-show and late-cancel shares, consumable mark-up",
    access: "signed_in",
    output: policyResponse,
    handler: async ({ ctx }) => ({ policy: await billingSettings(ctx) }),
  }),
  route({
    method: "put",
    path: "/billing/policy",
    summary: "Change the billing settings (months not yet final are priced with them)",
    access: MANAGER,
    body: billingPolicyInput,
    output: policyResponse,
    handler: async ({ ctx, actor, body }) => ({ policy: await saveBillingSettings(ctx, actor, body) }),
  }),
  route({
    method: "get",
    path: "/billing/preview",
    summary: "A month as a run would bill it, computed and not stored",
    description: "422 `period_not_ended` for a month that is not over. `missingRates` lists the charges no rate prices yet.",
    access: MANAGER,
    query: previewQuery,
    output: billingPreviewResponse,
    handler: async ({ ctx, query }) => ({ preview: await previewMonth(ctx, query.period) }),
  }),
  route({
    method: "get",
    path: "/billing/runs",
    summary: "Billing runs, newest month first, with statement counts by invoice status",
    access: MANAGER,
    query: pageQuery,
    output: billingRunPage,
    handler: ({ ctx, actor, query }) => listRuns(ctx, actor, query),
  }),
  route({
    method: "post",
    path: "/billing/runs",
    summary: "Finalise a month: statements and lines stored, invoices queued for external accounts",
    description:
      "Running the same month twice answers 409 `period_final` (with `runId`) unless the earlier run was voided; 422 `period_not_ended` " +
      "for a month not over, 422 `missing_rates` when some charge has no rate (nothing is stored).",
    access: MANAGER,
    policy: "billingPeriod.finalise",
    body: runInput,
    status: 201,
    output: billingRunResponse,
    handler: async ({ ctx, actor, body }) => {
      const run = await finaliseRun(ctx, actor, body.period);
      return { run: await getRun(ctx, actor, run.id) };
    },
  }),
  route({
    method: "get",
    path: "/billing/runs/:id",
    summary: "One run with its statements and their lines",
    access: MANAGER,
    params: idParam,
    output: billingRunResponse,
    handler: async ({ ctx, actor, params }) => ({ run: await getRun(ctx, actor, params.id) }),
  }),
  route({
    method: "post",
    path: "/billing/runs/:id/void",
    summary: "Void a run, saying why: its month may be run again, its open invoices are voided",
    description: "409 `already_void` for a voided run, 409 `invoice_paid` when one of its invoices has been paid.",
    access: MANAGER,
    policy: "billingRun.void",
    params: idParam,
    body: voidInput,
    output: billingRunResponse,
    handler: async ({ ctx, actor, params, body }) => {
      const run = await voidRun(ctx, actor, params.id, body.reason);
      return { run: await getRun(ctx, actor, run.id) };
    },
  }),
  route({
    method: "get",
    path: "/billing/runs/:id/journal.csv",
    summary: "The finance journal: per internal statement a debit to its account and a credit to the recovery account; debits = credits = the internal statements' total",
    description:
      "Columns `period, account, department, debit, credit, currency, description`; amounts in the currency's units with two decimals. " +
      "A voided run's journal is named `journal-YYYY-MM-VOID.csv` and starts with a VOID line before the header.",
    access: MANAGER,
    policy: "billingRun.journal",
    params: idParam,
    produces: "text/csv",
    handler: async ({ ctx, actor, params, res }) => {
      const { csv, filename } = await journalCsv(ctx, actor, params.id, "journal");
      res.type("text/csv; charset=utf-8").attachment(filename).send(csv);
      return WRITTEN;
    },
  }),
  route({
    method: "get",
    path: "/billing/runs/:id/reversal.csv",
    summary: "A voided run's reversing journal: its journal's lines with debit and credit swapped",
    description: "Same columns as journal.csv. 409 `run_not_void` for a run that stands.",
    access: MANAGER,
    policy: "billingRun.reversal",
    params: idParam,
    produces: "text/csv",
    handler: async ({ ctx, actor, params, res }) => {
      const { csv, filename } = await journalCsv(ctx, actor, params.id, "reversal");
      res.type("text/csv; charset=utf-8").attachment(filename).send(csv);
      return WRITTEN;
    },
  }),
  route({
    method: "post",
    path: "/billing/invoices/retry",
    summary: "Send every queued invoice to the payment service now",
    access: MANAGER,
    output: invoiceRetryResult,
    handler: ({ ctx }) => retryInvoices(ctx),
  }),
  route({
    method: "get",
    path: "/billing/statements",
    summary: "The statements the caller may see: the manager all, an owner their accounts', a customer's people their account's",
    access: "signed_in",
    policy: "statement.download",
    query: pageQuery,
    output: statementPage,
    handler: ({ ctx, actor, query }) => listStatements(ctx, actor, query),
  }),
  route({
    method: "get",
    path: "/billing/statements/:id/statement.pdf",
    summary: "A statement as PDF: every line, the total, the currency and the rounding rule",
    description: "404 for a statement the caller may not see.",
    access: "signed_in",
    policy: "statement.download",
    params: idParam,
    produces: "application/pdf",
    handler: async ({ ctx, actor, params, res }) => {
      const { pdf, filename } = await statementPdf(ctx, actor, params.id);
      res.type("application/pdf").attachment(filename).send(pdf);
      return WRITTEN;
    },
  }),
  route({
    method: "get",
    path: "/billing/revenue",
    summary: "Revenue of final runs by month, instrument and department",
    access: MANAGER,
    query: reportQuery,
    output: revenueReportDto,
    handler: ({ ctx, query }) => revenue(ctx, query),
  }),
  route({
    method: "get",
    path: "/billing/spend",
    summary: "Spend per month, account and member: a group lead's own accounts, or (manager) every account",
    access: ["group_lead", "manager"],
    query: reportQuery,
    output: spendReportDto,
    handler: ({ ctx, actor, query }) => spend(ctx, actor, query),
  }),
  route({
    method: "get",
    path: "/billing/my-charges",
    summary: "The caller's own lines on final statements, with their sum",
    access: "signed_in",
    query: pagedReport,
    output: myChargesDto,
    handler: ({ ctx, actor, query }) => myCharges(ctx, actor, query),
  }),
  route({
    method: "get",
    path: "/billing/outstanding",
    summary: "External invoices of final runs not yet paid",
    access: MANAGER,
    output: outstandingDto,
    handler: ({ ctx }) => outstanding(ctx),
  }),
];

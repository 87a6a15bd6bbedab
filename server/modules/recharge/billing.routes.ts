/**
 * Monthly billing: the policy, preview, runs (finalise, void), the finance journal, statement
 * PDFs, invoice retries and the spend and revenue views.
 */
import { Router } from "express";
import { idParam, pageQuery } from "@shared/schemas/common";
import { billingPolicyInput, previewQuery, reportQuery, runInput, voidInput, type BillingPolicyDto, type ReportQuery } from "@shared/schemas/recharge";
import type { Ctx } from "../../context";
import { currentUser, requireAuth, requireRole } from "../../middleware/auth";
import { body, params, query, validate } from "../../middleware/validate";

const pagedReport = pageQuery.extend(reportQuery.shape);

export function createBillingRouter(ctx: Ctx): Router {
  const r = Router();
  const billing = ctx.services.billing;
  const rates = ctx.services.rates;

  r.get("/policy", requireAuth, async (_req, res) => {
    res.json({ policy: await rates.policy() });
  });

  r.put("/policy", requireRole("manager"), validate({ body: billingPolicyInput }), async (req, res) => {
    res.json({ policy: await rates.setPolicy(currentUser(req), body<BillingPolicyDto>(req)) });
  });

  r.get("/preview", requireRole("manager"), validate({ query: previewQuery }), async (req, res) => {
    res.json({ preview: await billing.previewDto(query<{ period: string }>(req).period) });
  });

  r.get("/runs", requireRole("manager"), validate({ query: pageQuery }), async (req, res) => {
    res.json(await billing.listRuns(query<{ limit: number; offset: number }>(req)));
  });

  r.post("/runs", requireRole("manager"), validate({ body: runInput }), async (req, res) => {
    const run = await billing.createRun(currentUser(req), body<{ period: string }>(req).period);
    res.status(201).json({ run: await billing.getRun(run.id) });
  });

  r.get("/runs/:id", requireRole("manager"), validate({ params: idParam }), async (req, res) => {
    res.json({ run: await billing.getRun(params<{ id: number }>(req).id) });
  });

  r.post("/runs/:id/void", requireRole("manager"), validate({ params: idParam, body: voidInput }), async (req, res) => {
    const run = await billing.voidRun(currentUser(req), params<{ id: number }>(req).id, body<{ reason: string }>(req).reason);
    res.json({ run: await billing.getRun(run.id) });
  });

  r.get("/runs/:id/journal.csv", requireRole("manager"), validate({ params: idParam }), async (req, res) => {
    const { csv, period } = await billing.journalCsv(params<{ id: number }>(req).id);
    res.type("text/csv; charset=utf-8").attachment(`journal-${period}.csv`).send(csv);
  });

  r.post("/invoices/retry", requireRole("manager"), async (_req, res) => {
    res.json(await billing.retryInvoices());
  });

  r.get("/statements", requireAuth, validate({ query: pageQuery }), async (req, res) => {
    res.json(await billing.listStatements(currentUser(req), query<{ limit: number; offset: number }>(req)));
  });

  r.get("/statements/:id/statement.pdf", requireAuth, validate({ params: idParam }), async (req, res) => {
    const { pdf, filename } = await billing.statementPdf(currentUser(req), params<{ id: number }>(req).id);
    res.type("application/pdf").attachment(filename).send(pdf);
  });

  r.get("/revenue", requireRole("manager"), validate({ query: reportQuery }), async (req, res) => {
    res.json(await billing.revenue(query<ReportQuery>(req)));
  });

  r.get("/spend", requireRole("group_lead", "manager"), validate({ query: reportQuery }), async (req, res) => {
    res.json(await billing.spend(currentUser(req), query<ReportQuery>(req)));
  });

  r.get("/my-charges", requireAuth, validate({ query: pagedReport }), async (req, res) => {
    res.json(await billing.myCharges(currentUser(req), query<ReportQuery & { limit: number; offset: number }>(req)));
  });

  r.get("/outstanding", requireRole("manager"), async (_req, res) => {
    res.json(await billing.outstanding());
  });

  return r;
}

/**
 * Label printing and upkeep: the label PDF (contract route GET /api/labels.pdf), the label
 * stocks it lays labels out on, and re-issuing a label (which retires the old code) with its
 * history.
 */
import { Router } from "express";
import {
  labelStockInput,
  labelsPdfQuery,
  reissueInput,
  reissueParams,
  type LabelStockInput,
  type LabelledTypeName,
  type LabelsPdfQuery,
  type ReissueInput,
} from "@shared/schemas/labels";
import type { Ctx } from "../context";
import { currentUser, requireRole } from "../middleware/auth";
import { body, params, query, validate } from "../middleware/validate";

export function createLabelsPdfRouter(ctx: Ctx): Router {
  const r = Router();
  r.get("/", requireRole("manager", "safety_officer"), validate({ query: labelsPdfQuery }), async (req, res) => {
    const { pdf, count } = await ctx.services.labels.labelsPdf(currentUser(req), query<LabelsPdfQuery>(req));
    res
      .status(200)
      .type("application/pdf")
      .set("Content-Disposition", `inline; filename="phasebook-labels-${count}.pdf"`)
      .set("Cache-Control", "no-store")
      .send(pdf);
  });
  return r;
}

export function createLabelsRouter(ctx: Ctx): Router {
  const r = Router();
  const svc = () => ctx.services.labels;

  r.get("/stocks", requireRole("manager", "safety_officer", "admin"), async (_req, res) => {
    const items = await svc().listStocks();
    res.json({ items, total: items.length });
  });

  r.post("/stocks", requireRole("manager", "admin"), validate({ body: labelStockInput }), async (req, res) => {
    res.status(201).json({ stock: await svc().addStock(currentUser(req), body<LabelStockInput>(req)) });
  });

  r.post("/:type/:id/reissue", requireRole("manager", "safety_officer"), validate({ params: reissueParams, body: reissueInput }), async (req, res) => {
    const p = params<{ type: LabelledTypeName; id: number }>(req);
    res.json(await svc().reissue(currentUser(req), p.type, p.id, body<ReissueInput>(req).reason));
  });

  r.get("/:type/:id/history", requireRole("manager", "safety_officer"), validate({ params: reissueParams }), async (req, res) => {
    const p = params<{ type: LabelledTypeName; id: number }>(req);
    const items = await svc().history(p.type, p.id);
    res.json({ items, total: items.length });
  });
  return r;
}

/** The rate schedule (published to everyone signed in; changed by the manager) and the rate review. */
import { Router } from "express";
import { idParam } from "@shared/schemas/common";
import {
  rateApplyInput,
  rateInput,
  rateReviewInput,
  rateUpdateInput,
  type RateApplyInput,
  type RateInput,
  type RateReviewInput,
  type RateUpdateInput,
} from "@shared/schemas/recharge";
import type { Ctx } from "../../context";
import { currentUser, requireAuth, requireRole } from "../../middleware/auth";
import { body, params, validate } from "../../middleware/validate";

export function createRatesRouter(ctx: Ctx): Router {
  const r = Router();
  const rates = ctx.services.rates;

  r.get("/", requireAuth, async (_req, res) => {
    const items = await rates.list();
    res.json({ items, total: items.length });
  });

  r.post("/", requireRole("manager"), validate({ body: rateInput }), async (req, res) => {
    res.status(201).json({ rate: await rates.create(currentUser(req), body<RateInput>(req)) });
  });

  r.post("/review", requireRole("manager"), validate({ body: rateReviewInput }), async (req, res) => {
    res.json({ items: await rates.review(body<RateReviewInput>(req)) });
  });

  r.post("/apply", requireRole("manager"), validate({ body: rateApplyInput }), async (req, res) => {
    const items = await rates.apply(currentUser(req), body<RateApplyInput>(req));
    res.status(201).json({ items, total: items.length });
  });

  r.patch("/:id", requireRole("manager"), validate({ params: idParam, body: rateUpdateInput }), async (req, res) => {
    res.json({ rate: await rates.update(currentUser(req), params<{ id: number }>(req).id, body<RateUpdateInput>(req)) });
  });

  r.delete("/:id", requireRole("manager"), validate({ params: idParam }), async (req, res) => {
    await rates.remove(currentUser(req), params<{ id: number }>(req).id);
    res.status(204).end();
  });

  return r;
}

/** Setups: everyone signed in reads them (the booking form offers them); managers keep them. */
import { Router } from "express";
import { idParam } from "@shared/schemas/common";
import { setupInput, type SetupParsed } from "@shared/schemas/setups";
import type { Ctx } from "../context";
import { currentUser, requireAuth, requireRole } from "../middleware/auth";
import { body, params, validate } from "../middleware/validate";

export function createSetupsRouter(ctx: Ctx): Router {
  const r = Router();
  const svc = ctx.services.setups;

  r.get("/", requireAuth, async (_req, res) => {
    const items = await svc.list();
    res.json({ items, total: items.length });
  });
  r.post("/", requireRole("manager"), validate({ body: setupInput }), async (req, res) => {
    res.status(201).json({ setup: await svc.save(currentUser(req), body<SetupParsed>(req)) });
  });
  r.put("/:id", requireRole("manager"), validate({ params: idParam, body: setupInput }), async (req, res) => {
    res.json({ setup: await svc.save(currentUser(req), body<SetupParsed>(req), params<{ id: number }>(req).id) });
  });
  r.delete("/:id", requireRole("manager"), validate({ params: idParam }), async (req, res) => {
    await svc.remove(currentUser(req), params<{ id: number }>(req).id);
    res.status(204).end();
  });
  return r;
}

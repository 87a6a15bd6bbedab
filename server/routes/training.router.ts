/** Training records (managers grant and revoke; members see their own) and training requests. */
import { Router } from "express";
import { z } from "zod";
import { idParam } from "@shared/schemas/common";
import {
  closeTrainingRequestInput,
  grantTrainingInput,
  trainingListQuery,
  trainingRequestInput,
  type TrainingListQuery,
} from "@shared/schemas/training";
import { reasonInput } from "@shared/schemas/bookings";
import type { Ctx } from "../context";
import { currentUser, requireAuth, requireRole } from "../middleware/auth";
import { body, params, query, validate } from "../middleware/validate";

export function createTrainingRouter(ctx: Ctx): Router {
  const r = Router();
  const svc = ctx.services.training;

  r.get("/", requireAuth, validate({ query: trainingListQuery }), async (req, res) => {
    res.json(await svc.list(currentUser(req), query<TrainingListQuery>(req)));
  });

  r.post("/", requireRole("manager"), validate({ body: grantTrainingInput }), async (req, res) => {
    const input = body<z.output<typeof grantTrainingInput>>(req);
    const id = await svc.grant(currentUser(req), input);
    res.status(201).json({ record: await svc.get(id) });
  });

  r.post("/:id/revoke", requireRole("manager"), validate({ params: idParam, body: reasonInput }), async (req, res) => {
    const { id } = params<{ id: number }>(req);
    await svc.revoke(currentUser(req), id, body<{ reason: string }>(req).reason);
    res.json({ record: await svc.get(id) });
  });

  /** The people a manager may train: everyone active with the member role. */
  r.get("/people", requireRole("manager"), async (_req, res) => {
    const items: { id: number; name: string; email: string }[] = await ctx.ds.query(
      `SELECT DISTINCT u.id, u.name, u.email FROM users u JOIN user_roles r ON r.userId = u.id WHERE r.role = 'member' AND u.active = 1 ORDER BY u.name`,
    );
    res.json({ items, total: items.length });
  });

  r.get("/requests", requireAuth, validate({ query: z.object({ status: z.enum(["open", "granted", "dismissed"]).optional() }) }), async (req, res) => {
    const items = await svc.requests(currentUser(req), query<{ status?: string }>(req).status);
    res.json({ items, total: items.length });
  });

  r.post("/requests", requireAuth, validate({ body: trainingRequestInput }), async (req, res) => {
    const input = body<{ instrumentId: number; note: string }>(req);
    const id = await svc.request(currentUser(req), input.instrumentId, input.note);
    res.status(201).json({ request: { id, status: "open", instrumentId: input.instrumentId } });
  });

  r.post("/requests/:id/close", requireRole("manager"), validate({ params: idParam, body: closeTrainingRequestInput }), async (req, res) => {
    const { id } = params<{ id: number }>(req);
    await svc.closeRequest(currentUser(req), id, body<{ outcome: "granted" | "dismissed" }>(req).outcome);
    res.json({ request: { id, status: body<{ outcome: string }>(req).outcome } });
  });

  return r;
}

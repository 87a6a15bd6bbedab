/**
 * Scan and the quick actions a scanned label offers.
 * GET /api/scan/:labelToken → 200 { type, id, url, record }; 404 "label_malformed" for a token of
 * the wrong shape (no lookup is made); 404 "label_unknown"; 404 "label_replaced" for a token
 * retired by a re-issued label. The actions under /api/scan-actions are authorised by role and,
 * for containers, by ownership (own group or shared stock; managers and the safety officer: all).
 */
import { Router } from "express";
import { idParam } from "@shared/schemas/common";
import { isLabelTokenShape } from "@shared/domain/labels";
import {
  cleanedInput,
  disposeInput,
  markEmptyInput,
  moveContainerInput,
  reportFaultInput,
  reportProblemInput,
  type CleanedInput,
  type DisposeInput,
  type MarkEmptyInput,
  type MoveContainerInput,
  type ReportFaultInput,
  type ReportProblemInput,
} from "@shared/schemas/labels";
import type { Ctx } from "../context";
import { currentUser, requireAuth } from "../middleware/auth";
import { body, params, validate } from "../middleware/validate";
import { AppError } from "../errors";

export function createScanRouter(ctx: Ctx): Router {
  const r = Router();
  r.get("/:labelToken", requireAuth, async (req, res) => {
    const token = String(req.params.labelToken);
    if (!isLabelTokenShape(token)) {
      // 404 like any code that leads nowhere (API.md), with its own code for the Scan page.
      throw new AppError(404, "label_malformed", "This is not a Phasebook label code: a code is 22 to 64 letters, digits, '-' or '_'.");
    }
    res.json(await ctx.services.labels.resolve(currentUser(req), token));
  });
  return r;
}

export function createScanActionsRouter(ctx: Ctx): Router {
  const r = Router();
  const svc = () => ctx.services.scanActions;
  const labels = () => ctx.services.labels;
  const id = (req: Express.Request) => params<{ id: number }>(req).id;

  // The places a container can be moved to, as "building › room › cabinet", for the move action.
  r.get("/locations", requireAuth, async (_req, res) => {
    const items = await labels().locationChoices();
    res.json({ items, total: items.length });
  });

  r.post("/containers/:id/problem", requireAuth, validate({ params: idParam, body: reportProblemInput }), async (req, res) => {
    const user = currentUser(req);
    await svc().reportContainerProblem(user, id(req), body<ReportProblemInput>(req).note);
    res.json(await labels().describeContainer(user, id(req)));
  });
  r.post("/containers/:id/move", requireAuth, validate({ params: idParam, body: moveContainerInput }), async (req, res) => {
    const user = currentUser(req);
    await svc().move(user, id(req), body<MoveContainerInput>(req).locationId);
    res.json(await labels().describeContainer(user, id(req)));
  });
  r.post("/containers/:id/empty", requireAuth, validate({ params: idParam, body: markEmptyInput }), async (req, res) => {
    const user = currentUser(req);
    await svc().markEmpty(user, id(req), body<MarkEmptyInput>(req).wasteNote);
    res.json(await labels().describeContainer(user, id(req)));
  });
  r.post("/containers/:id/dispose", requireAuth, validate({ params: idParam, body: disposeInput }), async (req, res) => {
    const user = currentUser(req);
    await svc().dispose(user, id(req), body<DisposeInput>(req).wasteNote);
    res.json(await labels().describeContainer(user, id(req)));
  });
  r.post("/instruments/:id/cleaned", requireAuth, validate({ params: idParam, body: cleanedInput }), async (req, res) => {
    const user = currentUser(req);
    await svc().recordCleaned(user, id(req), body<CleanedInput>(req).note);
    res.json(await labels().describeInstrument(user, id(req)));
  });
  r.post("/instruments/:id/fault", requireAuth, validate({ params: idParam, body: reportFaultInput }), async (req, res) => {
    const user = currentUser(req);
    await svc().reportFault(user, id(req), body<ReportFaultInput>(req).note);
    res.json(await labels().describeInstrument(user, id(req)));
  });
  return r;
}

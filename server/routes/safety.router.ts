/**
 * The Safety review (safety officer, manager): per-location totals against limits (contract
 * GET /api/safety/locations), the review lists, the printable report, sheets due for review;
 * and the safety data sheet download for everyone signed in.
 */
import { Router } from "express";
import { idParam } from "@shared/schemas/common";
import type { Ctx } from "../context";
import { requireAuth, requireRole } from "../middleware/auth";
import { params, validate } from "../middleware/validate";
import { safetyLocationTotals, safetyReview } from "../services/safety.service";
import { renderSafetyReport } from "../services/safety-report";

const REVIEWERS = ["safety_officer", "manager"] as const;

export function createSafetyRouter(ctx: Ctx): Router {
  const r = Router();
  r.use(requireRole(...REVIEWERS));

  r.get("/locations", async (_req, res) => {
    const items = await safetyLocationTotals(ctx.ds);
    res.json({ items, total: items.length });
  });

  r.get("/review", async (_req, res) => {
    res.json(await safetyReview(ctx.ds, ctx.now(), ctx.config.FACILITY_TZ));
  });

  r.get("/sds-due", async (_req, res) => {
    const items = await ctx.services.sds.due();
    res.json({ items, total: items.length });
  });

  r.get("/report.pdf", async (_req, res) => {
    const pdf = await renderSafetyReport(ctx.ds, ctx.now(), ctx.config.FACILITY_TZ);
    res.type("application/pdf").setHeader("Content-Disposition", `inline; filename="phasebook-safety-review.pdf"`);
    res.send(pdf);
  });

  return r;
}

export function createSdsRouter(ctx: Ctx): Router {
  const r = Router();
  r.get("/:id/file", requireAuth, validate({ params: idParam }), async (req, res) => {
    const f = await ctx.services.sds.file(params<{ id: number }>(req).id);
    // attachment() writes both filename= (ASCII fallback) and filename*= (RFC 6266 / RFC 5987).
    res.attachment(f.originalName).type("application/pdf");
    res.sendFile(f.fullPath);
  });
  return r;
}

/** Health, the per-role start page's figures, the audit log and the development mailbox. */
import { Router } from "express";
import { z } from "zod";
import { pageQuery, type PageQuery } from "@shared/schemas/common";
import type { Ctx } from "../context";
import { currentUser, hasRole, requireAuth, requireRole } from "../middleware/auth";
import { query, validate } from "../middleware/validate";
import { AuditEntry } from "../entities";
import { NotFound } from "../errors";
import { dashboardFor } from "../services/dashboard.service";

export function createHealthRouter(ctx: Ctx): Router {
  const r = Router();
  r.get("/", async (_req, res) => {
    let db = "ok";
    try {
      await ctx.ds.query("SELECT 1");
    } catch {
      db = "unavailable";
    }
    res.status(db === "ok" ? 200 : 503).json({ status: db === "ok" ? "ok" : "degraded", db });
  });
  return r;
}

/** The facility's name, time zone and currency: the client shows local times in the facility's zone. */
export function createFacilityRouter(ctx: Ctx): Router {
  const r = Router();
  r.get("/", (_req, res) => {
    res.json({ name: ctx.config.FACILITY_NAME, timeZone: ctx.config.FACILITY_TZ, currency: ctx.config.CURRENCY });
  });
  return r;
}

export function createDashboardRouter(ctx: Ctx): Router {
  const r = Router();
  r.get("/", requireAuth, async (req, res) => {
    const user = currentUser(req);
    res.json(await dashboardFor(ctx, user, { manager: hasRole(user, "manager"), safety: hasRole(user, "safety_officer", "manager") }));
  });
  return r;
}

export function createAuditRouter(ctx: Ctx): Router {
  const r = Router();
  const q = pageQuery.extend({ entityType: z.string().max(40).optional(), entityId: z.coerce.number().int().optional() });
  r.get("/", requireRole("admin", "manager"), validate({ query: q }), async (req, res) => {
    const { limit, offset, entityType, entityId } = query<PageQuery & { entityType?: string; entityId?: number }>(req);
    const [items, total] = await ctx.ds.getRepository(AuditEntry).findAndCount({
      where: { ...(entityType ? { entityType } : {}), ...(entityId ? { entityId } : {}) },
      order: { id: "DESC" },
      skip: offset,
      take: limit,
    });
    res.json({ items: items.map((a) => ({ ...a, detail: JSON.parse(a.detail) as unknown })), total });
  });
  return r;
}

/** Development only: what the local fake mailbox received, for admins. */
export function createDevRouter(ctx: Ctx): Router {
  const r = Router();
  r.get("/mailbox", requireRole("admin"), async (_req, res) => {
    if (ctx.config.NODE_ENV === "production" || !ctx.mailboxUrl) throw new NotFound("The development mailbox");
    const answer = await fetch(`${ctx.mailboxUrl}/messages`);
    res.json(await answer.json());
  });
  return r;
}

/** Departments and research groups, readable by everyone signed in (forms pick from them). */
import { Router } from "express";
import type { Ctx } from "../context";
import { requireAuth } from "../middleware/auth";
import { Department, ResearchGroup } from "../entities";

export function createDepartmentsRouter(ctx: Ctx): Router {
  const r = Router();
  r.get("/", requireAuth, async (_req, res) => {
    const items = await ctx.ds.getRepository(Department).find({ order: { name: "ASC" } });
    res.json({ items: items.map((d) => ({ id: d.id, name: d.name, code: d.code })), total: items.length });
  });
  return r;
}

export function createGroupsRouter(ctx: Ctx): Router {
  const r = Router();
  r.get("/", requireAuth, async (_req, res) => {
    const items = await ctx.ds.getRepository(ResearchGroup).find({ order: { name: "ASC" } });
    res.json({
      items: items.map((g) => ({ id: g.id, name: g.name, departmentId: g.departmentId, leadId: g.leadId })),
      total: items.length,
    });
  });
  return r;
}

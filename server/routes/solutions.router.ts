/** Solution planning (contract POST /api/solutions/plan, pure) and preparation (one transaction). */
import { Router } from "express";
import { prepareSolutionInput, solutionPlanInput, type PrepareSolutionInput, type SolutionPlanInput } from "@shared/schemas/stock";
import type { Ctx } from "../context";
import { BENCH_ROLES } from "@shared/schemas/auth";
import { currentUser, requireRole } from "../middleware/auth";
import { body, validate } from "../middleware/validate";
import { presentContainer } from "../presenters/stock.presenter";

export function createSolutionsRouter(ctx: Ctx): Router {
  const r = Router();
  r.post("/plan", requireRole(...BENCH_ROLES), validate({ body: solutionPlanInput }), async (req, res) => {
    res.json(await ctx.services.solutions.plan(body<SolutionPlanInput>(req)));
  });
  r.post("/", requireRole(...BENCH_ROLES), validate({ body: prepareSolutionInput }), async (req, res) => {
    const out = await ctx.services.solutions.prepare(currentUser(req), body<PrepareSolutionInput>(req));
    res.status(201).json({
      container: presentContainer(out.container),
      plan: out.plan,
      massWeighedG: out.massWeighedG,
      actualConcentrationMolPerL: out.actualConcentrationMolPerL,
      parents: out.parents.map(presentContainer),
    });
  });
  return r;
}

/** Managers' reports: utilisation per instrument per month, as JSON for the chart and as CSV. */
import { Router } from "express";
import { z } from "zod";
import type { Ctx } from "../context";
import { requireRole } from "../middleware/auth";
import { query, validate } from "../middleware/validate";
import { utilisationCsv, utilisationReport } from "../services/utilisation.service";

const month = z.string().regex(/^\d{4}-(0[1-9]|1[0-2])$/, "Give a month as YYYY-MM");
const utilisationQuery = z.object({ from: month, to: month, instrumentId: z.coerce.number().int().positive().optional() });
type UtilisationQuery = z.infer<typeof utilisationQuery>;

export function createReportsRouter(ctx: Ctx): Router {
  const r = Router();
  r.get("/utilisation", requireRole("manager"), validate({ query: utilisationQuery }), async (req, res) => {
    const q = query<UtilisationQuery>(req);
    const items = await utilisationReport(ctx.ds, ctx.config.FACILITY_TZ, q.from, q.to, q.instrumentId);
    res.json({ items, total: items.length, tz: ctx.config.FACILITY_TZ });
  });
  r.get("/utilisation.csv", requireRole("manager"), validate({ query: utilisationQuery }), async (req, res) => {
    const q = query<UtilisationQuery>(req);
    const rows = await utilisationReport(ctx.ds, ctx.config.FACILITY_TZ, q.from, q.to, q.instrumentId);
    res
      .type("text/csv; charset=utf-8")
      .set("Content-Disposition", `attachment; filename="utilisation-${q.from}-to-${q.to}.csv"`)
      .send(utilisationCsv(rows));
  });
  return r;
}

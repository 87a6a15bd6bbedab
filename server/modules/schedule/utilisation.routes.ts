/** The manager's utilisation report: per instrument per month, as JSON for the chart and as CSV. */
import { utilisationQuery, utilisationReport as utilisationReportDto } from "@shared/schemas/reports";
import { route, WRITTEN } from "../../http/route-table";
import { utilisationCsv, utilisationReport } from "./utilisation.queries";

export const utilisationRoutes = [
  route({
    method: "get",
    path: "/reports/utilisation",
    summary: "Bookable, booked and used hours per instrument per month, in the facility's time zone",
    access: ["manager"],
    query: utilisationQuery,
    output: utilisationReportDto,
    handler: async ({ ctx, query }) => {
      const items = await utilisationReport(ctx.ds, ctx.config.FACILITY_TZ, query.from, query.to, query.instrumentId);
      return { items, total: items.length, tz: ctx.config.FACILITY_TZ };
    },
  }),
  route({
    method: "get",
    path: "/reports/utilisation.csv",
    summary: "The utilisation report as CSV (RFC 4180)",
    access: ["manager"],
    query: utilisationQuery,
    produces: "text/csv",
    handler: async ({ ctx, query, res }) => {
      const rows = await utilisationReport(ctx.ds, ctx.config.FACILITY_TZ, query.from, query.to, query.instrumentId);
      res.type("text/csv; charset=utf-8").set("Content-Disposition", `attachment; filename="utilisation-${query.from}-to-${query.to}.csv"`).send(utilisationCsv(rows));
      return WRITTEN;
    },
  }),
];

/**
 * Chemicals: the contract list and create (GET/POST /api/chemicals), one record, changes, holds
 * (which stop usage of every container of the chemical), and CSV import and export.
 */
import { z } from "zod";
import { boundedPageOf, idParam } from "@shared/schemas/common";
import { chemicalDto, chemicalInput, chemicalListQuery, chemicalUpdate, holdInput } from "@shared/schemas/stock";
import { route, WRITTEN } from "../../http/route-table";
import { createChemical, holdChemical, releaseChemical, updateChemical } from "./chemical.commands";
import { getChemical, listChemicals } from "./chemical.queries";
import { presentChemical } from "./stock.presenter";
import { chemicalsCsv, importChemicals } from "./stock-csv";
import { csvBody, csvText, importResult, STOCK_KEEPERS } from "./container.routes";

const one = z.object({ chemical: chemicalDto });

export const chemicalRoutes = [
  route({
    method: "get",
    path: "/chemicals",
    summary: "List chemicals with their hazard data and computed classes",
    description:
      "The text is plain text: part of a name, synonym, CAS number or formula. `total` is exact while `totalIsExact` is true; past 1,000 matches counting stops (more than `total` match).",
    access: "signed_in",
    query: chemicalListQuery,
    output: boundedPageOf(chemicalDto),
    handler: async ({ ctx, query }) => {
      const page = listChemicals(ctx.ds, query);
      return { items: page.items.map(presentChemical), total: page.total, totalIsExact: page.totalIsExact };
    },
  }),
  route({
    method: "post",
    path: "/chemicals",
    summary: "Add a chemical (molar mass from the formula unless given)",
    description: "422 for a CAS number that fails its check digit, a formula that cannot be weighed or an unknown H-code, naming the field.",
    access: STOCK_KEEPERS,
    body: chemicalInput,
    status: 201,
    output: one,
    handler: async ({ ctx, actor, body }) => ({ chemical: presentChemical(await createChemical(ctx, actor.id, body)) }),
  }),
  route({
    method: "get",
    path: "/chemicals/export.csv",
    summary: "Every chemical as CSV",
    access: "signed_in",
    produces: "text/csv",
    handler: async ({ ctx, res }) => {
      const page = await listChemicals(ctx.ds, { limit: 100_000, offset: 0, sort: "name", dir: "asc" });
      res.type("text/csv").attachment("phasebook-chemicals.csv").send(chemicalsCsv(page.items.map(presentChemical)));
      return WRITTEN;
    },
  }),
  route({
    method: "post",
    path: "/chemicals/import",
    summary: "Import chemicals from CSV: every row or none, each bad row listed",
    access: STOCK_KEEPERS,
    consumes: "text/csv",
    before: [csvBody],
    status: 201,
    output: importResult,
    handler: ({ ctx, actor, req }) => importChemicals(ctx, actor.id, csvText(req.body)),
  }),
  route({
    method: "get",
    path: "/chemicals/:id",
    summary: "One chemical",
    access: "signed_in",
    params: idParam,
    output: one,
    handler: async ({ ctx, params }) => ({ chemical: presentChemical(await getChemical(ctx.ds, params.id)) }),
  }),
  route({
    method: "patch",
    path: "/chemicals/:id",
    summary: "Change a chemical's identity or hazard data",
    access: STOCK_KEEPERS,
    params: idParam,
    body: chemicalUpdate,
    output: one,
    handler: async ({ ctx, actor, params, body }) => ({ chemical: presentChemical(await updateChemical(ctx, actor.id, params.id, body)) }),
  }),
  route({
    method: "post",
    path: "/chemicals/:id/hold",
    summary: "Place a chemical on hold: no container of it may be used",
    access: STOCK_KEEPERS,
    params: idParam,
    body: holdInput,
    output: one,
    handler: async ({ ctx, actor, params, body }) => ({ chemical: presentChemical(await holdChemical(ctx, actor.id, params.id, body.reason)) }),
  }),
  route({
    method: "post",
    path: "/chemicals/:id/release",
    summary: "Release a chemical from its hold",
    access: STOCK_KEEPERS,
    params: idParam,
    output: one,
    handler: async ({ ctx, actor, params }) => ({ chemical: presentChemical(await releaseChemical(ctx, actor.id, params.id)) }),
  }),
];

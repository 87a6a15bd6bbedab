/**
 * Labels and Scan. GET /api/scan/:labelToken → 200 { type, id, url, record } or 404 with code
 * label_malformed, label_unknown or label_replaced. The quick actions a scanned label offers
 * call the Stockroom's and the Schedule's own commands, so a change made from the Scan page is
 * the same change, with the same rules and records, as one made from the record's page.
 * Label printing (contract GET /api/labels.pdf), label stocks and re-issuing labels.
 */
import { z } from "zod";
import { idParam, pageOf } from "@shared/schemas/common";
import { labelHistoryEntryDto, labelStockDto, labelStockInput, labelsPdfQuery, reissueInput, reissueParams } from "@shared/schemas/labels";
import { cleanedInput, disposeInput, locationChoiceDto, markEmptyInput, moveContainerInput, reportFaultInput, reportProblemInput, scanResultDto } from "@shared/schemas/scan";
import { route, WRITTEN, type RouteTable } from "../../http/route-table";
import { disposeContainer, markContainerEmpty, moveContainer, reportContainerProblem } from "../stockroom";
import { recordCleaned, reportInstrumentFault } from "../schedule";
import { describeContainer, describeInstrument, locationChoices, resolveLabel } from "./scan.queries";
import { addLabelStock, labelHistory, labelsPdf, listLabelStocks, reissueLabel } from "./label.commands";

const STOCK_KEEPERS = ["manager", "safety_officer"] as const;

export const labelsTable: RouteTable = {
  module: "labels",
  description: "QR labels on bottles, cells and instruments; scanning one leads to its record and the one or two actions that make sense there.",
  routes: [
    route({
      method: "get",
      path: "/scan/:labelToken",
      summary: "The record a scanned label leads to",
      access: "signed_in",
      params: z.object({ labelToken: z.string().max(200) }),
      output: scanResultDto,
      handler: ({ ctx, actor, params }) => resolveLabel(ctx, actor, params.labelToken),
    }),
    route({
      method: "get",
      path: "/scan-actions/locations",
      summary: "The places a container can be moved to, as building › room › cabinet",
      access: "signed_in",
      output: pageOf(locationChoiceDto),
      handler: async ({ ctx }) => {
        const items = await locationChoices(ctx.ds);
        return { items, total: items.length };
      },
    }),
    route({
      method: "post",
      path: "/scan-actions/containers/:id/problem",
      summary: "Report a problem with a container (the safety officers are told)",
      access: "signed_in",
      policy: "container.reportProblem",
      params: idParam,
      body: reportProblemInput,
      output: scanResultDto,
      handler: async ({ ctx, actor, params, body }) => {
        await reportContainerProblem(ctx, actor, params.id, body.note);
        return describeContainer(ctx, actor, params.id);
      },
    }),
    route({
      method: "post",
      path: "/scan-actions/containers/:id/move",
      summary: "Move a scanned container (the Stockroom's move, with its movement record)",
      access: "signed_in",
      policy: "container.move",
      params: idParam,
      body: moveContainerInput,
      output: scanResultDto,
      handler: async ({ ctx, actor, params, body }) => {
        await moveContainer(ctx, actor, params.id, { locationId: body.locationId, note: "moved from the Scan page" });
        return describeContainer(ctx, actor, params.id);
      },
    }),
    route({
      method: "post",
      path: "/scan-actions/containers/:id/empty",
      summary: "Mark a scanned container empty, saying where what was left went",
      access: "signed_in",
      policy: "container.markEmpty",
      params: idParam,
      body: markEmptyInput,
      output: scanResultDto,
      handler: async ({ ctx, actor, params, body }) => {
        await markContainerEmpty(ctx, actor, params.id, body.wasteNote);
        return describeContainer(ctx, actor, params.id);
      },
    }),
    route({
      method: "post",
      path: "/scan-actions/containers/:id/dispose",
      summary: "Record that a scanned container was disposed of, with its waste stream",
      access: STOCK_KEEPERS,
      policy: "container.dispose",
      params: idParam,
      body: disposeInput,
      output: scanResultDto,
      handler: async ({ ctx, actor, params, body }) => {
        await disposeContainer(ctx, actor, params.id, { wasteNote: body.wasteNote });
        return describeContainer(ctx, actor, params.id);
      },
    }),
    route({
      method: "post",
      path: "/scan-actions/instruments/:id/cleaned",
      summary: "Record that an interface cell was cleaned and dried",
      access: "signed_in",
      policy: "instrument.recordCleaned",
      params: idParam,
      body: cleanedInput,
      output: scanResultDto,
      handler: async ({ ctx, actor, params, body }) => {
        await recordCleaned(ctx, actor, params.id, body.note);
        return describeInstrument(ctx, actor, params.id);
      },
    }),
    route({
      method: "post",
      path: "/scan-actions/instruments/:id/fault",
      summary: "Report a fault on an instrument: stored, shown on the instrument and mailed to the manager",
      description: "Answers 202: the report is accepted; whether the instrument leaves service is the manager's decision.",
      access: "signed_in",
      policy: "instrument.reportFault",
      params: idParam,
      body: reportFaultInput,
      status: 202,
      output: scanResultDto,
      handler: async ({ ctx, actor, params, body }) => {
        await reportInstrumentFault(ctx, actor, params.id, body.note);
        return describeInstrument(ctx, actor, params.id);
      },
    }),
    route({
      method: "get",
      path: "/labels.pdf",
      summary: "Labels with QR codes for containers and instruments, as a PDF",
      access: STOCK_KEEPERS,
      query: labelsPdfQuery,
      produces: "application/pdf",
      handler: async ({ ctx, actor, query, res }) => {
        const { pdf, count } = await labelsPdf(ctx, actor, query);
        res.status(200).type("application/pdf").set("Content-Disposition", `inline; filename="phasebook-labels-${count}.pdf"`).set("Cache-Control", "no-store").send(pdf);
        return WRITTEN;
      },
    }),
    route({
      method: "get",
      path: "/labels/stocks",
      summary: "Label sheet stocks labels can be laid out on",
      access: ["manager", "safety_officer", "admin"],
      output: pageOf(labelStockDto),
      handler: async ({ ctx }) => {
        const items = await listLabelStocks(ctx.ds);
        return { items, total: items.length };
      },
    }),
    route({
      method: "post",
      path: "/labels/stocks",
      summary: "Add a label sheet stock",
      access: ["manager", "admin"],
      body: labelStockInput,
      status: 201,
      output: z.object({ stock: labelStockDto }),
      handler: async ({ ctx, actor, body }) => ({ stock: await addLabelStock(ctx, actor, body) }),
    }),
    route({
      method: "post",
      path: "/labels/:type/:id/reissue",
      summary: "Re-issue a label: a new code; the old one answers 'replaced'",
      access: STOCK_KEEPERS,
      policy: "container.relabel",
      params: reissueParams,
      body: reissueInput,
      output: z.object({ token: z.string(), url: z.string() }),
      handler: ({ ctx, actor, params, body }) => reissueLabel(ctx, actor, params.type, params.id, body.reason),
    }),
    route({
      method: "get",
      path: "/labels/:type/:id/history",
      summary: "A record's retired labels",
      access: STOCK_KEEPERS,
      params: reissueParams,
      output: pageOf(labelHistoryEntryDto),
      handler: async ({ ctx, params }) => {
        const items = await labelHistory(ctx.ds, params.type, params.id);
        return { items, total: items.length };
      },
    }),
  ],
};

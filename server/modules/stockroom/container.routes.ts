/**
 * Containers: the Stockroom search (contract GET /api/containers), receiving a delivery, one
 * container with its history, usage (contract POST /api/containers/:id/usage), moves, holds,
 * emptying, pouring into a waste container, disposal, CSV import and export. Which container a
 * person may touch is the container policy's to say; the commands ask it.
 */
import express from "express";
import { z } from "zod";
import { BENCH_ROLES } from "@shared/schemas/auth";
import { boundedPageOf, idParam } from "@shared/schemas/common";
import { containerDetailDto, containerDto, containerListQuery, disposeInput, holdInput, moveInput, receiveInput, usageInput, wasteAddInput } from "@shared/schemas/stock";
import { route, WRITTEN } from "../../http/route-table";
import { UnsupportedMedia } from "../../errors";
import { containerDetail, listContainers } from "./container.queries";
import {
  disposeContainer,
  holdContainer,
  logUsage,
  markContainerEmpty,
  moveContainer,
  pourWaste,
  receiveContainers,
  releaseContainer,
} from "./container.commands";
import { presentContainer, presentContainerDetail } from "./stock.presenter";
import { containersCsv, importContainers } from "./stock-csv";

export const STOCK_KEEPERS = ["manager", "safety_officer"] as const;

const one = z.object({ container: containerDto });
export const importResult = z.object({ imported: z.number().int(), ids: z.array(z.number().int()) });

/** A CSV body sent as text/csv (or text/plain), or JSON { csv } from a form. */
/** 10 MB: a file of 20,000 containers with long location paths and names (~250 bytes a row) fits. */
export const csvBody = express.text({ type: ["text/csv", "text/plain"], limit: "10mb" });
export function csvText(body: unknown): string {
  if (typeof body === "string") return body;
  const b = body as { csv?: unknown } | undefined;
  if (b && typeof b.csv === "string") return b.csv;
  throw new UnsupportedMedia("Send the CSV file as text/csv (or JSON { csv }).", "csv");
}

export const containerRoutes = [
  route({
    method: "get",
    path: "/containers",
    summary: "Search containers (text, chemical, place, state) one page at a time",
    description:
      "The text is plain text (never query syntax): part of a chemical's name, synonym, CAS number or formula, or of a lot or supplier; a label code or #number exactly. " +
      "`total` is exact while `totalIsExact` is true; past 1,000 matches (or the end of the page asked for) counting stops and `total` is that bound: more than `total` match.",
    access: "signed_in",
    query: containerListQuery,
    output: boundedPageOf(containerDto),
    handler: async ({ ctx, actor, query }) => {
      const page = await listContainers(ctx.ds, query);
      return { items: page.items.map((c) => presentContainer(c, actor)), total: page.total, totalIsExact: page.totalIsExact };
    },
  }),
  route({
    method: "get",
    path: "/containers/export.csv",
    summary: "The containers of a search as CSV",
    access: "signed_in",
    query: containerListQuery.omit({ limit: true, offset: true }),
    produces: "text/csv",
    handler: async ({ ctx, actor, query, res }) => {
      const page = await listContainers(ctx.ds, { ...query, limit: 100_000, offset: 0 });
      res.type("text/csv").attachment("phasebook-containers.csv").send(containersCsv(page.items.map((c) => presentContainer(c, actor))));
      return WRITTEN;
    },
  }),
  route({
    method: "post",
    path: "/containers/receive",
    summary: "Receive a delivery: one or more containers of one chemical",
    access: STOCK_KEEPERS,
    body: receiveInput,
    status: 201,
    output: z.object({ containers: z.array(containerDto) }),
    handler: async ({ ctx, actor, body }) => ({ containers: (await receiveContainers(ctx, actor, body)).map((c) => presentContainer(c, actor)) }),
  }),
  route({
    method: "post",
    path: "/containers/import",
    summary: "Import containers from CSV: every row or none, each bad row listed",
    access: STOCK_KEEPERS,
    consumes: "text/csv",
    before: [csvBody],
    status: 201,
    output: importResult,
    handler: ({ ctx, actor, req }) => importContainers(ctx, actor.id, csvText(req.body)),
  }),
  route({
    method: "get",
    path: "/containers/:id",
    summary: "One container with its chemical, place, movements, usages and lineage",
    description: "Who used it, on which account and at what cost are shown only to those the container policy lets see its history (and to each person for their own usages).",
    access: "signed_in",
    policy: "container.seeHistory",
    params: idParam,
    output: containerDetailDto,
    handler: async ({ ctx, actor, params }) => presentContainerDetail(await containerDetail(ctx.ds, params.id), actor),
  }),
  route({
    method: "post",
    path: "/containers/:id/usage",
    summary: "Log a usage: take an amount, in any convertible unit",
    description: "API.md names this a member route; Phasebook allows every bench role (member, manager, safety officer).",
    access: BENCH_ROLES,
    policy: "container.draw",
    params: idParam,
    body: usageInput,
    output: one,
    handler: async ({ ctx, actor, params, body }) => ({ container: presentContainer(await logUsage(ctx, actor, params.id, body), actor) }),
  }),
  route({
    method: "post",
    path: "/containers/:id/move",
    summary: "Move a container to another location",
    access: "signed_in",
    policy: "container.move",
    params: idParam,
    body: moveInput,
    output: one,
    handler: async ({ ctx, actor, params, body }) => ({ container: presentContainer(await moveContainer(ctx, actor, params.id, body), actor) }),
  }),
  route({
    method: "post",
    path: "/containers/:id/waste",
    summary: "Pour an amount into a waste container",
    access: "signed_in",
    policy: "container.pourWaste",
    params: idParam,
    body: wasteAddInput,
    output: one,
    handler: async ({ ctx, actor, params, body }) => ({ container: presentContainer(await pourWaste(ctx, actor, params.id, body), actor) }),
  }),
  route({
    method: "post",
    path: "/containers/:id/hold",
    summary: "Place a container on hold",
    access: STOCK_KEEPERS,
    policy: "container.hold",
    params: idParam,
    body: holdInput,
    output: one,
    handler: async ({ ctx, actor, params, body }) => ({ container: presentContainer(await holdContainer(ctx, actor, params.id, body.reason), actor) }),
  }),
  route({
    method: "post",
    path: "/containers/:id/release",
    summary: "Release a container from its hold",
    access: STOCK_KEEPERS,
    policy: "container.release",
    params: idParam,
    output: one,
    handler: async ({ ctx, actor, params }) => ({ container: presentContainer(await releaseContainer(ctx, actor, params.id), actor) }),
  }),
  route({
    method: "post",
    path: "/containers/:id/empty",
    summary: "Mark a container empty",
    access: "signed_in",
    policy: "container.markEmpty",
    params: idParam,
    output: one,
    handler: async ({ ctx, actor, params }) => ({ container: presentContainer(await markContainerEmpty(ctx, actor, params.id), actor) }),
  }),
  route({
    method: "post",
    path: "/containers/:id/dispose",
    summary: "Record that a container was disposed of",
    access: STOCK_KEEPERS,
    policy: "container.dispose",
    params: idParam,
    body: disposeInput,
    output: one,
    handler: async ({ ctx, actor, params, body }) => ({ container: presentContainer(await disposeContainer(ctx, actor, params.id, body), actor) }),
  }),
];

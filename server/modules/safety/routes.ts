/**
 * The Safety review (safety officer, manager): per-location totals against limits (contract
 * GET /api/safety/locations), the review lists, the printable report, sheets due for review;
 * and the chemicals' safety data sheets, which everyone signed in may read.
 */
import type { Request, Response } from "express";
import multer from "multer";
import { z } from "zod";
import { idParam, pageOf } from "@shared/schemas/common";
import { locationTotalsDto, sdsDto, sdsUploadFields, SDS_MAX_BYTES } from "@shared/schemas/stock";
import { safetyReviewDto } from "@shared/schemas/safety";
import { route, WRITTEN, type RouteTable } from "../../http/route-table";
import { AppError } from "../../errors";
import { safetyLocationTotals, safetyReview } from "./safety.queries";
import { renderSafetyReport } from "./safety-report";
import { listSheets, sheetFile, sheetsDue, uploadSheet } from "./sds";
import { addLimit, removeLimit, replaceLimit } from "./limit.commands";
import { presentLimit } from "../stockroom";
import { storageLimitInput } from "@shared/schemas/storage";
import { locationLimitDto } from "@shared/schemas/stock";
import { id } from "@shared/schemas/common";

const limitParams = z.object({ id: id(), limitId: id() });

const REVIEWERS = ["safety_officer", "manager"] as const;
const STOCK_KEEPERS = ["manager", "safety_officer"] as const;

// preservePath: see the name as sent, so one with folder parts is refused rather than silently cut down.
const upload = multer({ storage: multer.memoryStorage(), preservePath: true, limits: { fileSize: SDS_MAX_BYTES, files: 1, fields: 10, parts: 12 } }).single("file");

/** multer as a promise, its errors turned into problems that name the file field. */
function receiveFile(req: Request, res: Response): Promise<void> {
  return new Promise((resolve, reject) => {
    upload(req, res, (err: unknown) => {
      if (!err) return resolve();
      const e = err as { code?: string; message?: string };
      if (e.code === "LIMIT_FILE_SIZE") return reject(new AppError(413, "too_large", `The file is larger than ${SDS_MAX_BYTES / 1024 / 1024} MB.`, [{ path: "file", message: "Too large." }]));
      reject(new AppError(400, "bad_upload", e.message ?? "The upload could not be read.", [{ path: "file", message: e.message ?? "Unreadable upload." }]));
    });
  });
}

export const safetyTable: RouteTable = {
  module: "safety",
  description: "The Safety review: storage totals per location against the limits the fire code and the safety office set, the review lists, its PDF, and safety data sheets.",
  routes: [
    route({
      method: "get",
      path: "/safety/locations",
      summary: "Per location: flammable totals by category against its limits",
      description: "Limits are those of the local fire code and the institution's safety office, which take precedence over anything Phasebook computes.",
      access: REVIEWERS,
      output: pageOf(locationTotalsDto),
      handler: async ({ ctx }) => {
        const items = await safetyLocationTotals(ctx.ds);
        return { items, total: items.length };
      },
    }),
    route({
      method: "get",
      path: "/safety/review",
      summary: "The review lists: hazardous substances, expired stock, no place, holds, halogenated waste, sheets due",
      access: REVIEWERS,
      output: safetyReviewDto,
      handler: ({ ctx }) => safetyReview(ctx.ds, ctx.now(), ctx.config.FACILITY_TZ),
    }),
    route({
      method: "get",
      path: "/safety/sds-due",
      summary: "Safety data sheets past their review period",
      access: REVIEWERS,
      output: pageOf(sdsDto),
      handler: async ({ ctx }) => {
        const items = await sheetsDue(ctx);
        return { items, total: items.length };
      },
    }),
    route({
      method: "get",
      path: "/safety/report.pdf",
      summary: "The Safety review as a PDF",
      access: REVIEWERS,
      produces: "application/pdf",
      handler: async ({ ctx, res }) => {
        const pdf = await renderSafetyReport(ctx.ds, ctx.now(), ctx.config.FACILITY_TZ);
        res.type("application/pdf").setHeader("Content-Disposition", `inline; filename="phasebook-safety-review.pdf"`);
        res.send(pdf);
        return WRITTEN;
      },
    }),
    route({
      method: "post",
      path: "/locations/:id/limits",
      summary: "Set a storage limit on a location: a group of liquid classes and the most litres (or US gallons) of them",
      access: REVIEWERS,
      params: idParam,
      body: storageLimitInput,
      status: 201,
      output: z.object({ limit: locationLimitDto }),
      handler: async ({ ctx, actor, params, body }) => ({ limit: presentLimit(await addLimit(ctx, actor, params.id, body)) }),
    }),
    route({
      method: "put",
      path: "/locations/:id/limits/:limitId",
      summary: "Change a storage limit",
      access: REVIEWERS,
      params: limitParams,
      body: storageLimitInput,
      output: z.object({ limit: locationLimitDto }),
      handler: async ({ ctx, actor, params, body }) => ({ limit: presentLimit(await replaceLimit(ctx, actor, params.id, params.limitId, body)) }),
    }),
    route({
      method: "delete",
      path: "/locations/:id/limits/:limitId",
      summary: "Remove a storage limit",
      access: REVIEWERS,
      params: limitParams,
      status: 204,
      handler: async ({ ctx, actor, params }) => {
        await removeLimit(ctx, actor, params.id, params.limitId);
      },
    }),
    route({
      method: "get",
      path: "/chemicals/:id/sds",
      summary: "A chemical's safety data sheets, newest review first",
      access: "signed_in",
      params: idParam,
      output: pageOf(sdsDto),
      handler: async ({ ctx, params }) => {
        const items = await listSheets(ctx, params.id);
        return { items, total: items.length };
      },
    }),
    route({
      method: "post",
      path: "/chemicals/:id/sds",
      summary: "Upload a safety data sheet (PDF, multipart field `file`, with `reviewedOn` and `supplier`)",
      access: STOCK_KEEPERS,
      params: idParam,
      consumes: "multipart/form-data",
      status: 201,
      output: z.object({ sheet: sdsDto }),
      handler: async ({ ctx, actor, params, req, res }) => {
        await receiveFile(req, res);
        const fields = sdsUploadFields.parse(req.body ?? {});
        return { sheet: await uploadSheet(ctx, actor.id, params.id, req.file, fields) };
      },
    }),
    route({
      method: "get",
      path: "/sds/:id/file",
      summary: "Download a safety data sheet",
      access: "signed_in",
      params: idParam,
      produces: "application/pdf",
      handler: async ({ ctx, params, res }) => {
        const f = await sheetFile(ctx, params.id);
        // attachment() writes both filename= (ASCII fallback) and filename*= (RFC 6266 / RFC 5987).
        res.attachment(f.originalName).type("application/pdf");
        await new Promise<void>((resolve, reject) => res.sendFile(f.fullPath, (e) => (e ? reject(e) : resolve())));
        return WRITTEN;
      },
    }),
  ],
};

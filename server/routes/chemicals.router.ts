/**
 * Chemicals: the contract list and create (GET/POST /api/chemicals), one record, changes,
 * holds, CSV import/export and the chemical's safety data sheets.
 */
import express, { Router, type Request } from "express";
import multer from "multer";
import { idParam } from "@shared/schemas/common";
import {
  chemicalInput,
  chemicalListQuery,
  chemicalUpdate,
  holdInput,
  sdsUploadFields,
  type ChemicalInput,
  type ChemicalListQuery,
  type ChemicalUpdate,
  type HoldInput,
} from "@shared/schemas/stock";
import type { Ctx } from "../context";
import { currentUser, requireAuth, requireRole } from "../middleware/auth";
import { body, params, query, validate } from "../middleware/validate";
import { AppError } from "../errors";
import { presentChemical } from "../presenters/stock.presenter";
import { chemicalsCsv } from "../services/stock-csv.service";
import { SDS_MAX_BYTES, UnsupportedMedia } from "../services/sds.service";

const STOCK_KEEPERS = ["manager", "safety_officer"] as const;

/** A CSV body sent as text/csv (or text/plain), or JSON { csv } from a form. */
export const csvBody = express.text({ type: ["text/csv", "text/plain"], limit: "5mb" });
export function csvText(req: Request): string {
  if (typeof req.body === "string") return req.body;
  const b = req.body as { csv?: unknown } | undefined;
  if (b && typeof b.csv === "string") return b.csv;
  throw new UnsupportedMedia("Send the CSV file as text/csv (or JSON { csv }).", "csv");
}

// preservePath: see the name as sent, so one with folder parts is refused rather than silently cut down.
const upload = multer({ storage: multer.memoryStorage(), preservePath: true, limits: { fileSize: SDS_MAX_BYTES, files: 1, fields: 10, parts: 12 } }).single("file");

/** multer as a promise, its errors turned into problems that name the file field. */
function receiveFile(req: Request, res: express.Response): Promise<void> {
  return new Promise((resolve, reject) => {
    upload(req, res, (err: unknown) => {
      if (!err) return resolve();
      const e = err as { code?: string; message?: string };
      if (e.code === "LIMIT_FILE_SIZE") return reject(new AppError(413, "too_large", `The file is larger than ${SDS_MAX_BYTES / 1024 / 1024} MB.`, [{ path: "file", message: "Too large." }]));
      reject(new AppError(400, "bad_upload", e.message ?? "The upload could not be read.", [{ path: "file", message: e.message ?? "Unreadable upload." }]));
    });
  });
}

export function createChemicalsRouter(ctx: Ctx): Router {
  const r = Router();
  const chemicals = ctx.services.chemicals;

  r.get("/", requireAuth, validate({ query: chemicalListQuery }), async (req, res) => {
    const page = await chemicals.list(query<ChemicalListQuery>(req));
    res.json({ items: page.items.map(presentChemical), total: page.total });
  });

  r.post("/", requireRole(...STOCK_KEEPERS), validate({ body: chemicalInput }), async (req, res) => {
    const chemical = await chemicals.create(currentUser(req).id, body<ChemicalInput>(req));
    res.status(201).json({ chemical: presentChemical(chemical) });
  });

  r.get("/export.csv", requireAuth, async (_req, res) => {
    const page = await chemicals.list({ limit: 100_000, offset: 0, sort: "name", dir: "asc" });
    res.type("text/csv").attachment("phasebook-chemicals.csv").send(chemicalsCsv(page.items.map(presentChemical)));
  });

  r.post("/import", requireRole(...STOCK_KEEPERS), csvBody, async (req, res) => {
    const result = await ctx.services.stockCsv.importChemicals(currentUser(req).id, csvText(req));
    res.status(201).json(result);
  });

  r.get("/:id", requireAuth, validate({ params: idParam }), async (req, res) => {
    res.json({ chemical: presentChemical(await chemicals.get(params<{ id: number }>(req).id)) });
  });

  r.patch("/:id", requireRole(...STOCK_KEEPERS), validate({ params: idParam, body: chemicalUpdate }), async (req, res) => {
    const chemical = await chemicals.update(currentUser(req).id, params<{ id: number }>(req).id, body<ChemicalUpdate>(req));
    res.json({ chemical: presentChemical(chemical) });
  });

  r.post("/:id/hold", requireRole(...STOCK_KEEPERS), validate({ params: idParam, body: holdInput }), async (req, res) => {
    const chemical = await chemicals.hold(currentUser(req).id, params<{ id: number }>(req).id, body<HoldInput>(req).reason);
    res.json({ chemical: presentChemical(chemical) });
  });

  r.post("/:id/release", requireRole(...STOCK_KEEPERS), validate({ params: idParam }), async (req, res) => {
    const chemical = await chemicals.release(currentUser(req).id, params<{ id: number }>(req).id);
    res.json({ chemical: presentChemical(chemical) });
  });

  r.get("/:id/sds", requireAuth, validate({ params: idParam }), async (req, res) => {
    const items = await ctx.services.sds.list(params<{ id: number }>(req).id);
    res.json({ items, total: items.length });
  });

  r.post("/:id/sds", requireRole(...STOCK_KEEPERS), validate({ params: idParam }), async (req, res) => {
    await receiveFile(req, res);
    const fields = sdsUploadFields.parse(req.body ?? {});
    const sheet = await ctx.services.sds.upload(currentUser(req).id, params<{ id: number }>(req).id, req.file, fields);
    res.status(201).json({ sheet });
  });

  return r;
}

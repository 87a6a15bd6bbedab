/**
 * Safety data sheets. A file is accepted only if its content is a PDF (the "%PDF-" signature,
 * ISO 32000-1 §7.5.2: the file begins with the header "%PDF-1.n"), not because of its name or
 * the browser's media type; it is stored in the data folder (outside the served client) under
 * a random name, and the original name — refused if it has path parts — is only used as the
 * download's name.
 */
import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import type { DataSource } from "typeorm";
import { DateTime } from "luxon";
import type { SdsDto } from "@shared/schemas/stock";
import { Chemical, SafetyDataSheet } from "../../entities";
import { NotFound, RuleBroken, UnsupportedMedia } from "../../errors";
import { serialTransaction } from "../../db/serial";
import { audit } from "../../core/audit";
import { facilityToday, sdsReviewMonths } from "./safety.queries";

// The limit is shared with the upload form, which checks it before sending.
export { SDS_MAX_BYTES } from "@shared/schemas/stock";


export function isPdf(buffer: Buffer): boolean {
  return buffer.length >= 5 && buffer.subarray(0, 5).toString("latin1") === "%PDF-";
}

/** The name as given, or a 422 if it tries to say where to put the file. */
export function checkUploadName(name: string): string {
  const trimmed = (name ?? "").trim();
  const problem =
    trimmed.length === 0
      ? "The file has no name."
      : /[/\\]/.test(trimmed) || trimmed.split(/[/\\]/).includes("..") || trimmed.startsWith(".")
        ? `"${trimmed}" contains folder parts; upload a plain file name.`
        : // eslint-disable-next-line no-control-regex
          /[\u0000-\u001f\u007f]/.test(trimmed)
          ? "The file name contains control characters."
          : trimmed.length > 200
            ? "The file name is longer than 200 characters."
            : null;
  if (problem) throw new RuleBroken(problem, [{ path: "file", message: problem }], "bad_file_name");
  return trimmed;
}

/** What the safety data sheet functions need: the database, the clock, the data folder and the facility's zone. */
export interface SdsDeps {
  ds: DataSource;
  now: () => Date;
  config: { dataDir: string; FACILITY_TZ: string };
}

const folderOf = (deps: SdsDeps) => path.join(deps.config.dataDir, "sds");

async function present({ ds, now, config }: SdsDeps, rows: (SafetyDataSheet & { chemicalName?: string })[]): Promise<SdsDto[]> {
  const months = await sdsReviewMonths(ds);
  const dueBefore = DateTime.fromISO(facilityToday(now(), config.FACILITY_TZ)).minus({ months }).toISODate()!;
  return rows.map((s) => ({
    id: s.id,
    chemicalId: s.chemicalId,
    chemicalName: s.chemicalName,
    originalName: s.originalName,
    sizeBytes: s.sizeBytes,
    supplier: s.supplier,
    reviewedOn: s.reviewedOn,
    uploadedAt: s.uploadedAt,
    due: s.reviewedOn < dueBefore,
  }));
}

/** A chemical's sheets, newest review first. */
export async function listSheets(deps: SdsDeps, chemicalId: number): Promise<SdsDto[]> {
  const { ds } = deps;
  if (!(await ds.getRepository(Chemical).existsBy({ id: chemicalId }))) throw new NotFound("That chemical");
  return present(deps, await ds.getRepository(SafetyDataSheet).find({ where: { chemicalId }, order: { reviewedOn: "DESC", id: "DESC" } }));
}

/** Stores an uploaded PDF sheet (the file first, then its row; the file goes if the row fails). */
export async function uploadSheet(
  deps: SdsDeps,
  actorId: number,
  chemicalId: number,
  file: { buffer: Buffer; originalname: string; size: number } | undefined,
  fields: { reviewedOn: string; supplier: string },
): Promise<SdsDto> {
  const { ds, now } = deps;
  const folder = folderOf(deps);
  if (!file) throw new RuleBroken("Attach the safety data sheet as a PDF file.", [{ path: "file", message: "Attach a PDF file." }], "no_file");
  const originalName = checkUploadName(file.originalname);
  if (!isPdf(file.buffer)) throw new UnsupportedMedia(`"${originalName}" is not a PDF file (its content does not start with %PDF-).`, "file", "not_a_pdf");
  if (fields.reviewedOn > facilityToday(now(), deps.config.FACILITY_TZ)) {
    throw new RuleBroken("The review date is in the future.", [{ path: "reviewedOn", message: "Give the date the sheet was issued or last reviewed." }]);
  }
  const chem = await ds.getRepository(Chemical).findOneBy({ id: chemicalId });
  if (!chem) throw new NotFound("That chemical");
  fs.mkdirSync(folder, { recursive: true, mode: 0o700 });
  const storedName = `${crypto.randomBytes(16).toString("hex")}.pdf`;
  const full = path.join(folder, storedName);
  fs.writeFileSync(full, file.buffer, { mode: 0o600, flag: "wx" });
  try {
    return await serialTransaction(ds, async (em) => {
      const res = await em.insert(SafetyDataSheet, {
        chemicalId,
        originalName,
        storedName,
        sizeBytes: file.size,
        sha256: crypto.createHash("sha256").update(file.buffer).digest("hex"),
        supplier: fields.supplier,
        reviewedOn: fields.reviewedOn,
        uploadedById: actorId,
        uploadedAt: now().toISOString(),
      });
      const id = res.identifiers[0].id as number;
      await audit(em, now(), actorId, "sds.uploaded", "chemical", chemicalId, { sdsId: id, originalName, reviewedOn: fields.reviewedOn });
      return (await present(deps, [(await em.findOneBy(SafetyDataSheet, { id }))!]))[0];
    });
  } catch (e) {
    fs.rmSync(full, { force: true });
    throw e;
  }
}

/** The stored file's path and the name to offer the browser. */
export async function sheetFile(deps: SdsDeps, id: number): Promise<{ fullPath: string; originalName: string }> {
  const s = await deps.ds.getRepository(SafetyDataSheet).findOneBy({ id });
  if (!s) throw new NotFound("That safety data sheet");
  // storedName is ours (hex + .pdf), but check anyway: the path must stay inside the folder.
  if (!/^[0-9a-f]{32}\.pdf$/.test(s.storedName)) throw new NotFound("That safety data sheet");
  const fullPath = path.join(folderOf(deps), s.storedName);
  if (!fs.existsSync(fullPath)) throw new NotFound("That safety data sheet's file");
  return { fullPath, originalName: s.originalName };
}

/** Every chemical's newest sheet that is past the review period. */
export async function sheetsDue(deps: SdsDeps): Promise<SdsDto[]> {
  const rows = (await deps.ds.query(
    `SELECT s.*, ch.name AS chemicalName FROM safety_data_sheets s JOIN chemicals ch ON ch.id = s.chemicalId
     WHERE s.id = (SELECT s2.id FROM safety_data_sheets s2 WHERE s2.chemicalId = s.chemicalId ORDER BY s2.reviewedOn DESC, s2.id DESC LIMIT 1)
     ORDER BY s.reviewedOn ASC`,
  )) as (SafetyDataSheet & { chemicalName: string })[];
  return (await present(deps, rows)).filter((s) => s.due);
}


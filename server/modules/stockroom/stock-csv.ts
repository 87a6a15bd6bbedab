/**
 * CSV import and export of the stock tables. An import is all-or-nothing: every row is checked
 * with the same rules as the forms (CAS check digit, formula, units, known chemical and
 * location), every bad row is reported with its line number and reason, and only a file with
 * no bad row is written, in one transaction. Exports are written by the shared CSV writer
 * (core/csv.ts), which applies OWASP's CSV-injection rule to every text cell.
 */
import Papa from "papaparse";
import { parseCas } from "@shared/domain/cas";
import { parseUnit, UnitError } from "@shared/domain/units";
import { chemicalInput, CONTAINER_STATUS_LABELS, type ChemicalDto, type ContainerDto } from "@shared/schemas/stock";
import { Chemical, Container, Location } from "../../entities";
import { RuleBroken, type FieldError } from "../../errors";
import { serialTransaction } from "../../db/serial";
import { prepared, refreshPlannerStatistics } from "../../db/prepared";
import { audit } from "../../core/audit";
import { toCsv, type CsvColumn } from "../../core/csv";
import { newToken } from "../../core/tokens";
import type { Deps } from "../../core/deps";
import { checkChemicalInput, insertChemical } from "./chemical.commands";
import { locationPaths } from "./stock.presenter";

export const IMPORT_MAX_ROWS = 20_000;
/** Containers per INSERT statement of an import (15 values each, far below SQLite's limit). */
const IMPORT_CHUNK = 500;

export interface BadRow {
  line: number;
  field: string | null;
  reason: string;
}

function parseCsv(text: string): { rows: Record<string, string>[]; bad: BadRow[] } {
  const parsed = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ""), {
    header: true,
    skipEmptyLines: "greedy",
    transformHeader: (h) => h.trim(),
  });
  const bad: BadRow[] = parsed.errors.map((e) => ({ line: (e.row ?? 0) + 2, field: null, reason: e.message }));
  if (parsed.data.length > IMPORT_MAX_ROWS) bad.push({ line: IMPORT_MAX_ROWS + 2, field: null, reason: `A file may hold at most ${IMPORT_MAX_ROWS} rows.` });
  return { rows: parsed.data, bad };
}

function refuse(bad: BadRow[], what: string): never {
  const sorted = [...bad].sort((a, b) => a.line - b.line);
  const errors: FieldError[] = sorted.map((b) => ({ path: `line ${b.line}${b.field ? `: ${b.field}` : ""}`, message: b.reason }));
  throw new RuleBroken(`${sorted.length} row(s) of the ${what} file are wrong; nothing was imported.`, errors, "import_refused", { rows: sorted });
}

const cell = (row: Record<string, string>, key: string): string => (row[key] ?? "").trim();

function num(row: Record<string, string>, key: string): number | undefined | string {
  const v = cell(row, key);
  if (v === "") return undefined;
  const n = Number(v);
  return Number.isFinite(n) ? n : v;
}

const list = (v: string) =>
  v
    .split(/[;,|]/)
    .map((s) => s.trim())
    .filter(Boolean);

/** Line numbers count the header as line 1; Papa's row index starts at 0 for the first data row. */
const lineOf = (index: number) => index + 2;

/** Imports chemicals from CSV: all rows or none, every bad row listed. */
export async function importChemicals({ ds, now }: Deps, actorId: number, text: string): Promise<{ imported: number; ids: number[] }> {
  const { rows, bad } = parseCsv(text);
  if (rows.length === 0 && bad.length === 0) bad.push({ line: 2, field: null, reason: "The file has no data rows." });
  const checked: Partial<Chemical>[] = [];
  const seen = new Map<string, number>();
  const existing = new Set(((await ds.query(`SELECT casNumber, lower(name) AS name FROM chemicals`)) as { casNumber: string; name: string }[]).map((r) => `${r.casNumber}|${r.name}`));
  rows.forEach((row, i) => {
    const line = lineOf(i);
    const raw = {
      name: cell(row, "name"),
      casNumber: cell(row, "casNumber"),
      formula: cell(row, "formula") || undefined,
      molarMass: num(row, "molarMass"),
      synonyms: cell(row, "synonyms") ? list(cell(row, "synonyms")) : undefined,
      hazardStatements: cell(row, "hazardStatements") ? list(cell(row, "hazardStatements").replace(/\s+/g, ";")) : undefined,
      signalWord: cell(row, "signalWord") || undefined,
      precautions: cell(row, "precautions") || undefined,
      flashPointC: num(row, "flashPointC"),
      boilingPointC: num(row, "boilingPointC"),
      densityGPerMl: num(row, "densityGPerMl"),
      storageGroup: cell(row, "storageGroup") || undefined,
      reorderPoint: num(row, "reorderPoint"),
      reorderUnit: cell(row, "reorderUnit") || undefined,
      unitCostCents: num(row, "unitCostCents"),
      costUnit: cell(row, "costUnit") || undefined,
    };
    const shape = chemicalInput.safeParse(raw);
    if (!shape.success) {
      for (const issue of shape.error.issues) bad.push({ line, field: issue.path.join(".") || null, reason: issue.message });
      return;
    }
    const { values, errors } = checkChemicalInput(shape.data);
    for (const e of errors) bad.push({ line, field: e.path, reason: e.message });
    if (errors.length) return;
    const key = `${values.casNumber}|${values.name!.toLowerCase()}`;
    if (existing.has(key)) bad.push({ line, field: "casNumber", reason: `${values.name} (${values.casNumber}) is already on record.` });
    else if (seen.has(key)) bad.push({ line, field: "casNumber", reason: `Same chemical as line ${seen.get(key)}.` });
    else {
      seen.set(key, line);
      checked.push(values);
    }
  });
  if (bad.length) refuse(bad, "chemicals");
  const ids = await serialTransaction(ds, async (em) => {
    const out: number[] = [];
    for (const values of checked) out.push((await insertChemical(em, now(), actorId, values)).id);
    await audit(em, now(), actorId, "chemicals.imported", "chemical", null, { count: out.length });
    return out;
  });
  refreshPlannerStatistics(ds);
  return { imported: ids.length, ids };
}

/** Imports containers from CSV: all rows or none, every bad row listed. */
export async function importContainers({ ds, now }: Deps, actorId: number, text: string): Promise<{ imported: number; ids: number[] }> {
  const { rows, bad } = parseCsv(text);
  if (rows.length === 0 && bad.length === 0) bad.push({ line: 2, field: null, reason: "The file has no data rows." });
  const chemicals = await ds.getRepository(Chemical).find();
  const byCas = new Map<string, Chemical[]>();
  for (const c of chemicals) byCas.set(c.casNumber, [...(byCas.get(c.casNumber) ?? []), c]);
  const locationIds = new Set<number>();
  const locations = await ds.getRepository(Location).find();
  const paths = locationPaths(locations);
  const byPath = new Map<string, number>();
  for (const l of locations) {
    locationIds.add(l.id);
    byPath.set((paths.get(l.id) ?? l.name).toLowerCase(), l.id);
    if (!byPath.has(l.name.toLowerCase())) byPath.set(l.name.toLowerCase(), l.id);
  }
  const good: Omit<Partial<Container>, "chemical" | "location" | "group">[] = [];
  rows.forEach((row, i) => {
    const line = lineOf(i);
    const errs: BadRow[] = [];
    let chemicalId: number | null = null;
    const cas = cell(row, "casNumber");
    if (!cas) errs.push({ line, field: "casNumber", reason: "Give the chemical's CAS number." });
    else {
      const parsed = parseCas(cas);
      if (!parsed.ok) errs.push({ line, field: "casNumber", reason: parsed.message });
      else {
        const name = cell(row, "chemicalName").toLowerCase();
        const matches = (byCas.get(parsed.cas) ?? []).filter((c) => !name || c.name.toLowerCase() === name);
        if (matches.length === 0) errs.push({ line, field: "casNumber", reason: `No chemical on record has CAS ${parsed.cas}${name ? ` and the name "${cell(row, "chemicalName")}"` : ""}; import the chemical first.` });
        else if (matches.length > 1) errs.push({ line, field: "chemicalName", reason: `Several chemicals have CAS ${parsed.cas}; add the chemicalName column to choose.` });
        else chemicalId = matches[0].id;
      }
    }
    const quantity = num(row, "quantity");
    if (typeof quantity !== "number" || quantity < 0 || quantity > 1e9) errs.push({ line, field: "quantity", reason: `"${cell(row, "quantity")}" is not a quantity between 0 and 1e9.` });
    let unit: string | null = null;
    try {
      unit = parseUnit(cell(row, "unit"));
    } catch (e) {
      if (!(e instanceof UnitError)) throw e;
      errs.push({ line, field: "unit", reason: e.message });
    }
    let locationId: number | null = null;
    const loc = cell(row, "location");
    if (loc) {
      const id = /^\d+$/.test(loc) ? (locationIds.has(Number(loc)) ? Number(loc) : undefined) : byPath.get(loc.toLowerCase());
      if (id === undefined) errs.push({ line, field: "location", reason: `There is no location "${loc}" (give its id, name or full path).` });
      else locationId = id;
    }
    const status = cell(row, "status") || "sealed";
    if (status !== "sealed" && status !== "in_use") errs.push({ line, field: "status", reason: `Imported containers are "sealed" or "in_use", not "${status}".` });
    const kind = cell(row, "kind") || "bottle";
    if (!["bottle", "vial", "waste"].includes(kind)) errs.push({ line, field: "kind", reason: `The kind is bottle, vial or waste, not "${kind}".` });
    for (const f of ["expiresAt", "retestAt"]) {
      const v = cell(row, f);
      if (v && (!/^\d{4}-\d{2}-\d{2}$/.test(v) || Number.isNaN(Date.parse(v)))) errs.push({ line, field: f, reason: `"${v}" is not a date as YYYY-MM-DD.` });
    }
    const price = num(row, "priceCents");
    if (price !== undefined && (typeof price !== "number" || !Number.isInteger(price) || price < 0)) errs.push({ line, field: "priceCents", reason: "Give the price in whole cents." });
    if (errs.length) {
      bad.push(...errs);
      return;
    }
    good.push({
      chemicalId: chemicalId!,
      kind: kind as Container["kind"],
      quantity: quantity as number,
      initialQuantity: quantity as number,
      unit: unit!,
      locationId,
      status: status as Container["status"],
      openedAt: status === "in_use" ? now().toISOString() : null,
      expiresAt: cell(row, "expiresAt") || null,
      retestAt: cell(row, "retestAt") || null,
      supplier: cell(row, "supplier").slice(0, 200),
      lot: cell(row, "lot").slice(0, 200),
      priceCents: (price as number | undefined) ?? null,
    });
  });
  if (bad.length) refuse(bad, "containers");
  // A file may hold 20,000 rows: multi-row inserts of IMPORT_CHUNK rows on the transaction's
  // connection (the full-text index, filled by trigger, writes once per statement rather than once
  // per row), then every new container's "received" movement in one statement. The write queue
  // is ours, so the new containers are exactly those above the highest id before.
  const ids = await serialTransaction(ds, async (em) => {
    const at = now().toISOString();
    const { last } = prepared(em.connection, `SELECT COALESCE(MAX(id), 0) AS last FROM containers`).get() as { last: number };
    const COLUMNS = `chemicalId, kind, quantity, initialQuantity, unit, locationId, status, openedAt, expiresAt, retestAt, labelToken, supplier, lot, priceCents, createdAt`;
    const row = `(${COLUMNS.split(",").map(() => "?").join(", ")})`;
    for (let i = 0; i < good.length; i += IMPORT_CHUNK) {
      const chunk = good.slice(i, i + IMPORT_CHUNK);
      const values = chunk.flatMap((c) => [
        c.chemicalId, c.kind, c.quantity, c.initialQuantity, c.unit, c.locationId ?? null, c.status, c.openedAt ?? null, c.expiresAt ?? null, c.retestAt ?? null,
        newToken(18), c.supplier, c.lot, c.priceCents ?? null, at,
      ]);
      prepared(em.connection, `INSERT INTO containers (${COLUMNS}) VALUES ${chunk.map(() => row).join(", ")}`).run(...values);
    }
    prepared(
      em.connection,
      `INSERT INTO container_movements (containerId, fromLocationId, toLocationId, userId, kind, note, at)
       SELECT id, NULL, locationId, ?, 'received', 'CSV import', ? FROM containers WHERE id > ? ORDER BY id`,
    ).run(actorId, at, last);
    const out = (prepared(em.connection, `SELECT id FROM containers WHERE id > ? ORDER BY id`).all(last) as { id: number }[]).map((r) => r.id);
    await audit(em, now(), actorId, "containers.imported", "container", null, { count: out.length });
    return out;
  });
  // Many new rows at once: let SQLite refresh the statistics its query planner reads.
  refreshPlannerStatistics(ds);
  return { imported: ids.length, ids };
}

/** Every column of the chemicals export; text goes through the shared writer's formula guard. */
const CHEMICAL_COLUMNS: CsvColumn<ChemicalDto>[] = [
  { header: "id", kind: "number", value: (c) => c.id },
  { header: "name", value: (c) => c.name },
  { header: "casNumber", value: (c) => c.casNumber },
  { header: "formula", value: (c) => c.formula },
  { header: "molarMass", kind: "number", value: (c) => c.molarMass },
  { header: "synonyms", value: (c) => c.synonyms.join("; ") },
  { header: "hazardStatements", value: (c) => c.hazardStatements.join(" ") },
  { header: "signalWord", value: (c) => c.signalWord },
  { header: "flashPointC", kind: "number", value: (c) => c.flashPointC },
  { header: "boilingPointC", kind: "number", value: (c) => c.boilingPointC },
  { header: "densityGPerMl", kind: "number", value: (c) => c.densityGPerMl },
  { header: "ghsFlammableCategory", kind: "number", value: (c) => c.ghsFlammableCategory },
  { header: "nfpaClass", value: (c) => c.nfpaClass },
  { header: "carcinogen", value: (c) => c.carcinogen },
  { header: "acuteToxic", value: (c) => c.acuteToxic },
  { header: "storageGroup", value: (c) => c.storageGroup },
  { header: "reorderPoint", kind: "number", value: (c) => c.reorderPoint },
  { header: "reorderUnit", value: (c) => c.reorderUnit },
  { header: "unitCostCents", kind: "number", value: (c) => c.unitCostCents },
  { header: "costUnit", value: (c) => c.costUnit },
  { header: "onHold", value: (c) => c.onHoldReason },
];

/** Every column of the containers export. */
const CONTAINER_COLUMNS: CsvColumn<ContainerDto>[] = [
  { header: "id", kind: "number", value: (c) => c.id },
  { header: "chemicalName", value: (c) => c.chemicalName },
  { header: "casNumber", value: (c) => c.casNumber },
  { header: "kind", value: (c) => c.kind },
  { header: "quantity", kind: "number", value: (c) => c.quantity },
  { header: "unit", value: (c) => c.unit },
  { header: "status", value: (c) => CONTAINER_STATUS_LABELS[c.status] },
  { header: "location", value: (c) => c.locationName },
  { header: "expiresAt", value: (c) => c.expiresAt },
  { header: "retestAt", value: (c) => c.retestAt },
  { header: "openedAt", value: (c) => c.openedAt },
  { header: "supplier", value: (c) => c.supplier },
  { header: "lot", value: (c) => c.lot },
  { header: "priceCents", kind: "number", value: (c) => c.priceCents },
  { header: "holdReason", value: (c) => c.holdReason },
];

export function chemicalsCsv(items: ChemicalDto[]): string {
  return toCsv(items, CHEMICAL_COLUMNS);
}

export function containersCsv(items: ContainerDto[]): string {
  return toCsv(items, CONTAINER_COLUMNS);
}

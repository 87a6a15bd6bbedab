/** Reads of chemicals: the Stockroom's chemicals list (contract GET /api/chemicals) and one record. */
import type { DataSource } from "typeorm";
import type { ChemicalListQuery } from "@shared/schemas/stock";
import { Chemical } from "../../entities";
import { NotFound } from "../../errors";
import { prepared, readEntities } from "../../db/prepared";
import { matchingRowids, pageTotal, type BoundedTotal } from "../../db/text-search";
import { CHEMICAL_TEXT } from "./container-search";

const SORT_COLUMNS: Record<ChemicalListQuery["sort"], string> = { name: "ch.name", casNumber: "ch.casNumber", flashPointC: "ch.flashPointC", createdAt: "ch.createdAt" };

/**
 * One page of chemicals: the text (part of a name, synonym, CAS number or formula) found through
 * the chemicals' full-text index, the hold filter, a sort, and a total that stops counting at the
 * bound of server/db/text-search.ts.
 */
export function listChemicals(ds: DataSource, q: ChemicalListQuery): { items: Chemical[] } & BoundedTotal {
  const where: string[] = [];
  const args: unknown[] = [];
  if (q.q) {
    where.push(`ch.id IN (SELECT value FROM json_each(?))`);
    args.push(JSON.stringify(matchingRowids(ds, CHEMICAL_TEXT, q.q, Number.MAX_SAFE_INTEGER)));
  }
  if (q.onHold === "true") where.push("ch.onHoldReason IS NOT NULL");
  if (q.onHold === "false") where.push("ch.onHoldReason IS NULL");
  const whereSql = where.length ? `WHERE ${where.join(" AND ")}` : "";
  const dir = q.dir === "desc" ? "DESC" : "ASC";
  const items = readEntities(ds, Chemical, `SELECT ch.* FROM chemicals ch ${whereSql} ORDER BY ${SORT_COLUMNS[q.sort]} ${dir}, ch.id ASC LIMIT ? OFFSET ?`, ...args, q.limit, q.offset);
  const total = pageTotal(items.length, q.offset, q.limit, (upTo) => (prepared(ds, `SELECT COUNT(*) AS n FROM (SELECT 1 FROM chemicals ch ${whereSql} LIMIT ?)`).get(...args, upTo) as { n: number }).n);
  return { items, ...total };
}

export async function getChemical(ds: DataSource, id: number): Promise<Chemical> {
  const c = await ds.getRepository(Chemical).findOneBy({ id });
  if (!c) throw new NotFound("That chemical");
  return c;
}

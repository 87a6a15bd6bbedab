/**
 * The Stockroom search (GET /api/containers) in work that grows with the page, not the stockroom.
 *
 * Text: a container matches when its chemical's name, synonyms, CAS number or formula, or its own
 * lot or supplier, hold the text (parts of words; ASCII letters in either case), or when the text
 * is its label code or its number (#123). Chemicals are found through `chemical_text`, containers'
 * own text through `container_text` (FTS5 trigram indexes, server/db/text-search.ts). A text in
 * the lot or supplier of more than OWN_TEXT_LIST_MAX containers (a supplier's name, "LOT"), or
 * shorter than three characters, is checked row by row instead: it matches broadly, so the
 * reads below stop early.
 *
 * A page is read as a series of segments, each in an order an index gives: by chemical or
 * location, one segment per chemical (location) in name order, found through the name index
 * and counted through the (chemicalId, locationId, status) and (chemicalId, status) indexes; by
 * expiry, the dated containers then the undated ones; other sorts, one segment in their column's
 * index. Segments are counted only as far as the page and the bounded total need
 * (`totalIsExact: false` beyond the bound of text-search.ts), and rows are read only from the
 * segments the page falls in.
 */
import type { DataSource } from "typeorm";
import type { ContainerListQuery } from "@shared/schemas/stock";
import { prepared } from "../../db/prepared";
import { boundedTotal, countCap, likeAny, matchingRowids, pageTotal, TRIGRAM, type BoundedTotal, type TextIndex } from "../../db/text-search";
import type { ContainerRow } from "./stock.presenter";

/** Chemicals' searchable text (synonyms one per line), kept by the TextSearch migration's triggers. */
export const CHEMICAL_TEXT: TextIndex = { table: "chemical_text", columns: ["name", "synonyms", "casNumber", "formula"] };
/** Containers' own searchable text. */
export const CONTAINER_TEXT: TextIndex = { table: "container_text", columns: ["lot", "supplier"] };

/** Containers found by their own text beyond this many are checked row by row instead of listed. */
const OWN_TEXT_LIST_MAX = 2_000;
/** Matches a grouped page counts in one pass before it counts group by group instead. */
const GROUPING_PASS_MAX = 1_000;

const ROW_COLUMNS = `c.*, ch.name AS chemicalName, ch.casNumber AS casNumber, ch.onHoldReason AS chemicalHoldReason, l.name AS locationName`;
const ROW_FROM = `FROM containers c JOIN chemicals ch ON ch.id = c.chemicalId LEFT JOIN locations l ON l.id = c.locationId`;

/** Sorts read as one segment: the column (its index gives the order, then the id). */
const COLUMN_SORTS: Record<"id" | "quantity" | "status" | "lot", string> = { id: "", quantity: "c.quantity", status: "c.status", lot: "c.lot" };

/** AND-ed conditions on `containers c`, with their arguments. */
interface Where {
  sql: string[];
  args: unknown[];
}

const NOTHING: Where = { sql: [], args: [] };
const and = (...parts: Where[]): Where => ({ sql: parts.flatMap((p) => p.sql), args: parts.flatMap((p) => p.args) });
const whereSql = (w: Where) => (w.sql.length ? `WHERE ${w.sql.join(" AND ")}` : "");
const inList = (column: string, ids: readonly unknown[]): Where => ({ sql: [`${column} IN (SELECT value FROM json_each(?))`], args: [JSON.stringify(ids)] });

/** What a search text found. */
interface TextMatch {
  /** Chemicals whose own text holds it: all their containers match. */
  chemicalIds: number[];
  /** Containers matched by their own text, label code or number: a list, or null when checked row by row. */
  containerIds: number[] | null;
  /** The text's condition on one container row. */
  row: Where;
}

/** The label code in a text: the text itself, or the end of a scanned label's address (…/s/<code>). */
function labelCodeOf(text: string): string {
  const m = /\/s\/([A-Za-z0-9_-]+)\/?$/.exec(text);
  return m ? m[1] : text;
}

function matchText(ds: DataSource, text: string): TextMatch {
  const chemicalIds = matchingRowids(ds, CHEMICAL_TEXT, text, Number.MAX_SAFE_INTEGER);
  const exact: number[] = [];
  const label = prepared(ds, `SELECT id FROM containers WHERE labelToken = ?`).get(labelCodeOf(text)) as { id: number } | undefined;
  if (label) exact.push(label.id);
  const asNumber = /^#?([1-9]\d{0,14})$/.exec(text);
  if (asNumber) exact.push(Number(asNumber[1]));
  const own = [...text].length >= TRIGRAM ? matchingRowids(ds, CONTAINER_TEXT, text, OWN_TEXT_LIST_MAX + 1) : null;
  const listed = own !== null && own.length <= OWN_TEXT_LIST_MAX;
  const ids = listed ? [...new Set([...own!, ...exact])] : exact;
  const ors: Where[] = [];
  if (chemicalIds.length) ors.push(inList("c.chemicalId", chemicalIds));
  if (ids.length) ors.push(inList("c.id", ids));
  if (!listed) {
    const like = likeAny(CONTAINER_TEXT.columns, text, "c.");
    ors.push({ sql: [like.sql], args: like.args });
  }
  const row: Where = ors.length === 0 ? { sql: ["0"], args: [] } : ors.length === 1 ? ors[0] : { sql: [`(${ors.map((o) => o.sql[0]).join(" OR ")})`], args: ors.flatMap((o) => o.args) };
  return { chemicalIds, containerIds: listed ? ids : null, row };
}

/** The filters other than the text; `locationIds` are the location and, with `within`, what it holds. */
function filtersOf(q: ContainerListQuery, locationIds: number[] | null): Where {
  const parts: Where[] = [];
  if (q.chemicalId) parts.push({ sql: ["c.chemicalId = ?"], args: [q.chemicalId] });
  if (locationIds) parts.push(inList("c.locationId", locationIds));
  if (q.status?.length) parts.push(inList("c.status", q.status));
  if (q.kind) parts.push({ sql: ["c.kind = ?"], args: [q.kind] });
  return and(...parts);
}

function countUpTo(ds: DataSource, w: Where, upTo: number): number {
  return (prepared(ds, `SELECT COUNT(*) AS n FROM (SELECT 1 FROM containers c ${whereSql(w)} LIMIT ?)`).get(...w.args, upTo) as { n: number }).n;
}

function rows(ds: DataSource, w: Where, orderBy: string, limit: number, offset: number): ContainerRow[] {
  return prepared(ds, `SELECT ${ROW_COLUMNS} ${ROW_FROM} ${whereSql(w)} ORDER BY ${orderBy} LIMIT ? OFFSET ?`).all(...w.args, limit, offset) as ContainerRow[];
}

export interface ContainerPage extends BoundedTotal {
  items: ContainerRow[];
}

/** The search: filters, text, sort and one page, with a bounded total. */
export function searchContainers(ds: DataSource, q: ContainerListQuery, locationIds: number[] | null): ContainerPage {
  const filters = filtersOf(q, locationIds);
  const text = q.q ? matchText(ds, q.q) : null;
  const dir = q.dir === "desc" ? "DESC" : "ASC";
  const all = text ? and(filters, text.row) : filters;
  if (q.sort === "chemical" || q.sort === "location") return byGroup(ds, q, filters, text, dir);
  if (q.sort === "expiresAt") {
    // Containers without a date come last either way: "soonest expiry first" must not open on them.
    return walk(ds, q, [
      { where: and(all, { sql: ["c.expiresAt IS NOT NULL"], args: [] }), orderBy: `c.expiresAt ${dir}, c.id ${dir}` },
      { where: and(all, { sql: ["c.expiresAt IS NULL"], args: [] }), orderBy: `c.id ${dir}` },
    ]);
  }
  const column = COLUMN_SORTS[q.sort];
  const items = rows(ds, all, `${column ? `${column} ${dir}, ` : ""}c.id ${dir}`, q.limit, q.offset);
  return { items, ...pageTotal(items.length, q.offset, q.limit, (upTo) => countUpTo(ds, all, upTo)) };
}

/** Part of a page's order: the rows meeting `where`, in `orderBy`; `count` when already known. */
interface Segment {
  where: Where;
  orderBy: string;
  count?: number;
}

/**
 * Reads a page across segments in order: each counted up to what the page and the bounded total
 * still need, rows read only from the segments the page falls in. Leaving early closes the
 * segments' generator (and any statement it iterates).
 */
function walk(ds: DataSource, q: ContainerListQuery, segments: Iterable<Segment>, knownTotal?: number): ContainerPage {
  const cap = countCap(q.offset, q.limit);
  let counted = 0;
  let skip = q.offset;
  let need = q.limit;
  const items: ContainerRow[] = [];
  for (const s of segments) {
    const n = s.count ?? countUpTo(ds, s.where, cap + 1 - counted);
    if (n > 0 && need > 0) {
      if (skip >= n) skip -= n;
      else {
        const take = Math.min(n - skip, need);
        items.push(...rows(ds, s.where, s.orderBy, take, skip));
        need -= take;
        skip = 0;
      }
    }
    counted += n;
    if (counted > cap || (knownTotal !== undefined && need <= 0)) break;
  }
  return { items, ...boundedTotal(knownTotal ?? counted, cap) };
}

/**
 * By chemical (or location): one segment per group in name order, then id (containers without a
 * location first ascending, as SQLite sorts NULL). When the matches are at most
 * GROUPING_PASS_MAX, one pass counts every group and only groups that hold any are visited;
 * otherwise the groups are walked in name order through the name index and counted one by one.
 */
function byGroup(ds: DataSource, q: ContainerListQuery, filters: Where, text: TextMatch | null, dir: "ASC" | "DESC"): ContainerPage {
  const byChemical = q.sort === "chemical";
  const key = byChemical ? "c.chemicalId" : "c.locationId";
  const table = byChemical ? "chemicals" : "locations";
  const inGroup = (id: number | null): Where => (id === null ? { sql: [`${key} IS NULL`], args: [] } : { sql: [`${key} = ?`], args: [id] });
  const all = text ? and(filters, text.row) : filters;
  let within = (id: number | null): Where => and(all, inGroup(id));
  /** The matches as disjoint parts, for the counting pass. */
  let parts: Where[] = [all];

  if (byChemical && text?.containerIds) {
    // By chemical, a listed text names its groups: the chemicals it found (all their containers
    // match) and the chemicals of the containers it found by lot, supplier, label or number.
    const found = new Set(text.chemicalIds);
    const own = new Map<number, number[]>();
    const owned = prepared(ds, `SELECT id, chemicalId FROM containers WHERE id IN (SELECT value FROM json_each(?))`).all(JSON.stringify(text.containerIds)) as {
      id: number;
      chemicalId: number;
    }[];
    for (const r of owned) if (!found.has(r.chemicalId)) own.set(r.chemicalId, [...(own.get(r.chemicalId) ?? []), r.id]);
    within = (id) => and(filters, inGroup(id), found.has(id!) ? NOTHING : inList("c.id", own.get(id!) ?? []));
    parts = [];
    if (found.size) parts.push(and(filters, inList("c.chemicalId", [...found])));
    const ownIds = [...own.values()].flat();
    if (ownIds.length) parts.push(and(filters, inList("c.id", ownIds)));
  }

  const counts = countGroups(ds, key, parts);
  const groups = function* (): Generator<Segment> {
    const withNull = !byChemical && (counts ? counts.has(null) : true);
    const segment = (id: number | null): Segment => ({ where: within(id), orderBy: `c.id ${dir}`, count: counts ? (counts.get(id) ?? 0) : undefined });
    if (withNull && dir === "ASC") yield segment(null);
    const ids = counts ? [...counts.keys()].filter((id) => id !== null) : byChemical && q.chemicalId ? [q.chemicalId] : null;
    const ordered =
      ids === null
        ? prepared(ds, `SELECT id FROM ${table} ORDER BY name ${dir}, id ${dir}`).iterate()
        : prepared(ds, `SELECT id FROM ${table} WHERE id IN (SELECT value FROM json_each(?)) ORDER BY name ${dir}, id ${dir}`).iterate(JSON.stringify(ids));
    for (const r of ordered as Iterable<{ id: number }>) yield segment(r.id);
    if (withNull && dir === "DESC") yield segment(null);
  };
  return walk(ds, q, groups(), counts ? [...counts.values()].reduce((sum, n) => sum + n, 0) : undefined);
}

/**
 * Every group's number of matches in one pass over at most GROUPING_PASS_MAX of them, or null
 * when there are more (the groups are then counted one by one, as far as needed).
 */
function countGroups(ds: DataSource, key: string, parts: Where[]): Map<number | null, number> | null {
  if (parts.length === 0) return new Map();
  const union = parts.map((p) => `SELECT ${key} AS g FROM containers c ${whereSql(p)}`).join(" UNION ALL ");
  const found = prepared(ds, `SELECT g AS id, COUNT(*) AS n FROM (${union} LIMIT ?) GROUP BY g`).all(...parts.flatMap((p) => p.args), GROUPING_PASS_MAX + 1) as {
    id: number | null;
    n: number;
  }[];
  if (found.reduce((sum, r) => sum + r.n, 0) > GROUPING_PASS_MAX) return null;
  return new Map(found.map((r) => [r.id, r.n]));
}

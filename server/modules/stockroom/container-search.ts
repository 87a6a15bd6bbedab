/**
 * The Stockroom search (GET /api/containers) in work that grows with the page, not the stockroom.
 *
 * Text: a container matches when its chemical's name, synonyms, CAS number or formula, or its own
 * lot or supplier, hold the text (parts of words; ASCII letters in either case), or when the text
 * is its label code or its number (#123). Chemicals are found through `chemical_text`, containers'
 * own text through `container_text` (FTS5 trigram indexes, server/db/text-search.ts). A text in
 * the lot or supplier of more than ownTextListMax containers (a supplier's name, "LOT"), or
 * shorter than three characters, is checked row by row instead.
 *
 * A page is read as a series of segments, each in an order an index gives: by chemical or
 * location, one segment per chemical (location) in name order, walked through the name index;
 * by expiry, the dated containers then the undated ones; other sorts, one segment in their
 * column's index. Segments are counted only as far as the page and the bounded total need
 * (`totalIsExact: false` beyond the bound of text-search.ts), mostly from the (chemicalId,
 * locationId, status) and (locationId, status) indexes alone, and rows are read only from the
 * segments the page falls in. There, a few matches (at most denseAbove) are found through the
 * filters' indexes and sorted; many are read in the sort's own index, the filters then checked
 * row by row (their columns written `+c.x`, which keeps SQLite from choosing their indexes), so
 * the read stops after the page.
 */
import type { DataSource } from "typeorm";
import type { ContainerListQuery } from "@shared/schemas/stock";
import { prepared } from "../../db/prepared";
import { boundedTotal, countCap, likeAny, matchingRowids, TRIGRAM, type BoundedTotal, type TextIndex } from "../../db/text-search";
import type { ContainerRow } from "./stock.presenter";

/** Chemicals' searchable text (synonyms one per line), kept by the TextSearch migration's triggers. */
export const CHEMICAL_TEXT: TextIndex = { table: "chemical_text", columns: ["name", "synonyms", "casNumber", "formula"] };
/** Containers' own searchable text. */
export const CONTAINER_TEXT: TextIndex = { table: "container_text", columns: ["lot", "supplier"] };

/**
 * Where the search changes its way of reading (numbers of matching rows). Fixed in use; a test
 * lowers them to take each way on a small stockroom.
 */
export const SEARCH_TUNING = {
  /** Containers found by their own text beyond this many are checked row by row instead of listed. */
  ownTextListMax: 2_000,
  /** Matches a grouped page sorts in one read; beyond, it walks the groups. */
  groupingPassMax: 1_000,
  /** Beyond this many matches a segment is read in its sort's index rather than sorted. */
  denseAbove: 4_000,
};

/** A container row with the names the Stockroom shows beside it and the amount reserved by run plans. */
export const ROW_COLUMNS = `c.*, ch.name AS chemicalName, ch.casNumber AS casNumber, ch.onHoldReason AS chemicalHoldReason, l.name AS locationName,
  (SELECT COALESCE(SUM(r.amount - r.drawn), 0) FROM reservations r WHERE r.containerId = c.id AND r.state = 'held') AS reservedQuantity`;
export const ROW_FROM = `FROM containers c JOIN chemicals ch ON ch.id = c.chemicalId LEFT JOIN locations l ON l.id = c.locationId`;

/** Sorts read as one segment: the column (its index gives the order, then the id). */
const COLUMN_SORTS: Record<"id" | "quantity" | "status" | "lot", string> = { id: "", quantity: "c.quantity", status: "c.status", lot: "c.lot" };

/** AND-ed conditions on `containers c`, with their arguments. */
interface Where {
  sql: string[];
  args: unknown[];
}
/** How a condition names a column: `c.x` (its index may be used) or `+c.x` (it may not). */
type Ref = (column: string) => string;
/** A condition, written either way. */
type Cond = (ref: Ref) => Where;

const INDEXED: Ref = (column) => `c.${column}`;
const UNINDEXED: Ref = (column) => `+c.${column}`;
const NOTHING: Where = { sql: [], args: [] };
const and = (...parts: Where[]): Where => ({ sql: parts.flatMap((p) => p.sql), args: parts.flatMap((p) => p.args) });
const both = (...conds: Cond[]): Cond => (ref) => and(...conds.map((c) => c(ref)));
const whereSql = (w: Where) => (w.sql.length ? `WHERE ${w.sql.join(" AND ")}` : "");
const inList = (column: string, ids: readonly unknown[]): Where => ({ sql: [`${column} IN (SELECT value FROM json_each(?))`], args: [JSON.stringify(ids)] });

/** What a search text found. */
interface TextMatch {
  /** Chemicals whose own text holds it: all their containers match. */
  chemicalIds: number[];
  /** Containers matched by their own text, label code or number: a list, or null when checked row by row. */
  containerIds: number[] | null;
  /** The text's condition on one container row. */
  row: Cond;
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
  const own = [...text].length >= TRIGRAM ? matchingRowids(ds, CONTAINER_TEXT, text, SEARCH_TUNING.ownTextListMax + 1) : null;
  const listed = own !== null && own.length <= SEARCH_TUNING.ownTextListMax;
  const ids = listed ? [...new Set([...own, ...exact])] : exact;
  const like = likeAny(CONTAINER_TEXT.columns, text, "c.");
  const row: Cond = (ref) => {
    const ors: Where[] = [];
    if (chemicalIds.length) ors.push(inList(ref("chemicalId"), chemicalIds));
    if (ids.length) ors.push(inList(ref("id"), ids));
    if (!listed) ors.push({ sql: [like.sql], args: like.args });
    if (ors.length === 0) return { sql: ["0"], args: [] };
    return ors.length === 1 ? ors[0] : { sql: [`(${ors.map((o) => o.sql[0]).join(" OR ")})`], args: ors.flatMap((o) => o.args) };
  };
  return { chemicalIds, containerIds: listed ? ids : null, row };
}

/** The filters other than the text; `locationIds` are the location and, with `within`, what it holds. */
function filtersOf(q: ContainerListQuery, locationIds: number[] | null): Cond {
  return (ref) => {
    const parts: Where[] = [];
    if (q.chemicalId) parts.push({ sql: [`${ref("chemicalId")} = ?`], args: [q.chemicalId] });
    if (locationIds) parts.push(inList(ref("locationId"), locationIds));
    if (q.status?.length) parts.push(inList(ref("status"), q.status));
    if (q.kind) parts.push({ sql: [`${ref("kind")} = ?`], args: [q.kind] });
    return and(...parts);
  };
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
  if (q.sort === "chemical" || q.sort === "location") return byGroup(ds, q, filters, text, dir);
  const all = text ? both(filters, text.row) : filters;
  if (q.sort === "expiresAt") {
    // Containers without a date come last either way: "soonest expiry first" must not open on them.
    return walk(ds, q, [
      { where: both(all, () => ({ sql: ["c.expiresAt IS NOT NULL"], args: [] })), orderBy: `c.expiresAt ${dir}, c.id ${dir}` },
      { where: both(all, () => ({ sql: ["c.expiresAt IS NULL"], args: [] })), orderBy: `c.id ${dir}` },
    ]);
  }
  const column = COLUMN_SORTS[q.sort];
  return walk(ds, q, [{ where: all, orderBy: `${column ? `${column} ${dir}, ` : ""}c.id ${dir}` }]);
}

/** Part of a page's order: the rows meeting `where`, in `orderBy`. */
interface Segment {
  where: Cond;
  orderBy: string;
}

/**
 * Reads a page across segments in order: each counted up to what the page and the bounded total
 * still need, rows read only from the segments the page falls in. Leaving early closes the
 * segments' generator (and any statement it iterates).
 */
function walk(ds: DataSource, q: ContainerListQuery, segments: Iterable<Segment>): ContainerPage {
  const cap = countCap(q.offset, q.limit);
  let counted = 0;
  let skip = q.offset;
  let need = q.limit;
  const items: ContainerRow[] = [];
  for (const s of segments) {
    const upTo = cap + 1 - counted;
    const n = countUpTo(ds, s.where(INDEXED), upTo);
    if (n > 0 && need > 0) {
      if (skip >= n) skip -= n;
      else {
        const take = Math.min(n - skip, need);
        const dense = n < upTo ? n > SEARCH_TUNING.denseAbove : countUpTo(ds, s.where(INDEXED), SEARCH_TUNING.denseAbove + 1) > SEARCH_TUNING.denseAbove;
        items.push(...rows(ds, s.where(dense ? UNINDEXED : INDEXED), s.orderBy, take, skip));
        need -= take;
        skip = 0;
      }
    }
    counted += n;
    if (counted > cap) break;
  }
  return { items, ...boundedTotal(counted, cap) };
}

/**
 * By chemical (or location): in name order, then id (containers without a location first
 * ascending, as SQLite sorts NULL). At most groupingPassMax matches are counted and sorted in
 * one read; more are walked one group (segment) at a time in name order through the name index,
 * each counted only as far as needed; a group of many matches is read in id order from the table.
 */
function byGroup(ds: DataSource, q: ContainerListQuery, filters: Cond, text: TextMatch | null, dir: "ASC" | "DESC"): ContainerPage {
  const byChemical = q.sort === "chemical";
  const column = byChemical ? "chemicalId" : "locationId";
  const table = byChemical ? "chemicals" : "locations";
  // The group's column follows the read like the filters: indexed for a few matches, and for many
  // unindexed too, so the group is read in id order from the table itself and the read stops
  // after the page (its (chemicalId, locationId, status) index would give another order, and
  // SQLite would sort the whole group for one page).
  const inGroup = (id: number | null, ref: Ref): Where => (id === null ? { sql: [`${ref(column)} IS NULL`], args: [] } : { sql: [`${ref(column)} = ?`], args: [id] });
  const all = text ? both(filters, text.row) : filters;
  let within = (id: number | null): Cond => (ref) => and(inGroup(id, ref), all(ref));
  /** The matches as disjoint parts (each can use its own index). */
  let parts: Where[] = [all(INDEXED)];
  /** The groups that can hold a match, when known without reading containers; null for every one. */
  let candidates: number[] | null = byChemical && q.chemicalId ? [q.chemicalId] : null;

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
    within = (id) => (ref) => and(inGroup(id, ref), filters(ref), found.has(id!) ? NOTHING : inList(ref("id"), own.get(id!) ?? []));
    parts = [];
    if (found.size) parts.push(and(filters(INDEXED), inList("c.chemicalId", [...found])));
    const ownIds = [...own.values()].flat();
    if (ownIds.length) parts.push(and(filters(INDEXED), inList("c.id", ownIds)));
    if (!q.chemicalId) candidates = [...found, ...own.keys()];
  }

  if (parts.length === 0) return { items: [], total: 0, totalIsExact: true };
  const union = parts.map((p) => `SELECT c.id FROM containers c ${whereSql(p)}`).join(" UNION ALL ");
  const unionArgs = parts.flatMap((p) => p.args);
  const few = (prepared(ds, `SELECT COUNT(*) AS n FROM (${union} LIMIT ?)`).get(...unionArgs, SEARCH_TUNING.groupingPassMax + 1) as { n: number }).n;
  if (few <= SEARCH_TUNING.groupingPassMax) {
    // Few matches: one read sorts them all in the groups' order (the walk below gives the same).
    const order = byChemical ? `ch.name ${dir}, ch.id ${dir}` : `l.name ${dir}, l.id ${dir}`;
    const items = prepared(ds, `SELECT ${ROW_COLUMNS} ${ROW_FROM} WHERE c.id IN (${union}) ORDER BY ${order}, c.id ${dir} LIMIT ? OFFSET ?`).all(
      ...unionArgs,
      q.limit,
      q.offset,
    ) as ContainerRow[];
    return { items, ...boundedTotal(few, countCap(q.offset, q.limit)) };
  }
  const groups = function* (): Generator<Segment> {
    const segment = (id: number | null): Segment => ({ where: within(id), orderBy: `c.id ${dir}` });
    const withNull = !byChemical;
    if (withNull && dir === "ASC") yield segment(null);
    const ordered =
      candidates === null
        ? prepared(ds, `SELECT id FROM ${table} ORDER BY name ${dir}, id ${dir}`).iterate()
        : prepared(ds, `SELECT id FROM ${table} WHERE id IN (SELECT value FROM json_each(?)) ORDER BY name ${dir}, id ${dir}`).iterate(JSON.stringify(candidates));
    for (const r of ordered as Iterable<{ id: number }>) yield segment(r.id);
    if (withNull && dir === "DESC") yield segment(null);
  };
  return walk(ds, q, groups());
}

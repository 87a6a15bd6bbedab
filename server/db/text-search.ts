/**
 * Text search through SQLite's full-text index (FTS5, `trigram` tokenizer), and totals that stop
 * counting. Each area declares its index (an FTS5 table kept in step with its table by the
 * triggers of migration TextSearch) and asks `matchingRowids` for the rows whose text holds a
 * search; this file only builds the two clauses every such search uses.
 *
 * - The trigram tokenizer indexes every run of three characters, so a search finds parts of
 *   words, CAS numbers ("7447-41") and lot codes, not only whole words.
 * - The search is one FTS5 phrase in double quotes, with any quote inside doubled: `AND`, `NEAR`,
 *   `*`, `^`, `:` and parentheses are then plain text, never query syntax.
 * - The index only narrows. Every row it proposes is checked with `LIKE '%text%'` on the indexed
 *   copy, so the answer is exactly a plain scan's (`LIKE`: ASCII letters in either case, any
 *   other character as written); the tokenizer's own folding is wider and never decides.
 * - The phrase is the text's first 64 characters: a row that holds the whole text holds its start,
 *   so the index's work stays bounded whatever is pasted in, and LIKE checks the rest.
 * - Fallback: a text shorter than three characters has no trigram, so those searches are a scan of
 *   the FTS table's copy with the same LIKE. One or two characters match broadly anyway; the
 *   callers stop reading once a page and the bounded total are served.
 */
import type { DataSource } from "typeorm";
import { prepared } from "./prepared";

/** The trigram tokenizer's run length: shorter texts cannot use the index. */
export const TRIGRAM = 3;
/** Characters of the text given to the index (the rest is checked by LIKE). */
const PHRASE_MAX = 64;

/** An FTS5 table over some text columns of a table (rowid = the row's id). */
export interface TextIndex {
  table: string;
  columns: readonly string[];
}

/** The text as one FTS5 phrase (null when too short for the trigram index). */
export function ftsPhrase(text: string): string | null {
  const chars = [...text];
  if (chars.length < TRIGRAM) return null;
  return `"${chars.slice(0, PHRASE_MAX).join("").replace(/"/g, '""')}"`;
}

/** `%text%` for `LIKE … ESCAPE '\'`: the text's own %, _ and \ are literal. */
export function likeContains(text: string): string {
  return `%${text.replace(/[\\%_]/g, (m) => `\\${m}`)}%`;
}

/** The SQL condition "one of the index's columns holds the text", and its arguments. */
export function likeAny(columns: readonly string[], text: string, alias = ""): { sql: string; args: string[] } {
  const pattern = likeContains(text);
  return { sql: `(${columns.map((c) => `${alias}"${c}" LIKE ? ESCAPE '\\'`).join(" OR ")})`, args: columns.map(() => pattern) };
}

/**
 * Ids of the rows whose indexed text holds `text` (case-insensitive for ASCII letters), at most
 * `limit` of them (in no particular order). Pass `em.connection` inside a transaction.
 */
export function matchingRowids(ds: DataSource, index: TextIndex, text: string, limit: number): number[] {
  const like = likeAny(index.columns, text);
  const phrase = ftsPhrase(text);
  const sql = phrase
    ? `SELECT rowid AS id FROM "${index.table}" WHERE "${index.table}" MATCH ? AND ${like.sql} LIMIT ?`
    : `SELECT rowid AS id FROM "${index.table}" WHERE ${like.sql} LIMIT ?`;
  const args = phrase ? [phrase, ...like.args, limit] : [...like.args, limit];
  return (prepared(ds, sql).all(...args) as { id: number }[]).map((r) => r.id);
}

/**
 * Totals are exact up to this many rows; beyond it a list answers `total: COUNT_BOUND` (or the end
 * of the page asked for, if further) with `totalIsExact: false`, "more than …", so no request
 * counts a whole large table.
 */
export const COUNT_BOUND = 1_000;

/** How far a page at `offset` counts: the bound, or the page's own end when it lies beyond. */
export function countCap(offset: number, limit: number): number {
  return Math.max(COUNT_BOUND, offset + limit);
}

export interface BoundedTotal {
  total: number;
  totalIsExact: boolean;
}

/** `n` rows counted with `LIMIT cap + 1`: exact when at most `cap`, else "more than cap". */
export function boundedTotal(n: number, cap: number): BoundedTotal {
  return n > cap ? { total: cap, totalIsExact: false } : { total: n, totalIsExact: true };
}

/**
 * The total of a page: a short page (not past the end) already says where the list ends;
 * otherwise `count(cap)` counts at most `cap + 1` rows.
 */
export function pageTotal(shown: number, offset: number, limit: number, count: (upTo: number) => number): BoundedTotal {
  if (shown < limit && (shown > 0 || offset === 0)) return { total: offset + shown, totalIsExact: true };
  const cap = countCap(offset, limit);
  return boundedTotal(count(cap + 1), cap);
}

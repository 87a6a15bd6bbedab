import { z } from "zod";

const ID_MESSAGE = "Give an id: a positive whole number";

/**
 * A record id: a positive integer, as a JSON number or a string of digits (paths and queries are
 * text). Booleans, fractions, exponents ("1e3") and signs are refused, never coerced.
 */
export const id = (message = ID_MESSAGE) =>
  z.union([z.number().int().min(1).max(Number.MAX_SAFE_INTEGER), z.string().regex(/^[1-9][0-9]{0,14}$/).transform(Number)], { error: message });

/**
 * A whole number in a query string (or a JSON number) between min and max: digits only, so
 * "1.5", "1e3", "-1" and "true" are 400, not guesses.
 */
export const wholeNumber = (min: number, max: number, what = "number") =>
  z
    .union([z.number().int(), z.string().regex(/^-?[0-9]{1,15}$/).transform(Number)], { error: `Give the ${what} as a whole number` })
    .pipe(z.number().min(min, `The ${what} must be at least ${min}`).max(max, `The ${what} must be at most ${max}`));

/** Every list route accepts ?limit=&offset= and answers { items, total }. */
export const pageQuery = z.object({
  limit: wholeNumber(1, 500, "limit").default(50),
  offset: wholeNumber(0, Number.MAX_SAFE_INTEGER, "offset").default(0),
});
export type PageQuery = z.infer<typeof pageQuery>;

export const idParam = z.object({ id: id() });

/** A page of a list as every list route answers it. */
export const pageOf = <T extends z.ZodType>(item: T) => z.object({ items: z.array(item), total: z.number().int() });

/**
 * A page of a list that may be too long to count on every request (containers, chemicals, people):
 * `total` is exact while `totalIsExact` is true; otherwise more than `total` rows match (counting
 * stopped there) and the client says "more than …".
 */
export const boundedPageOf = <T extends z.ZodType>(item: T) => z.object({ items: z.array(item), total: z.number().int(), totalIsExact: z.boolean() });

/** The longest search text a list route takes; longer is 400. */
export const SEARCH_MAX = 10_000;
/** "10,000": grouped by hand, since formatting with Intl would load locale data whenever the schemas load. */
const SEARCH_MAX_TEXT = String(SEARCH_MAX).replace(/\B(?=(\d{3})+$)/g, ",");

/**
 * What a person types into a list's search box: any characters (quotes, operators, emoji), taken
 * as plain text and never as query syntax. Control characters (a pasted line break) become
 * spaces, then the text is trimmed; an empty search lists everything.
 */
export const searchText = z
  .string()
  .max(SEARCH_MAX, `Search for at most ${SEARCH_MAX_TEXT} characters`)
  // eslint-disable-next-line no-control-regex
  .transform((s) => s.replace(/[\u0000-\u001f\u007f]+/g, " ").trim());

/** ISO 8601 date-time that must carry an offset or Z, so no time is read in the server's zone. */
export const isoDateTime = z.iso.datetime({ offset: true, message: "Give an ISO 8601 date-time with an offset or Z, e.g. 2026-12-02T14:00:00-04:00" });

/** YYYY-MM-DD calendar date. */
export const isoDate = z.iso.date({ message: "Give a date as YYYY-MM-DD" });

export interface Page<T> {
  items: T[];
  total: number;
}

export interface BoundedPage<T> extends Page<T> {
  totalIsExact: boolean;
}

/** RFC 9457 problem details as the API sends them. */
export interface Problem {
  type: string;
  title: string;
  status: number;
  detail?: string;
  code?: string;
  errors?: { path: string; message: string }[];
}

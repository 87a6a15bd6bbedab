import { z } from "zod";

/** Every list route accepts ?limit=&offset= and answers { items, total }. */
export const pageQuery = z.object({
  limit: z.coerce.number().int().min(1).max(500).default(50),
  offset: z.coerce.number().int().min(0).default(0),
});
export type PageQuery = z.infer<typeof pageQuery>;

export const idParam = z.object({ id: z.coerce.number().int().positive() });

/** ISO 8601 date-time that must carry an offset or Z, so no time is read in the server's zone. */
export const isoDateTime = z.iso.datetime({ offset: true, message: "Give an ISO 8601 date-time with an offset or Z, e.g. 2026-12-02T14:00:00-04:00" });

/** YYYY-MM-DD calendar date. */
export const isoDate = z.iso.date({ message: "Give a date as YYYY-MM-DD" });

export interface Page<T> {
  items: T[];
  total: number;
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

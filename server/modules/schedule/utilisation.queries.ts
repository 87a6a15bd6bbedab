/**
 * Utilisation per instrument per local month, computed by the pure utilisation() of
 * shared/domain over the instrument's bookable hours and its bookings, and written as CSV by
 * the one CSV writer (server/core/csv.ts).
 */
import type { DataSource } from "typeorm";
import { DateTime } from "luxon";
import type { BookableHours } from "@shared/domain/booking-rules";
import { monthRange, utilisation } from "@shared/domain/utilisation";
import type { BookingStatus } from "@shared/domain/intervals";
import type { UtilisationRow } from "@shared/schemas/reports";
import { toCsv, type CsvColumn } from "../../core/csv";
import { MAX_BOOKING_MS } from "./booking.queries";

export type { UtilisationRow };

/** The months from `from` to `to` inclusive, "YYYY-MM". */
export function monthsBetween(from: string, to: string): string[] {
  const out: string[] = [];
  let m = DateTime.fromFormat(from, "yyyy-MM", { zone: "utc" });
  const end = DateTime.fromFormat(to, "yyyy-MM", { zone: "utc" });
  while (m <= end && out.length < 120) {
    out.push(m.toFormat("yyyy-MM"));
    m = m.plus({ months: 1 });
  }
  return out;
}

export async function utilisationReport(ds: DataSource, tz: string, from: string, to: string, instrumentId?: number): Promise<UtilisationRow[]> {
  const months = monthsBetween(from, to);
  if (months.length === 0) return [];
  const instruments: { id: number; name: string; bookableHours: string }[] = await ds.query(
    `SELECT id, name, bookableHours FROM instruments WHERE status <> 'retired' ${instrumentId ? "AND id = ?" : ""} ORDER BY kind, name`,
    instrumentId ? [instrumentId] : [],
  );
  const first = monthRange(months[0], tz).monthStart.getTime();
  const last = monthRange(months[months.length - 1], tz).monthEnd.getTime();
  const bookings: { instrumentId: number; startMs: number; endMs: number; status: BookingStatus; checkedInAt: string | null; checkedOutAt: string | null }[] =
    await ds.query(
      `SELECT bi.instrumentId, b.startMs, b.endMs, b.status, b.checkedInAt, b.checkedOutAt FROM bookings b JOIN booking_instruments bi ON bi.bookingId = b.id
       WHERE b.startMs < ? AND b.endMs > ? AND b.startMs > ?`,
      [last, first, first - MAX_BOOKING_MS],
    );
  const rows: UtilisationRow[] = [];
  for (const inst of instruments) {
    const hours = JSON.parse(inst.bookableHours) as BookableHours;
    const mine = bookings
      .filter((b) => b.instrumentId === inst.id)
      .map((b) => ({ start: b.startMs, end: b.endMs, status: b.status, checkedInAt: b.checkedInAt ? new Date(b.checkedInAt) : null, checkedOutAt: b.checkedOutAt ? new Date(b.checkedOutAt) : null }));
    for (const period of months) {
      const { monthStart, monthEnd } = monthRange(period, tz);
      rows.push({ instrumentId: inst.id, instrumentName: inst.name, period, ...utilisation({ monthStart, monthEnd, tz, bookableHours: hours, bookings: mine }) });
    }
  }
  return rows;
}

/** The CSV's columns: hours to two decimals, percentages to one, both numbers to a spreadsheet. */
const UTILISATION_COLUMNS: CsvColumn<UtilisationRow>[] = [
  { header: "instrument", value: (r) => r.instrumentName },
  { header: "month", value: (r) => r.period },
  { header: "bookable_hours", kind: "number", decimals: 2, value: (r) => r.bookableHours },
  { header: "booked_hours", kind: "number", decimals: 2, value: (r) => r.bookedHours },
  { header: "used_hours", kind: "number", decimals: 2, value: (r) => r.usedHours },
  { header: "booked_percent", kind: "number", decimals: 1, value: (r) => r.bookedPct },
  { header: "used_percent", kind: "number", decimals: 1, value: (r) => r.usedPct },
];

/** RFC 4180 CSV with CRLF line ends, through the one CSV writer (an instrument's name cannot start a formula). */
export function utilisationCsv(rows: UtilisationRow[]): string {
  return toCsv(rows, UTILISATION_COLUMNS);
}

/**
 * Utilisation per instrument per local month, computed by the pure utilisation() of
 * shared/domain over the instrument's bookable hours and its bookings, and written as CSV.
 */
import type { DataSource } from "typeorm";
import { DateTime } from "luxon";
import type { BookableHours } from "@shared/domain/booking-rules";
import { monthRange, utilisation } from "@shared/domain/utilisation";
import type { BookingStatus } from "@shared/domain/intervals";
import type { UtilisationRow } from "@shared/schemas/reports";
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

function csvCell(v: string | number | null): string {
  if (v === null) return "";
  const s = String(v);
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** RFC 4180 CSV with CRLF line ends; hours to two decimals, percentages to one. */
export function utilisationCsv(rows: UtilisationRow[]): string {
  const head = ["instrument", "month", "bookable_hours", "booked_hours", "used_hours", "booked_percent", "used_percent"];
  const lines = rows.map((r) =>
    [
      r.instrumentName,
      r.period,
      r.bookableHours.toFixed(2),
      r.bookedHours.toFixed(2),
      r.usedHours.toFixed(2),
      r.bookedPct === null ? null : r.bookedPct.toFixed(1),
      r.usedPct === null ? null : r.usedPct.toFixed(1),
    ]
      .map(csvCell)
      .join(","),
  );
  return [head.join(","), ...lines].join("\r\n") + "\r\n";
}

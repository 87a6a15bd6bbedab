/**
 * Booking DTOs. The owner and managers see a booking in full; everyone else sees a busy block
 * (time, instruments, state) with nothing about who booked it or why.
 */
import type { DataSource } from "typeorm";
import type { BookingDto, BookingListItem, BusyBlockDto } from "@shared/schemas/bookings";
import { hasRole, type AuthUser } from "../middleware/auth";
import { prepared } from "../db/prepared";
import type { BookingWithInstruments } from "../services/booking.service";

interface Names {
  users: Map<number, string>;
  accounts: Map<number, string>;
}

export function presentBusy({ booking: b, instrumentIds }: BookingWithInstruments): BusyBlockDto {
  return { id: b.id, status: b.status, instrumentIds, start: b.startsAt, end: b.endsAt, busy: true, mine: false };
}

export function presentBookingFull({ booking: b, instrumentIds }: BookingWithInstruments, viewerId: number, names: Names): BookingDto {
  return {
    id: b.id,
    status: b.status,
    instrumentIds,
    start: b.startsAt,
    end: b.endsAt,
    busy: false,
    mine: b.userId === viewerId,
    userId: b.userId,
    userName: names.users.get(b.userId) ?? "",
    accountId: b.accountId,
    accountCode: names.accounts.get(b.accountId) ?? "",
    purpose: b.purpose,
    seriesId: b.seriesId,
    checkedInAt: b.checkedInAt,
    checkedOutAt: b.checkedOutAt,
    lateCancel: Boolean(b.lateCancel),
    declineReason: b.declineReason,
    cancelReason: b.cancelReason,
    createdAt: b.createdAt,
  };
}

export function canSeeInFull(viewer: AuthUser, userId: number): boolean {
  return viewer.id === userId || hasRole(viewer, "manager");
}

async function lookupNames(ds: DataSource, list: BookingWithInstruments[]): Promise<Names> {
  const userIds = [...new Set(list.map((x) => x.booking.userId))];
  const accountIds = [...new Set(list.map((x) => x.booking.accountId))];
  const users = new Map<number, string>();
  const accounts = new Map<number, string>();
  // One prepared statement each, whatever the number of ids: the list travels as a JSON array.
  if (userIds.length) {
    const rows = prepared(ds, `SELECT id, name FROM users WHERE id IN (SELECT value FROM json_each(?))`).all(JSON.stringify(userIds)) as { id: number; name: string }[];
    for (const r of rows) users.set(r.id, r.name);
  }
  if (accountIds.length) {
    const rows = prepared(ds, `SELECT id, code FROM accounts WHERE id IN (SELECT value FROM json_each(?))`).all(JSON.stringify(accountIds)) as { id: number; code: string }[];
    for (const r of rows) accounts.set(r.id, r.code);
  }
  return { users, accounts };
}

/** Presents a list for one viewer, looking names up only for the bookings they may see in full. */
export async function presentBookings(ds: DataSource, viewer: AuthUser, list: BookingWithInstruments[]): Promise<BookingListItem[]> {
  const full = list.filter((x) => canSeeInFull(viewer, x.booking.userId));
  const names = await lookupNames(ds, full);
  return list.map((x) => (canSeeInFull(viewer, x.booking.userId) ? presentBookingFull(x, viewer.id, names) : presentBusy(x)));
}

export async function presentBooking(ds: DataSource, viewer: AuthUser, x: BookingWithInstruments): Promise<BookingListItem> {
  return (await presentBookings(ds, viewer, [x]))[0];
}

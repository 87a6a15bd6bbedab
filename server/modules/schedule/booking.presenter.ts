/**
 * Booking DTOs. Those the booking policy lets see a booking in full (its owner, the manager) get
 * it with what they may do to it now (`abilities`); everyone else sees a busy block (time,
 * instruments, state) with nothing about who booked it or why.
 */
import type { DataSource } from "typeorm";
import type { BookingDto, BookingListItem, BookingSettings, BusyBlockDto } from "@shared/schemas/bookings";
import type { AuthUser } from "../../middleware/auth";
import { bookingPolicy, seesInFull } from "./booking.policy";
import { readBookingSettings } from "./booking-settings";
import { userNamesAndAccountCodes, type BookingWithInstruments } from "./booking.queries";

interface Names {
  users: Map<number, string>;
  accounts: Map<number, string>;
}

/** What presenting a booking in full needs besides the booking: names, the clock and check-in's opening. */
export interface FullView {
  names: Names;
  nowMs: number;
  settings: Pick<BookingSettings, "checkInEarlyMinutes">;
}

export function presentBusy({ booking: b, instrumentIds }: BookingWithInstruments): BusyBlockDto {
  return { id: b.id, status: b.status, instrumentIds, start: b.startsAt, end: b.endsAt, busy: true, mine: false };
}

export function presentBookingFull({ booking: b, instrumentIds }: BookingWithInstruments, viewer: AuthUser, view: FullView): BookingDto {
  return {
    id: b.id,
    status: b.status,
    instrumentIds,
    start: b.startsAt,
    end: b.endsAt,
    busy: false,
    mine: b.userId === viewer.id,
    userId: b.userId,
    userName: view.names.users.get(b.userId) ?? "",
    accountId: b.accountId,
    accountCode: view.names.accounts.get(b.accountId) ?? "",
    purpose: b.purpose,
    seriesId: b.seriesId,
    checkedInAt: b.checkedInAt,
    checkedOutAt: b.checkedOutAt,
    lateCancel: Boolean(b.lateCancel),
    declineReason: b.declineReason,
    cancelReason: b.cancelReason,
    createdAt: b.createdAt,
    abilities: bookingPolicy.abilities(viewer, { booking: b, nowMs: view.nowMs, checkInEarlyMinutes: view.settings.checkInEarlyMinutes }),
  };
}

function fullView(ds: DataSource, now: Date, full: BookingWithInstruments[]): FullView {
  return {
    names: userNamesAndAccountCodes(ds, [...new Set(full.map((x) => x.booking.userId))], [...new Set(full.map((x) => x.booking.accountId))]),
    nowMs: now.getTime(),
    settings: readBookingSettings(ds),
  };
}

/** Bookings the viewer has just made: their own, so always in full. */
export function presentOwnBookings(ds: DataSource, viewer: AuthUser, now: Date, list: BookingWithInstruments[]): BookingDto[] {
  const view = fullView(ds, now, list);
  return list.map((x) => presentBookingFull(x, viewer, view));
}

/**
 * Presents a list for one viewer at one moment. Names and the settings are read only when some
 * booking is shown in full, so a member's week of others' busy blocks costs no extra read.
 */
export function presentBookings(ds: DataSource, viewer: AuthUser, now: Date, list: BookingWithInstruments[]): BookingListItem[] {
  const full = list.filter((x) => seesInFull(viewer, x.booking));
  if (full.length === 0) return list.map(presentBusy);
  const view = fullView(ds, now, full);
  return list.map((x) => (seesInFull(viewer, x.booking) ? presentBookingFull(x, viewer, view) : presentBusy(x)));
}

export function presentBooking(ds: DataSource, viewer: AuthUser, now: Date, x: BookingWithInstruments): BookingListItem {
  return presentBookings(ds, viewer, now, [x])[0];
}

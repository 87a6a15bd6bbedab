/** Bookings on the Schedule: inputs, queries and DTOs shared by the booking form and the API. */
import { z } from "zod";
import { isoDateTime, pageQuery, id as idSchema, wholeNumber } from "./common";
import { MAX_WEEKLY_OCCURRENCES } from "../domain/recurrence-limits";

export const BOOKING_STATUSES = ["requested", "confirmed", "declined", "cancelled", "in_progress", "completed", "no_show"] as const;
export const bookingStatus = z.enum(BOOKING_STATUSES);
export type BookingStatus = z.infer<typeof bookingStatus>;

/** Words for each state; the Schedule shows these beside the colour, never colour alone. */
export const BOOKING_STATUS_LABELS: Record<BookingStatus, string> = {
  requested: "Requested",
  confirmed: "Confirmed",
  declined: "Declined",
  cancelled: "Cancelled",
  in_progress: "In progress",
  completed: "Completed",
  no_show: "No-show",
};

const id = idSchema();

export const createBookingInput = z
  .object({
    instrumentIds: z.array(id).min(1, "Choose at least one instrument").max(10).optional(),
    setupId: id.optional(),
    start: isoDateTime,
    end: isoDateTime,
    accountId: id,
    purpose: z.string().trim().max(500).default(""),
    /** Weekly repeat: how many sessions in all, the first included. */
    repeatWeeks: wholeNumber(1, MAX_WEEKLY_OCCURRENCES, "number of weekly sessions").default(1),
  })
  .refine((v) => (v.instrumentIds && v.instrumentIds.length > 0) || v.setupId !== undefined, {
    message: "Choose instruments or a setup",
    path: ["instrumentIds"],
  });
export type CreateBookingInput = z.input<typeof createBookingInput>;
export type CreateBookingParsed = z.output<typeof createBookingInput>;

export const moveBookingInput = z.object({ start: isoDateTime, end: isoDateTime });
export type MoveBookingInput = z.infer<typeof moveBookingInput>;

export const reasonInput = z.object({ reason: z.string().trim().min(1, "Give a reason").max(500) });
export const optionalReasonInput = z.object({ reason: z.string().trim().max(500).optional() });

const flag = z
  .union([z.boolean(), z.enum(["true", "false", "1", "0"])])
  .transform((v) => v === true || v === "true" || v === "1");

export const bookingListQuery = pageQuery.extend({
  from: isoDateTime.optional(),
  to: isoDateTime.optional(),
  instrumentId: id.optional(),
  status: z
    .string()
    .transform((s) => s.split(",").filter(Boolean))
    .pipe(z.array(bookingStatus))
    .optional(),
  /** Only the caller's own bookings (My bookings). */
  mine: flag.optional(),
  limit: wholeNumber(1, 5000, "limit").default(500),
});
export type BookingListQuery = z.infer<typeof bookingListQuery>;

/** What a person may do to a booking, decided by the server's booking policy with its clock. */
export const BOOKING_ACTIONS = ["cancel", "move", "checkIn", "checkOut", "approve", "decline", "noShow"] as const;
export type BookingAction = (typeof BOOKING_ACTIONS)[number];
export const bookingAbilities = z.object(Object.fromEntries(BOOKING_ACTIONS.map((a) => [a, z.boolean()])) as Record<BookingAction, z.ZodBoolean>);
export type BookingAbilities = z.infer<typeof bookingAbilities>;

/** A booking in full: for its owner and for managers. */
export const bookingDto = z.object({
  id: z.number(),
  status: bookingStatus,
  instrumentIds: z.array(z.number()),
  start: z.string(),
  end: z.string(),
  busy: z.literal(false),
  mine: z.boolean(),
  userId: z.number(),
  userName: z.string(),
  accountId: z.number(),
  accountCode: z.string(),
  purpose: z.string(),
  seriesId: z.string().nullable(),
  checkedInAt: z.string().nullable(),
  checkedOutAt: z.string().nullable(),
  lateCancel: z.boolean(),
  declineReason: z.string().nullable(),
  cancelReason: z.string().nullable(),
  createdAt: z.string(),
  /** What the caller may do to it now (the booking policy's answer; the client offers only these). */
  abilities: bookingAbilities,
});
export type BookingDto = z.infer<typeof bookingDto>;

/** Someone else's booking as a member sees it: the time is taken, nothing about who or why. */
export const busyBlockDto = z.object({
  id: z.number(),
  status: bookingStatus,
  instrumentIds: z.array(z.number()),
  start: z.string(),
  end: z.string(),
  busy: z.literal(true),
  mine: z.literal(false),
});
export type BusyBlockDto = z.infer<typeof busyBlockDto>;

export const bookingListItem = z.union([bookingDto, busyBlockDto]);
export type BookingListItem = BookingDto | BusyBlockDto;

/** One booking as the routes that change it answer. */
export const oneBookingDto = z.object({ booking: bookingListItem });
/** POST /api/bookings: the first booking, and every session of a weekly series. */
export const madeBookingsDto = z.object({ booking: bookingDto, bookings: z.array(bookingDto) });

/** One failing session of a weekly series, as the 409/422 answer names it. */
export interface OccurrenceProblem {
  index: number;
  start: string;
  end: string;
  status: 403 | 409 | 422;
  reasons: { path: string; message: string }[];
}

/**
 * The facility's booking settings (a settings row the manager edits; GET/PUT /api/bookings/policy):
 * numbers the booking rules use, not who may do what (that is the server's booking policy).
 */
export const bookingSettings = z.object({
  /** Cancelling less than this many hours before the start is a late cancellation. */
  lateCancelHours: z.number().int().min(0).max(24 * 14),
  /** A confirmed booking nobody checked in to within this many minutes becomes a no-show. */
  noShowGraceMinutes: z.number().int().min(5).max(24 * 60),
  /** Check-in opens this many minutes before the start. */
  checkInEarlyMinutes: z.number().int().min(0).max(240),
});
export type BookingSettings = z.infer<typeof bookingSettings>;
export const DEFAULT_BOOKING_SETTINGS: BookingSettings = { lateCancelHours: 24, noShowGraceMinutes: 30, checkInEarlyMinutes: 15 };
/** The answer of GET and PUT /api/bookings/policy (the path and the key keep the contract's first name). */
export const bookingSettingsAnswer = z.object({ policy: bookingSettings });

/** The secret address of a person's calendar feed (GET /api/calendar/me, POST /api/calendar/me/rotate). */
export const calendarFeedDto = z.object({ url: z.string() });

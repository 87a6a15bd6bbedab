/**
 * Bookings on the Schedule: the window (contract GET /api/bookings), create (contract POST),
 * the booking settings, one booking and its .ics, move, approve, decline, cancel, check-in,
 * check-out and no-show. Which booking a person may change, and when, is the booking policy's
 * to say; the commands ask it, and every booking shown in full carries its `abilities`.
 */
import { idParam, pageOf } from "@shared/schemas/common";
import {
  bookingListItem,
  bookingListQuery,
  bookingSettings,
  bookingSettingsAnswer,
  createBookingInput,
  madeBookingsDto,
  moveBookingInput,
  oneBookingDto,
  optionalReasonInput,
  reasonInput,
} from "@shared/schemas/bookings";
import { route, WRITTEN } from "../../http/route-table";
import { NotFound } from "../../errors";
import { seesInFull } from "./booking.policy";
import { getBooking, listBookings, type BookingWithInstruments } from "./booking.queries";
import { createBookings } from "./booking-create.commands";
import { approveBooking, cancelBooking, checkIn, checkOut, declineBooking, moveBooking, recordNoShow } from "./booking.commands";
import { presentBooking, presentBookings, presentOwnBookings } from "./booking.presenter";
import { readBookingSettings, saveBookingSettings } from "./booking-settings";
import { bookingIcs } from "./calendar.queries";
import type { Ctx } from "../../context";
import type { AuthUser } from "../../middleware/auth";

/** The answer of every route that changes one booking: the booking as the caller now sees it. */
const answer = (ctx: Ctx, actor: AuthUser, x: BookingWithInstruments) => ({ booking: presentBooking(ctx.ds, actor, ctx.now(), x) });

export const bookingRoutes = [
  route({
    method: "get",
    path: "/bookings",
    summary: "Bookings overlapping a window (from, to; optionally one instrument), or the caller's own (mine=true)",
    description: "Others' bookings come as busy blocks (time, instruments, state) to everyone but the manager.",
    access: "signed_in",
    query: bookingListQuery,
    output: pageOf(bookingListItem),
    handler: ({ ctx, actor, query }) => {
      const { items, total } = listBookings(ctx.ds, actor, query);
      return { items: presentBookings(ctx.ds, actor, ctx.now(), items), total };
    },
  }),
  route({
    method: "post",
    path: "/bookings",
    summary: "Book instruments (or a setup) for one session or a weekly series, all or nothing",
    description:
      "201 confirmed or requested (instruments that need the manager's approval). 403 when the caller is not trained on one of them or may not charge the account; 422 for rule breaks; 409 when any instrument (with its cleaning buffer) is taken. A failing series names each failing session in `occurrences`.",
    access: ["member", "manager"],
    body: createBookingInput,
    status: 201,
    output: madeBookingsDto,
    handler: async ({ ctx, actor, body }) => {
      const bookings = presentOwnBookings(ctx.ds, actor, ctx.now(), await createBookings(ctx, actor, body));
      return { booking: bookings[0], bookings };
    },
  }),
  route({
    method: "get",
    path: "/bookings/policy",
    summary: "The facility's booking settings: late-cancellation window, no-show grace, check-in opening",
    access: "signed_in",
    output: bookingSettingsAnswer,
    handler: ({ ctx }) => ({ policy: readBookingSettings(ctx.ds) }),
  }),
  route({
    method: "put",
    path: "/bookings/policy",
    summary: "Change the booking settings",
    access: ["manager"],
    body: bookingSettings,
    output: bookingSettingsAnswer,
    handler: async ({ ctx, actor, body }) => ({ policy: await saveBookingSettings(ctx, actor, body) }),
  }),
  // Before "/bookings/:id", so "12.ics" is not read as an id.
  route({
    method: "get",
    path: "/bookings/:id.ics",
    summary: "One booking as an iCalendar file",
    description: "404 to anyone who may not see the booking in full.",
    access: "signed_in",
    params: idParam,
    produces: "text/calendar",
    handler: async ({ ctx, actor, params, res }) => {
      const found = await getBooking(ctx.ds, params.id).catch(() => null);
      if (!found || !seesInFull(actor, found.booking)) throw new NotFound("That booking");
      const text = await bookingIcs(ctx.ds, found.booking.id, ctx.now(), ctx.config.PUBLIC_URL, ctx.config.FACILITY_NAME);
      res.type("text/calendar; charset=utf-8").set("Content-Disposition", `attachment; filename="booking-${found.booking.id}.ics"`).send(text);
      return WRITTEN;
    },
  }),
  route({
    method: "get",
    path: "/bookings/:id",
    summary: "One booking (a busy block to anyone who may not see it in full)",
    access: "signed_in",
    params: idParam,
    output: oneBookingDto,
    handler: async ({ ctx, actor, params }) => answer(ctx, actor, await getBooking(ctx.ds, params.id)),
  }),
  route({
    method: "patch",
    path: "/bookings/:id",
    summary: "Move a booking that has not started; the new time is checked as a new booking would be",
    access: "signed_in",
    policy: "booking.move",
    params: idParam,
    body: moveBookingInput,
    output: oneBookingDto,
    handler: async ({ ctx, actor, params, body }) => answer(ctx, actor, await moveBooking(ctx, actor, params.id, body)),
  }),
  route({
    method: "post",
    path: "/bookings/:id/approve",
    summary: "Approve a request; 409 if its instruments are now taken",
    access: ["manager"],
    policy: "booking.approve",
    params: idParam,
    output: oneBookingDto,
    handler: async ({ ctx, actor, params }) => answer(ctx, actor, await approveBooking(ctx, actor, params.id)),
  }),
  route({
    method: "post",
    path: "/bookings/:id/decline",
    summary: "Decline a request with a reason the person receives",
    access: ["manager"],
    policy: "booking.decline",
    params: idParam,
    body: reasonInput,
    output: oneBookingDto,
    handler: async ({ ctx, actor, params, body }) => answer(ctx, actor, await declineBooking(ctx, actor, params.id, body.reason)),
  }),
  route({
    method: "post",
    path: "/bookings/:id/cancel",
    summary: "Cancel a booking (its owner, or the manager with a reason)",
    access: "signed_in",
    policy: "booking.cancel",
    params: idParam,
    body: optionalReasonInput,
    output: oneBookingDto,
    handler: async ({ ctx, actor, params, body }) => answer(ctx, actor, await cancelBooking(ctx, actor, params.id, body.reason)),
  }),
  route({
    method: "post",
    path: "/bookings/:id/check-in",
    summary: "Check in to one's own confirmed booking (records the actual start)",
    access: "signed_in",
    policy: "booking.checkIn",
    params: idParam,
    output: oneBookingDto,
    handler: async ({ ctx, actor, params }) => answer(ctx, actor, await checkIn(ctx, actor, params.id)),
  }),
  route({
    method: "post",
    path: "/bookings/:id/check-out",
    summary: "Check out of one's own booking in progress (records the actual end)",
    access: "signed_in",
    policy: "booking.checkOut",
    params: idParam,
    output: oneBookingDto,
    handler: async ({ ctx, actor, params }) => answer(ctx, actor, await checkOut(ctx, actor, params.id)),
  }),
  route({
    method: "post",
    path: "/bookings/:id/no-show",
    summary: "Record that nobody came to a confirmed booking that has started",
    access: ["manager"],
    policy: "booking.noShow",
    params: idParam,
    output: oneBookingDto,
    handler: async ({ ctx, actor, params }) => answer(ctx, actor, await recordNoShow(ctx, actor, params.id)),
  }),
];

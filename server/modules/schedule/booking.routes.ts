/** Bookings on the Schedule: list, create, move, approve, decline, cancel, check-in/out, no-show, .ics. */
import { Router } from "express";
import { idParam } from "@shared/schemas/common";
import {
  bookingListQuery,
  bookingPolicy,
  createBookingInput,
  moveBookingInput,
  optionalReasonInput,
  reasonInput,
  type BookingListQuery,
  type BookingPolicy,
  type CreateBookingParsed,
  type MoveBookingInput,
} from "@shared/schemas/bookings";
import type { Ctx } from "../context";
import { currentUser, requireAuth, requireRole } from "../middleware/auth";
import { body, params, query, validate } from "../middleware/validate";
import { NotFound } from "../errors";
import { serialTransaction } from "../db/serial";
import { canSeeInFull, presentBooking, presentBookings } from "../presenters/booking.presenter";
import { bookingIcs } from "../services/calendar.service";
import { writeBookingPolicy } from "../services/booking-policy";
import { audit } from "../core/audit";

export function createBookingsRouter(ctx: Ctx): Router {
  const r = Router();
  const svc = ctx.services.bookings;
  const id = (req: Express.Request) => params<{ id: number }>(req).id;

  r.get("/", requireAuth, validate({ query: bookingListQuery }), async (req, res) => {
    const viewer = currentUser(req);
    const { items, total } = await svc.list(viewer, query<BookingListQuery>(req));
    res.json({ items: await presentBookings(ctx.ds, viewer, items), total });
  });

  r.post("/", requireRole("member", "manager"), validate({ body: createBookingInput }), async (req, res) => {
    const viewer = currentUser(req);
    const made = await svc.create(viewer, body<CreateBookingParsed>(req));
    const bookings = await presentBookings(ctx.ds, viewer, made);
    res.status(201).json({ booking: bookings[0], bookings });
  });

  r.get("/policy", requireAuth, async (_req, res) => {
    res.json({ policy: await svc.policy() });
  });

  r.put("/policy", requireRole("manager"), validate({ body: bookingPolicy }), async (req, res) => {
    const policy = body<BookingPolicy>(req);
    await serialTransaction(ctx.ds, async (em) => {
      await writeBookingPolicy(em, policy);
      await audit(em, ctx.now(), currentUser(req).id, "booking_policy.changed", "setting", null, policy);
    });
    res.json({ policy });
  });

  // Before "/:id" so "12.ics" is not read as an id.
  r.get("/:id.ics", requireAuth, validate({ params: idParam }), async (req, res) => {
    const viewer = currentUser(req);
    const found = await svc.get(id(req)).catch(() => null);
    if (!found || !canSeeInFull(viewer, found.booking.userId)) throw new NotFound("That booking");
    const text = await bookingIcs(ctx.ds, found.booking.id, ctx.now(), ctx.config.PUBLIC_URL, ctx.config.FACILITY_NAME);
    res.type("text/calendar; charset=utf-8").set("Content-Disposition", `attachment; filename="booking-${found.booking.id}.ics"`).send(text);
  });

  r.get("/:id", requireAuth, validate({ params: idParam }), async (req, res) => {
    res.json({ booking: await presentBooking(ctx.ds, currentUser(req), await svc.get(id(req))) });
  });

  r.patch("/:id", requireAuth, validate({ params: idParam, body: moveBookingInput }), async (req, res) => {
    const viewer = currentUser(req);
    res.json({ booking: await presentBooking(ctx.ds, viewer, await svc.move(viewer, id(req), body<MoveBookingInput>(req))) });
  });

  r.post("/:id/approve", requireRole("manager"), validate({ params: idParam }), async (req, res) => {
    const viewer = currentUser(req);
    res.json({ booking: await presentBooking(ctx.ds, viewer, await svc.approve(viewer, id(req))) });
  });

  r.post("/:id/decline", requireRole("manager"), validate({ params: idParam, body: reasonInput }), async (req, res) => {
    const viewer = currentUser(req);
    res.json({ booking: await presentBooking(ctx.ds, viewer, await svc.decline(viewer, id(req), body<{ reason: string }>(req).reason)) });
  });

  r.post("/:id/cancel", requireAuth, validate({ params: idParam, body: optionalReasonInput }), async (req, res) => {
    const viewer = currentUser(req);
    res.json({ booking: await presentBooking(ctx.ds, viewer, await svc.cancel(viewer, id(req), body<{ reason?: string }>(req).reason)) });
  });

  r.post("/:id/check-in", requireAuth, validate({ params: idParam }), async (req, res) => {
    const viewer = currentUser(req);
    res.json({ booking: await presentBooking(ctx.ds, viewer, await svc.checkIn(viewer, id(req))) });
  });

  r.post("/:id/check-out", requireAuth, validate({ params: idParam }), async (req, res) => {
    const viewer = currentUser(req);
    res.json({ booking: await presentBooking(ctx.ds, viewer, await svc.checkOut(viewer, id(req))) });
  });

  r.post("/:id/no-show", requireRole("manager"), validate({ params: idParam }), async (req, res) => {
    const viewer = currentUser(req);
    res.json({ booking: await presentBooking(ctx.ds, viewer, await svc.noShow(viewer, id(req))) });
  });

  return r;
}

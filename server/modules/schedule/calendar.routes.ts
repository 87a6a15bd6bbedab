/** Personal iCalendar feeds: the secret feed itself (no sign-in, the token is the key) and its address and rotation. */
import { z } from "zod";
import { calendarFeedDto } from "@shared/schemas/bookings";
import { route, WRITTEN } from "../../http/route-table";
import { NotFound } from "../../errors";
import { calendarTokenOf, feedForToken, feedUrl } from "./calendar.queries";
import { rotateCalendarToken } from "./calendar.commands";

/** Tokens are base64url; anything else cannot be one, and is answered like an unknown token. */
const FEED_TOKEN = /^[A-Za-z0-9_-]{16,64}$/;

export const calendarRoutes = [
  route({
    method: "get",
    path: "/calendar/me",
    summary: "The secret address of the signed-in person's calendar feed",
    access: "signed_in",
    output: calendarFeedDto,
    handler: async ({ ctx, actor }) => ({ url: feedUrl(ctx.config.PUBLIC_URL, await calendarTokenOf(ctx.ds, actor.id)) }),
  }),
  route({
    method: "post",
    path: "/calendar/me/rotate",
    summary: "A new secret address for the calendar feed; the old one stops working",
    access: "signed_in",
    output: calendarFeedDto,
    handler: async ({ ctx, actor }) => ({ url: feedUrl(ctx.config.PUBLIC_URL, await rotateCalendarToken(ctx, actor)) }),
  }),
  route({
    method: "get",
    path: "/calendar/:token.ics",
    summary: "A person's bookings as an iCalendar feed (RFC 5545); the secret token is the key",
    description: "404 for a token that is unknown, of an inactive person, or not shaped like a token.",
    access: "public",
    params: z.object({ token: z.string() }),
    produces: "text/calendar",
    handler: async ({ ctx, params, res }) => {
      const text = FEED_TOKEN.test(params.token) ? await feedForToken(ctx.ds, params.token, ctx.now(), ctx.config.PUBLIC_URL, ctx.config.FACILITY_NAME) : null;
      if (text === null) throw new NotFound("That calendar feed");
      res.type("text/calendar; charset=utf-8").set("Cache-Control", "private, max-age=300").send(text);
      return WRITTEN;
    },
  }),
];

/** Personal iCalendar feeds: the secret feed itself (no sign-in, the token is the key) and its rotation. */
import { Router } from "express";
import type { Ctx } from "../context";
import { currentUser, requireAuth } from "../middleware/auth";
import { NotFound } from "../errors";
import { User } from "../entities";
import { serialTransaction } from "../db/serial";
import { audit } from "../core/audit";
import { newToken } from "../core/tokens";
import { feedForToken } from "../services/calendar.service";

export function createCalendarRouter(ctx: Ctx): Router {
  const r = Router();
  const feedUrl = (token: string) => `${ctx.config.PUBLIC_URL}/api/calendar/${token}.ics`;

  r.get("/me", requireAuth, async (req, res) => {
    const u = await ctx.ds.getRepository(User).findOneByOrFail({ id: currentUser(req).id });
    res.json({ url: feedUrl(u.calendarToken) });
  });

  r.post("/me/rotate", requireAuth, async (req, res) => {
    const me = currentUser(req);
    const token = newToken(24);
    await serialTransaction(ctx.ds, async (em) => {
      await em.update(User, me.id, { calendarToken: token, updatedAt: ctx.now().toISOString() });
      await audit(em, ctx.now(), me.id, "calendar_token.rotated", "user", me.id, {});
    });
    res.json({ url: feedUrl(token) });
  });

  r.get("/:token.ics", async (req, res) => {
    const token = String(req.params.token ?? "");
    // Tokens are base64url; anything else cannot be one, and is answered like an unknown token.
    const text = /^[A-Za-z0-9_-]{16,64}$/.test(token) ? await feedForToken(ctx.ds, token, ctx.now(), ctx.config.PUBLIC_URL, ctx.config.FACILITY_NAME) : null;
    if (text === null) throw new NotFound("That calendar feed");
    res.type("text/calendar; charset=utf-8").set("Cache-Control", "private, max-age=300").send(text);
  });

  return r;
}

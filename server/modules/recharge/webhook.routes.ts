/**
 * Events from the payment service. The body arrives raw (app.ts) because the signature covers the
 * exact bytes; a missing or bad signature is a 400 and changes nothing; each event id is handled once.
 */
import { Router } from "express";
import Stripe from "stripe";
import type { Ctx } from "../../context";
import { BadRequest } from "../../errors";

export function createWebhooksRouter(ctx: Ctx): Router {
  const r = Router();

  r.post("/stripe", async (req, res) => {
    const secret = ctx.config.STRIPE_WEBHOOK_SECRET;
    const signature = req.get("stripe-signature");
    if (!secret) throw new BadRequest("Payment events are not accepted: no webhook secret is configured.");
    if (!signature || !Buffer.isBuffer(req.body)) throw new BadRequest("The event carries no valid signature.");
    let event: Stripe.Event;
    try {
      event = Stripe.webhooks.constructEvent(req.body, signature, secret);
    } catch {
      throw new BadRequest("The event's signature does not verify.");
    }
    const { duplicate } = await ctx.services.billing.handleEvent(event);
    res.json({ received: true, duplicate });
  });

  return r;
}

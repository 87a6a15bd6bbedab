/**
 * Events from the payment service. The body arrives raw (app.ts mounts express.raw for
 * /api/webhooks, and no CSRF token is asked there) because the signature covers the exact bytes:
 * the route declares no body schema, so nothing parses it. A missing or bad signature is a 400
 * and changes nothing; each event id is handled once.
 */
import Stripe from "stripe";
import { webhookReceipt } from "@shared/schemas/recharge";
import { route } from "../../http/route-table";
import { AppError } from "../../errors";
import { handlePaymentEvent, HANDLED_EVENT_TYPES, readPaymentEvent } from "./payment-events.commands";

export const webhookRoutes = [
  route({
    method: "post",
    path: "/webhooks/stripe",
    summary: "An event from the payment service, signed (Stripe-Signature header)",
    description: `The raw JSON body is verified against the webhook secret before anything is read; 400 for a missing or bad signature. A signed event without an id or a type is 400 \`event_id_missing\` / \`event_type_missing\`; one of a type other than ${HANDLED_EVENT_TYPES.join(", ")} is recorded once, changes nothing and is 400 \`event_type_unknown\`. An event id already handled answers \`duplicate: true\` and changes nothing.`,
    access: "public",
    consumes: "application/json",
    output: webhookReceipt,
    handler: async ({ ctx, req }) => {
      const secret = ctx.config.STRIPE_WEBHOOK_SECRET;
      const signature = req.get("stripe-signature");
      if (!secret) throw new AppError(400, "webhook_secret_missing", "Payment events are not accepted: no webhook secret is configured.");
      if (!signature || !Buffer.isBuffer(req.body)) throw new AppError(400, "signature_missing", "The event carries no signature.");
      let verified: unknown;
      try {
        verified = Stripe.webhooks.constructEvent(req.body, signature, secret);
      } catch {
        throw new AppError(400, "signature_invalid", "The event's signature does not verify.");
      }
      const event = await readPaymentEvent(ctx, verified);
      const { duplicate } = await handlePaymentEvent(ctx, event);
      return { received: true, duplicate };
    },
  }),
];

/**
 * Events from the payment service (POST /api/webhooks/stripe, after the signature is verified):
 * each event id is handled once, later deliveries change nothing. Invoice events move their
 * statement's invoice status: paid (with the time), payment declined, or void; a paid invoice
 * stays paid whatever arrives after.
 *
 * A signed event is still checked before anything is written: without an id or a type it is
 * 400 `event_id_missing` / `event_type_missing`; of a type Phasebook does not handle it is
 * recorded once (processed_events and an audit row `billing.event_ignored`), changes nothing and
 * is answered 400 `event_type_unknown`, so the payment service's dashboard shows an endpoint
 * subscribed to more than it should be; an invoice event without its invoice is 400
 * `event_malformed`. Never a 500.
 */
import type Stripe from "stripe";
import { ProcessedEvent, Statement } from "../../entities";
import { serialTransaction } from "../../db/serial";
import { audit } from "../../core/audit";
import type { Deps } from "../../core/deps";
import { AppError } from "../../errors";

/** The event types Phasebook handles: subscribe the payment service's endpoint to these only. */
export const HANDLED_EVENT_TYPES = ["invoice.paid", "invoice.payment_failed", "invoice.voided"] as const;

const refuse = (code: string, message: string) => new AppError(400, code, message);
const isText = (v: unknown): v is string => typeof v === "string" && v.trim() !== "" && v.length <= 255;

/**
 * The verified event's shape, checked field by field (the payment service's SDK parses JSON but
 * checks nothing): an event Phasebook handles, or a 400 after recording an unknown type.
 */
export async function readPaymentEvent(deps: Deps, event: unknown): Promise<Stripe.Event> {
  const e = (typeof event === "object" && event !== null ? event : {}) as Record<string, unknown>;
  if (!isText(e.id)) throw refuse("event_id_missing", "The event has no id, so it cannot be handled once and only once.");
  if (!isText(e.type)) throw refuse("event_type_missing", "The event has no type.");
  if (!(HANDLED_EVENT_TYPES as readonly string[]).includes(e.type)) {
    await recordIgnoredEvent(deps, e.id, e.type);
    throw refuse("event_type_unknown", `Phasebook does not handle ${e.type} events; it was recorded and ignored. Subscribe this endpoint to ${HANDLED_EVENT_TYPES.join(", ")} only.`);
  }
  const data = e.data as { object?: { id?: unknown } } | undefined;
  if (typeof data?.object !== "object" || data.object === null || !isText(data.object.id)) {
    throw refuse("event_malformed", "The invoice event does not carry its invoice.");
  }
  return event as Stripe.Event;
}

/** Keeps an event of an unknown type once, with an audit row, and changes nothing else. */
async function recordIgnoredEvent(deps: Deps, id: string, type: string): Promise<void> {
  await serialTransaction(deps.ds, async (em) => {
    if (await em.findOne(ProcessedEvent, { where: { id } })) return;
    await em.insert(ProcessedEvent, { id, type, processedAt: deps.now().toISOString() });
    await audit(em, deps.now(), null, "billing.event_ignored", "payment_event", null, { eventId: id, type });
  });
}

type InvoicePatch = { invoiceStatus?: Statement["invoiceStatus"]; paidAt?: string };

/** What an invoice event changes on its statement (nothing, for one it does not move). */
function invoicePatch(event: Stripe.Event, invoice: Stripe.Invoice, st: Statement): InvoicePatch {
  if (event.type === "invoice.paid") {
    return { invoiceStatus: "paid", paidAt: new Date((invoice.status_transitions?.paid_at ?? event.created) * 1000).toISOString() };
  }
  if (event.type === "invoice.payment_failed" && st.invoiceStatus !== "paid") return { invoiceStatus: "payment_failed" };
  if (event.type === "invoice.voided" && st.invoiceStatus !== "paid") return { invoiceStatus: "void" };
  return {};
}

export async function handlePaymentEvent(deps: Deps, event: Stripe.Event): Promise<{ duplicate: boolean }> {
  return serialTransaction(deps.ds, async (em) => {
    if (await em.findOne(ProcessedEvent, { where: { id: event.id } })) return { duplicate: true };
    await em.insert(ProcessedEvent, { id: event.id, type: event.type, processedAt: deps.now().toISOString() });
    if (!event.type.startsWith("invoice.")) return { duplicate: false };
    const invoice = event.data.object as Stripe.Invoice;
    const st = invoice.id ? await em.findOne(Statement, { where: { invoiceId: invoice.id } }) : null;
    if (!st) return { duplicate: false };
    const patch = invoicePatch(event, invoice, st);
    if (Object.keys(patch).length > 0) {
      await em.update(Statement, st.id, patch);
      await audit(em, deps.now(), null, `billing.${event.type}`, "statement", st.id, { invoiceId: invoice.id, eventId: event.id });
    }
    return { duplicate: false };
  });
}

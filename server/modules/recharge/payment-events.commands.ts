/**
 * Events from the payment service (POST /api/webhooks/stripe, after the signature is verified):
 * each event id is handled once, later deliveries change nothing. Invoice events move their
 * statement's invoice status: paid (with the time), payment declined, or void; a paid invoice
 * stays paid whatever arrives after.
 */
import type Stripe from "stripe";
import { ProcessedEvent, Statement } from "../../entities";
import { serialTransaction } from "../../db/serial";
import { audit } from "../../core/audit";
import type { Deps } from "../../core/deps";

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

/**
 * POST /api/webhooks/stripe with events that are correctly signed but that Phasebook cannot or
 * will not handle: each is a 400 with a stable code, never a 500, and changes no statement.
 * Signed with the fake payment service's own signing (fakes/payments/webhook-sender.ts), and
 * once delivered by the fake itself, subscribed to every event type.
 */
import fs from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import Stripe from "stripe";
import { startFakePayments, type FakePayments } from "../../fakes/payments/server";
import { signWebhookPayload } from "../../fakes/payments/webhook-sender";
import { startTestApp, type TestApp } from "../support/test-app";

const WEBHOOK_SECRET = "whsec_test_phasebook_webhook_refusals";

let dir: string;
let fake: FakePayments;
let t: TestApp;

beforeAll(async () => {
  dir = await fs.mkdtemp(path.join(os.tmpdir(), "phasebook-webhooks-"));
  t = await startTestApp({ env: { STRIPE_WEBHOOK_SECRET: WEBHOOK_SECRET } });
  fake = await startFakePayments({
    port: 0,
    dataPath: path.join(dir, "payments.json"),
    webhookSecret: WEBHOOK_SECRET,
    webhookUrl: `${t.url}/api/webhooks/stripe`,
    enabledEvents: ["*"],
    webhookRetryDelaysMs: [],
  });
});
afterAll(async () => {
  await t.close();
  await fake.close();
  await fs.rm(dir, { recursive: true, force: true });
});

async function deliver(event: unknown): Promise<{ status: number; body: { code?: string; received?: boolean } }> {
  const body = JSON.stringify(event);
  const r = await fetch(`${t.url}/api/webhooks/stripe`, {
    method: "POST",
    headers: { "content-type": "application/json", "stripe-signature": signWebhookPayload(body, WEBHOOK_SECRET) },
    body,
  });
  return { status: r.status, body: (await r.json()) as { code?: string } };
}

const count = async (sql: string, ...args: unknown[]): Promise<number> => Number((await t.ds.query(sql, args))[0].n);

describe("a signed payment event Phasebook cannot handle", () => {
  it.each([
    ["without an id", { object: "event", type: "invoice.paid", data: { object: { id: "in_1" } } }, "event_id_missing"],
    ["with an empty id", { id: "", object: "event", type: "invoice.paid", data: { object: { id: "in_1" } } }, "event_id_missing"],
    ["with an id that is not text", { id: 42, object: "event", type: "invoice.paid", data: { object: { id: "in_1" } } }, "event_id_missing"],
    ["that is not an object", ["evt_1"], "event_id_missing"],
    ["without a type", { id: "evt_no_type", object: "event", data: { object: { id: "in_1" } } }, "event_type_missing"],
    ["of a known type without its invoice", { id: "evt_no_invoice", object: "event", type: "invoice.paid", data: {} }, "event_malformed"],
  ])("answers 400 for an event %s, with a code, and records nothing", async (_what, event, code) => {
    const before = await count(`SELECT COUNT(*) AS n FROM processed_events`);
    const r = await deliver(event);
    expect(r.status).toBe(400);
    expect(r.body.code).toBe(code);
    expect(await count(`SELECT COUNT(*) AS n FROM processed_events`)).toBe(before);
  });

  it("records an event of a type it does not handle once, ignores it, and answers 400 event_type_unknown every time", async () => {
    const event = { id: "evt_customer_made", object: "event", type: "customer.created", created: 1796000000, data: { object: { id: "cus_1", object: "customer" } } };
    const first = await deliver(event);
    expect(first.status).toBe(400);
    expect(first.body.code).toBe("event_type_unknown");
    const again = await deliver(event);
    expect(again.status).toBe(400);
    expect(again.body.code).toBe("event_type_unknown");
    expect(await t.ds.query(`SELECT id, type FROM processed_events WHERE id = ?`, ["evt_customer_made"])).toEqual([{ id: "evt_customer_made", type: "customer.created" }]);
    const audit = await t.ds.query(`SELECT action, entityType, detail FROM audit_log WHERE action = 'billing.event_ignored'`);
    expect(audit.filter((a: { detail: string }) => JSON.parse(a.detail).eventId === "evt_customer_made")).toEqual([
      { action: "billing.event_ignored", entityType: "payment_event", detail: JSON.stringify({ eventId: "evt_customer_made", type: "customer.created" }) },
    ]);
  });

  it("refuses, as the fake service delivers it, an invoice.created event the endpoint should not be subscribed to", async () => {
    const sdk = new Stripe("sk_test_phasebook_webhooks", { host: "127.0.0.1", port: fake.port, protocol: "http" });
    const customer = await sdk.customers.create({ name: "Harbour Analytical Ltd", email: "ap@harbour.example" });
    await sdk.invoices.create({ customer: customer.id, collection_method: "send_invoice", days_until_due: 30 });
    const [created] = (await sdk.events.list({ type: "invoice.created" })).data;
    let deliveries: { status: number | null }[] = [];
    for (let i = 0; i < 50 && deliveries.length === 0; i++) {
      await new Promise((r) => setTimeout(r, 50));
      deliveries = ((await (await fetch(`${fake.url}/_control/events/${created.id}`)).json()) as { deliveries: { status: number | null }[] }).deliveries;
    }
    expect(deliveries.map((d) => d.status)).toEqual([400]);
    expect(await t.ds.query(`SELECT type FROM processed_events WHERE id = ?`, [created.id])).toEqual([{ type: "invoice.created" }]);
  });
});

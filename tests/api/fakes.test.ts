/**
 * The local fakes, exercised through the real clients Phasebook uses: nodemailer over SMTP for the
 * mailbox, the payment provider's own SDK over HTTP for the payment service, and the SDK's
 * webhook verifier for the signatures the fake puts on its events.
 */
import fs from "node:fs/promises";
import http from "node:http";
import os from "node:os";
import path from "node:path";
import type { AddressInfo } from "node:net";
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import nodemailer from "nodemailer";
import Stripe from "stripe";
import { startFakeMailbox, type FakeMailbox, type MailboxMessage } from "../../fakes/mailbox/server";
import { startFakePayments, type FakePayments } from "../../fakes/payments/server";

const WEBHOOK_SECRET = "whsec_test_phasebook_fakes_suite";
const API_KEY = "sk_test_phasebook_fakes_suite";

async function tempDir(): Promise<string> {
  return fs.mkdtemp(path.join(os.tmpdir(), "phasebook-fakes-"));
}

async function listMessages(mailbox: FakeMailbox, query = ""): Promise<{ items: MailboxMessage[]; total: number }> {
  const res = await fetch(`${mailbox.httpUrl}/messages${query}`);
  expect(res.status).toBe(200);
  return (await res.json()) as { items: MailboxMessage[]; total: number };
}

describe("fake mailbox", () => {
  let dir: string;
  let storePath: string;
  let mailbox: FakeMailbox;

  beforeAll(async () => {
    dir = await tempDir();
    storePath = path.join(dir, "mailbox.json");
    mailbox = await startFakeMailbox({ smtpPort: 0, httpPort: 0, storePath });
  });

  afterAll(async () => {
    await mailbox.close();
    await fs.rm(dir, { recursive: true, force: true });
  });

  it("stores a message sent with nodemailer over SMTP and lists it at GET /messages", async () => {
    const transport = nodemailer.createTransport(mailbox.smtpUrl);
    await transport.sendMail({
      from: "Phasebook <phasebook@kestrelbay.example>",
      to: "r.okafor@tidewater.example",
      subject: "Invoice 2025-03 for potentiostat time",
      text: "Your invoice for March is ready.",
      html: "<p>Your invoice for March is ready.</p>",
    });

    const { items, total } = await listMessages(mailbox);
    expect(total).toBe(1);
    expect(items[0]).toMatchObject({
      from: "phasebook@kestrelbay.example",
      to: ["r.okafor@tidewater.example"],
      subject: "Invoice 2025-03 for potentiostat time",
      html: "<p>Your invoice for March is ready.</p>",
    });
    expect(items[0]!.text.trim()).toBe("Your invoice for March is ready.");
    expect(items[0]!.headers["message-id"]).toMatch(/^<.+@.+>$/);

    const one = await fetch(`${mailbox.httpUrl}/messages/${items[0]!.id}`);
    expect(((await one.json()) as MailboxMessage).subject).toBe("Invoice 2025-03 for potentiostat time");
  });

  it("accepts any SMTP credentials, lists newest first and filters by recipient with ?to=", async () => {
    const [host, port] = mailbox.smtpUrl.replace("smtp://", "").split(":");
    const transport = nodemailer.createTransport({ host, port: Number(port), secure: false, auth: { user: "anyone", pass: "anything" } });
    await transport.sendMail({
      from: "phasebook@kestrelbay.example",
      to: "m.lindqvist@kestrelbay.example",
      bcc: "safety-office@kestrelbay.example",
      subject: "Training on the four-electrode cell expires in 14 days",
      text: "Renew before it lapses.",
    });

    const all = await listMessages(mailbox);
    expect(all.items.map((m) => m.subject)).toEqual([
      "Training on the four-electrode cell expires in 14 days",
      "Invoice 2025-03 for potentiostat time",
    ]);
    const toLindqvist = await listMessages(mailbox, "?to=M.Lindqvist@kestrelbay.example");
    expect(toLindqvist.items.map((m) => m.subject)).toEqual(["Training on the four-electrode cell expires in 14 days"]);
    // A Bcc recipient is only in the SMTP envelope, and the filter still finds the message.
    const toSafety = await listMessages(mailbox, "?to=safety-office@kestrelbay.example");
    expect(toSafety.total).toBe(1);
    expect(toSafety.items[0]!.envelope.to).toContain("safety-office@kestrelbay.example");
  });

  it("keeps its messages across a restart on the same store file", async () => {
    await mailbox.close();
    mailbox = await startFakeMailbox({ smtpPort: 0, httpPort: 0, storePath });
    const { total, items } = await listMessages(mailbox);
    expect(total).toBe(2);
    expect(items[1]!.subject).toBe("Invoice 2025-03 for potentiostat time");
  });

  it("answers 404 for an unknown message and empties the box on DELETE /messages", async () => {
    expect((await fetch(`${mailbox.httpUrl}/messages/nope`)).status).toBe(404);
    expect((await fetch(`${mailbox.httpUrl}/messages`, { method: "DELETE" })).status).toBe(204);
    expect((await listMessages(mailbox)).total).toBe(0);
  });
});

/** A stand-in for Phasebook's webhook route: it keeps each raw body and signature header. */
interface Received {
  body: string;
  signature: string;
}

async function startReceiver(): Promise<{
  url: string;
  received: Received[];
  failNext: number;
  waitFor(count: number): Promise<void>;
  close(): Promise<void>;
}> {
  const received: Received[] = [];
  const state = { failNext: 0 };
  const server = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on("data", (c: Buffer) => chunks.push(c));
    req.on("end", () => {
      received.push({ body: Buffer.concat(chunks).toString("utf8"), signature: String(req.headers["stripe-signature"] ?? "") });
      if (state.failNext > 0) {
        state.failNext -= 1;
        res.writeHead(500).end("try again");
      } else {
        res.writeHead(200, { "Content-Type": "application/json" }).end('{"received":true}');
      }
    });
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const port = (server.address() as AddressInfo).port;
  return {
    url: `http://127.0.0.1:${port}/api/webhooks/stripe`,
    received,
    get failNext() {
      return state.failNext;
    },
    set failNext(n: number) {
      state.failNext = n;
    },
    async waitFor(count: number) {
      const deadline = Date.now() + 10_000;
      while (received.length < count) {
        if (Date.now() > deadline) throw new Error(`expected ${count} webhook deliveries, got ${received.length}`);
        await new Promise((r) => setTimeout(r, 20));
      }
    },
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}

function sdkFor(fake: FakePayments): Stripe {
  return new Stripe(API_KEY, { host: "127.0.0.1", port: fake.port, protocol: "http", maxNetworkRetries: 0 });
}

async function postControl(fake: FakePayments, route: string): Promise<{ status: number; body: Record<string, unknown> }> {
  const res = await fetch(`${fake.url}/_control/${route}`, { method: "POST" });
  return { status: res.status, body: (await res.json()) as Record<string, unknown> };
}

describe("fake payment service", () => {
  let dir: string;
  let dataPath: string;
  let receiver: Awaited<ReturnType<typeof startReceiver>>;
  let fake: FakePayments;
  let stripe: Stripe;

  beforeAll(async () => {
    dir = await tempDir();
    dataPath = path.join(dir, "payments.json");
    receiver = await startReceiver();
    fake = await startFakePayments({ port: 0, dataPath, webhookUrl: receiver.url, webhookSecret: WEBHOOK_SECRET, webhookRetryDelaysMs: [50, 50] });
    stripe = sdkFor(fake);
  });

  afterEach(() => {
    receiver.failNext = 0;
  });

  afterAll(async () => {
    await fake.close();
    await receiver.close();
    await fs.rm(dir, { recursive: true, force: true });
  });

  /** An external customer with two billed lines, 125.00 and 2 × 37.50, on one draft invoice. */
  async function draftInvoice(): Promise<{ customer: Stripe.Customer; items: Stripe.InvoiceItem[]; invoice: Stripe.Invoice }> {
    const customer = await stripe.customers.create({
      name: "Tidewater Metals Recovery Ltd",
      email: "accounts@tidewater.example",
      metadata: { phasebookAccountId: "42" },
    });
    const items = [
      await stripe.invoiceItems.create({
        customer: customer.id,
        amount: 12500,
        currency: "cad",
        description: "Potentiostat PS-2, 2.5 h at 50.00/h",
        metadata: { bookingId: "901" },
      }),
      await stripe.invoiceItems.create({
        customer: customer.id,
        unit_amount_decimal: "3750",
        quantity: 2,
        currency: "cad",
        description: "Four-electrode cell, 2 sessions",
      }),
    ];
    const invoice = await stripe.invoices.create({
      customer: customer.id,
      collection_method: "send_invoice",
      days_until_due: 30,
      auto_advance: false,
      pending_invoice_items_behavior: "include",
      metadata: { billingRunId: "7", period: "2025-03" },
    });
    return { customer, items, invoice };
  }

  it("creates a customer, bills two items, finalises and sends an invoice whose amount_due is the items' sum", async () => {
    const { customer, items, invoice } = await draftInvoice();
    expect(customer.id).toMatch(/^cus_[0-9A-Za-z]+$/);
    expect(customer.metadata).toEqual({ phasebookAccountId: "42" });
    expect(items.map((i) => i.id)).toEqual([expect.stringMatching(/^ii_[0-9A-Za-z]{24}$/), expect.stringMatching(/^ii_/)]);
    expect(items.map((i) => i.amount)).toEqual([12500, 7500]);
    expect(invoice.id).toMatch(/^in_[0-9A-Za-z]{24}$/);
    expect(invoice.status).toBe("draft");
    expect(invoice.lines.data.map((l) => l.parent?.invoice_item_details?.invoice_item)).toEqual(items.map((i) => i.id));

    const finalized = await stripe.invoices.finalizeInvoice(invoice.id!);
    expect(finalized.status).toBe("open");
    expect(finalized.amount_due).toBe(items[0]!.amount + items[1]!.amount);
    expect(finalized.number).toMatch(/^[A-Z0-9]{8}-0001$/);
    expect(finalized.hosted_invoice_url).toBe(`${fake.url}/invoices/${invoice.id}`);
    expect(finalized.due_date! - finalized.status_transitions.finalized_at!).toBe(30 * 86400);

    const sent = await stripe.invoices.sendInvoice(invoice.id!);
    expect(sent.status).toBe("open");

    const listed = await stripe.invoices.list({ customer: customer.id, expand: ["data.customer"] });
    expect(listed.data.map((i) => i.id)).toEqual([invoice.id]);
    expect((listed.data[0]!.customer as Stripe.Customer).email).toBe("accounts@tidewater.example");
  });

  it("posts a signed invoice.paid event that the SDK's constructEvent accepts, and one a wrong secret rejects", async () => {
    const { invoice } = await draftInvoice();
    await stripe.invoices.finalizeInvoice(invoice.id!);
    const before = receiver.received.length;

    const paid = await postControl(fake, `invoices/${invoice.id}/pay`);
    expect(paid.status).toBe(200);
    expect(receiver.received.length).toBe(before + 1);
    const { body, signature } = receiver.received[before]!;
    expect(signature).toMatch(/^t=\d+,v1=[0-9a-f]{64}$/);

    const event = stripe.webhooks.constructEvent(body, signature, WEBHOOK_SECRET);
    expect(event.id).toMatch(/^evt_[0-9A-Za-z]{24}$/);
    expect(event.type).toBe("invoice.paid");
    expect(event.livemode).toBe(false);
    expect(event.api_version).toBe(Stripe.API_VERSION);
    const object = event.data.object as Stripe.Invoice;
    expect(object.id).toBe(invoice.id);
    expect(object.status).toBe("paid");
    expect(object.amount_paid).toBe(20000);

    expect(() => stripe.webhooks.constructEvent(body, signature, "whsec_some_other_endpoint")).toThrow(
      Stripe.errors.StripeSignatureVerificationError,
    );
    expect(() => stripe.webhooks.constructEvent(body.replace('"paid"', '"open"'), signature, WEBHOOK_SECRET)).toThrow(
      Stripe.errors.StripeSignatureVerificationError,
    );
    expect((await stripe.invoices.retrieve(invoice.id!)).status).toBe("paid");
  });

  it("redelivers the very same event on /_control/events/:id/resend", async () => {
    const { invoice } = await draftInvoice();
    await stripe.invoices.finalizeInvoice(invoice.id!);
    const failed = await postControl(fake, `invoices/${invoice.id}/fail`);
    const eventId = (failed.body.event as { id: string }).id;
    expect((failed.body.invoice as { status: string; attempt_count: number })).toMatchObject({ status: "open", attempt_count: 1 });

    const resent = await postControl(fake, `events/${eventId}/resend`);
    expect(resent.status).toBe(200);
    const [first, second] = receiver.received.slice(-2).map((r) => stripe.webhooks.constructEvent(r.body, r.signature, WEBHOOK_SECRET));
    expect(first!.type).toBe("invoice.payment_failed");
    expect(second!.id).toBe(first!.id);
    expect(second!.data.object).toEqual(first!.data.object);
  });

  it("retries a refused webhook delivery and records every attempt", async () => {
    const { invoice } = await draftInvoice();
    await stripe.invoices.finalizeInvoice(invoice.id!);
    const before = receiver.received.length;
    receiver.failNext = 1;

    const paid = await postControl(fake, `invoices/${invoice.id}/pay`);
    const delivery = paid.body.delivery as { delivered: boolean; retrying: boolean };
    expect(delivery).toMatchObject({ delivered: false, retrying: true });
    await receiver.waitFor(before + 2);

    const eventId = (paid.body.event as { id: string }).id;
    const log = await (await fetch(`${fake.url}/_control/events/${eventId}`)).json() as { deliveries: { ok: boolean; status: number }[] };
    expect(log.deliveries.map((d) => [d.ok, d.status])).toEqual([[false, 500], [true, 200]]);
  });

  it("replays the stored answer for a repeated Idempotency-Key and refuses the key with other parameters", async () => {
    const a = await stripe.customers.create({ name: "Harbour Analytical" }, { idempotencyKey: "phasebook-account-17" });
    const b = await stripe.customers.create({ name: "Harbour Analytical" }, { idempotencyKey: "phasebook-account-17" });
    expect(b.id).toBe(a.id);
    expect(b.lastResponse.headers["idempotent-replayed"]).toBe("true");
    await expect(stripe.customers.create({ name: "Someone Else" }, { idempotencyKey: "phasebook-account-17" })).rejects.toBeInstanceOf(
      Stripe.errors.StripeIdempotencyError,
    );
  });

  it("answers in the service's error shape, so the SDK throws its typed errors", async () => {
    const missing = await stripe.invoices.retrieve("in_doesnotexist").catch((e: unknown) => e);
    expect(missing).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(missing).toMatchObject({ statusCode: 404, code: "resource_missing", param: "id" });

    const unknownCustomer = await stripe.invoiceItems.create({ customer: "cus_nobody", amount: 100, currency: "cad" }).catch((e: unknown) => e);
    expect(unknownCustomer).toMatchObject({ type: "StripeInvalidRequestError", statusCode: 400, code: "resource_missing", param: "customer" });

    const noDays = await stripe.customers
      .create({ name: "No Terms Ltd" })
      .then((c) => stripe.invoices.create({ customer: c.id, collection_method: "send_invoice" }))
      .catch((e: unknown) => e);
    expect(noDays).toMatchObject({ statusCode: 400, param: "days_until_due" });

    const noKey = await fetch(`${fake.url}/v1/customers`);
    expect(noKey.status).toBe(401);
    expect(((await noKey.json()) as { error: { type: string } }).error.type).toBe("invalid_request_error");
    const live = new Stripe("sk_live_not_for_fakes", { host: "127.0.0.1", port: fake.port, protocol: "http", maxNetworkRetries: 0 });
    await expect(live.customers.list()).rejects.toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
  });

  it("serves a hosted invoice page whose Pay now button marks the invoice paid and notifies the webhook", async () => {
    const { invoice } = await draftInvoice();
    const open = await stripe.invoices.finalizeInvoice(invoice.id!);
    const page = await fetch(open.hosted_invoice_url!);
    const html = await page.text();
    expect(html).toContain("Pay now");
    expect(html).toContain("Potentiostat PS-2, 2.5 h at 50.00/h");
    expect(html).toContain("CAD\u00a0200.00");

    const before = receiver.received.length;
    const pay = await fetch(`${fake.url}/invoices/${invoice.id}/pay`, { method: "POST", redirect: "manual" });
    expect(pay.status).toBe(303);
    expect(receiver.received.length).toBe(before + 1);
    const after = await (await fetch(open.hosted_invoice_url!)).text();
    expect(after).toContain("Paid");
    expect(after).not.toContain("Pay now");
  });

  it("keeps customers, invoices and events across a restart on the same data file", async () => {
    const { customer, invoice } = await draftInvoice();
    await stripe.invoices.finalizeInvoice(invoice.id!);
    await postControl(fake, `invoices/${invoice.id}/pay`);

    await fake.close();
    fake = await startFakePayments({ port: 0, dataPath, webhookUrl: receiver.url, webhookSecret: WEBHOOK_SECRET, webhookRetryDelaysMs: [50, 50] });
    stripe = sdkFor(fake);

    expect((await stripe.customers.retrieve(customer.id)) as Stripe.Customer).toMatchObject({ name: "Tidewater Metals Recovery Ltd" });
    const again = await stripe.invoices.retrieve(invoice.id!);
    expect(again).toMatchObject({ status: "paid", amount_due: 20000, amount_paid: 20000 });
    const events = await stripe.events.list({ type: "invoice.paid" });
    expect(events.data.some((e) => (e.data.object as Stripe.Invoice).id === invoice.id)).toBe(true);
    // The next invoice for the same customer carries on the number sequence.
    const next = await stripe.invoices.create({ customer: customer.id, collection_method: "send_invoice", days_until_due: 14 });
    await stripe.invoiceItems.create({ customer: customer.id, invoice: next.id, amount: 4000, description: "Solvent surcharge" });
    const numbered = await stripe.invoices.finalizeInvoice(next.id!);
    expect(numbered.number).toBe(`${again.number!.slice(0, 8)}-0002`);
    expect(numbered.amount_due).toBe(4000);
  });
});

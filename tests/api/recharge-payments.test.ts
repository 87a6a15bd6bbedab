/**
 * External invoices against the fake payment API through the real stripe SDK, and the signed
 * webhook route: a bad signature is refused with 400, the same event delivered twice changes
 * nothing, and an unreachable payment service leaves invoices queued until the retry job runs.
 */
import fs from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import crypto from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import Stripe from "stripe";
import { startFakePayments, type FakePayments } from "../../fakes/payments/server";
import { createPaymentsClient } from "../../server/integrations/payments";
import { processDueInvoices } from "../../server/modules/recharge/invoice.commands";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { readPdf } from "../support/pdf-text";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeAccount, makeBooking, makeInstrument, makeRate } from "../support/billing-factories";
import type { Account } from "../../server/entities";

const WEBHOOK_SECRET = "whsec_test_phasebook_recharge_suite";

let dir: string;
let fake: FakePayments;
let t: TestApp;
let manager: ApiClient;
let customer: Account;

async function statementRow(accountId: number): Promise<{ id: number; invoiceStatus: string; invoiceId: string | null; invoiceUrl: string | null }> {
  const rows = await t.ds.query(`SELECT id, invoiceStatus, invoiceId, invoiceUrl FROM statements WHERE accountId = ? ORDER BY id DESC LIMIT 1`, [accountId]);
  return rows[0];
}

/** Signs a body the way the payment service does (t=<seconds>,v1=<HMAC-SHA256 of "t.body">). */
function sign(body: string, secret: string): string {
  const ts = Math.floor(Date.now() / 1000);
  const v1 = crypto.createHmac("sha256", secret).update(`${ts}.${body}`).digest("hex");
  return `t=${ts},v1=${v1}`;
}

beforeAll(async () => {
  dir = await fs.mkdtemp(path.join(os.tmpdir(), "phasebook-recharge-pay-"));
  fake = await startFakePayments({ port: 0, dataPath: path.join(dir, "payments.json"), webhookSecret: WEBHOOK_SECRET, webhookRetryDelaysMs: [50] });
  const payments = createPaymentsClient({ secretKey: "sk_test_phasebook_recharge", apiBase: fake.url, webhookSecret: WEBHOOK_SECRET });
  t = await startTestApp({ deps: { payments }, env: { STRIPE_WEBHOOK_SECRET: WEBHOOK_SECRET } });
  fake.setWebhookUrl(`${t.url}/api/webhooks/stripe`);
  const m = await makeUser(t.ds, { roles: ["manager"] });
  manager = new ApiClient(t.url);
  await manager.login(m.email, TEST_PASSWORD);

  const u = await makeUser(t.ds);
  customer = await makeAccount(t.ds, { kind: "external", customerClass: "commercial", name: "Harbour Analytical Ltd", organisation: "Harbour Analytical Ltd", billingEmail: "ap@harbour.example" });
  const ps = await makeInstrument(t.ds, { kind: "potentiostat" });
  await makeRate(t.ds, { instrumentKind: "potentiostat", customerClass: "commercial", hourlyRateCents: 12000, effectiveFrom: "2026-01-01" });
  // 90 booked minutes × 12000/60 = 18000 cents.
  await makeBooking(t.ds, { userId: u.id, accountId: customer.id, instrumentIds: [ps.id], start: "2026-11-12T14:00:00Z", end: "2026-11-12T15:30:00Z" });
});

afterAll(async () => {
  await t.close();
  await fake.close();
  await fs.rm(dir, { recursive: true, force: true });
});

describe("external invoices", () => {
  it("invoices an external statement on the payment service: open, with the statement's total due", async () => {
    const r = await manager.post("/api/billing/runs", { period: "2026-11" });
    expect(r.status, r.text).toBe(201);
    const st = r.body.run.statements.find((s: { accountId: number }) => s.accountId === customer.id);
    expect(st.invoiceStatus).toBe("open");
    expect(st.invoiceUrl).toMatch(new RegExp(`^${fake.url}/invoices/in_`));
    const sdk = new Stripe("sk_test_phasebook_recharge", { host: "127.0.0.1", port: fake.port, protocol: "http" });
    const row = await statementRow(customer.id);
    const inv = await sdk.invoices.retrieve(row.invoiceId!);
    expect(inv).toMatchObject({ status: "open", amount_due: 18000, currency: "cad" });
  });

  it("prints the invoice's number, its status and a link to pay it on the external statement's PDF", async () => {
    const row = await statementRow(customer.id);
    const [{ invoiceNumber }] = await t.ds.query(`SELECT invoiceNumber FROM statements WHERE id = ?`, [row.id]);
    expect(invoiceNumber).toBeTruthy();
    const res = await fetch(`${t.url}/api/billing/statements/${row.id}/statement.pdf`, { headers: { cookie: manager.cookieHeader } });
    expect(res.status).toBe(200);
    const pdf = await readPdf(new Uint8Array(await res.arrayBuffer()));
    const flat = pdf.text.replace(/\s+/g, " ");
    expect(flat).toContain("Organisation: Harbour Analytical Ltd");
    expect(flat).toContain(`Settled by invoice ${invoiceNumber}.`);
    expect(flat).toContain("Status: invoice open");
    expect(flat).toContain(`Pay online: ${row.invoiceUrl}`);
    expect(pdf.links).toContain(row.invoiceUrl);
    // 90 booked minutes × 12000/60 = 18000 cents = $180.00: the only line, its instrument's subtotal, and the total.
    expect(pdf.text.split("\n").filter((r) => r === "$180.00")).toHaveLength(3);
  });

  it("marks the statement paid when the signed invoice.paid event arrives, and a replay changes nothing", async () => {
    const row = await statementRow(customer.id);
    const paid = await fetch(`${fake.url}/_control/invoices/${row.invoiceId}/pay`, { method: "POST" });
    const body = (await paid.json()) as { event: { id: string }; delivery: { delivered: boolean } };
    expect(body.delivery.delivered).toBe(true);
    expect((await statementRow(customer.id)).invoiceStatus).toBe("paid");

    // Pretend the statement went back to open; a replay of the same event must not touch it.
    await t.ds.query(`UPDATE statements SET invoiceStatus = 'open' WHERE id = ?`, [row.id]);
    const resent = await fetch(`${fake.url}/_control/events/${body.event.id}/resend`, { method: "POST" });
    expect(resent.status).toBe(200);
    expect((await statementRow(customer.id)).invoiceStatus).toBe("open");
    const processed = await t.ds.query(`SELECT COUNT(*) AS n FROM processed_events WHERE id = ?`, [body.event.id]);
    expect(Number(processed[0].n)).toBe(1);
    await t.ds.query(`UPDATE statements SET invoiceStatus = 'paid' WHERE id = ?`, [row.id]);
  });

  it("refuses an event with a bad or missing signature with 400 and changes nothing", async () => {
    const event = JSON.stringify({ id: "evt_forged", object: "event", type: "invoice.paid", data: { object: { id: "in_x" } } });
    const forged = await fetch(`${t.url}/api/webhooks/stripe`, {
      method: "POST",
      headers: { "content-type": "application/json", "stripe-signature": sign(event, "whsec_someone_else") },
      body: event,
    });
    expect(forged.status).toBe(400);
    const unsigned = await fetch(`${t.url}/api/webhooks/stripe`, { method: "POST", headers: { "content-type": "application/json" }, body: event });
    expect(unsigned.status).toBe(400);
    const processed = await t.ds.query(`SELECT COUNT(*) AS n FROM processed_events WHERE id = 'evt_forged'`);
    expect(Number(processed[0].n)).toBe(0);
    // The same body correctly signed is accepted: the signature was the only thing wrong.
    const good = await fetch(`${t.url}/api/webhooks/stripe`, {
      method: "POST",
      headers: { "content-type": "application/json", "stripe-signature": sign(event, WEBHOOK_SECRET) },
      body: event,
    });
    expect(good.status).toBe(200);
  });

  it("records a declined payment as payment_failed", async () => {
    const other = await makeAccount(t.ds, { kind: "external", customerClass: "commercial", billingEmail: "ap@other.example" });
    const u = await makeUser(t.ds);
    const inst = await makeInstrument(t.ds, { kind: "potentiostat" });
    await makeBooking(t.ds, { userId: u.id, accountId: other.id, instrumentIds: [inst.id], start: "2026-10-12T14:00:00Z", end: "2026-10-12T15:00:00Z" });
    expect((await manager.post("/api/billing/runs", { period: "2026-10" })).status).toBe(201);
    const row = await statementRow(other.id);
    await fetch(`${fake.url}/_control/invoices/${row.invoiceId}/fail`, { method: "POST" });
    expect((await statementRow(other.id)).invoiceStatus).toBe("payment_failed");
  });
});

describe("an unreachable payment service", () => {
  it("completes the run with the invoice queued, and the retry job invoices it later", async () => {
    const unreachable = createPaymentsClient({ secretKey: "sk_test_phasebook_recharge", apiBase: "http://127.0.0.1:9", webhookSecret: WEBHOOK_SECRET });
    const down = await startTestApp({ deps: { payments: unreachable } });
    try {
      const m = await makeUser(down.ds, { roles: ["manager"] });
      const c = new ApiClient(down.url);
      await c.login(m.email, TEST_PASSWORD);
      const acct = await makeAccount(down.ds, { kind: "external", customerClass: "commercial", billingEmail: "ap@later.example" });
      const u = await makeUser(down.ds);
      const inst = await makeInstrument(down.ds, { kind: "potentiostat" });
      await makeRate(down.ds, { instrumentKind: "potentiostat", customerClass: "commercial", hourlyRateCents: 6000, effectiveFrom: "2026-01-01" });
      await makeBooking(down.ds, { userId: u.id, accountId: acct.id, instrumentIds: [inst.id], start: "2026-11-02T14:00:00Z", end: "2026-11-02T15:00:00Z" });

      const r = await c.post("/api/billing/runs", { period: "2026-11" });
      expect(r.status).toBe(201);
      expect(r.body.run.statements[0].invoiceStatus).toBe("queued");
      const [queued] = await down.ds.query(`SELECT invoiceAttempts, invoiceLastError FROM statements`);
      expect(queued.invoiceAttempts).toBe(1);
      expect(queued.invoiceLastError).toBeTruthy();

      // The service comes back: the job (what the scheduler runs) finishes the invoice.
      const back = createPaymentsClient({ secretKey: "sk_test_phasebook_recharge", apiBase: fake.url, webhookSecret: WEBHOOK_SECRET });
      const later = () => new Date(down.clock.now().getTime() + 2 * 60_000);
      const result = await processDueInvoices({ ds: down.ds, payments: back, now: later });
      const [why] = await down.ds.query(`SELECT invoiceLastError FROM statements`);
      expect(result, why.invoiceLastError).toEqual({ done: 1, failed: 0 });
      const [after] = await down.ds.query(`SELECT invoiceStatus, invoiceId FROM statements`);
      expect(after.invoiceStatus).toBe("open");
      const sdk = new Stripe("sk_test_phasebook_recharge", { host: "127.0.0.1", port: fake.port, protocol: "http" });
      expect((await sdk.invoices.retrieve(after.invoiceId)).amount_due).toBe(6000);
    } finally {
      await down.close();
    }
  });
});

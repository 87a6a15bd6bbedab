/**
 * External statements become invoices on the payment service through the stripe SDK: customer,
 * a draft invoice, one invoice item per statement line, finalise, send. Every step is
 * idempotent (the ids are kept as soon as they exist, the items carry their line id), so a run
 * completes while the service is unreachable and the `send-invoices` job finishes the work
 * later; nothing is lost and nothing is billed twice.
 */
import type { DataSource } from "typeorm";
import type Stripe from "stripe";
import { Account, BillingRun, ChargeLine, Statement } from "../../entities";

/** Minutes before each retry of an invoice the payment service did not take. */
const RETRY_MINUTES = [1, 5, 15, 60, 180, 720];

export interface InvoicingDeps {
  ds: DataSource;
  payments?: Stripe;
  now: () => Date;
  /** Names the invoice; FACILITY_NAME. */
  facilityName?: string;
}

async function ensureCustomer(deps: InvoicingDeps, stripe: Stripe, account: Account): Promise<string> {
  if (account.paymentCustomerId) return account.paymentCustomerId;
  const customer = await stripe.customers.create(
    {
      name: account.organisation ?? account.name,
      email: account.billingEmail ?? undefined,
      description: account.name,
      metadata: { phasebookAccountId: String(account.id), accountCode: account.code },
    },
    { idempotencyKey: `phasebook-account-${account.id}-${account.code}-${account.createdAt}` },
  );
  await deps.ds.getRepository(Account).update(account.id, { paymentCustomerId: customer.id });
  return customer.id;
}

async function invoicedLineIds(stripe: Stripe, invoiceId: string): Promise<Set<string>> {
  const ids = new Set<string>();
  for await (const item of stripe.invoiceItems.list({ invoice: invoiceId, limit: 100 })) {
    if (item.metadata?.lineId) ids.add(item.metadata.lineId);
  }
  return ids;
}

/** Carries one statement's invoice as far as it can go; throws when the service fails. */
export async function pushInvoice(deps: InvoicingDeps, statementId: number): Promise<Statement> {
  const stripe = deps.payments;
  if (!stripe) throw new Error("No payment service is configured");
  const repo = deps.ds.getRepository(Statement);
  let st = await repo.findOneByOrFail({ id: statementId });
  const account = await deps.ds.getRepository(Account).findOneByOrFail({ id: st.accountId });
  const currency = st.currency.toLowerCase();
  const customer = await ensureCustomer(deps, stripe, account);

  if (!st.invoiceId) {
    const draft = await stripe.invoices.create(
      {
        customer,
        collection_method: "send_invoice",
        days_until_due: 30,
        auto_advance: false,
        currency,
        pending_invoice_items_behavior: "exclude",
        description: `${deps.facilityName ?? "Liquid Interfaces Core"} recharge, ${st.period}`,
        metadata: { statementId: String(st.id), runId: String(st.runId), period: st.period, accountCode: account.code },
      },
      { idempotencyKey: `phasebook-statement-${st.id}-${account.code}-${st.createdAt}` },
    );
    await repo.update(st.id, { invoiceId: draft.id! });
    st = { ...st, invoiceId: draft.id! };
  }
  let invoice = await stripe.invoices.retrieve(st.invoiceId!);
  if (invoice.status === "draft") {
    const done = await invoicedLineIds(stripe, invoice.id!);
    const lines = await deps.ds.getRepository(ChargeLine).find({ where: { statementId: st.id }, order: { id: "ASC" } });
    for (const l of lines) {
      if (done.has(String(l.id))) continue;
      await stripe.invoiceItems.create(
        { customer, invoice: invoice.id!, amount: l.amountCents, currency, description: l.description.slice(0, 500), metadata: { lineId: String(l.id) } },
        { idempotencyKey: `phasebook-line-${l.id}-${account.code}-${st.createdAt}` },
      );
    }
    invoice = await stripe.invoices.finalizeInvoice(invoice.id!);
  }
  if (invoice.status === "open") invoice = await stripe.invoices.sendInvoice(invoice.id!);
  const status = invoice.status === "paid" ? "paid" : invoice.status === "void" ? "void" : "open";
  await repo.update(st.id, {
    invoiceStatus: st.invoiceStatus === "payment_failed" && status === "open" ? "payment_failed" : status,
    invoiceNumber: invoice.number ?? null,
    invoiceUrl: invoice.hosted_invoice_url ?? null,
    invoiceNextAttemptAt: null,
    invoiceLastError: null,
    paidAt: status === "paid" ? deps.now().toISOString() : st.paidAt,
  });
  return repo.findOneByOrFail({ id: st.id });
}

/** Voids a voided run's invoice on the payment service (open ones only; a paid one stays paid). */
async function voidInvoice(deps: InvoicingDeps, st: Statement): Promise<void> {
  const stripe = deps.payments;
  const repo = deps.ds.getRepository(Statement);
  if (!st.invoiceId) {
    await repo.update(st.id, { invoiceStatus: "void", invoiceNextAttemptAt: null });
    return;
  }
  if (!stripe) throw new Error("No payment service is configured");
  const inv = await stripe.invoices.retrieve(st.invoiceId);
  if (inv.status === "draft") await stripe.invoices.del(st.invoiceId);
  else if (inv.status === "open") await stripe.invoices.voidInvoice(st.invoiceId);
  await repo.update(st.id, { invoiceStatus: inv.status === "paid" ? "paid" : "void", invoiceNextAttemptAt: null, invoiceLastError: null });
}

async function recordFailure(deps: InvoicingDeps, st: Statement, e: unknown): Promise<void> {
  const attempts = st.invoiceAttempts + 1;
  const wait = RETRY_MINUTES[Math.min(attempts - 1, RETRY_MINUTES.length - 1)];
  await deps.ds.getRepository(Statement).update(st.id, {
    invoiceAttempts: attempts,
    invoiceLastError: String((e as Error).message ?? e).slice(0, 500),
    invoiceNextAttemptAt: new Date(deps.now().getTime() + wait * 60_000).toISOString(),
  });
}

/**
 * The job: every queued invoice of a final run whose retry time has come, and every open
 * invoice of a voided run. Retries keep going (the last interval repeats) until the service
 * answers: an invoice is never dropped.
 */
export async function processDueInvoices(deps: InvoicingDeps, opts: { force?: boolean; runId?: number } = {}): Promise<{ done: number; failed: number }> {
  if (!deps.payments) return { done: 0, failed: 0 };
  const now = deps.now().toISOString();
  const pick = async (runStatus: string, statuses: string[]) => {
    const qb = deps.ds
      .getRepository(Statement)
      .createQueryBuilder("s")
      .innerJoin(BillingRun, "r", "r.id = s.runId")
      .where("r.status = :runStatus AND s.invoiceStatus IN (:...statuses)", { runStatus, statuses });
    if (!opts.force) qb.andWhere("(s.invoiceNextAttemptAt IS NULL OR s.invoiceNextAttemptAt <= :now)", { now });
    if (opts.runId) qb.andWhere("s.runId = :runId", { runId: opts.runId });
    return qb.orderBy("s.id").getMany();
  };
  const due = [
    ...(await pick("final", ["queued"])).map((st) => ({ st, voided: false })),
    ...(await pick("voided", ["queued", "open", "payment_failed"])).map((st) => ({ st, voided: true })),
  ];
  let done = 0;
  let failed = 0;
  for (const { st, voided } of due) {
    try {
      if (voided) await voidInvoice(deps, st);
      else await pushInvoice(deps, st.id);
      done++;
    } catch (e) {
      await recordFailure(deps, st, e);
      failed++;
    }
  }
  return { done, failed };
}

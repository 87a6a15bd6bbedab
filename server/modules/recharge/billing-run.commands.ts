/**
 * Monthly billing runs: preview (computed, nothing stored), finalise (statements and lines
 * stored once as the month is priced, invoices queued for external accounts; the statement PDFs
 * are mailed to the account owners by the mail-statements job), void
 * (the month may be run again); the finance journal; statement PDFs; payment-service events;
 * the spend and revenue views. Money is integer cents throughout (rounding: money.ts).
 */
import type { DataSource, EntityManager } from "typeorm";
import type Stripe from "stripe";
import { centsToDecimalString } from "@shared/domain/money";
import { monthRange } from "@shared/domain/utilisation";
import type {
  BillingPreviewDto,
  BillingRunDto,
  BillingRunSummaryDto,
  InvoiceStatusName,
  MyChargesDto,
  OutstandingDto,
  ReportQuery,
  RevenueReportDto,
  SpendReportDto,
  StatementListItemDto,
} from "@shared/schemas/recharge";
import type { AuthUser } from "../../middleware/auth";
import { hasRole } from "../../middleware/auth";
import { Account, AccountMember, BillingRun, ChargeLine, ProcessedEvent, Statement, User } from "../../entities";
import { Conflict, NotFound, RuleBroken } from "../../errors";
import { serialTransaction } from "../../db/serial";
import { audit } from "../../core/audit";
import { enqueueMail } from "../../core/outbox";
import { type ComputedMonth, computeMonth, streamMonth } from "./month-stream";
import { presentComputedStatement, presentStatement } from "./recharge.presenter";
import { createRunWriter } from "./statement-lines.commands";
import { processDueInvoices } from "./invoice.commands";
import { renderStatementPdf } from "./statement-pdf";

/** Used where no facility name is passed in (the bench, older callers); FACILITY_NAME sets it. */
export const DEFAULT_FACILITY_NAME = "Liquid Interfaces Core";

export interface BillingDeps {
  ds: DataSource;
  tz: string;
  currency: string;
  now: () => Date;
  payments?: Stripe;
  /** The facility's name on statements, journal lines and invoices. */
  facilityName?: string;
  /** true: mail the statement PDFs right after a run's commit. Default: the mail-statements job does. */
  mailStatements?: boolean;
}

async function ownerEmail(em: EntityManager, account: Account): Promise<string | null> {
  if (account.kind === "external") return account.billingEmail;
  if (account.ownerId) return (await em.findOne(User, { where: { id: account.ownerId } }))?.email ?? account.billingEmail;
  return account.billingEmail;
}

export async function pdfFor(
  em: EntityManager,
  st: Statement,
  account: Account,
  lines: { at: string; description: string; amountCents: number; userId: number | null }[],
  tz?: string,
  facility = DEFAULT_FACILITY_NAME,
) {
  const ids = [...new Set(lines.map((l) => l.userId).filter((x): x is number => x != null))];
  const names = new Map<number, string>();
  for (let i = 0; i < ids.length; i += 500) {
    const rows: { id: number; name: string }[] = await em.query(`SELECT id, name FROM users WHERE id IN (${ids.slice(i, i + 500).map(() => "?").join(",")})`, ids.slice(i, i + 500));
    for (const r of rows) names.set(r.id, r.name);
  }
  return renderStatementPdf({
    facility,
    period: st.period,
    currency: st.currency,
    account: { code: account.code, name: account.name, kind: account.kind, organisation: account.organisation },
    lines: lines.map((l) => ({ ...l, person: l.userId == null ? null : (names.get(l.userId) ?? null) })),
    totalCents: st.totalCents,
    status:
      account.kind === "external"
        ? { none: "nothing to pay", queued: "invoice being prepared", open: "invoice open", paid: "paid", payment_failed: "payment declined; invoice open", void: "void" }[st.invoiceStatus]
        : "settled by journal",
    invoiceNumber: st.invoiceNumber,
    paymentUrl: account.kind === "external" && st.invoiceStatus !== "paid" && st.invoiceStatus !== "void" ? st.invoiceUrl : null,
    tz,
  });
}

/**
 * Renders and queues the PDF of every final statement not yet mailed (one transaction each, so
 * a crash loses nothing: the next pass picks up what is left). Used after a run and by the job.
 */
export async function mailDueStatements(ds: DataSource, now: () => Date, opts: { runId?: number; limit?: number; tz?: string; facility?: string } = {}): Promise<number> {
  const qb = ds
    .getRepository(Statement)
    .createQueryBuilder("s")
    .innerJoin(BillingRun, "r", "r.id = s.runId")
    .where("r.status = 'final' AND s.mailedAt IS NULL");
  if (opts.runId) qb.andWhere("s.runId = :runId", { runId: opts.runId });
  const due = await qb.orderBy("s.id").limit(opts.limit ?? 500).getMany();
  for (const st of due) {
    await serialTransaction(ds, async (em) => {
      const account = await em.findOneOrFail(Account, { where: { id: st.accountId } });
      const to = await ownerEmail(em, account);
      if (to) {
        const lines = await em.find(ChargeLine, { where: { statementId: st.id }, order: { at: "ASC", id: "ASC" } });
        const pdf = await pdfFor(em, st, account, lines, opts.tz, opts.facility);
        await enqueueMail(em, now(), {
          to,
          subject: `${opts.facility ?? DEFAULT_FACILITY_NAME} statement ${st.period} — ${account.code}`,
          text:
            `The statement for ${account.name} (${account.code}) for ${st.period} is attached: ` +
            `${lines.length} line(s), total ${centsToDecimalString(st.totalCents)} ${st.currency}.` +
            (account.kind === "external" ? "\nAn invoice follows from our payment service." : "\nInternal accounts are settled by journal transfer; nothing to pay."),
          attachments: [{ filename: `statement-${st.period}-${account.code}.pdf`, contentType: "application/pdf", base64: pdf.toString("base64") }],
        });
      }
      await em.update(Statement, st.id, { mailedAt: now().toISOString() });
    });
  }
  return due.length;
}

export function createBillingService(deps: BillingDeps) {
  const { ds, tz, currency } = deps;
  const facility = deps.facilityName ?? DEFAULT_FACILITY_NAME;

  function assertEnded(period: string): void {
    const { monthEnd } = monthRange(period, tz);
    if (monthEnd.getTime() > deps.now().getTime()) {
      throw new RuleBroken(`${period} has not ended yet; a month is billed once it is over.`, [{ path: "period", message: "This month has not ended" }], "period_not_ended");
    }
  }

  async function preview(period: string): Promise<ComputedMonth> {
    assertEnded(period);
    return ds.transaction((em) => computeMonth(em, { period, tz }));
  }

  async function createRun(actor: AuthUser, period: string): Promise<BillingRun> {
    assertEnded(period);
    const runId = await serialTransaction(ds, async (em) => {
      const existing = await em.findOne(BillingRun, { where: { period, status: "final" } });
      if (existing) {
        throw new Conflict(`${period} already has a final billing run (#${existing.id}); void it first to run the month again.`, "period_final", { runId: existing.id });
      }
      const nowIso = deps.now().toISOString();
      // The run row first (its statements refer to it); its total is set once the month is priced.
      const run = await em.save(BillingRun, {
        period,
        status: "final",
        currency,
        totalCents: 0,
        createdById: actor.id,
        createdAt: nowIso,
        voidedAt: null,
        voidedById: null,
        voidReason: null,
      });
      const writer = createRunWriter(em, { id: run.id, period, currency, createdAt: nowIso });
      const month = await streamMonth(em, { period, tz, ownRunId: run.id }, (lines) => writer.write(lines));
      if (month.missingRates.length > 0) {
        // Throwing rolls back the run, its statements and the lines written so far.
        throw new RuleBroken(
          "Some charges have no rate in effect; add the rates and run again.",
          month.missingRates.map((m) => ({ path: "rates", message: `No rate for ${m}` })),
          "missing_rates",
        );
      }
      await em.update(BillingRun, run.id, { totalCents: month.totalCents });
      for (const s of month.accounts) {
        const external = s.account.kind === "external";
        await em.update(Statement, writer.statementId(s.account.id)!, {
          totalCents: s.totalCents,
          invoiceStatus: external && s.totalCents > 0 ? "queued" : "none",
          invoiceNextAttemptAt: external && s.totalCents > 0 ? nowIso : null,
        });
      }
      await audit(em, deps.now(), actor.id, "billing.run_finalised", "billing_run", run.id, { period, totalCents: month.totalCents, statements: month.accounts.length });
      return run.id;
    });
    // After the commit: invoices go out outside the run's transaction, so an unreachable payment
    // service never undoes a finished run (send-invoices retries). Statement PDFs are rendered
    // and mailed by the mail-statements job, never by the run: a large month has many pages.
    if (deps.mailStatements === true) await mailDueStatements(ds, deps.now, { runId, tz, facility }).catch(() => undefined);
    await processDueInvoices({ ds, payments: deps.payments, now: deps.now, facilityName: facility }, { runId, force: true }).catch(() => undefined);
    return ds.getRepository(BillingRun).findOneByOrFail({ id: runId });
  }

  async function voidRun(actor: AuthUser, id: number, reason: string): Promise<BillingRun> {
    await serialTransaction(ds, async (em) => {
      const run = await em.findOne(BillingRun, { where: { id } });
      if (!run) throw new NotFound("That billing run");
      if (run.status === "voided") throw new Conflict("This run is already void.", "already_void");
      const paid = await em.count(Statement, { where: { runId: id, invoiceStatus: "paid" } });
      if (paid > 0) {
        throw new Conflict("An invoice of this run has been paid; enter a credit in the next month instead of voiding the run.", "invoice_paid");
      }
      await em.update(BillingRun, id, { status: "voided", voidedAt: deps.now().toISOString(), voidedById: actor.id, voidReason: reason });
      await audit(em, deps.now(), actor.id, "billing.run_voided", "billing_run", id, { period: run.period, reason });
    });
    await processDueInvoices({ ds, payments: deps.payments, now: deps.now, facilityName: facility }, { runId: id, force: true }).catch(() => undefined);
    return ds.getRepository(BillingRun).findOneByOrFail({ id });
  }

  async function listRuns(q: { limit: number; offset: number }): Promise<{ items: BillingRunSummaryDto[]; total: number }> {
    const [runs, total] = await ds.getRepository(BillingRun).findAndCount({ order: { period: "DESC", id: "DESC" }, skip: q.offset, take: q.limit });
    const items: BillingRunSummaryDto[] = [];
    for (const r of runs) {
      const rows: { invoiceStatus: string; n: number }[] = await ds.query(
        `SELECT invoiceStatus, COUNT(*) AS n FROM statements WHERE runId = ? GROUP BY invoiceStatus`,
        [r.id],
      );
      items.push({
        id: r.id,
        period: r.period,
        status: r.status,
        currency: r.currency,
        total: r.totalCents,
        createdAt: r.createdAt,
        voidedAt: r.voidedAt,
        statementCount: rows.reduce((n, x) => n + Number(x.n), 0),
        invoices: Object.fromEntries(rows.filter((x) => x.invoiceStatus !== "none").map((x) => [x.invoiceStatus, Number(x.n)])),
      });
    }
    return { items, total };
  }

  async function getRun(id: number): Promise<BillingRunDto> {
    const run = await ds.getRepository(BillingRun).findOneBy({ id });
    if (!run) throw new NotFound("That billing run");
    const statements = await ds.getRepository(Statement).find({ where: { runId: id }, order: { accountId: "ASC" } });
    const lines = await ds.getRepository(ChargeLine).find({ where: { runId: id }, order: { at: "ASC", id: "ASC" } });
    const accounts = new Map((await ds.getRepository(Account).find()).map((a) => [a.id, a]));
    const byStatement = new Map<number, ChargeLine[]>();
    for (const l of lines) byStatement.set(l.statementId, [...(byStatement.get(l.statementId) ?? []), l]);
    return {
      id: run.id,
      period: run.period,
      status: run.status,
      currency: run.currency,
      total: run.totalCents,
      createdAt: run.createdAt,
      voidedAt: run.voidedAt,
      voidReason: run.voidReason,
      statements: statements.map((st) => presentStatement(st, accounts.get(st.accountId)!, byStatement.get(st.id) ?? [])),
    };
  }

  /** Internal statements as journal rows for the finance office; the rows add up to their total. */
  async function journalCsv(id: number): Promise<{ csv: string; period: string }> {
    const run = await ds.getRepository(BillingRun).findOneBy({ id });
    if (!run) throw new NotFound("That billing run");
    const rows: { code: string; name: string; totalCents: number; lines: number; department: string | null }[] = await ds.query(
      `SELECT a.code, a.name, s.totalCents, (SELECT COUNT(*) FROM charge_lines cl WHERE cl.statementId = s.id) AS lines, d.code AS department
       FROM statements s JOIN accounts a ON a.id = s.accountId LEFT JOIN departments d ON d.id = a.departmentId
       WHERE s.runId = ? AND a.kind = 'internal' AND s.totalCents <> 0 ORDER BY a.code`,
      [id],
    );
    const esc = (v: string) => (/[",\n\r]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v);
    const out = [["period", "cost_centre", "department", "amount", "currency", "description"].join(",")];
    for (const r of rows) {
      out.push(
        [
          run.period,
          r.code,
          r.department ?? "",
          centsToDecimalString(Number(r.totalCents)),
          run.currency,
          `${facility} recharge ${run.period}: ${r.name} (${r.lines} line${Number(r.lines) === 1 ? "" : "s"})${run.status === "voided" ? " [VOID RUN]" : ""}`,
        ]
          .map((v) => esc(String(v)))
          .join(","),
      );
    }
    return { csv: out.join("\r\n") + "\r\n", period: run.period };
  }

  async function canSeeAccount(user: AuthUser, account: Account): Promise<boolean> {
    if (hasRole(user, "manager")) return true;
    if (account.ownerId === user.id) return true;
    if (account.kind === "external") return (await ds.getRepository(AccountMember).countBy({ accountId: account.id, userId: user.id })) > 0;
    return false;
  }

  async function statementPdf(user: AuthUser, statementId: number): Promise<{ pdf: Buffer; filename: string }> {
    const st = await ds.getRepository(Statement).findOneBy({ id: statementId });
    const account = st ? await ds.getRepository(Account).findOneBy({ id: st.accountId }) : null;
    if (!st || !account || !(await canSeeAccount(user, account))) throw new NotFound("That statement");
    const lines = await ds.getRepository(ChargeLine).find({ where: { statementId }, order: { at: "ASC", id: "ASC" } });
    const pdf = await ds.transaction((em) => pdfFor(em, st, account, lines, tz, facility));
    return { pdf, filename: `statement-${st.period}-${account.code}.pdf` };
  }

  async function listStatements(user: AuthUser, q: { limit: number; offset: number }): Promise<{ items: StatementListItemDto[]; total: number }> {
    const manager = hasRole(user, "manager");
    const where = manager
      ? ""
      : `AND (a.ownerId = ? OR (a.kind = 'external' AND EXISTS (SELECT 1 FROM account_members m WHERE m.accountId = a.id AND m.userId = ?)))`;
    const params = manager ? [] : [user.id, user.id];
    const base = `FROM statements s JOIN accounts a ON a.id = s.accountId JOIN billing_runs r ON r.id = s.runId WHERE 1 = 1 ${where}`;
    const total = Number((await ds.query(`SELECT COUNT(*) AS n ${base}`, params))[0].n);
    const rows: Record<string, unknown>[] = await ds.query(
      `SELECT s.id, s.runId, s.period, r.status AS runStatus, s.accountId, a.code, a.name, a.kind, s.totalCents, s.currency, s.invoiceStatus, s.invoiceNumber, s.invoiceUrl, s.paidAt
       ${base} ORDER BY s.period DESC, s.id DESC LIMIT ? OFFSET ?`,
      [...params, q.limit, q.offset],
    );
    return {
      total,
      items: rows.map((r) => ({
        id: Number(r.id),
        runId: Number(r.runId),
        period: String(r.period),
        runStatus: r.runStatus as BillingRunDto["status"],
        accountId: Number(r.accountId),
        accountCode: String(r.code),
        accountName: String(r.name),
        accountKind: r.kind as "internal" | "external",
        total: Number(r.totalCents),
        currency: String(r.currency),
        warnings: [],
        invoiceStatus: r.invoiceStatus as InvoiceStatusName,
        invoiceNumber: (r.invoiceNumber as string | null) ?? null,
        invoiceUrl: (r.invoiceUrl as string | null) ?? null,
        paidAt: (r.paidAt as string | null) ?? null,
      })),
    };
  }

  /** A payment-service event, handled once per event id; later deliveries change nothing. */
  async function handleEvent(event: Stripe.Event): Promise<{ duplicate: boolean }> {
    return serialTransaction(ds, async (em) => {
      if (await em.findOne(ProcessedEvent, { where: { id: event.id } })) return { duplicate: true };
      await em.insert(ProcessedEvent, { id: event.id, type: event.type, processedAt: deps.now().toISOString() });
      if (!event.type.startsWith("invoice.")) return { duplicate: false };
      const invoice = event.data.object as Stripe.Invoice;
      const st = invoice.id ? await em.findOne(Statement, { where: { invoiceId: invoice.id } }) : null;
      if (!st) return { duplicate: false };
      const patch: { invoiceStatus?: Statement["invoiceStatus"]; paidAt?: string } = {};
      if (event.type === "invoice.paid") {
        patch.invoiceStatus = "paid";
        patch.paidAt = new Date((invoice.status_transitions?.paid_at ?? event.created) * 1000).toISOString();
      } else if (event.type === "invoice.payment_failed" && st.invoiceStatus !== "paid") {
        patch.invoiceStatus = "payment_failed";
      } else if (event.type === "invoice.voided" && st.invoiceStatus !== "paid") {
        patch.invoiceStatus = "void";
      }
      if (Object.keys(patch).length > 0) {
        await em.update(Statement, st.id, patch);
        await audit(em, deps.now(), null, `billing.${event.type}`, "statement", st.id, { invoiceId: invoice.id, eventId: event.id });
      }
      return { duplicate: false };
    });
  }

  // ---- views ----------------------------------------------------------------------------------

  function rangeWhere(q: ReportQuery): { sql: string; params: string[] } {
    const parts: string[] = [];
    const params: string[] = [];
    if (q.from) {
      parts.push("r.period >= ?");
      params.push(q.from);
    }
    if (q.to) {
      parts.push("r.period <= ?");
      params.push(q.to);
    }
    return { sql: parts.length ? `AND ${parts.join(" AND ")}` : "", params };
  }

  async function revenue(q: ReportQuery): Promise<RevenueReportDto> {
    const w = rangeWhere(q);
    const from = `FROM charge_lines cl JOIN billing_runs r ON r.id = cl.runId AND r.status = 'final' JOIN accounts a ON a.id = cl.accountId`;
    const byMonth: { period: string; internal: number; external: number; total: number }[] = await ds.query(
      `SELECT r.period AS period, SUM(CASE WHEN a.kind = 'internal' THEN cl.amountCents ELSE 0 END) AS internal,
         SUM(CASE WHEN a.kind = 'external' THEN cl.amountCents ELSE 0 END) AS external, SUM(cl.amountCents) AS total
       ${from} WHERE 1 = 1 ${w.sql} GROUP BY r.period ORDER BY r.period`,
      w.params,
    );
    const byInstrument: { instrumentId: number | null; name: string | null; total: number; minutes: number }[] = await ds.query(
      `SELECT cl.instrumentId AS instrumentId, i.name AS name, SUM(cl.amountCents) AS total,
         SUM(CASE WHEN cl.kind = 'instrument' THEN cl.quantity ELSE 0 END) AS minutes
       ${from} LEFT JOIN instruments i ON i.id = cl.instrumentId WHERE 1 = 1 ${w.sql} GROUP BY cl.instrumentId ORDER BY total DESC`,
      w.params,
    );
    // External customers form one group of their own; internal accounts group by department.
    const byDepartment: { departmentId: number | null; external: number; name: string | null; total: number }[] = await ds.query(
      `SELECT CASE WHEN a.kind = 'external' THEN NULL ELSE a.departmentId END AS departmentId, a.kind = 'external' AS external,
         MAX(d.name) AS name, SUM(cl.amountCents) AS total
       ${from} LEFT JOIN departments d ON d.id = a.departmentId AND a.kind = 'internal' WHERE 1 = 1 ${w.sql}
       GROUP BY 1, 2 ORDER BY total DESC`,
      w.params,
    );
    const n = (v: unknown) => Number(v ?? 0);
    return {
      currency,
      byMonth: byMonth.map((r) => ({ period: r.period, internal: n(r.internal), external: n(r.external), total: n(r.total) })),
      byInstrument: byInstrument.map((r) => ({
        instrumentId: r.instrumentId,
        name: r.instrumentId == null ? "Consumables, adjustments and credits" : (r.name ?? `Instrument #${r.instrumentId}`),
        total: n(r.total),
        hours: Math.round((n(r.minutes) / 60) * 100) / 100,
      })),
      byDepartment: byDepartment.map((r) => ({
        departmentId: r.departmentId,
        external: Boolean(r.external),
        name: r.external ? "External customers" : r.departmentId == null ? "Internal, no department" : (r.name ?? `Department #${r.departmentId}`),
        total: n(r.total),
      })),
    };
  }

  async function spend(user: AuthUser, q: ReportQuery): Promise<SpendReportDto> {
    const w = rangeWhere(q);
    const manager = hasRole(user, "manager");
    const rows: Record<string, unknown>[] = await ds.query(
      `SELECT r.period AS period, a.id AS accountId, a.code AS code, a.name AS accountName, cl.userId AS userId, u.name AS userName,
         SUM(cl.amountCents) AS total
       FROM charge_lines cl JOIN billing_runs r ON r.id = cl.runId AND r.status = 'final' JOIN accounts a ON a.id = cl.accountId
       LEFT JOIN users u ON u.id = cl.userId
       WHERE ${manager ? "1 = 1" : "a.ownerId = ?"} ${w.sql}
       GROUP BY r.period, a.id, cl.userId ORDER BY r.period DESC, a.code, u.name`,
      manager ? w.params : [user.id, ...w.params],
    );
    return {
      currency,
      items: rows.map((r) => ({
        period: String(r.period),
        accountId: Number(r.accountId),
        accountCode: String(r.code),
        accountName: String(r.accountName),
        userId: r.userId == null ? null : Number(r.userId),
        userName: r.userId == null ? "Account-level (credits, adjustments)" : String(r.userName),
        total: Number(r.total),
      })),
    };
  }

  async function myCharges(user: AuthUser, q: ReportQuery & { limit: number; offset: number }): Promise<MyChargesDto> {
    const w = rangeWhere(q);
    const base = `FROM charge_lines cl JOIN billing_runs r ON r.id = cl.runId AND r.status = 'final' JOIN accounts a ON a.id = cl.accountId
      WHERE cl.userId = ? ${w.sql}`;
    const total = Number((await ds.query(`SELECT COUNT(*) AS n ${base}`, [user.id, ...w.params]))[0].n);
    const sum = Number((await ds.query(`SELECT COALESCE(SUM(cl.amountCents), 0) AS s ${base}`, [user.id, ...w.params]))[0].s);
    const rows: Record<string, unknown>[] = await ds.query(
      `SELECT cl.id, r.period, a.code AS accountCode, a.name AS accountName, cl.kind, cl.description, cl.quantity, cl.unit, cl.amountCents, cl.at, cl.bookingId
       ${base} ORDER BY cl.at DESC, cl.id DESC LIMIT ? OFFSET ?`,
      [user.id, ...w.params, q.limit, q.offset],
    );
    return {
      currency,
      total,
      sum,
      items: rows.map((r) => ({
        id: Number(r.id),
        period: String(r.period),
        accountCode: String(r.accountCode),
        accountName: String(r.accountName),
        kind: r.kind as MyChargesDto["items"][number]["kind"],
        description: String(r.description),
        quantity: Number(r.quantity),
        unit: String(r.unit),
        amount: Number(r.amountCents),
        at: String(r.at),
        bookingId: r.bookingId == null ? null : Number(r.bookingId),
      })),
    };
  }

  async function outstanding(): Promise<OutstandingDto> {
    const rows: Record<string, unknown>[] = await ds.query(
      `SELECT s.id, s.runId, s.period, s.accountId, a.code, a.name, a.billingEmail, s.totalCents, s.currency, s.invoiceStatus, s.invoiceNumber, s.invoiceUrl,
         s.invoiceLastError, s.invoiceAttempts
       FROM statements s JOIN billing_runs r ON r.id = s.runId AND r.status = 'final' JOIN accounts a ON a.id = s.accountId
       WHERE s.invoiceStatus IN ('queued', 'open', 'payment_failed') ORDER BY s.period, a.code`,
    );
    const items = rows.map((r) => ({
      statementId: Number(r.id),
      runId: Number(r.runId),
      period: String(r.period),
      accountId: Number(r.accountId),
      accountCode: String(r.code),
      accountName: String(r.name),
      billingEmail: (r.billingEmail as string | null) ?? null,
      total: Number(r.totalCents),
      currency: String(r.currency),
      invoiceStatus: r.invoiceStatus as InvoiceStatusName,
      invoiceNumber: (r.invoiceNumber as string | null) ?? null,
      invoiceUrl: (r.invoiceUrl as string | null) ?? null,
      lastError: (r.invoiceLastError as string | null) ?? null,
      attempts: Number(r.invoiceAttempts),
    }));
    return { items, total: items.length, sum: items.reduce((s, i) => s + i.total, 0), currency };
  }

  return {
    preview,
    previewDto: async (period: string): Promise<BillingPreviewDto> => {
      const m = await preview(period);
      return {
        period,
        currency,
        total: m.totalCents,
        missingRates: m.missingRates,
        unbillableUsages: m.unbillableUsages,
        statements: m.statements.map((s) => presentComputedStatement(s, currency)),
      };
    },
    createRun,
    voidRun,
    listRuns,
    getRun,
    journalCsv,
    statementPdf,
    listStatements,
    handleEvent,
    revenue,
    spend,
    myCharges,
    outstanding,
    retryInvoices: () => processDueInvoices({ ds, payments: deps.payments, now: deps.now, facilityName: facility }, { force: true }),
  };
}

export type BillingService = ReturnType<typeof createBillingService>;

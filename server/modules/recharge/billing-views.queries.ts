/**
 * The money views, read from final runs only (a voided run's lines are left out): revenue by
 * month, instrument and department and the invoices outstanding (the manager's), spend per
 * account and member (a group lead's own accounts; the manager's: all), and each person's own
 * charges. Each view adds up to the runs' statements to the cent.
 */
import type { MyChargesDto, OutstandingDto, ReportQuery, RevenueReportDto, SpendReportDto, InvoiceStatusName } from "@shared/schemas/recharge";
import { hasRole, type AuthUser } from "../../middleware/auth";
import type { RechargeDeps } from "./recharge-deps";

/** Final runs' periods from `from` to `to` (both optional, both included). */
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

export async function revenue(deps: RechargeDeps, q: ReportQuery): Promise<RevenueReportDto> {
  const { ds } = deps;
  const currency = deps.config.CURRENCY;
  const w = rangeWhere(q);
  const from = `FROM charge_lines cl JOIN billing_runs r ON r.id = cl.runId AND r.status = 'final' JOIN accounts a ON a.id = cl.accountId`;
  const byMonth: { period: string; internal: number; external: number; total: number }[] = await ds.query(
    `SELECT r.period AS period, SUM(CASE WHEN a.kind = 'internal' THEN cl.amountCents ELSE 0 END) AS internal,
       SUM(CASE WHEN a.kind = 'external' THEN cl.amountCents ELSE 0 END) AS external, SUM(cl.amountCents) AS total
     ${from} WHERE 1 = 1 ${w.sql} GROUP BY r.period ORDER BY r.period`,
    w.params,
  );
  // Instrument lines hold exact hours as text, a decimal or a fraction such as "1/6"; summed as numbers for the view.
  const hours = `CASE WHEN instr(cl.quantity, '/') > 0
      THEN CAST(substr(cl.quantity, 1, instr(cl.quantity, '/') - 1) AS REAL) / CAST(substr(cl.quantity, instr(cl.quantity, '/') + 1) AS REAL)
      ELSE CAST(cl.quantity AS REAL) END`;
  const byInstrument: { instrumentId: number | null; name: string | null; total: number; hours: number }[] = await ds.query(
    `SELECT cl.instrumentId AS instrumentId, i.name AS name, SUM(cl.amountCents) AS total,
       SUM(CASE WHEN cl.kind = 'instrument' AND cl.unit = 'h' THEN ${hours} ELSE 0 END) AS hours
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
      hours: Math.round(n(r.hours) * 100) / 100,
    })),
    byDepartment: byDepartment.map((r) => ({
      departmentId: r.departmentId,
      external: Boolean(r.external),
      name: r.external ? "External customers" : r.departmentId == null ? "Internal, no department" : (r.name ?? `Department #${r.departmentId}`),
      total: n(r.total),
    })),
  };
}

/** A group lead's accounts' spend per month, account and member; the manager's: every account's. */
export async function spend(deps: RechargeDeps, user: AuthUser, q: ReportQuery): Promise<SpendReportDto> {
  const { ds } = deps;
  const currency = deps.config.CURRENCY;
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

/** The caller's own lines on final statements, a page at a time, with the sum of all of them. */
export async function myCharges(deps: RechargeDeps, user: AuthUser, q: ReportQuery & { limit: number; offset: number }): Promise<MyChargesDto> {
  const { ds } = deps;
  const currency = deps.config.CURRENCY;
  const w = rangeWhere(q);
  const base = `FROM charge_lines cl JOIN billing_runs r ON r.id = cl.runId AND r.status = 'final' JOIN accounts a ON a.id = cl.accountId
    WHERE cl.userId = ? ${w.sql}`;
  const total = Number((await ds.query(`SELECT COUNT(*) AS n ${base}`, [user.id, ...w.params]))[0].n);
  const sum = Number((await ds.query(`SELECT COALESCE(SUM(cl.amountCents), 0) AS s ${base}`, [user.id, ...w.params]))[0].s);
  const rows: Record<string, unknown>[] = await ds.query(
    `SELECT cl.id, r.period, a.code AS accountCode, a.name AS accountName, cl.kind, cl.description, cl.quantity, cl.unit, cl.unitPriceCents, cl.amountCents, cl.at, cl.bookingId
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
      quantity: String(r.quantity),
      unit: String(r.unit),
      unitPriceCents: String(r.unitPriceCents),
      amount: Number(r.amountCents),
      at: String(r.at),
      bookingId: r.bookingId == null ? null : Number(r.bookingId),
    })),
  };
}

/** External invoices of final runs not yet paid. */
export async function outstanding(deps: RechargeDeps): Promise<OutstandingDto> {
  const { ds } = deps;
  const currency = deps.config.CURRENCY;
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


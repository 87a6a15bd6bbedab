/**
 * Recharge entities and computed statements → the DTOs of shared/schemas/recharge, the one
 * contract the client parses every answer with. Records carry `abilities` from their policy.
 */
import type {
  AccountAbilities,
  AccountDto,
  AccountMemberDto,
  BillingRunAbilities,
  BillingRunDto,
  BillingRunSummaryDto,
  ChargeLineDto,
  RateDto,
  StatementAbilities,
  StatementDto,
} from "@shared/schemas/recharge";
import type { Account, BillingRun, ChargeLine, Rate, Statement } from "../../entities";
import type { ComputedStatement } from "./month-stream";

type LineFields = Pick<ChargeLine, "kind" | "description" | "bookingId" | "instrumentId" | "usageId" | "userId" | "quantity" | "unit" | "unitPriceCents" | "amountCents" | "at">;

/** The fields a stored line and a previewed (computed, unstored) line share. */
function lineFields(l: LineFields): Omit<ChargeLineDto, "id"> {
  return {
    kind: l.kind,
    description: l.description,
    bookingId: l.bookingId,
    instrumentId: l.instrumentId,
    usageId: l.usageId,
    userId: l.userId,
    quantity: l.quantity,
    unit: l.unit,
    unitPriceCents: l.unitPriceCents,
    amount: l.amountCents,
    at: l.at,
  };
}

export function presentChargeLine(l: ChargeLine): ChargeLineDto {
  return { id: l.id, ...lineFields(l) };
}

/** A stored statement with its lines (in statement order: by date, then as priced). */
export function presentStatement(st: Statement, account: Account, lines: ChargeLine[], abilities: StatementAbilities, warnings: string[] = []): StatementDto {
  return {
    id: st.id,
    accountId: account.id,
    accountCode: account.code,
    accountName: account.name,
    accountKind: account.kind,
    total: st.totalCents,
    currency: st.currency,
    lines: lines.map(presentChargeLine),
    warnings,
    invoiceStatus: st.invoiceStatus,
    invoiceNumber: st.invoiceNumber,
    invoiceUrl: st.invoiceUrl,
    paidAt: st.paidAt,
    abilities,
  };
}

/** A preview's statement: computed, not stored, so it has no ids and nothing to act on. */
export function presentComputedStatement(s: ComputedStatement, currency: string): StatementDto {
  return {
    accountId: s.account.id,
    accountCode: s.account.code,
    accountName: s.account.name,
    accountKind: s.account.kind,
    total: s.totalCents,
    currency,
    warnings: s.warnings,
    lines: s.lines.map(lineFields),
  };
}

export function presentRun(run: BillingRun, statements: StatementDto[], abilities: BillingRunAbilities): BillingRunDto {
  return {
    id: run.id,
    period: run.period,
    status: run.status,
    currency: run.currency,
    total: run.totalCents,
    createdAt: run.createdAt,
    voidedAt: run.voidedAt,
    voidReason: run.voidReason,
    statements,
    abilities,
  };
}

/** A run in the list: counts of its statements by invoice status instead of the statements. */
export function presentRunSummary(run: BillingRun, byInvoiceStatus: { invoiceStatus: string; n: number }[], abilities: BillingRunAbilities): BillingRunSummaryDto {
  return {
    id: run.id,
    period: run.period,
    status: run.status,
    currency: run.currency,
    total: run.totalCents,
    createdAt: run.createdAt,
    voidedAt: run.voidedAt,
    statementCount: byInvoiceStatus.reduce((n, x) => n + Number(x.n), 0),
    invoices: Object.fromEntries(byInvoiceStatus.filter((x) => x.invoiceStatus !== "none").map((x) => [x.invoiceStatus, Number(x.n)])),
    abilities,
  };
}

export function presentAccount(
  a: Account,
  extra: { ownerName: string | null; chargeable: boolean; myMembership: { monthlyCapCents: number | null } | null; abilities: AccountAbilities },
): AccountDto {
  return {
    id: a.id,
    code: a.code,
    name: a.name,
    kind: a.kind,
    customerClass: a.customerClass,
    departmentId: a.departmentId,
    ownerId: a.ownerId,
    ownerName: extra.ownerName,
    validFrom: a.validFrom,
    validTo: a.validTo,
    organisation: a.organisation,
    billingEmail: a.billingEmail,
    active: a.active,
    chargeable: extra.chargeable,
    ...(extra.myMembership ? { myMonthlyCapCents: extra.myMembership.monthlyCapCents } : {}),
    abilities: extra.abilities,
  };
}

export function presentMember(m: { userId: number | string; name: string; email: string; monthlyCapCents: number | string | null; exceptionReason: string | null }): AccountMemberDto {
  return {
    userId: Number(m.userId),
    name: m.name,
    email: m.email,
    monthlyCapCents: m.monthlyCapCents == null ? null : Number(m.monthlyCapCents),
    exceptionReason: m.exceptionReason ?? null,
  };
}

export function presentRate(r: Rate, instrumentName: string | null, today: string): RateDto {
  return {
    id: r.id,
    instrumentId: r.instrumentId,
    instrumentName,
    instrumentKind: r.instrumentKind,
    customerClass: r.customerClass,
    hourlyRateCents: r.hourlyRateCents,
    effectiveFrom: r.effectiveFrom,
    effectiveTo: r.effectiveTo,
    minimumMinutes: r.minimumMinutes,
    roundingIncrementMinutes: r.roundingIncrementMinutes,
    afterHoursFactor: r.afterHoursFactor,
    note: r.note,
    inEffect: r.effectiveFrom <= today && (r.effectiveTo == null || today < r.effectiveTo),
  };
}

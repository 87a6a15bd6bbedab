/**
 * Recharge entities and computed statements → the DTOs of shared/schemas/recharge, the one
 * contract the client parses every answer with.
 */
import type { ChargeLineDto, StatementDto } from "@shared/schemas/recharge";
import type { Account, ChargeLine, Statement } from "../../entities";
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
export function presentStatement(st: Statement, account: Account, lines: ChargeLine[], warnings: string[] = []): StatementDto {
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
  };
}

/** A preview's statement: computed, not stored, so it has no ids. */
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

/**
 * Recharge: accounts and who may charge them, billing runs, statements, the rate review and the
 * spend views (rates and the billing policy are in rates.ts, re-exported here). Inputs and DTOs
 * shared by client and server: the server's presenters return these types, the client parses
 * every answer with these schemas.
 */
import { z } from "zod";
import { id, isoDate, pageOf, pageQuery } from "./common";
import { amount, cents, customerClass } from "./rates";

export * from "./rates";

export const period = z.string().regex(/^\d{4}-(0[1-9]|1[0-2])$/, "Give the month as YYYY-MM");

/** Answers of list routes: `{ items, total }`. */
export { pageOf };
/**
 * An exact figure as text: a decimal ("1.5", "13.2", "-250") or, where no decimal is exact, a
 * reduced fraction ("1/6" h for ten minutes). Charge lines carry quantities and unit prices so,
 * because a JSON number could not hold them exactly.
 */
export const exactFigure = z.string().regex(/^-?\d+(\.\d+)?$|^-?\d+\/\d+$/, "An exact decimal such as 1.25, or a fraction such as 1/6");

// ---- accounts -----------------------------------------------------------------------------------

export const accountListQuery = pageQuery.extend({ all: z.enum(["true", "false"]).optional() });

export const accountKind = z.enum(["internal", "external"]);

export const accountAbilities = z.object({
  view: z.boolean(),
  /** Change who may charge it and their caps (its group lead, the manager). */
  manageMembers: z.boolean(),
  /** Add someone now (manageMembers, and the account open today). */
  addMember: z.boolean(),
  /** Let in someone of another organisation, saying why (the manager). */
  makeException: z.boolean(),
  edit: z.boolean(),
  adjust: z.boolean(),
  charge: z.boolean(),
});
export type AccountAbilities = z.infer<typeof accountAbilities>;

/**
 * The codes a refused new member is answered with (422) when they are not of the account's
 * organisation; the manager may then add them as an exception, saying why.
 */
export const ORGANISATION_MISMATCH_CODES = ["external_person_internal_account", "internal_person_external_account", "other_organisation"] as const;

/** Why the manager lets someone of another organisation charge an account: a few words at least. */
export const exceptionReason = z
  .string()
  .trim()
  .min(10, "Say why, in a few words")
  .max(500)
  .refine((v) => v.split(/\s+/).filter(Boolean).length >= 3, "Say why, in a few words");

export const accountDto = z.object({
  id: z.number().int(),
  code: z.string(),
  name: z.string(),
  kind: accountKind,
  customerClass,
  departmentId: z.number().int().nullable(),
  ownerId: z.number().int().nullable(),
  ownerName: z.string().nullable(),
  validFrom: z.string().nullable(),
  validTo: z.string().nullable(),
  organisation: z.string().nullable(),
  billingEmail: z.string().nullable(),
  active: z.boolean(),
  /** Active and within its validity dates today. */
  chargeable: z.boolean(),
  /** The caller's monthly cap on this account, when the caller may charge it. */
  myMonthlyCapCents: amount.nullable().optional(),
  /** What the caller may do with this account, as the account policy decides (the client shows buttons from these). */
  abilities: accountAbilities,
});
export type AccountDto = z.infer<typeof accountDto>;
export const accountPage = pageOf(accountDto);
export const accountResponse = z.object({ account: accountDto });

export const accountCreateInput = z.object({
  code: z.string().trim().min(2).max(40),
  name: z.string().trim().min(2).max(200),
  kind: z.enum(["internal", "external"]),
  customerClass,
  departmentId: id().nullable().optional(),
  ownerId: id().nullable().optional(),
  validFrom: isoDate.nullable().optional(),
  validTo: isoDate.nullable().optional(),
  organisation: z.string().max(200).nullable().optional(),
  billingEmail: z.email().nullable().optional(),
});
export type AccountCreateInput = z.infer<typeof accountCreateInput>;

export const accountUpdateInput = accountCreateInput.partial().extend({ active: z.boolean().optional() });
export type AccountUpdateInput = z.infer<typeof accountUpdateInput>;

export const accountMemberInput = z.object({
  email: z.string().trim().min(3).max(254),
  monthlyCapCents: cents("the monthly cap").min(0).nullable().optional(),
  /** The manager's stated exception for a person of another organisation (only the manager may send it). */
  exceptionReason: exceptionReason.optional(),
});
export type AccountMemberInput = z.infer<typeof accountMemberInput>;

export const accountMemberUpdateInput = z.object({ monthlyCapCents: cents("the monthly cap").min(0).nullable() });
export type AccountMemberUpdateInput = z.infer<typeof accountMemberUpdateInput>;

export const memberParams = z.object({ id: id(), userId: id() });

export const accountMemberDto = z.object({
  userId: z.number().int(),
  name: z.string(),
  email: z.string(),
  monthlyCapCents: amount.nullable(),
  /** Why the manager let this person charge an account of another organisation; null: no exception. */
  exceptionReason: z.string().nullable(),
});
export type AccountMemberDto = z.infer<typeof accountMemberDto>;
export const accountMemberPage = pageOf(accountMemberDto);
export const accountMemberResponse = z.object({ member: accountMemberDto });

export const adjustmentInput = z.object({
  amountCents: cents("the amount").refine((v) => v !== 0, "An adjustment of zero changes nothing"),
  reason: z.string().trim().min(3, "Say why, in a few words").max(500),
  period: period.optional(),
});
export type AdjustmentInput = z.infer<typeof adjustmentInput>;

export const adjustmentDto = z.object({
  id: z.number().int(),
  accountId: z.number().int(),
  amountCents: amount,
  reason: z.string(),
  period: z.string(),
  createdAt: z.string(),
  billedRunId: z.number().int().nullable(),
});
export type AdjustmentDto = z.infer<typeof adjustmentDto>;
export const adjustmentPage = pageOf(adjustmentDto);
export const adjustmentResponse = z.object({ adjustment: adjustmentDto });

// ---- billing runs and statements ----------------------------------------------------------------

export const runInput = z.object({ period });
export const previewQuery = z.object({ period });
export const voidInput = z.object({ reason: z.string().trim().min(3, "Say why the run is voided").max(500) });

export const CHARGE_KINDS = ["instrument", "consumable", "adjustment", "correction", "cap_credit"] as const;
export const INVOICE_STATUSES = ["none", "queued", "open", "paid", "payment_failed", "void"] as const;
export const invoiceStatus = z.enum(INVOICE_STATUSES);
export type InvoiceStatusName = z.infer<typeof invoiceStatus>;
export const runStatus = z.enum(["final", "voided"]);

export const chargeLineDto = z.object({
  /** Absent on a preview's lines, which are not stored. */
  id: z.number().int().optional(),
  kind: z.enum(CHARGE_KINDS),
  description: z.string(),
  bookingId: z.number().int().nullable(),
  instrumentId: z.number().int().nullable(),
  usageId: z.number().int().nullable(),
  userId: z.number().int().nullable(),
  /** Exact: hours for instrument time, the amount in the cost unit for consumables, 1 for single amounts. */
  quantity: exactFigure,
  /** h, mL, g, each… */
  unit: z.string(),
  /** The price of one unit in cents, mark-up included (may hold fractions of a cent); quantity × unit price rounds to `amount`. */
  unitPriceCents: exactFigure,
  /** Integer cents: quantity × unit price rounded once, half away from zero. */
  amount,
  at: z.string(),
});
export type ChargeLineDto = z.infer<typeof chargeLineDto>;

export const statementAbilities = z.object({
  /** See it in the list and download its PDF. */
  download: z.boolean(),
  /** Pay its invoice: an external account's open invoice on a final run. */
  pay: z.boolean(),
});
export type StatementAbilities = z.infer<typeof statementAbilities>;

export const statementDto = z.object({
  /** Absent on a preview's statements, which are not stored. */
  id: z.number().int().optional(),
  accountId: z.number().int(),
  accountCode: z.string(),
  accountName: z.string(),
  accountKind: accountKind,
  /** Integer cents: the sum of the lines' amounts. */
  total: amount,
  currency: z.string(),
  lines: z.array(chargeLineDto),
  warnings: z.array(z.string()),
  invoiceStatus: invoiceStatus.optional(),
  invoiceNumber: z.string().nullable().optional(),
  invoiceUrl: z.string().nullable().optional(),
  paidAt: z.string().nullable().optional(),
  /** What the caller may do with it; absent on a preview's statements, which are not stored. */
  abilities: statementAbilities.optional(),
});
export type StatementDto = z.infer<typeof statementDto>;

export const billingRunAbilities = z.object({
  /** Void it (a final run none of whose invoices has been paid). */
  void: z.boolean(),
  /** Export its finance journal (a voided run's is marked VOID). */
  journal: z.boolean(),
  /** Export the reversing journal (a voided run only). */
  reversal: z.boolean(),
});
export type BillingRunAbilities = z.infer<typeof billingRunAbilities>;

export const billingRunDto = z.object({
  id: z.number().int(),
  period: z.string(),
  status: runStatus,
  currency: z.string(),
  total: amount,
  createdAt: z.string(),
  voidedAt: z.string().nullable(),
  voidReason: z.string().nullable(),
  statements: z.array(statementDto),
  abilities: billingRunAbilities,
});
export type BillingRunDto = z.infer<typeof billingRunDto>;
export const billingRunResponse = z.object({ run: billingRunDto });

/** A run in the list: the run without its statements, with counts instead. */
export const billingRunSummaryDto = billingRunDto.omit({ statements: true, voidReason: true }).extend({
  statementCount: z.number().int(),
  /** How many statements of the run are in each invoice status (internal ones are left out). */
  invoices: z.record(z.string(), z.number().int()),
});
export type BillingRunSummaryDto = z.infer<typeof billingRunSummaryDto>;
export const billingRunPage = pageOf(billingRunSummaryDto);

export const billingPreviewDto = z.object({
  period: z.string(),
  currency: z.string(),
  total: amount,
  /** Charges with no rate in effect: the month cannot be finalised until they have one. */
  missingRates: z.array(z.string()),
  /** Usages with no account or no unit cost: shown, not billed. */
  unbillableUsages: z.number().int(),
  statements: z.array(statementDto),
});
export type BillingPreviewDto = z.infer<typeof billingPreviewDto>;
export const billingPreviewResponse = z.object({ preview: billingPreviewDto });

/** A statement in the list of statements the caller may see (without its lines). */
export const statementListItemDto = statementDto.omit({ lines: true }).extend({
  id: z.number().int(),
  runId: z.number().int(),
  period: z.string(),
  runStatus,
  abilities: statementAbilities,
});
export type StatementListItemDto = z.infer<typeof statementListItemDto>;
export const statementPage = pageOf(statementListItemDto);

export const invoiceRetryResult = z.object({ done: z.number().int(), failed: z.number().int() });

/** The answer to a payment-service event: received, and whether its id had been handled before. */
export const webhookReceipt = z.object({ received: z.boolean(), duplicate: z.boolean() });

// ---- rate review ------------------------------------------------------------------------------

export const COST_CATEGORIES = ["salaries", "service_contracts", "depreciation", "supplies", "indirect", "other"] as const;

export const rateReviewInput = z.object({
  factors: z.object({ external_academic: z.number().min(1), commercial: z.number().min(1) }),
  instruments: z
    .array(
      z.object({
        instrumentId: id(),
        costLines: z.array(z.object({ label: z.string().max(200), category: z.enum(COST_CATEGORIES), amountCents: cents("the cost").min(0) })).max(50),
        subsidyCents: cents("the subsidy").min(0),
        carriedBalanceCents: cents("the carried balance"),
        projectedBillableHours: z.number().positive("Projected billable hours must be more than zero"),
      }),
    )
    .min(1)
    .max(100),
});
export type RateReviewInput = z.infer<typeof rateReviewInput>;

export const rateReviewRowDto = z.object({
  instrumentId: z.number().int(),
  instrumentName: z.string(),
  totalCostCents: amount,
  recoverableCents: amount,
  breakEvenCents: amount,
  proposed: z.record(customerClass, amount),
  current: z.record(customerClass, amount.nullable()),
});
export type RateReviewRowDto = z.infer<typeof rateReviewRowDto>;
export const rateReviewResponse = z.object({ items: z.array(rateReviewRowDto) });

export const rateApplyInput = z.object({
  effectiveFrom: isoDate,
  rates: z
    .array(z.object({ instrumentId: id(), customerClass, hourlyRateCents: cents("the hourly rate").min(0) }))
    .min(1)
    .max(300),
});
export type RateApplyInput = z.infer<typeof rateApplyInput>;

// ---- views --------------------------------------------------------------------------------------

export const reportQuery = z.object({ from: period.optional(), to: period.optional() });
export type ReportQuery = z.infer<typeof reportQuery>;

export const revenueReportDto = z.object({
  currency: z.string(),
  byMonth: z.array(z.object({ period: z.string(), internal: amount, external: amount, total: amount })),
  /** instrumentId null: consumables, adjustments and credits, which belong to no instrument. */
  byInstrument: z.array(z.object({ instrumentId: z.number().int().nullable(), name: z.string(), total: amount, hours: z.number() })),
  /** External customers are one row (external: true); internal accounts group by department (null: none). */
  byDepartment: z.array(z.object({ departmentId: z.number().int().nullable(), external: z.boolean(), name: z.string(), total: amount })),
});
export type RevenueReportDto = z.infer<typeof revenueReportDto>;

export const spendRowDto = z.object({
  period: z.string(),
  accountId: z.number().int(),
  accountCode: z.string(),
  accountName: z.string(),
  /** null: account-level lines (credits, adjustments) that belong to no member. */
  userId: z.number().int().nullable(),
  userName: z.string(),
  total: amount,
});
export type SpendRowDto = z.infer<typeof spendRowDto>;
export const spendReportDto = z.object({ currency: z.string(), items: z.array(spendRowDto) });
export type SpendReportDto = z.infer<typeof spendReportDto>;

export const myChargeDto = z.object({
  id: z.number().int(),
  period: z.string(),
  accountCode: z.string(),
  accountName: z.string(),
  kind: z.enum(CHARGE_KINDS),
  description: z.string(),
  quantity: exactFigure,
  unit: z.string(),
  unitPriceCents: exactFigure,
  amount,
  at: z.string(),
  bookingId: z.number().int().nullable(),
});
export type MyChargeDto = z.infer<typeof myChargeDto>;
/** A page of the caller's lines; `sum` is the amount of every matching line, not only this page's. */
export const myChargesDto = pageOf(myChargeDto).extend({ currency: z.string(), sum: amount });
export type MyChargesDto = z.infer<typeof myChargesDto>;

export const outstandingRowDto = z.object({
  statementId: z.number().int(),
  runId: z.number().int(),
  period: z.string(),
  accountId: z.number().int(),
  accountCode: z.string(),
  accountName: z.string(),
  billingEmail: z.string().nullable(),
  total: amount,
  currency: z.string(),
  invoiceStatus,
  invoiceNumber: z.string().nullable(),
  invoiceUrl: z.string().nullable(),
  lastError: z.string().nullable(),
  attempts: z.number().int(),
});
export type OutstandingRowDto = z.infer<typeof outstandingRowDto>;
export const outstandingDto = pageOf(outstandingRowDto).extend({ currency: z.string(), sum: amount });
export type OutstandingDto = z.infer<typeof outstandingDto>;

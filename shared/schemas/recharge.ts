/**
 * Recharge: rates, billing policy, accounts and who may charge them, billing runs, statements,
 * the rate review and the spend views. Inputs and DTOs shared by client and server.
 */
import { z } from "zod";
import { isoDate, pageQuery } from "./common";

export const CUSTOMER_CLASSES = ["internal", "external_academic", "commercial"] as const;
export const customerClass = z.enum(CUSTOMER_CLASSES);
export type CustomerClassName = z.infer<typeof customerClass>;
export const CUSTOMER_CLASS_LABELS: Record<CustomerClassName, string> = {
  internal: "Internal",
  external_academic: "External academic",
  commercial: "Commercial",
};

export const INSTRUMENT_KINDS = ["potentiostat", "interface_cell", "support"] as const;
export const instrumentKind = z.enum(INSTRUMENT_KINDS);

const cents = (what: string) => z.number({ message: `Give ${what} in whole cents` }).int(`Give ${what} in whole cents`);
const minutes = (what: string) => z.number({ message: `Give ${what} in whole minutes` }).int(`Give ${what} in whole minutes`).min(0).max(24 * 60);

export const period = z.string().regex(/^\d{4}-(0[1-9]|1[0-2])$/, "Give the month as YYYY-MM");

// ---- rates ------------------------------------------------------------------------------------

export const rateInput = z
  .object({
    instrumentId: z.number().int().positive().nullable().optional(),
    instrumentKind: instrumentKind.nullable().optional(),
    customerClass,
    hourlyRateCents: cents("the hourly rate").min(0),
    effectiveFrom: isoDate,
    effectiveTo: isoDate.nullable().optional(),
    minimumMinutes: minutes("the minimum charge").nullable().optional(),
    roundingIncrementMinutes: minutes("the rounding increment").min(1).max(240).nullable().optional(),
    afterHoursFactor: z.number().min(1, "An after-hours factor is 1 or more").max(5).nullable().optional(),
    note: z.string().max(500).optional(),
  })
  .refine((r) => (r.instrumentId == null) !== (r.instrumentKind == null), {
    message: "Give either an instrument or an instrument kind",
    path: ["instrumentId"],
  });
export type RateInput = z.infer<typeof rateInput>;

export const rateUpdateInput = z.object({
  hourlyRateCents: cents("the hourly rate").min(0).optional(),
  effectiveFrom: isoDate.optional(),
  effectiveTo: isoDate.nullable().optional(),
  minimumMinutes: minutes("the minimum charge").nullable().optional(),
  roundingIncrementMinutes: minutes("the rounding increment").min(1).max(240).nullable().optional(),
  afterHoursFactor: z.number().min(1).max(5).nullable().optional(),
  note: z.string().max(500).optional(),
});
export type RateUpdateInput = z.infer<typeof rateUpdateInput>;

export interface RateDto {
  id: number;
  instrumentId: number | null;
  instrumentName: string | null;
  instrumentKind: string | null;
  customerClass: CustomerClassName;
  hourlyRateCents: number;
  effectiveFrom: string;
  effectiveTo: string | null;
  minimumMinutes: number | null;
  roundingIncrementMinutes: number | null;
  afterHoursFactor: number | null;
  note: string;
  inEffect: boolean;
}

export const rateListQuery = z.object({ at: isoDate.optional() });

// ---- billing policy ---------------------------------------------------------------------------

export const billingPolicyInput = z.object({
  roundingIncrementMinutes: minutes("the rounding increment").min(1).max(240),
  minimumMinutes: minutes("the minimum charge"),
  noShowShare: z.number().min(0, "Give a share between 0 and 1").max(1, "Give a share between 0 and 1"),
  lateCancelShare: z.number().min(0, "Give a share between 0 and 1").max(1, "Give a share between 0 and 1"),
  cancellationWindowMinutes: z.number().int().min(0).max(14 * 24 * 60),
  consumableMarkupPercent: z.number().min(0).max(500),
});
export type BillingPolicyDto = z.infer<typeof billingPolicyInput>;

// ---- accounts -----------------------------------------------------------------------------------

export const accountListQuery = pageQuery.extend({ all: z.enum(["true", "false"]).optional() });

export interface AccountDto {
  id: number;
  code: string;
  name: string;
  kind: "internal" | "external";
  customerClass: CustomerClassName;
  departmentId: number | null;
  ownerId: number | null;
  ownerName: string | null;
  validFrom: string | null;
  validTo: string | null;
  organisation: string | null;
  billingEmail: string | null;
  active: boolean;
  /** Active and within its validity dates today. */
  chargeable: boolean;
  /** The caller's monthly cap on this account, when the caller may charge it. */
  myMonthlyCapCents?: number | null;
  /** The caller owns it (group lead) or manages all accounts: may change who charges it. */
  canManageMembers: boolean;
}

export const accountCreateInput = z.object({
  code: z.string().trim().min(2).max(40),
  name: z.string().trim().min(2).max(200),
  kind: z.enum(["internal", "external"]),
  customerClass,
  departmentId: z.number().int().positive().nullable().optional(),
  ownerId: z.number().int().positive().nullable().optional(),
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
});
export type AccountMemberInput = z.infer<typeof accountMemberInput>;

export const accountMemberUpdateInput = z.object({ monthlyCapCents: cents("the monthly cap").min(0).nullable() });
export type AccountMemberUpdateInput = z.infer<typeof accountMemberUpdateInput>;

export const memberParams = z.object({ id: z.coerce.number().int().positive(), userId: z.coerce.number().int().positive() });

export interface AccountMemberDto {
  userId: number;
  name: string;
  email: string;
  monthlyCapCents: number | null;
}

export const adjustmentInput = z.object({
  amountCents: cents("the amount").refine((v) => v !== 0, "An adjustment of zero changes nothing"),
  reason: z.string().trim().min(3, "Say why, in a few words").max(500),
  period: period.optional(),
});
export type AdjustmentInput = z.infer<typeof adjustmentInput>;

export interface AdjustmentDto {
  id: number;
  accountId: number;
  amountCents: number;
  reason: string;
  period: string;
  createdAt: string;
  billedRunId: number | null;
}

// ---- billing runs and statements ----------------------------------------------------------------

export const runInput = z.object({ period });
export const previewQuery = z.object({ period });
export const voidInput = z.object({ reason: z.string().trim().min(3, "Say why the run is voided").max(500) });

export interface ChargeLineDto {
  id?: number;
  kind: "instrument" | "consumable" | "adjustment" | "correction" | "cap_credit";
  description: string;
  bookingId: number | null;
  instrumentId: number | null;
  usageId: number | null;
  userId: number | null;
  quantity: number;
  unit: string;
  unitPriceCents: number;
  /** Integer cents. */
  amount: number;
  at: string;
}

export interface StatementDto {
  id?: number;
  accountId: number;
  accountCode: string;
  accountName: string;
  accountKind: "internal" | "external";
  /** Integer cents: the sum of the lines' amounts. */
  total: number;
  currency: string;
  lines: ChargeLineDto[];
  warnings: string[];
  invoiceStatus?: string;
  invoiceNumber?: string | null;
  invoiceUrl?: string | null;
  paidAt?: string | null;
}

export interface BillingRunDto {
  id: number;
  period: string;
  status: "final" | "voided";
  currency: string;
  total: number;
  createdAt: string;
  voidedAt: string | null;
  voidReason: string | null;
  statements: StatementDto[];
}

export interface BillingRunSummaryDto {
  id: number;
  period: string;
  status: "final" | "voided";
  currency: string;
  total: number;
  createdAt: string;
  voidedAt: string | null;
  statementCount: number;
  invoices: Record<string, number>;
}

export interface BillingPreviewDto {
  period: string;
  currency: string;
  total: number;
  statements: StatementDto[];
}

// ---- rate review ------------------------------------------------------------------------------

export const COST_CATEGORIES = ["salaries", "service_contracts", "depreciation", "supplies", "indirect", "other"] as const;

export const rateReviewInput = z.object({
  factors: z.object({ external_academic: z.number().min(1), commercial: z.number().min(1) }),
  instruments: z
    .array(
      z.object({
        instrumentId: z.number().int().positive(),
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

export interface RateReviewRowDto {
  instrumentId: number;
  instrumentName: string;
  totalCostCents: number;
  recoverableCents: number;
  breakEvenCents: number;
  proposed: Record<CustomerClassName, number>;
  current: Record<CustomerClassName, number | null>;
}

export const rateApplyInput = z.object({
  effectiveFrom: isoDate,
  rates: z
    .array(z.object({ instrumentId: z.number().int().positive(), customerClass, hourlyRateCents: cents("the hourly rate").min(0) }))
    .min(1)
    .max(300),
});
export type RateApplyInput = z.infer<typeof rateApplyInput>;

// ---- views --------------------------------------------------------------------------------------

export const reportQuery = z.object({ from: period.optional(), to: period.optional() });
export type ReportQuery = z.infer<typeof reportQuery>;

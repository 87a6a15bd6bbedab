/**
 * Recharge's price list: the customer classes and instrument kinds rates are set for, the rates
 * themselves and the billing policy (rounding, minimum, no-show and late-cancel shares, mark-up).
 * Re-exported by recharge.ts, which holds the accounts, runs and statements.
 */
import { z } from "zod";
import { id, isoDate, pageOf } from "./common";
import { INSTRUMENT_KINDS, instrumentKind } from "./instruments";

export const CUSTOMER_CLASSES = ["internal", "external_academic", "commercial"] as const;
export const customerClass = z.enum(CUSTOMER_CLASSES);
export type CustomerClassName = z.infer<typeof customerClass>;
export const CUSTOMER_CLASS_LABELS: Record<CustomerClassName, string> = {
  internal: "Internal",
  external_academic: "External academic",
  commercial: "Commercial",
};

// Rates are set per instrument kind: the kinds the instruments' own schema defines.
export { INSTRUMENT_KINDS, instrumentKind };


/** Whole cents in an input, with the field's name in the message. */
export const cents = (what: string) => z.number({ message: `Give ${what} in whole cents` }).int(`Give ${what} in whole cents`);
/** Whole minutes within a day, with the field's name in the message. */
export const minutes = (what: string) => z.number({ message: `Give ${what} in whole minutes` }).int(`Give ${what} in whole minutes`).min(0).max(24 * 60);
/** Whole cents in an answer. */
export const amount = z.number().int();

// ---- rates ------------------------------------------------------------------------------------

export const rateInput = z
  .object({
    instrumentId: id().nullable().optional(),
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

export const rateDto = z.object({
  id: z.number().int(),
  instrumentId: z.number().int().nullable(),
  instrumentName: z.string().nullable(),
  instrumentKind: instrumentKind.nullable(),
  customerClass,
  hourlyRateCents: amount,
  effectiveFrom: z.string(),
  effectiveTo: z.string().nullable(),
  minimumMinutes: z.number().int().nullable(),
  roundingIncrementMinutes: z.number().int().nullable(),
  afterHoursFactor: z.number().nullable(),
  note: z.string(),
  inEffect: z.boolean(),
});
export type RateDto = z.infer<typeof rateDto>;
export const ratePage = pageOf(rateDto);
export const rateResponse = z.object({ rate: rateDto });

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
export const policyResponse = z.object({ policy: billingPolicyInput });

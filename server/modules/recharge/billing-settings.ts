/**
 * The facility's billing policy, kept as one JSON row in the settings table. Defaults apply until
 * a manager saves one; the rates' own increment and minimum override the policy's when set.
 */
import type { EntityManager } from "typeorm";
import type { BillingPolicyDto } from "@shared/schemas/recharge";
import { Setting } from "../../entities";

export const BILLING_POLICY_KEY = "billing_policy";

export const DEFAULT_BILLING_POLICY: BillingPolicyDto = {
  roundingIncrementMinutes: 15,
  minimumMinutes: 30,
  noShowShare: 0.5,
  lateCancelShare: 0.5,
  cancellationWindowMinutes: 24 * 60,
  consumableMarkupPercent: 0,
};

export async function readBillingPolicy(em: EntityManager): Promise<BillingPolicyDto> {
  const row = await em.findOne(Setting, { where: { key: BILLING_POLICY_KEY } });
  if (!row) return { ...DEFAULT_BILLING_POLICY };
  return { ...DEFAULT_BILLING_POLICY, ...(JSON.parse(row.value) as Partial<BillingPolicyDto>) };
}

export async function writeBillingPolicy(em: EntityManager, policy: BillingPolicyDto): Promise<void> {
  await em.save(Setting, { key: BILLING_POLICY_KEY, value: JSON.stringify(policy) });
}

/**
 * The facility's billing settings (rounding increment, minimum charge, no-show and late-cancel
 * shares, consumable mark-up): settings, not a record policy. The API calls them the billing
 * policy (GET/PUT /api/billing/policy, `BillingPolicyDto`) and they are kept under that key, as
 * one JSON row in the settings table. Defaults apply until a manager saves them; a rate's own
 * increment and minimum override these when set.
 */
import type { EntityManager } from "typeorm";
import type { BillingPolicyDto } from "@shared/schemas/recharge";
import { Setting } from "../../entities";

export type BillingSettings = BillingPolicyDto;

/** The settings row's key (named before these were called settings; stored data keeps it). */
export const BILLING_SETTINGS_KEY = "billing_policy";

export const DEFAULT_BILLING_SETTINGS: BillingSettings = {
  roundingIncrementMinutes: 15,
  minimumMinutes: 30,
  noShowShare: 0.5,
  lateCancelShare: 0.5,
  cancellationWindowMinutes: 24 * 60,
  consumableMarkupPercent: 0,
};

export async function readBillingSettings(em: EntityManager): Promise<BillingSettings> {
  const row = await em.findOne(Setting, { where: { key: BILLING_SETTINGS_KEY } });
  if (!row) return { ...DEFAULT_BILLING_SETTINGS };
  return { ...DEFAULT_BILLING_SETTINGS, ...(JSON.parse(row.value) as Partial<BillingSettings>) };
}

export async function writeBillingSettings(em: EntityManager, settings: BillingSettings): Promise<void> {
  await em.save(Setting, { key: BILLING_SETTINGS_KEY, value: JSON.stringify(settings) });
}

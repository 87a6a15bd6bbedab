/**
 * Reads of the rate schedule and the billing settings, and the yearly rate review: break-even
 * rates per instrument (2 CFR 200.468, see shared/domain/rate-review.ts) beside the rates in
 * effect. The review changes nothing; applying its rates is a command (rate.commands.ts).
 */
import type { EntityManager } from "typeorm";
import { type RateEntry, rateFor } from "@shared/domain/billing";
import { breakEvenRate, classRates } from "@shared/domain/rate-review";
import { CUSTOMER_CLASSES, type CustomerClassName, type RateDto, type RateReviewInput, type RateReviewRowDto } from "@shared/schemas/recharge";
import { Instrument, Rate } from "../../entities";
import { RuleBroken } from "../../errors";
import { readBillingSettings, type BillingSettings } from "./billing-settings";
import { toRateEntry } from "./month-pricer";
import { presentRate } from "./recharge.presenter";
import { facilityToday, type RechargeDeps } from "./recharge-deps";

/** Rates as DTOs, with their instrument's name and whether each is in effect today. */
export async function presentRates(em: EntityManager, deps: RechargeDeps, rates: Rate[]): Promise<RateDto[]> {
  const names = new Map((await em.getRepository(Instrument).find({ select: { id: true, name: true } })).map((i) => [i.id, i.name]));
  const today = facilityToday(deps);
  return rates.map((r) => presentRate(r, r.instrumentId == null ? null : (names.get(r.instrumentId) ?? null), today));
}

export async function listRates(deps: RechargeDeps): Promise<RateDto[]> {
  const rates = await deps.ds.getRepository(Rate).find({ order: { customerClass: "ASC", instrumentKind: "ASC", instrumentId: "ASC", effectiveFrom: "ASC" } });
  return presentRates(deps.ds.manager, deps, rates);
}

export function billingSettings(deps: RechargeDeps): Promise<BillingSettings> {
  return deps.ds.transaction((em) => readBillingSettings(em));
}

/** Break-even and class rates per instrument, beside the rates in effect today. */
export async function reviewRates(deps: RechargeDeps, input: RateReviewInput): Promise<RateReviewRowDto[]> {
  const tz = deps.config.FACILITY_TZ;
  const instruments = new Map((await deps.ds.getRepository(Instrument).find()).map((i) => [i.id, i]));
  const table = (await deps.ds.getRepository(Rate).find()).map((r) => toRateEntry(r, tz));
  const at = deps.now();
  const rows: RateReviewRowDto[] = [];
  const errors: { path: string; message: string }[] = [];
  for (const [k, item] of input.instruments.entries()) {
    const inst = instruments.get(item.instrumentId);
    if (!inst) {
      errors.push({ path: `instruments.${k}.instrumentId`, message: "Unknown instrument" });
      continue;
    }
    const r = breakEvenRate(item);
    if (!r.ok) {
      errors.push(...r.errors.map((e) => ({ path: `instruments.${k}.${e.path}`, message: e.message })));
      continue;
    }
    const current = Object.fromEntries(
      CUSTOMER_CLASSES.map((cls) => [
        cls,
        rateFor({ rates: table as RateEntry[], instrumentId: inst.id, instrumentKind: inst.kind, customerClass: cls, at })?.hourlyRateCents ?? null,
      ]),
    ) as Record<CustomerClassName, number | null>;
    rows.push({
      instrumentId: inst.id,
      instrumentName: inst.name,
      totalCostCents: r.value.totalCostCents,
      recoverableCents: r.value.recoverableCents,
      breakEvenCents: r.value.hourlyRateCents,
      proposed: classRates(r.value.hourlyRateCents, input.factors),
      current,
    });
  }
  if (errors.length > 0) throw new RuleBroken("Some review figures cannot give a rate.", errors);
  return rows;
}

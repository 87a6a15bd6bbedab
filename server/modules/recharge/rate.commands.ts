/**
 * Changes to the rate schedule (effective-dated hourly rates per instrument or kind and customer
 * class) and to the billing settings, and applying a rate review's rates from a date. The
 * manager's alone (the routes' role gates); each change is one serialised transaction with its
 * audit entry, and none leaves one instrument (or kind) and class with two rates at once.
 */
import type { EntityManager } from "typeorm";
import { DateTime } from "luxon";
import { type RateEntry, rateFor, validateRateTable } from "@shared/domain/billing";
import type { RateApplyInput, RateDto, RateInput, RateUpdateInput } from "@shared/schemas/recharge";
import { Instrument, Rate } from "../../entities";
import { Conflict, NotFound, RuleBroken } from "../../errors";
import { serialTransaction } from "../../db/serial";
import type { AuthUser } from "../../middleware/auth";
import { audit } from "../../core/audit";
import { readBillingSettings, writeBillingSettings, type BillingSettings } from "./billing-settings";
import { toRateEntry } from "./month-pricer";
import { presentRates } from "./rate.queries";
import { facilityToday, type RechargeDeps } from "./recharge-deps";

/** Refuses a schedule in which one instrument (or kind) and class would have two rates at once. */
async function assertValidTable(em: EntityManager, tz: string, candidate: Rate, exceptId?: number): Promise<void> {
  const others = (await em.find(Rate)).filter((r) => r.id !== exceptId);
  const table = [...others, candidate].map((r) => toRateEntry(r, tz));
  const problems = validateRateTable(table);
  const mine = problems.filter((p) => p.path.startsWith(`rates.${table.length - 1}.`) || p.code === "overlap");
  if (mine.length > 0) {
    throw new RuleBroken(
      "This rate overlaps another rate for the same instrument (or kind) and customer class; end the other one first.",
      mine.map((p) => ({ path: p.path.replace(/^rates\.\d+\./, ""), message: p.message })),
      "rate_overlap",
    );
  }
}

async function checkInstrument(em: EntityManager, instrumentId: number | null | undefined): Promise<void> {
  if (instrumentId != null && !(await em.findOne(Instrument, { where: { id: instrumentId } }))) {
    throw new RuleBroken("That instrument does not exist.", [{ path: "instrumentId", message: "Unknown instrument" }]);
  }
}

function checkDates(from: string, to: string | null | undefined): void {
  if (to != null && to <= from) throw new RuleBroken("A rate must end after it takes effect.", [{ path: "effectiveTo", message: "End after the start" }]);
}

export async function createRate(deps: RechargeDeps, actor: AuthUser, input: RateInput): Promise<RateDto> {
  checkDates(input.effectiveFrom, input.effectiveTo);
  const rate = await serialTransaction(deps.ds, async (em) => {
    await checkInstrument(em, input.instrumentId);
    const row = em.create(Rate, {
      instrumentId: input.instrumentId ?? null,
      instrumentKind: input.instrumentId != null ? null : (input.instrumentKind ?? null),
      customerClass: input.customerClass,
      hourlyRateCents: input.hourlyRateCents,
      effectiveFrom: input.effectiveFrom,
      effectiveTo: input.effectiveTo ?? null,
      minimumMinutes: input.minimumMinutes ?? null,
      roundingIncrementMinutes: input.roundingIncrementMinutes ?? null,
      afterHoursFactor: input.afterHoursFactor ?? null,
      note: input.note ?? "",
      createdById: actor.id,
      createdAt: deps.now().toISOString(),
    });
    await assertValidTable(em, deps.config.FACILITY_TZ, row);
    const saved = await em.save(Rate, row);
    await audit(em, deps.now(), actor.id, "rate.created", "rate", saved.id, { ...input });
    return saved;
  });
  return (await presentRates(deps.ds.manager, deps, [rate]))[0];
}

export async function updateRate(deps: RechargeDeps, actor: AuthUser, id: number, input: RateUpdateInput): Promise<RateDto> {
  const rate = await serialTransaction(deps.ds, async (em) => {
    const row = await em.findOne(Rate, { where: { id } });
    if (!row) throw new NotFound("That rate");
    const next = { ...row, ...Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined)) } as Rate;
    checkDates(next.effectiveFrom, next.effectiveTo);
    await assertValidTable(em, deps.config.FACILITY_TZ, next, id);
    await em.save(Rate, next);
    await audit(em, deps.now(), actor.id, "rate.changed", "rate", id, { before: row, after: input });
    return next;
  });
  return (await presentRates(deps.ds.manager, deps, [rate]))[0];
}

/** Deletes a rate no final statement was priced with (409 otherwise: end it with a date instead). */
export async function removeRate(deps: RechargeDeps, actor: AuthUser, id: number): Promise<void> {
  await serialTransaction(deps.ds, async (em) => {
    const row = await em.findOne(Rate, { where: { id } });
    if (!row) throw new NotFound("That rate");
    const used = await em.query(
      `SELECT COUNT(*) AS n FROM charge_lines cl JOIN billing_runs r ON r.id = cl.runId WHERE r.status = 'final' AND cl.rateId = ?`,
      [id],
    );
    if (Number(used[0].n) > 0) throw new Conflict("Final statements were priced with this rate; end it with an end date instead.", "rate_in_use");
    await em.delete(Rate, id);
    await audit(em, deps.now(), actor.id, "rate.deleted", "rate", id, { ...row });
  });
}

/** PUT /api/billing/policy: the facility's billing settings. */
export async function saveBillingSettings(deps: RechargeDeps, actor: AuthUser, settings: BillingSettings): Promise<BillingSettings> {
  return serialTransaction(deps.ds, async (em) => {
    const before = await readBillingSettings(em);
    await writeBillingSettings(em, settings);
    await audit(em, deps.now(), actor.id, "billing.policy_changed", "setting", null, { before, after: settings });
    return settings;
  });
}

/**
 * New instrument rates from a date: an instrument's own rate still running on that date ends
 * there; the increment, minimum and after-hours factor carry over from the rate in effect.
 */
export async function applyRates(deps: RechargeDeps, actor: AuthUser, input: RateApplyInput): Promise<RateDto[]> {
  const tz = deps.config.FACILITY_TZ;
  const created = await serialTransaction(deps.ds, async (em) => {
    const out: Rate[] = [];
    const from = input.effectiveFrom;
    const fromMs = DateTime.fromISO(from, { zone: tz }).toMillis();
    for (const [k, item] of input.rates.entries()) {
      const inst = await em.findOne(Instrument, { where: { id: item.instrumentId } });
      if (!inst) throw new RuleBroken("Unknown instrument.", [{ path: `rates.${k}.instrumentId`, message: "Unknown instrument" }]);
      const all = await em.find(Rate);
      const own = all.filter((r) => r.instrumentId === inst.id && r.customerClass === item.customerClass);
      if (own.some((r) => r.effectiveFrom >= from)) {
        throw new RuleBroken(`${inst.name} already has a ${item.customerClass} rate starting on or after ${from}.`, [
          { path: `rates.${k}`, message: "A later rate exists; change it instead" },
        ], "rate_overlap");
      }
      const inEffect = rateFor({ rates: all.map((r) => toRateEntry(r, tz)), instrumentId: inst.id, instrumentKind: inst.kind, customerClass: item.customerClass, at: fromMs }) as
        | (RateEntry & { row: Rate })
        | null;
      for (const r of own) {
        if (r.effectiveTo == null || r.effectiveTo > from) await em.update(Rate, r.id, { effectiveTo: from });
      }
      const row = await em.save(Rate, {
        instrumentId: inst.id,
        instrumentKind: null,
        customerClass: item.customerClass,
        hourlyRateCents: item.hourlyRateCents,
        effectiveFrom: from,
        effectiveTo: null,
        minimumMinutes: inEffect?.row.minimumMinutes ?? null,
        roundingIncrementMinutes: inEffect?.row.roundingIncrementMinutes ?? null,
        afterHoursFactor: inEffect?.row.afterHoursFactor ?? null,
        note: `Rate review applied ${facilityToday(deps)}`,
        createdById: actor.id,
        createdAt: deps.now().toISOString(),
      });
      out.push(row);
    }
    const check = validateRateTable((await em.find(Rate)).map((r) => toRateEntry(r, tz)));
    if (check.length > 0) throw new RuleBroken("The new rates would overlap existing ones.", check.map((p) => ({ path: p.path, message: p.message })), "rate_overlap");
    await audit(em, deps.now(), actor.id, "rate.review_applied", "rate", null, { effectiveFrom: from, count: out.length });
    return out;
  });
  return presentRates(deps.ds.manager, deps, created);
}

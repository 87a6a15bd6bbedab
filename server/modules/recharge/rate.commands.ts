/**
 * The rate schedule (effective-dated hourly rates per instrument or kind and customer class),
 * the billing policy, and the yearly rate review: break-even rates per instrument (2 CFR 200.468,
 * see shared/domain/rate-review.ts), compared with the rates in effect, applied from a date.
 */
import type { DataSource, EntityManager } from "typeorm";
import { DateTime } from "luxon";
import { type RateEntry, rateFor, validateRateTable } from "@shared/domain/billing";
import { breakEvenRate, classRates } from "@shared/domain/rate-review";
import {
  CUSTOMER_CLASSES,
  type BillingPolicyDto,
  type CustomerClassName,
  type RateApplyInput,
  type RateDto,
  type RateInput,
  type RateReviewInput,
  type RateReviewRowDto,
  type RateUpdateInput,
} from "@shared/schemas/recharge";
import { Instrument, Rate } from "../../entities";
import { Conflict, NotFound, RuleBroken } from "../../errors";
import { serialTransaction } from "../../db/serial";
import type { AuthUser } from "../../middleware/auth";
import { audit } from "../../core/audit";
import { toRateEntry } from "./month-stream";
import { readBillingPolicy, writeBillingPolicy } from "./billing-settings";

export interface RatesDeps {
  ds: DataSource;
  tz: string;
  now: () => Date;
}

export function createRatesService(deps: RatesDeps) {
  const { ds, tz } = deps;
  const today = () => DateTime.fromJSDate(deps.now(), { zone: tz }).toISODate()!;

  async function present(rates: Rate[]): Promise<RateDto[]> {
    const names = new Map((await ds.getRepository(Instrument).find({ select: { id: true, name: true } })).map((i) => [i.id, i.name]));
    const d = today();
    return rates.map((r) => ({
      id: r.id,
      instrumentId: r.instrumentId,
      instrumentName: r.instrumentId == null ? null : (names.get(r.instrumentId) ?? null),
      instrumentKind: r.instrumentKind,
      customerClass: r.customerClass,
      hourlyRateCents: r.hourlyRateCents,
      effectiveFrom: r.effectiveFrom,
      effectiveTo: r.effectiveTo,
      minimumMinutes: r.minimumMinutes,
      roundingIncrementMinutes: r.roundingIncrementMinutes,
      afterHoursFactor: r.afterHoursFactor,
      note: r.note,
      inEffect: r.effectiveFrom <= d && (r.effectiveTo == null || d < r.effectiveTo),
    }));
  }

  /** Refuses a schedule in which one instrument (or kind) and class would have two rates at once. */
  async function assertValidTable(em: EntityManager, candidate: Rate, exceptId?: number): Promise<void> {
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

  return {
    async list(): Promise<RateDto[]> {
      const rates = await ds.getRepository(Rate).find({ order: { customerClass: "ASC", instrumentKind: "ASC", instrumentId: "ASC", effectiveFrom: "ASC" } });
      return present(rates);
    },

    async create(actor: AuthUser, input: RateInput): Promise<RateDto> {
      checkDates(input.effectiveFrom, input.effectiveTo);
      const rate = await serialTransaction(ds, async (em) => {
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
        await assertValidTable(em, row);
        const saved = await em.save(Rate, row);
        await audit(em, deps.now(), actor.id, "rate.created", "rate", saved.id, { ...input });
        return saved;
      });
      return (await present([rate]))[0];
    },

    async update(actor: AuthUser, id: number, input: RateUpdateInput): Promise<RateDto> {
      const rate = await serialTransaction(ds, async (em) => {
        const row = await em.findOne(Rate, { where: { id } });
        if (!row) throw new NotFound("That rate");
        const next = { ...row, ...Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined)) } as Rate;
        checkDates(next.effectiveFrom, next.effectiveTo);
        await assertValidTable(em, next, id);
        await em.save(Rate, next);
        await audit(em, deps.now(), actor.id, "rate.changed", "rate", id, { before: row, after: input });
        return next;
      });
      return (await present([rate]))[0];
    },

    async remove(actor: AuthUser, id: number): Promise<void> {
      await serialTransaction(ds, async (em) => {
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
    },

    policy: () => ds.transaction((em) => readBillingPolicy(em)),

    async setPolicy(actor: AuthUser, policy: BillingPolicyDto): Promise<BillingPolicyDto> {
      return serialTransaction(ds, async (em) => {
        const before = await readBillingPolicy(em);
        await writeBillingPolicy(em, policy);
        await audit(em, deps.now(), actor.id, "billing.policy_changed", "setting", null, { before, after: policy });
        return policy;
      });
    },

    /** Break-even and class rates per instrument, beside the rates in effect today. */
    async review(input: RateReviewInput): Promise<RateReviewRowDto[]> {
      const instruments = new Map((await ds.getRepository(Instrument).find()).map((i) => [i.id, i]));
      const table = (await ds.getRepository(Rate).find()).map((r) => toRateEntry(r, tz));
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
    },

    /**
     * New instrument rates from a date: an instrument's own rate still running on that date ends
     * there; the increment, minimum and after-hours factor carry over from the rate in effect.
     */
    async apply(actor: AuthUser, input: RateApplyInput): Promise<RateDto[]> {
      const created = await serialTransaction(ds, async (em) => {
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
            note: `Rate review applied ${today()}`,
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
      return present(created);
    },
  };
}

export type RatesService = ReturnType<typeof createRatesService>;

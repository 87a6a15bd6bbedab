/**
 * Charge lines rounded once (issue 11: 1.4 ¢ → 1 ¢ → 1 ¢ where rounding once gives 2 ¢).
 * Rounding rule: halves away from zero (what a spreadsheet's ROUND gives; common practice in
 * invoicing). Expected amounts are worked by hand beside each check; the density of
 * 1,2-dichloroethane, 1.2569 g/mL at 20 °C, is the Merck Index's.
 */
import { describe, expect, it } from "vitest";
import {
  CHARGE_ROUNDING_NOTE,
  CHARGE_ROUNDING_RULE,
  chargeLine,
  consumableChargeLine,
  eachChargeLine,
  lineAmountCents,
  lineReconciles,
  markupFactor,
  timeChargeLine,
  usageCost,
} from "@shared/domain/charges";
import { consumableCharge } from "@shared/domain/billing";
import { multiplyRate } from "@shared/domain/money";
import { usageCostCents } from "@shared/domain/stock";
import { toDecimalString } from "@shared/domain/exact";

const salt = { densityGPerMl: null, molarMass: 42.39, unitCostCents: 2, costUnit: "g" };

describe("consumable lines", () => {
  it("charges 0.7 g at 2 ¢/g with a 10 % mark-up as 2 ¢ (0.7 × 2 × 1.1 = 1.54), where rounding at use gave 1 ¢", () => {
    // The path this replaces: cost rounded at the time of use (1.4 → 1 ¢), then again after the mark-up (1.1 → 1 ¢).
    const atUse = usageCostCents(0.7, "g", salt);
    expect(atUse).toBe(1);
    expect(consumableCharge({ quantityUsed: 1, unitCostCents: atUse!, markupPercent: 10 }).amountCents).toBe(1);

    const cost = usageCost(0.7, "g", salt)!;
    expect(cost).toEqual({ quantity: "0.7", unit: "g", unitCostCents: "2", costCents: "1.4" });
    const line = consumableChargeLine(cost, 10);
    expect(line).toEqual({ quantity: "0.7", unit: "g", unitPriceCents: "2.2", amountCents: 2 });
    expect(lineReconciles(line)).toBe(true);
  });

  it("puts the amount used in the cost unit: 25 mL of 1,2-dichloroethane priced per g is 31.4225 g (× 1.2569 g/mL)", () => {
    const dce = { densityGPerMl: 1.2569, molarMass: 98.95, unitCostCents: 12, costUnit: "g" };
    const cost = usageCost(25, "mL", dce)!;
    expect(cost.quantity).toBe("31.4225");
    expect(cost.costCents).toBe("377.07"); // 31.4225 × 12
    // Mark-up 10 %: unit price 13.2 ¢/g; 31.4225 × 13.2 = 414.777 → 415 ¢
    const line = consumableChargeLine(cost, 10);
    expect(line).toMatchObject({ unitPriceCents: "13.2", amountCents: 415 });
    expect(lineReconciles(line)).toBe(true);
  });

  it("prices mg against a per-g cost exactly: 250 mg at 70 ¢/g is 17.5 ¢ → 18 ¢ (half away from zero)", () => {
    const line = consumableChargeLine(usageCost(250, "mg", { ...salt, unitCostCents: 70 })!, 0);
    expect(line).toEqual({ quantity: "0.25", unit: "g", unitPriceCents: "70", amountCents: 18 });
  });

  it("has no cost for an unpriced chemical or an amount that cannot be put in the cost unit", () => {
    expect(usageCost(1, "g", { ...salt, unitCostCents: null })).toBeNull();
    expect(usageCost(1, "mL", salt)).toBeNull(); // a solid priced per g, logged in mL without density
  });
});

describe("time lines", () => {
  it("bills 90 minutes at 45.00 $/h as 1.5 h × 4500 ¢ = 6750 ¢", () => {
    expect(timeChargeLine(90, 4500)).toEqual({ quantity: "1.5", unit: "h", unitPriceCents: "4500", amountCents: 6750 });
  });

  it("writes 10 minutes as the exact 1/6 h, so 1/6 × 4550 = 758.33… rounds to the 758 ¢ money.ts multiplyRate gives", () => {
    const line = timeChargeLine(10, 4550);
    expect(line.quantity).toBe("1/6");
    expect(line.amountCents).toBe(758);
    expect(line.amountCents).toBe(multiplyRate(4550, 10));
    expect(lineReconciles(line)).toBe(true);
  });

  it("agrees with multiplyRate for every minute count of a day at several rates", () => {
    for (const rate of [0, 1, 999, 4550, 12_345]) {
      for (let minutes = 0; minutes <= 24 * 60; minutes += 7) {
        expect(timeChargeLine(minutes, rate).amountCents).toBe(multiplyRate(rate, minutes));
      }
    }
  });
});

describe("the rounding rule", () => {
  it("rounds halves away from zero, once, and says so", () => {
    expect(CHARGE_ROUNDING_RULE).toBe("half_away_from_zero");
    expect(lineAmountCents(1, "2.5")).toBe(3);
    expect(lineAmountCents(1, "-2.5")).toBe(-3);
    expect(lineAmountCents("0.5", "0.99")).toBe(0); // 0.495
    expect(CHARGE_ROUNDING_NOTE).toMatch(/rounded once to the cent/);
    expect(CHARGE_ROUNDING_NOTE).toMatch(/halves away from zero/);
  });

  it("folds a mark-up of any decimal percent into the unit price exactly (12.5 % → × 1.125)", () => {
    expect(toDecimalString(markupFactor("12.5"))).toBe("1.125");
    expect(chargeLine({ quantity: 3, unit: "each", unitPriceCents: 100, markupPercent: 12.5 })).toEqual({ quantity: "3", unit: "each", unitPriceCents: "112.5", amountCents: 338 });
    expect(() => markupFactor(-1)).toThrow(RangeError);
  });

  it("makes single-amount lines 1 each at the amount", () => {
    expect(eachChargeLine(-250)).toEqual({ quantity: "1", unit: "each", unitPriceCents: "-250", amountCents: -250 });
  });

  it("notices a line whose figures do not reconcile", () => {
    expect(lineReconciles({ quantity: "0.17", unit: "h", unitPriceCents: "4550", amountCents: 758 })).toBe(false); // 0.17 × 4550 = 773.5
  });

  it("reconciles every line of a pseudo-random batch of quantities, prices and mark-ups", () => {
    let seed = 42;
    const next = () => (seed = (seed * 1_103_515_245 + 12_345) % 2 ** 31) / 2 ** 31;
    for (let i = 0; i < 500; i++) {
      const quantity = (Math.floor(next() * 1e6) / 1e3).toString();
      const price = (Math.floor(next() * 1e5) / 100).toString();
      const markup = (Math.floor(next() * 5000) / 100).toString();
      const line = chargeLine({ quantity, unit: "g", unitPriceCents: price, markupPercent: markup });
      expect(lineReconciles(line), JSON.stringify(line)).toBe(true);
    }
  });
});

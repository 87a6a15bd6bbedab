/**
 * Charge-line figures as statements print them: unit prices held in cents (with fractions of a
 * cent) shown in the currency's units with every decimal they have, never rounded. Values worked
 * by hand beside each check; currency formatting is en-CA's (Intl, CLDR).
 */
import { describe, expect, it } from "vitest";
import { formatQuantity, formatUnitPrice, formatUnitPricePer } from "@shared/domain/charge-format";

describe("formatUnitPrice", () => {
  it("shows whole-cent prices with two decimals: 4000 ¢ = $40.00", () => {
    expect(formatUnitPrice("4000")).toBe("$40.00");
    expect(formatUnitPrice("-1500")).toBe("-$15.00");
  });

  it("keeps every decimal of a price with fractions of a cent: 2.16 ¢ = $0.0216, 1357.4 ¢ = $13.574", () => {
    expect(formatUnitPrice("2.16")).toBe("$0.0216");
    expect(formatUnitPrice("1357.4")).toBe("$13.574");
    expect(formatUnitPrice("64.8")).toBe("$0.648");
  });

  it("shows a price with no finite decimal form in cents as its exact fraction", () => {
    expect(formatUnitPrice("1/3")).toBe("1/3 ¢");
  });

  it("names the unit, except for single items", () => {
    expect(formatUnitPricePer("4000", "h")).toBe("$40.00/h");
    expect(formatUnitPricePer("250", "each")).toBe("$2.50");
  });
});

describe("formatQuantity", () => {
  it("shows the exact text, fractions included", () => {
    expect(formatQuantity("1.25")).toBe("1.25");
    expect(formatQuantity("1/6")).toBe("1/6");
  });
});

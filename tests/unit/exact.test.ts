/**
 * Exact fractions behind amounts and charge lines. Expected values are worked by hand from the
 * decimal digits; the float results they replace are IEEE 754 double arithmetic (what JavaScript
 * numbers are), shown where they differ.
 */
import { describe, expect, it } from "vitest";
import { add, compare, divide, exact, fraction, multiply, roundToInteger, roundToPlaces, subtract, terminatingPlaces, toDecimalString, toNumber } from "@shared/domain/exact";

describe("exact", () => {
  it("reads numbers by their decimal digits: 0.1 + 0.2 is exactly 0.3 (in floats it is 0.30000000000000004)", () => {
    expect(0.1 + 0.2).not.toBe(0.3); // IEEE 754 doubles
    expect(compare(add(exact(0.1), exact(0.2)), exact("0.3"))).toBe(0);
    expect(toNumber(add(exact(0.1), exact(0.2)))).toBe(0.3);
  });

  it("reads decimal text, exponents and fractions, and refuses anything else", () => {
    expect(exact("2.5e-7")).toEqual(fraction(1n, 4_000_000n));
    expect(exact("-0.025")).toEqual(fraction(-1n, 40n));
    expect(exact("1/6")).toEqual(fraction(1n, 6n));
    expect(exact(".5")).toEqual(fraction(1n, 2n));
    for (const bad of ["", "abc", "1/0", "1.2.3", "e5"]) expect(() => exact(bad), bad).toThrow(RangeError);
    expect(() => exact(Number.NaN)).toThrow(RangeError);
    expect(() => exact(Infinity)).toThrow(RangeError);
  });

  it("keeps fractions reduced with a positive denominator", () => {
    expect(fraction(6n, -4n)).toEqual({ n: -3n, d: 2n });
    expect(divide(exact(1), exact(3))).toEqual({ n: 1n, d: 3n });
    expect(multiply(exact("1/3"), exact(3))).toEqual({ n: 1n, d: 1n });
    expect(subtract(exact("0.3"), exact("0.1"))).toEqual(exact("0.2"));
  });

  it("rounds halves away from zero, or to even when asked (2.5 → 3 or 2; −2.5 → −3 or −2; 3.5 → 4 either way)", () => {
    expect(roundToInteger(exact("2.5"))).toBe(3n);
    expect(roundToInteger(exact("-2.5"))).toBe(-3n);
    expect(roundToInteger(exact("2.5"), "half_even")).toBe(2n);
    expect(roundToInteger(exact("-2.5"), "half_even")).toBe(-2n);
    expect(roundToInteger(exact("3.5"), "half_even")).toBe(4n);
    expect(roundToInteger(exact("2.4999999"))).toBe(2n);
    expect(roundToInteger(exact("2.9"), "down")).toBe(2n);
    expect(roundToInteger(exact("2.1"), "up")).toBe(3n);
    expect(toDecimalString(roundToPlaces(exact("1.005"), 2))).toBe("1.01"); // in floats 1.005 is 1.00499999999999989…
  });

  it("writes exact decimals when they exist and a fraction when they do not", () => {
    expect(toDecimalString(exact("0.0250"))).toBe("0.025");
    expect(toDecimalString(exact(-3))).toBe("-3");
    expect(toDecimalString(exact("1e-9"))).toBe("0.000000001");
    expect(toDecimalString(fraction(1n, 6n))).toBe("1/6");
    expect(toDecimalString(fraction(1n, 6n), 4)).toBe("0.1667");
    expect(terminatingPlaces(fraction(1n, 8n))).toBe(3);
    expect(terminatingPlaces(fraction(1n, 3n))).toBeNull();
    expect(toNumber(fraction(1n, 3n))).toBeCloseTo(1 / 3, 15);
  });
});

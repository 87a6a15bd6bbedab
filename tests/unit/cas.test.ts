import { describe, expect, it } from "vitest";
import { casCheckDigit, isValidCas, parseCas } from "@shared/domain/cas";

// Real CAS Registry Numbers (CAS registry; the same numbers appear on the suppliers' safety data sheets).
const REAL_NUMBERS: Array<[string, string]> = [
  ["107-06-2", "1,2-dichloroethane"],
  ["7447-41-8", "lithium chloride"],
  ["7732-18-5", "water"],
  ["1643-19-2", "tetrabutylammonium bromide"],
  ["102-54-5", "ferrocene"],
  ["98-95-3", "nitrobenzene"],
  ["7647-14-5", "sodium chloride"],
];

describe("casCheckDigit", () => {
  it("weights the digits 1, 2, 3 … from the right and keeps the sum modulo 10 (CAS check-digit rule)", () => {
    // 7732-18-5: 8·1 + 1·2 + 2·3 + 3·4 + 7·5 + 7·6 = 105 → 5
    expect(casCheckDigit("773218")).toBe(5);
    // 107-06-2: 6·1 + 0·2 + 7·3 + 0·4 + 1·5 = 32 → 2
    expect(casCheckDigit("10706")).toBe(2);
  });

  it("refuses anything but digits", () => {
    expect(() => casCheckDigit("77-32")).toThrow(RangeError);
  });
});

describe("isValidCas", () => {
  it.each(REAL_NUMBERS)("accepts %s (%s)", (cas) => {
    expect(isValidCas(cas)).toBe(true);
  });

  it.each([
    ["107-06-3", "1,2-dichloroethane with the last digit changed"],
    ["7732-18-4", "water with the last digit changed"],
    ["7447-14-8", "lithium chloride with two digits swapped"],
  ])("rejects %s (%s) on the check digit", (cas) => {
    expect(isValidCas(cas)).toBe(false);
  });

  it.each([
    ["7732185", "no hyphens (the strict form wants them)"],
    ["7732-185", "two groups"],
    ["7732-18-55", "a two-digit check group"],
    ["7-18-5", "a one-digit first group"],
    ["12345678-18-5", "an eight-digit first group"],
    ["77a2-18-5", "a letter"],
    ["0107-06-2", "a leading zero"],
    ["", "nothing"],
  ])("rejects %j (%s) on its shape", (cas) => {
    expect(isValidCas(cas)).toBe(false);
  });
});

describe("parseCas", () => {
  it("returns the canonical form of a valid number with spaces around it", () => {
    expect(parseCas("  7647-14-5 ")).toEqual({ ok: true, cas: "7647-14-5" });
  });

  it("puts the hyphens back into a number pasted as bare digits", () => {
    expect(parseCas("1643192")).toEqual({ ok: true, cas: "1643-19-2" });
  });

  it("drops the leading zeros of a zero-padded export", () => {
    expect(parseCas("0000102-54-5")).toEqual({ ok: true, cas: "102-54-5" });
  });

  it("names the expected check digit when the last digit is wrong", () => {
    const result = parseCas("98-95-4");
    expect(result.ok).toBe(false);
    if (!result.ok) {
      expect(result.reason).toBe("check_digit");
      expect(result.message).toContain("should end in 3");
    }
  });

  it("says when the text is not shaped like a CAS number", () => {
    const result = parseCas("LiCl");
    expect(result).toMatchObject({ ok: false, reason: "shape" });
  });
});

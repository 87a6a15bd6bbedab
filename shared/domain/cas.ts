/**
 * CAS Registry Numbers on chemical records. The published check-digit rule catches most
 * typing slips before a wrong number reaches a label or a safety sheet lookup.
 *
 * Format (CAS): up to ten digits in three groups, NNNNNNN-NN-N; the first group has two to
 * seven digits, the second two, the last is the check digit. Check digit (CAS): number the
 * digits before it 1, 2, 3 … from the right, multiply each digit by its number, add the
 * products; the sum modulo 10 is the check digit. 7732-18-5: 8·1 + 1·2 + 2·3 + 3·4 + 7·5 +
 * 7·6 = 105, and 105 mod 10 = 5.
 */

const CANONICAL = /^(\d{2,7})-(\d{2})-(\d)$/;

/** The check digit for the digits before it (both groups, hyphens left out). */
export function casCheckDigit(digits: string): number {
  if (!/^\d+$/.test(digits)) throw new RangeError(`"${digits}" must contain digits only`);
  let sum = 0;
  for (let i = 0; i < digits.length; i++) {
    sum += Number(digits[digits.length - 1 - i]) * (i + 1);
  }
  return sum % 10;
}

/** True for a number in the hyphenated form whose check digit is right. */
export function isValidCas(input: string): boolean {
  return typeof input === "string" && parseStrict(input) === "ok";
}

function parseStrict(text: string): "ok" | "shape" | "check_digit" {
  const m = CANONICAL.exec(text);
  if (!m) return "shape";
  if (m[1].startsWith("0")) return "shape";
  return casCheckDigit(m[1] + m[2]) === Number(m[3]) ? "ok" : "check_digit";
}

export type CasParseResult =
  | { ok: true; cas: string }
  | { ok: false; reason: "shape" | "check_digit"; message: string };

/**
 * Reads a CAS number as a person may paste it: surrounding spaces, or digits without hyphens
 * ("7732185"), and leading zeros from zero-padded exports ("0007732-18-5"); returns the
 * canonical hyphenated form or says what is wrong.
 */
export function parseCas(input: string): CasParseResult {
  const text = typeof input === "string" ? input.trim() : "";
  let candidate = text;
  if (/^\d{5,10}$/.test(text)) {
    candidate = `${text.slice(0, -3)}-${text.slice(-3, -1)}-${text.slice(-1)}`;
  }
  const m = /^0*(\d+)-(\d{2})-(\d)$/.exec(candidate);
  if (m) candidate = `${m[1]}-${m[2]}-${m[3]}`;

  const verdict = parseStrict(candidate);
  if (verdict === "ok") return { ok: true, cas: candidate };
  if (verdict === "check_digit") {
    const parts = CANONICAL.exec(candidate) as RegExpExecArray;
    const expected = casCheckDigit(parts[1] + parts[2]);
    return {
      ok: false,
      reason: "check_digit",
      message: `${candidate} fails the CAS check digit (it should end in ${expected}); check the number for a typing slip.`,
    };
  }
  return {
    ok: false,
    reason: "shape",
    message: `"${text}" is not shaped like a CAS Registry Number (2–7 digits, 2 digits, 1 check digit, e.g. 7732-18-5).`,
  };
}

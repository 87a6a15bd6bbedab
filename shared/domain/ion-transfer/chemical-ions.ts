/**
 * The ions a Stockroom chemical gives when it dissolves, as the chemical's record keeps them
 * (LiCl → Li+ + Cl−; BTPPA TB(C6F5)4 → BTPPA+ + TB(C6F5)4−), so a run plan can start from the
 * bottles on the shelf. Written by people as a list: "Li+, Cl-" or "2 Na+, SO4 2-".
 *
 * Checks: every ion ends in its sign, the charge's sign agrees with it, and the formula unit is
 * electroneutral (Σ count·charge = 0).
 */
import { InputRuleError } from "../input-rule-error";

export interface ChemicalIonEntry {
  ion: string;
  charge: number;
  count: number;
}

export class ChemicalIonsError extends InputRuleError<"invalid_ions", string> {}

/** The charge a name spells: "Li+" → +1, "SO4 2-" or "SO4^2-" → −2, "Ca2+" → +2 only with a space or caret ("Ca 2+"). */
export function chargeFromName(name: string): number | null {
  const text = name.trim().replace(/[\u2212\u2013\u207B]/g, "-").replace(/\u207A/g, "+");
  const m = /(?:[\s^](\d))?([+-]+)$/.exec(text);
  if (!m) return null;
  const sign = m[2][0] === "+" ? 1 : -1;
  const magnitude = m[1] ? Number(m[1]) : m[2].length;
  return sign * magnitude;
}

/** Reads "Li+, Cl-" or "2 Na+, SO4 2-" (counts before the ion, names as the trade writes them). */
export function parseChemicalIons(text: string, field = "ions"): ChemicalIonEntry[] | null {
  const parts = text
    .split(/[,;]/)
    .map((p) => p.trim())
    .filter(Boolean);
  if (parts.length === 0) return null;
  const out: ChemicalIonEntry[] = parts.map((part, i) => {
    const m = /^(?:(\d+)\s*(?:[×x*]\s*)?\s+)?(.+)$/.exec(part) as RegExpExecArray;
    const count = m[1] ? Number(m[1]) : 1;
    const ion = m[2].trim();
    const charge = chargeFromName(ion);
    if (charge === null) {
      throw new ChemicalIonsError("invalid_ions", `${field}.${i}`, `"${part}" has no sign at its end: write the ion as Li+ or Cl- (SO4 2- for a double charge).`);
    }
    return { ion: ion.replace(/\s+(\d[+-])$/, " $1"), charge, count };
  });
  return checkChemicalIons(out, field);
}

/** Checks a list of ions (from the API or parsed) and answers it, or throws naming the field. */
export function checkChemicalIons(ions: ChemicalIonEntry[], field = "ions"): ChemicalIonEntry[] {
  const seen = new Set<string>();
  ions.forEach((entry, i) => {
    const spelled = chargeFromName(entry.ion);
    if (spelled !== null && Math.sign(spelled) !== Math.sign(entry.charge)) {
      throw new ChemicalIonsError("invalid_ions", `${field}.${i}.charge`, `${entry.ion} is written as ${spelled > 0 ? "a cation" : "an anion"} but given the charge ${entry.charge}.`);
    }
    if (seen.has(entry.ion)) throw new ChemicalIonsError("invalid_ions", `${field}.${i}.ion`, `${entry.ion} is listed twice; give it once with its count.`);
    seen.add(entry.ion);
  });
  if (!ions.some((e) => e.charge > 0) || !ions.some((e) => e.charge < 0)) {
    throw new ChemicalIonsError("invalid_ions", field, "An electrolyte gives at least one cation and one anion.");
  }
  const net = ions.reduce((sum, e) => sum + e.count * e.charge, 0);
  if (net !== 0) {
    const described = ions.map((e) => `${e.count} × ${e.ion}`).join(" + ");
    throw new ChemicalIonsError("invalid_ions", field, `${described} carries a net charge of ${net > 0 ? "+" : ""}${net}; a formula unit is neutral.`);
  }
  return ions;
}

/** "Li+ + Cl-", "2 Na+ + SO4 2-": how a page writes a chemical's ions. */
export function formatChemicalIons(ions: readonly ChemicalIonEntry[]): string {
  return ions.map((e) => `${e.count > 1 ? `${e.count} ` : ""}${e.ion}`).join(" + ");
}

/**
 * Molar masses from molecular formulas, for the stockroom and the solution planner.
 *
 * mf-parser reads the formula (parentheses, groups such as Bu, Et, Ph, Cp, isotope labels,
 * charges), but its element masses are isotopic-composition means (e.g. H 1.00794,
 * Cl 35.4529) that give C2H4Cl2 98.96 instead of 98.95. Phasebook promises masses from the
 * IUPAC/CIAAW 2021 abridged standard atomic weights, so we take only the parsed element counts
 * from mf-parser and weigh them with our own table below.
 *
 * Notation a person types and that we accept:
 * - adducts (hydrates, solvates, etherates) joined by ".", "·", "•", "⋅", "∙" or "*":
 *   "LiCl.H2O", "CuSO4·5H2O", "LiB(C6F5)4·2.5(C2H5)2O". A number right after a joining dot
 *   multiplies that adduct part and may be decimal (solvates are often non-integral);
 *   between a count and letters a dot joins parts, so "CuSO4.5H2O" is the pentahydrate,
 *   never "CuSO4.5" with an H2O.
 * - decimal counts, as Phasebook prints them in Hill formulas ("C34H25BF20LiO2.5" for the
 *   2.5-etherate of LiB(C6F5)4): a dot between digits is a decimal point when nothing could
 *   follow it as an adduct, i.e. its digits end the formula or are followed by ")", "]", a
 *   charge ("O2.5", "(OH)2.5"); when what follows is a single element, which is no adduct
 *   ("CaHO4.5S", the Hill formula of CaSO4·0.5H2O; "FeH2.5O2.5"); when the count before it is
 *   0 ("Fe0.95O"); and throughout a formula written in Hill order with carbon (C, then H, then
 *   the other elements alphabetically, each once: "C6H12.5O6.25"). Elsewhere such a dot keeps
 *   its traditional meaning and joins an adduct ("MgCl2.6H2O", "BaCl2.2H2O" are hydrates).
 *   Left ambiguous, and read as an adduct: a non-carbon Hill formula whose decimal count is
 *   followed by two or more elements (write such a formula with its adduct, e.g. "CaSO4·0.5H2O").
 * - square brackets as grouping ("K[B(C6H5)4]"); "[13C]", "[2H]" (a digit first) label isotopes.
 * - charges in parentheses ("SO4(2-)", "Fe(3+)") or a bare sign after a letter or a bracket
 *   ("Na+", "Cl-"). A bare sign after a digit ("Fe2+", "PF6-") is refused as ambiguous:
 *   mf-parser would read "Fe2+" as Fe₂⁺. A charge does not change the molar mass here
 *   (the electron mass is neglected, as is usual for the molar mass of an ion).
 */
import { MF } from "mf-parser";

export class FormulaError extends Error {
  readonly formula: string;
  constructor(formula: string, message: string) {
    super(message);
    this.name = "FormulaError";
    this.formula = formula;
  }
}

/**
 * IUPAC/CIAAW standard atomic weights 2021, abridged to five significant figures (or fewer where
 * natural variation limits them): T. Prohaska et al., "Standard atomic weights of the elements
 * 2021 (IUPAC Technical Report)", Pure Appl. Chem. 94 (2022) 573–600, abridged column; the
 * same values are published on ciaaw.org. Elements without a standard atomic weight (Tc, Pm,
 * Po … Ac, Np and heavier) are deliberately absent: a formula using them has no standard
 * molar mass and is refused.
 */
export const STANDARD_ATOMIC_WEIGHTS: Readonly<Record<string, number>> = Object.freeze({
  H: 1.008, He: 4.0026, Li: 6.94, Be: 9.0122, B: 10.81, C: 12.011, N: 14.007, O: 15.999,
  F: 18.998, Ne: 20.18, Na: 22.99, Mg: 24.305, Al: 26.982, Si: 28.085, P: 30.974, S: 32.06,
  Cl: 35.45, Ar: 39.95, K: 39.098, Ca: 40.078, Sc: 44.956, Ti: 47.867, V: 50.942, Cr: 51.996,
  Mn: 54.938, Fe: 55.845, Co: 58.933, Ni: 58.693, Cu: 63.546, Zn: 65.38, Ga: 69.723,
  Ge: 72.63, As: 74.922, Se: 78.971, Br: 79.904, Kr: 83.798, Rb: 85.468, Sr: 87.62,
  Y: 88.906, Zr: 91.224, Nb: 92.906, Mo: 95.95, Ru: 101.07, Rh: 102.91, Pd: 106.42,
  Ag: 107.87, Cd: 112.41, In: 114.82, Sn: 118.71, Sb: 121.76, Te: 127.6, I: 126.9,
  Xe: 131.29, Cs: 132.91, Ba: 137.33, La: 138.91, Ce: 140.12, Pr: 140.91, Nd: 144.24,
  Sm: 150.36, Eu: 151.96, Gd: 157.25, Tb: 158.93, Dy: 162.5, Ho: 164.93, Er: 167.26,
  Tm: 168.93, Yb: 173.05, Lu: 174.97, Hf: 178.49, Ta: 180.95, W: 183.84, Re: 186.21,
  Os: 190.23, Ir: 192.22, Pt: 195.08, Au: 196.97, Hg: 200.59, Tl: 204.38, Pb: 207.2,
  Bi: 208.98, Th: 232.04, Pa: 231.04, U: 238.03,
});

/** Abridged standard atomic weight of an element symbol, or undefined if it has none. */
export function atomicWeight(symbol: string): number | undefined {
  return Object.hasOwn(STANDARD_ATOMIC_WEIGHTS, symbol) ? STANDARD_ATOMIC_WEIGHTS[symbol] : undefined;
}

/** One kind of atom in a formula: an element, or one nuclide of it when the formula labels it. */
export interface AtomCount {
  symbol: string;
  /** Mass number for an isotope label such as [13C] or D; absent for the natural element. */
  massNumber?: number;
  count: number;
}

export interface FormulaAnalysis {
  /** The formula as Phasebook stores and shows it (see normaliseFormula). */
  formula: string;
  /** Hill-order formula of the whole, adducts included. */
  hillFormula: string;
  molarMassGPerMol: number;
  atoms: AtomCount[];
  /** Net charge as read from the formula (0 for a neutral compound). */
  charge: number;
}

const ADDUCT_SEPARATORS = /[.·•⋅∙*]/;
const ALLOWED_CHARACTERS = /^[A-Za-z0-9()[\]+\-.·•⋅∙*]*$/;

interface ParsedLine {
  kind: string;
  value: unknown;
  multiplier: number;
}

const HILL_TOKEN = /([A-Z][a-z]?)(\d+(?:\.\d+)?)?/g;

/**
 * True for a formula in Hill order with carbon and decimal counts allowed ("C34H25BF20LiO2.5"):
 * only element symbols and counts, C first, H next if present, the rest alphabetically, each once.
 */
function isCarbonHillFormula(compact: string): boolean {
  if (!/^(?:[A-Z][a-z]?(?:\d+(?:\.\d+)?)?)+$/.test(compact)) return false;
  const symbols = [...compact.matchAll(HILL_TOKEN)].map((m) => m[1]);
  if (symbols[0] !== "C" || new Set(symbols).size !== symbols.length) return false;
  const rest = symbols.slice(symbols[1] === "H" ? 2 : 1);
  return !rest.includes("H") && rest.every((sym, i) => i === 0 || rest[i - 1].localeCompare(sym, "en") < 0);
}

/** A "." at `i` that can only be a decimal point (see the notes at the top of this file). */
function isDecimalPoint(body: string, i: number): boolean {
  if (body[i] !== "." || !/\d/.test(body[i - 1] ?? "") || !/\d/.test(body[i + 1] ?? "")) return false;
  const before = /\d+$/.exec(body.slice(0, i))![0];
  if (before === "0") return true;
  const after = body.slice(i + 1).replace(/^\d+/, "");
  // Nothing an adduct could be: the end, a closing bracket, a charge, or a separator before letters.
  if (after === "" || /^[)\]]/.test(after) || /^\(\d*[+-]\)/.test(after) || /^[.·•⋅∙*]\D/.test(after)) return true;
  // A single element is no adduct ("CaHO4.5S", the Hill formula of CaSO4·0.5H2O, is not CaHO4 with 5 S).
  const single = /^([A-Z][a-z]?)(?:\d+(?:\.\d+)?)?(?:$|[)\]]|\(\d*[+-]\)|[.·•⋅∙*]\D)/.exec(after);
  return single !== null && atomicWeight(single[1]) !== undefined;
}

/** The first adduct separator in `body` that is not a decimal point, or −1. */
function findAdductCut(body: string): number {
  for (let i = 0; i < body.length; i++) {
    if (ADDUCT_SEPARATORS.test(body[i]) && !isDecimalPoint(body, i)) return i;
  }
  return -1;
}

/** Splits at adduct dots, keeping a leading decimal multiplier of each later part intact. */
function splitAdductParts(compact: string): string[] {
  if (isCarbonHillFormula(compact)) return [compact];
  const parts: string[] = [];
  let rest = compact;
  let first = true;
  while (rest.length > 0) {
    const leading = first ? "" : (/^\d+(?:\.\d+)?/.exec(rest)?.[0] ?? "");
    const body = rest.slice(leading.length);
    const cut = findAdductCut(body);
    if (cut === -1) {
      parts.push(leading + body);
      rest = "";
    } else {
      parts.push(leading + body.slice(0, cut));
      rest = body.slice(cut + 1);
      if (rest.length === 0) parts.push("");
    }
    first = false;
  }
  return parts;
}

/** Square brackets group like parentheses unless they hold an isotope label ("[13C]"). */
function bracketsToParentheses(formula: string, part: string): string {
  const stack: boolean[] = [];
  let out = "";
  for (let i = 0; i < part.length; i++) {
    const ch = part[i];
    if (ch === "[") {
      const isotope = /\d/.test(part[i + 1] ?? "");
      stack.push(isotope);
      out += isotope ? "[" : "(";
    } else if (ch === "]") {
      const isotope = stack.pop();
      if (isotope === undefined) throw new FormulaError(formula, `"${formula}" has a "]" without a matching "[".`);
      out += isotope ? "]" : ")";
    } else {
      out += ch;
    }
  }
  if (stack.length > 0) throw new FormulaError(formula, `"${formula}" has a "[" that is never closed.`);
  return out;
}

function compactInput(formula: string): string {
  if (typeof formula !== "string") throw new FormulaError(String(formula), "A formula must be text.");
  const compact = formula.replace(/\s+/g, "");
  if (compact.length === 0) throw new FormulaError(formula, "The formula is empty.");
  if (compact.length > 200) throw new FormulaError(formula, "The formula is longer than 200 characters.");
  if (!ALLOWED_CHARACTERS.test(compact)) {
    const bad = [...compact].find((ch) => !ALLOWED_CHARACTERS.test(ch));
    throw new FormulaError(formula, `"${formula}" contains "${bad}", which is not part of a molecular formula.`);
  }
  return compact;
}

interface PreparedFormula {
  /** Parts as typed (spaces removed), for storage and display. */
  display: string[];
  /** The same parts in mf-parser's notation (grouping brackets as parentheses). */
  parser: string[];
}

function prepare(formula: string): PreparedFormula {
  const display = splitAdductParts(compactInput(formula));
  const parser = display.map((part) => {
    if (part.length === 0 || /^\d+(?:\.\d+)?$/.test(part)) {
      throw new FormulaError(formula, `"${formula}" has an empty part around a "." or "·".`);
    }
    if (/\d[+-]+$/.test(part)) {
      throw new FormulaError(
        formula,
        `"${formula}": a charge sign right after a number is ambiguous (is "Fe2+" Fe²⁺ or Fe₂⁺?). ` +
          `Write the charge in parentheses, e.g. Fe(2+) or PF6(-).`,
      );
    }
    return bracketsToParentheses(formula, part);
  });
  return { display, parser };
}

function parseLines(formula: string, parserInput: string): ParsedLine[][] {
  try {
    return new MF(parserInput).toParts() as ParsedLine[][];
  } catch (error) {
    const detail = error instanceof Error ? error.message.split("\n")[0] : String(error);
    throw new FormulaError(formula, `"${formula}" is not a readable formula: ${detail}.`);
  }
}

const nuclideMassCache = new Map<string, number>();

/** Nuclide masses are not standard atomic weights; for labelled compounds we use mf-parser's own. */
function nuclideMass(formula: string, symbol: string, massNumber: number): number {
  const key = `[${massNumber}${symbol}]`;
  let mass = nuclideMassCache.get(key);
  if (mass === undefined) {
    try {
      mass = (new MF(key).getInfo() as { mass: number }).mass;
    } catch {
      throw new FormulaError(formula, `"${formula}" names the unknown nuclide ${massNumber}${symbol}.`);
    }
    nuclideMassCache.set(key, mass);
  }
  return mass;
}

function addAtom(atoms: AtomCount[], symbol: string, massNumber: number | undefined, count: number): void {
  const found = atoms.find((a) => a.symbol === symbol && a.massNumber === massNumber);
  if (found) found.count += count;
  else atoms.push(massNumber === undefined ? { symbol, count } : { symbol, massNumber, count });
}

function countAtoms(formula: string, parts: ParsedLine[][]): { atoms: AtomCount[]; charge: number } {
  const atoms: AtomCount[] = [];
  let charge = 0;
  for (const part of parts) {
    if (part.length === 0) throw new FormulaError(formula, `"${formula}" has a part without any element.`);
    for (const line of part) {
      if (line.kind === "atom") {
        addAtom(atoms, line.value as string, undefined, line.multiplier);
      } else if (line.kind === "isotope") {
        const { atom, isotope } = line.value as { atom: string; isotope: number };
        addAtom(atoms, atom, isotope, line.multiplier);
      } else if (line.kind === "charge") {
        charge += line.value as number;
      } else {
        throw new FormulaError(formula, `"${formula}" uses notation Phasebook does not weigh (${line.kind}).`);
      }
    }
  }
  for (const atom of atoms) {
    if (!(atom.count > 0) || !Number.isFinite(atom.count)) {
      throw new FormulaError(formula, `"${formula}" gives ${atom.symbol} a count of ${atom.count}.`);
    }
  }
  if (atoms.length === 0) throw new FormulaError(formula, `"${formula}" contains no element.`);
  return { atoms, charge };
}

function massOf(formula: string, atoms: AtomCount[]): number {
  let total = 0;
  for (const atom of atoms) {
    if (atom.massNumber !== undefined) {
      total += nuclideMass(formula, atom.symbol, atom.massNumber) * atom.count;
      continue;
    }
    const weight = atomicWeight(atom.symbol);
    if (weight === undefined) {
      const known = /^[A-Z][a-z]?$/.test(atom.symbol);
      throw new FormulaError(
        formula,
        known
          ? `"${formula}" contains ${atom.symbol}, which has no standard atomic weight (IUPAC/CIAAW 2021) or is not an element.`
          : `"${formula}" contains "${atom.symbol}", which is neither an element nor a known group.`,
      );
    }
    total += weight * atom.count;
  }
  return total;
}

function formatCount(count: number): string {
  return count === 1 ? "" : String(Number(count.toFixed(6)));
}

function formatCharge(charge: number): string {
  if (charge === 0) return "";
  const size = Math.abs(charge) === 1 ? "" : String(Math.abs(charge));
  return `(${size}${charge > 0 ? "+" : "-"})`;
}

/** Hill system: C first, then H, then the rest alphabetically; with no carbon, all alphabetically. */
export function hillOrder(atoms: readonly AtomCount[]): AtomCount[] {
  const hasCarbon = atoms.some((a) => a.symbol === "C");
  const rank = (symbol: string) => (!hasCarbon ? 2 : symbol === "C" ? 0 : symbol === "H" ? 1 : 2);
  return [...atoms].sort(
    (a, b) =>
      rank(a.symbol) - rank(b.symbol) ||
      a.symbol.localeCompare(b.symbol, "en") ||
      (a.massNumber ?? 0) - (b.massNumber ?? 0),
  );
}

function hillString(atoms: readonly AtomCount[], charge: number): string {
  const body = hillOrder(atoms)
    .map((a) => (a.massNumber === undefined ? a.symbol : `[${a.massNumber}${a.symbol}]`) + formatCount(a.count))
    .join("");
  return body + formatCharge(charge);
}

/** Parses and weighs a formula; throws FormulaError with a message for a person. */
export function analyseFormula(formula: string): FormulaAnalysis {
  const parts = prepare(formula);
  const lines = parseLines(formula, parts.parser.join(" . "));
  const { atoms, charge } = countAtoms(formula, lines);
  const molarMassGPerMol = massOf(formula, atoms);
  return {
    formula: parts.display.join("·"),
    hillFormula: hillString(atoms, charge),
    molarMassGPerMol,
    atoms: hillOrder(atoms),
    charge,
  };
}

/** Molar mass in g/mol from IUPAC/CIAAW 2021 abridged standard atomic weights. */
export function molarMassFromFormula(formula: string): number {
  return analyseFormula(formula).molarMassGPerMol;
}

export interface NormaliseFormulaOptions {
  /** Rewrite the whole formula in Hill order (adducts merged), e.g. "CuSO4·5H2O" → "CuH10O9S". */
  hill?: boolean;
}

/**
 * The formula as Phasebook stores and shows it: spaces removed and every adduct separator
 * written "·" ("CuSO4 . 5H2O" → "CuSO4·5H2O"); groups, brackets and element order kept as the
 * person typed them, because "Bu4NCl" or "K[B(C6H5)4]" say more to a chemist than Hill order.
 * Throws FormulaError for a formula that cannot be weighed, so nothing unreadable is stored.
 */
export function normaliseFormula(formula: string, options: NormaliseFormulaOptions = {}): string {
  const analysis = analyseFormula(formula);
  return options.hill ? analysis.hillFormula : analysis.formula;
}

/**
 * A halogenated organic for waste segregation: the formula has carbon and F, Cl, Br or I.
 * A formula cannot show bonds, so an organic salt with a halide ion (tetrabutylammonium
 * chloride) counts too; that errs towards the halogenated waste stream, which is the safe
 * side. Inorganic halides (LiCl, NaCl) do not count. Throws FormulaError for a bad formula.
 */
export function isHalogenated(formula: string): boolean {
  const symbols = new Set(analyseFormula(formula).atoms.map((a) => a.symbol));
  return symbols.has("C") && ["F", "Cl", "Br", "I"].some((x) => symbols.has(x));
}

/**
 * Names → ions: find the solvent and each named ion in the table, or take a custom ion given
 * inline ({ ion: "X+", charge: 1, standardPotentialV: -0.30 }), and split a salt's name into
 * its ions ("LiCl" → Li+ + Cl−, "BTPPA TB(C6F5)4" → BTPPA+ + TB(C6F5)4−).
 *
 * An unknown solvent or ion is a rule broken by the request (the server answers 422), so the
 * error lists every unknown name at once together with the names the table knows.
 */
import { InputRuleError } from "../input-rule-error";
import { DEFAULT_SOLVENT_ID, type IonTransferTable, type SolventEntry, type TabulatedIon } from "./ion-table";

export type IonTransferErrorCode =
  | "unknown_solvent"
  | "unknown_ion"
  | "unknown_salt"
  | "invalid_ion"
  | "invalid_number"
  | "not_electroneutral";

export class IonTransferError extends InputRuleError<IonTransferErrorCode, string> {
  /** Every request field the rule concerns (field is the first of them). */
  readonly fields: readonly string[];
  /** The names that were not found. */
  readonly unknown: readonly string[];
  /** The names the table knows, for the answer to offer. */
  readonly known: readonly string[];
  constructor(
    code: IonTransferErrorCode,
    fields: string | readonly string[],
    message: string,
    detail: { unknown?: readonly string[]; known?: readonly string[] } = {},
  ) {
    const list = typeof fields === "string" ? [fields] : [...fields];
    super(code, list[0] ?? "", message);
    this.fields = list;
    this.unknown = detail.unknown ?? [];
    this.known = detail.known ?? [];
  }
}

/** How a request names an ion: a table name, or a custom ion with its charge and Δ_o^w φ°. */
export interface IonRef {
  ion: string;
  charge?: number;
  standardPotentialV?: number;
  diffusionAqueousCm2PerS?: number;
  diffusionOrganicCm2PerS?: number;
}

/** An ion ready for the equations, with where each number came from. */
export interface ResolvedIon {
  ion: string;
  charge: number;
  standardPotentialV: number;
  /** Source of Δ_o^w φ°: the table's, or "given in the request" for a custom ion. */
  source: string;
  /** True when the request gave the ion's charge and potential itself. */
  custom: boolean;
  diffusionAqueousCm2PerS: number | null;
  diffusionAqueousSource: string | null;
  diffusionOrganicCm2PerS: number | null;
  diffusionOrganicSource: string | null;
}

export const GIVEN_IN_REQUEST = "given in the request";

/** Unicode minus, superscript signs and stray spaces to the ASCII form the table uses. */
export function normaliseIonName(name: string): string {
  return name
    .trim()
    .replace(/[\u2212\u2013\u207B]/g, "-")
    .replace(/\u207A/g, "+")
    .replace(/\s+/g, "");
}

function solventKey(name: string): string {
  return name.trim().toLowerCase().replace(/\s+/g, "");
}

/** Every name a solvent answers to. */
export function solventNames(table: IonTransferTable): string[] {
  return table.map((s) => s.id);
}

/**
 * The solvent entry for an id, name or alias (case-insensitive). Without a name, the facility's
 * default solvent (1,2-dichloroethane). Throws IonTransferError "unknown_solvent".
 */
export function resolveSolvent(table: IonTransferTable, name: string | undefined | null, field = "solvent"): SolventEntry {
  const wanted = name === undefined || name === null || name.trim() === "" ? DEFAULT_SOLVENT_ID : name;
  const key = solventKey(wanted);
  const found = table.find((s) => solventKey(s.id) === key || solventKey(s.name) === key || s.aliases.some((a) => solventKey(a) === key));
  if (found) return found;
  const known = table.map((s) => `${s.id} (${s.name})`);
  throw new IonTransferError(
    "unknown_solvent",
    field,
    `Phasebook has no ion-transfer data for the solvent "${wanted}". Known solvents: ${known.join(", ")}.`,
    { unknown: [wanted], known: table.map((s) => s.id) },
  );
}

/** Alternative spellings of ions the trade uses, mapped to the table's name. */
const ION_ALIASES: Readonly<Record<string, string>> = {
  "TPFB-": "TB(C6F5)4-",
  "B(C6F5)4-": "TB(C6F5)4-",
  "[B(C6F5)4]-": "TB(C6F5)4-",
  "BPh4-": "TPB-",
  "TPhB-": "TPB-",
  "Ph4As+": "TPAs+",
  "TPhAs+": "TPAs+",
  "PNP+": "BTPPA+",
  "Me4N+": "TMA+",
  "Et4N+": "TEA+",
  "Pr4N+": "TPrA+",
  "Bu4N+": "TBA+",
  "TBuA+": "TBA+",
  "PPN+": "BTPPA+",
};

/** The tabulated ion for a name or a known alias, or undefined. */
export function findIon(solvent: SolventEntry, name: string): TabulatedIon | undefined {
  const key = normaliseIonName(name);
  const canonical = Object.hasOwn(ION_ALIASES, key) ? ION_ALIASES[key] : key;
  return solvent.ions.find((i) => i.ion === canonical);
}

function isCustom(ref: IonRef): boolean {
  return ref.charge !== undefined || ref.standardPotentialV !== undefined;
}

function checkCustom(ref: IonRef, field: string): { charge: number; standardPotentialV: number } {
  const { charge, standardPotentialV } = ref;
  if (charge === undefined || standardPotentialV === undefined) {
    throw new IonTransferError(
      "invalid_ion",
      field,
      `A custom ion needs both its charge and its standard transfer potential (standardPotentialV); "${ref.ion}" gives only one.`,
    );
  }
  if (!Number.isInteger(charge) || charge === 0) {
    throw new IonTransferError("invalid_ion", field, `The charge of "${ref.ion}" must be a whole number other than zero (got ${charge}).`);
  }
  if (!Number.isFinite(standardPotentialV)) {
    throw new IonTransferError("invalid_ion", field, `The standard transfer potential of "${ref.ion}" must be a finite number.`);
  }
  return { charge, standardPotentialV };
}

function optionalDiffusion(value: number | undefined, field: string, what: string): number | null {
  if (value === undefined) return null;
  if (!Number.isFinite(value) || value <= 0) {
    throw new IonTransferError("invalid_number", field, `The ${what} must be above zero (got ${value}).`);
  }
  return value;
}

/**
 * Resolves named or custom ions against one solvent's table. Request values win over the table
 * (a custom charge and potential, or a measured diffusion coefficient). All unknown names are
 * reported together in one IonTransferError "unknown_ion", with the solvent's known ions.
 *
 * @param refs each ion and the request path of its entry, e.g. "aqueous[0]"
 */
export function resolveIons(solvent: SolventEntry, refs: readonly { ref: IonRef; path: string }[]): ResolvedIon[] {
  const unknown: { name: string; path: string }[] = [];
  const resolved: (ResolvedIon | null)[] = refs.map(({ ref, path }) => {
    const dAq = optionalDiffusion(ref.diffusionAqueousCm2PerS, `${path}.diffusionAqueousCm2PerS`, "aqueous diffusion coefficient");
    const dOrg = optionalDiffusion(ref.diffusionOrganicCm2PerS, `${path}.diffusionOrganicCm2PerS`, "organic diffusion coefficient");
    const name = typeof ref.ion === "string" ? normaliseIonName(ref.ion) : "";
    if (name === "") throw new IonTransferError("invalid_ion", `${path}.ion`, "Name the ion.");
    if (isCustom(ref)) {
      const { charge, standardPotentialV } = checkCustom(ref, path);
      return {
        ion: name,
        charge,
        standardPotentialV,
        source: GIVEN_IN_REQUEST,
        custom: true,
        diffusionAqueousCm2PerS: dAq,
        diffusionAqueousSource: dAq === null ? null : GIVEN_IN_REQUEST,
        diffusionOrganicCm2PerS: dOrg,
        diffusionOrganicSource: dOrg === null ? null : GIVEN_IN_REQUEST,
      };
    }
    const found = findIon(solvent, name);
    if (!found) {
      unknown.push({ name, path: `${path}.ion` });
      return null;
    }
    return {
      ion: found.ion,
      charge: found.charge,
      standardPotentialV: found.standardPotential.value,
      source: found.standardPotential.source,
      custom: false,
      diffusionAqueousCm2PerS: dAq ?? found.diffusionAqueous?.value ?? null,
      diffusionAqueousSource: dAq !== null ? GIVEN_IN_REQUEST : (found.diffusionAqueous?.source ?? null),
      diffusionOrganicCm2PerS: dOrg ?? found.diffusionOrganic?.value ?? null,
      diffusionOrganicSource: dOrg !== null ? GIVEN_IN_REQUEST : (found.diffusionOrganic?.source ?? null),
    };
  });
  if (unknown.length > 0) {
    const names = [...new Set(unknown.map((u) => u.name))];
    const known = solvent.ions.map((i) => i.ion);
    throw new IonTransferError(
      "unknown_ion",
      unknown.map((u) => u.path),
      `Phasebook has no standard transfer potential for ${names.map((n) => `"${n}"`).join(", ")} at water | ${solvent.name}. ` +
        `Known ions: ${known.join(", ")}. Or give the ion inline with its charge and standardPotentialV.`,
      { unknown: names, known },
    );
  }
  return resolved as ResolvedIon[];
}

// ---------------------------------------------------------------- salts

export interface SaltIon {
  ion: string;
  charge: number;
  /** Ions of this kind per formula unit of the salt. */
  stoichiometry: number;
}

function baseName(ionName: string): string {
  return ionName.replace(/[+-]+$/, "");
}

function gcd(a: number, b: number): number {
  return b === 0 ? a : gcd(b, a % b);
}

/** Bases of every ion in the solvent's table, and of the aliases, each with its ion. */
function basesOf(solvent: SolventEntry, sign: 1 | -1): { base: string; ion: TabulatedIon }[] {
  const out: { base: string; ion: TabulatedIon }[] = [];
  for (const entry of solvent.ions) if (Math.sign(entry.charge) === sign) out.push({ base: baseName(entry.ion), ion: entry });
  for (const [alias, target] of Object.entries(ION_ALIASES)) {
    const entry = solvent.ions.find((i) => i.ion === target);
    if (entry && Math.sign(entry.charge) === sign) out.push({ base: baseName(alias), ion: entry });
  }
  return out;
}

/**
 * The ions a salt gives, by the trade's way of writing it: the cation then the anion, joined or
 * spaced ("LiCl", "TBA TPB", "BTPPA TB(C6F5)4", "BTPPATPFB"). The stoichiometry follows from the
 * charges (electroneutral formula unit). Throws IonTransferError "unknown_salt" when no split of
 * the name into a known cation and a known anion exists, or more than one does.
 */
export function saltIons(solvent: SolventEntry, salt: string, field = "salt"): SaltIon[] {
  const compact = normaliseIonName(salt);
  const cations = basesOf(solvent, 1);
  const anions = basesOf(solvent, -1);
  const matches = new Map<string, [TabulatedIon, TabulatedIon]>();
  for (const c of cations) {
    if (!compact.startsWith(c.base)) continue;
    const rest = compact.slice(c.base.length);
    for (const a of anions) if (rest === a.base) matches.set(`${c.ion.ion}|${a.ion.ion}`, [c.ion, a.ion]);
  }
  if (matches.size !== 1) {
    const why = matches.size === 0 ? "cannot be read as a known cation followed by a known anion" : "can be read in more than one way";
    throw new IonTransferError(
      "unknown_salt",
      field,
      `The salt "${salt}" ${why} at water | ${solvent.name}. Write it as cation then anion, e.g. "LiCl" or "BTPPA TB(C6F5)4"; ` +
        `known ions: ${solvent.ions.map((i) => i.ion).join(", ")}.`,
      { unknown: [salt], known: solvent.ions.map((i) => i.ion) },
    );
  }
  const [cation, anion] = [...matches.values()][0];
  const g = gcd(cation.charge, -anion.charge);
  return [
    { ion: cation.ion, charge: cation.charge, stoichiometry: -anion.charge / g },
    { ion: anion.ion, charge: anion.charge, stoichiometry: cation.charge / g },
  ];
}

/** Ion concentrations from a salt concentration: each ion at stoichiometry × c(salt). */
export function saltIonConcentrations(
  solvent: SolventEntry,
  salt: string,
  saltMolPerL: number,
  field = "salt",
): { ion: string; molPerL: number }[] {
  if (!Number.isFinite(saltMolPerL) || saltMolPerL <= 0) {
    throw new IonTransferError("invalid_number", `${field}.molPerL`, `The salt concentration must be above zero (got ${saltMolPerL}).`);
  }
  return saltIons(solvent, salt, field).map((i) => ({ ion: i.ion, molPerL: i.stoichiometry * saltMolPerL }));
}

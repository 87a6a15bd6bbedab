/**
 * The solution planner: how much solute to weigh for a target concentration, what
 * concentration a weighed mass actually gives, and how to dilute a stock.
 *
 * Concentrations are amount concentrations in mol/L, volumes in mL, masses in g. The molar
 * mass must be that of the form in the bottle: a hydrate or an etherate (many hydrophobic
 * borate salts are sold as solvates) weighs more per mole than the bare salt.
 *
 * Assumption, stated because it decides the solvent volume: the solution is made up to the
 * final volume in a volumetric flask, and the solvent volume we report equals that final
 * volume. That treats the solute's own volume as negligible, which is common practice for
 * dilute electrolytes (the millimolar supporting electrolytes of the facility); above about
 * 10 g of solute per litre we flag the figure as approximate (Phasebook's threshold, not a
 * standard), because solute volume and volume changes on mixing are then no longer small.
 */
import { InputRuleError } from "./input-rule-error";

export type SolutionErrorCode = "invalid_number" | "purity_out_of_range" | "concentration_increase";

export class SolutionError extends InputRuleError<SolutionErrorCode, string> {}

/** Above this many grams of solute per litre the "solvent ≈ final volume" figure is flagged. */
export const NEGLIGIBLE_SOLUTE_G_PER_L = 10;

const MAX_VALUE = 1e9;

function positive(value: unknown, field: string, what: string): number {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new SolutionError("invalid_number", field, `The ${what} must be a finite number.`);
  }
  if (value <= 0) throw new SolutionError("invalid_number", field, `The ${what} must be above zero (got ${value}).`);
  if (value > MAX_VALUE) throw new SolutionError("invalid_number", field, `The ${what} of ${value} is larger than Phasebook accepts.`);
  return value;
}

function purity(value: unknown, field = "purityPercent"): number {
  if (value === undefined) return 100;
  if (typeof value !== "number" || !Number.isFinite(value) || value <= 0 || value > 100) {
    throw new SolutionError("purity_out_of_range", field, `The purity must be above 0 % and at most 100 % (got ${String(value)}).`);
  }
  return value;
}

export interface PlanSolutionInput {
  concentrationMolPerL: number;
  volumeMl: number;
  molarMassGPerMol: number;
  /** Assay of the solid in the bottle, (0, 100]; defaults to 100. */
  purityPercent?: number;
}

export interface SolutionPlan {
  /** Mass of the bottle's contents to weigh, purity included: c × V × M ÷ (purity / 100). */
  soluteMassG: number;
  /** Mass of the pure compound in that weighing: c × V × M. */
  pureSoluteMassG: number;
  soluteAmountMol: number;
  /** Make up to this final volume; see the module note on the solute volume. */
  finalVolumeMl: number;
  /** Solvent to use, taken equal to the final volume (solute volume neglected). */
  solventVolumeMl: number;
  /** True when the solute is concentrated enough that solventVolumeMl is only approximate. */
  solventVolumeApproximate: boolean;
}

export function planSolution(input: PlanSolutionInput): SolutionPlan {
  const c = positive(input.concentrationMolPerL, "concentrationMolPerL", "concentration");
  const volumeMl = positive(input.volumeMl, "volumeMl", "volume");
  const molarMass = positive(input.molarMassGPerMol, "molarMassGPerMol", "molar mass");
  const p = purity(input.purityPercent);
  const soluteAmountMol = (c * volumeMl) / 1000;
  const pureSoluteMassG = soluteAmountMol * molarMass;
  const soluteMassG = pureSoluteMassG / (p / 100);
  return {
    soluteMassG,
    pureSoluteMassG,
    soluteAmountMol,
    finalVolumeMl: volumeMl,
    solventVolumeMl: volumeMl,
    solventVolumeApproximate: (soluteMassG / volumeMl) * 1000 > NEGLIGIBLE_SOLUTE_G_PER_L,
  };
}

export interface ActualConcentrationInput {
  massWeighedG: number;
  volumeMl: number;
  molarMassGPerMol: number;
  purityPercent?: number;
}

/** The concentration (mol/L) a weighed mass really gives: m × purity ÷ (M × V). */
export function actualConcentration(input: ActualConcentrationInput): number {
  const mass = positive(input.massWeighedG, "massWeighedG", "weighed mass");
  const volumeMl = positive(input.volumeMl, "volumeMl", "volume");
  const molarMass = positive(input.molarMassGPerMol, "molarMassGPerMol", "molar mass");
  const p = purity(input.purityPercent);
  return (mass * (p / 100)) / molarMass / (volumeMl / 1000);
}

export interface DilutionInput {
  /** Stock concentration. */
  c1: number;
  /** Target concentration, in the same unit as c1. */
  c2: number;
  /** Target volume. */
  v2: number;
}

export interface DilutionPlan {
  /** Stock volume to take, in the unit of v2: C1V1 = C2V2. */
  v1: number;
  /** Diluent to add, v2 − v1 (volumes of dilute solutions taken as additive). */
  diluentVolume: number;
}

export function dilution(input: DilutionInput): DilutionPlan {
  const c1 = positive(input.c1, "c1", "stock concentration");
  const c2 = positive(input.c2, "c2", "target concentration");
  const v2 = positive(input.v2, "v2", "target volume");
  if (c2 > c1) {
    throw new SolutionError(
      "concentration_increase",
      "c2",
      `A dilution cannot raise the concentration: the target (${c2}) is above the stock (${c1}).`,
    );
  }
  const v1 = (c2 * v2) / c1;
  return { v1, diluentVolume: v2 - v1 };
}

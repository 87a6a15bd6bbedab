/**
 * Where an analyte ion transfers and with what current.
 *
 * Reversible half-wave potential. Take the ion starting in phase α (bulk c*, diffusion D_α)
 * and moving into phase β (initially free of it, D_β), with planar semi-infinite diffusion on
 * both sides and the Nernst partition at the interface. Flux continuity and the Laplace-domain
 * solutions give, at every instant, c_α(0) = c* − m/√D_α and c_β(0) = m/√D_β, where m is the
 * same semi-integral of the flux on both sides (the same algebra as Bard & Faulkner,
 * Electrochemical Methods, 2nd ed., §5.4 / §6.2 for O + ne ⇌ R). Half of the way up the wave
 * m = c*√D_α / 2, so
 *   c_β(0) / c_α(0) = √(D_α / D_β).
 * For an ion starting in water (α = w, β = o): c^o/c^w = √(D_w/D_o) = exp(zF(Δφ½ − Δφ°)/RT), hence
 *   Δφ½ = Δφ° + (RT / 2zF) · ln(D_w / D_o).
 * For an ion starting in oil (α = o, β = w): c^w/c^o = √(D_o/D_w), i.e. again c^o/c^w = √(D_w/D_o):
 * the same Δφ½. The ratio does not invert with the starting phase — just as E½ of a reversible
 * couple is the same whether O or R is in the bulk (Bard & Faulkner eq. 5.4.22 form,
 * E½ = E°′ + (RT/nF)·ln(D_R/D_O)^½, from memory). The simulation in voltammogram.ts checks this.
 *
 * Currents are magnitudes here; the voltammogram carries the sign (positive current = positive
 * charge crossing from water to oil, the usual convention at liquid|liquid interfaces).
 */
import { FARADAY_C_PER_MOL, GAS_CONSTANT_J_PER_MOL_K, kelvin, thermalVoltageV } from "./constants";
import type { Phase } from "./ion-table";
import type { WindowSide } from "./window";

/** Reversible half-wave potential Δφ½ = Δφ° + (RT/2zF)·ln(D_w/D_o), whichever phase the ion starts in. */
export function halfWavePotentialV(input: {
  standardPotentialV: number;
  charge: number;
  diffusionAqueousCm2PerS: number;
  diffusionOrganicCm2PerS: number;
  temperatureC: number;
}): number {
  const { standardPotentialV, charge, diffusionAqueousCm2PerS, diffusionOrganicCm2PerS, temperatureC } = input;
  return standardPotentialV + (thermalVoltageV(temperatureC) / (2 * charge)) * Math.log(diffusionAqueousCm2PerS / diffusionOrganicCm2PerS);
}

/**
 * The direction an analyte's wave lies in when scanned away from where it stays put: a cation
 * in water or an anion in oil transfers towards positive Δ_o^w φ, the other two towards negative.
 * currentSign is the sign of its current under the convention above.
 */
export function transferOf(charge: number, phase: Phase): { towards: WindowSide; currentSign: 1 | -1; from: Phase; to: Phase } {
  const fromWater = phase === "aqueous";
  const towards: WindowSide = Math.sign(charge) * (fromWater ? 1 : -1) > 0 ? "positive" : "negative";
  // Positive charge moving water → oil: cation from water, or anion from oil.
  const currentSign: 1 | -1 = Math.sign(charge) * (fromWater ? 1 : -1) > 0 ? 1 : -1;
  return { towards, currentSign, from: phase, to: fromWater ? "organic" : "aqueous" };
}

/** The dimensionless forward peak of a reversible wave under planar diffusion (π^½ χ_max). */
export const RANDLES_SEVCIK_CONSTANT = 0.4463;

/**
 * Forward peak current (A, magnitude) of a reversible transfer at a large interface:
 * i_p = 0.4463 |z|F A c √(|z|F v D / RT) (Randles–Ševčík; Bard & Faulkner, 2nd ed., eq. 6.2.19),
 * with D of the phase the ion starts in.
 */
export function randlesSevcikPeakCurrentA(input: {
  charge: number;
  areaCm2: number;
  molPerL: number;
  diffusionCm2PerS: number;
  scanRateVPerS: number;
  temperatureC: number;
}): number {
  const n = Math.abs(input.charge);
  const cMolPerCm3 = input.molPerL / 1000;
  const rt = GAS_CONSTANT_J_PER_MOL_K * kelvin(input.temperatureC);
  return (
    RANDLES_SEVCIK_CONSTANT *
    n *
    FARADAY_C_PER_MOL *
    input.areaCm2 *
    cMolPerCm3 *
    Math.sqrt((n * FARADAY_C_PER_MOL * input.scanRateVPerS * input.diffusionCm2PerS) / rt)
  );
}

/**
 * Steady-state current (A, magnitude) of an inlaid micro-disc interface of radius r:
 * i_ss = 4|z|F D c r (Saito, Rev. Polarogr. 15 (1968) 177; Bard & Faulkner, 2nd ed., §5.3 — from
 * memory). For a micropipette this holds for ingress (transfer into the pipette from outside);
 * egress from inside the pipette is linear diffusion and gives a peak, not a plateau.
 */
export function microdiscSteadyStateCurrentA(input: { charge: number; radiusCm: number; molPerL: number; diffusionCm2PerS: number }): number {
  return 4 * Math.abs(input.charge) * FARADAY_C_PER_MOL * input.diffusionCm2PerS * (input.molPerL / 1000) * input.radiusCm;
}

/** Full-scale current ranges of a typical potentiostat, 1 nA … 10 mA, one per decade. */
export const CURRENT_RANGES_A: readonly number[] = Object.freeze([1e-9, 1e-8, 1e-7, 1e-6, 1e-5, 1e-4, 1e-3, 1e-2]);

/** Full scale at least this many times the expected current: the peak then sits at 5–50 % of the range. */
export const CURRENT_RANGE_HEADROOM = 2;

export const CURRENT_RANGE_RULE =
  "Current range: the smallest decade range (1 nA … 10 mA) at least twice the largest expected current, so the peak sits " +
  "between 5 % and 50 % of full scale with room for charging current and background. This is common practice, not a standard; check the first scan.";

/**
 * The suggested potentiostat range for an expected current (A, magnitude): the smallest of
 * CURRENT_RANGES_A at least CURRENT_RANGE_HEADROOM times it. Null when none is large enough.
 */
export function suggestedCurrentRangeA(expectedA: number): number | null {
  const needed = Math.abs(expectedA) * CURRENT_RANGE_HEADROOM;
  // A small relative tolerance so that a need of 1.0000000000000002e-6 A still fits the 1 µA range.
  return CURRENT_RANGES_A.find((range) => range >= needed * (1 - 1e-9)) ?? null;
}

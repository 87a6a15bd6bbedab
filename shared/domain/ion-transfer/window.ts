/**
 * The potential window of a water | organic electrolyte pair.
 *
 * Nernst equation for ion partition (activities taken as concentrations):
 *   Δ_o^w φ = Δ_o^w φ°_i + (RT / z_i F) · ln(c_i^o / c_i^w).
 * A supporting ion limits the window where this equation puts its concentration in the receiving
 * phase at the threshold c_th (default 1 × 10⁻⁴ mol/L):
 *   - ion in water (receiving phase organic): c^w = c, c^o = c_th → edge = Δφ° + (RT/zF)·ln(c_th/c);
 *   - ion in the organic phase (receiving water): c^o = c, c^w = c_th → edge = Δφ° + (RT/zF)·ln(c/c_th).
 *
 * Which end it limits follows from the same equation. c^o/c^w = exp(zF(Δφ − Δφ°)/RT):
 *   - a cation in water moves into oil as Δφ rises → limits the positive end;
 *   - an anion in water moves into oil as Δφ falls → limits the negative end;
 *   - a cation in oil moves into water as Δφ falls → limits the negative end;
 *   - an anion in oil moves into water as Δφ rises → limits the positive end.
 * In short: sign(z) × (+1 for water, −1 for oil) > 0 means the positive end. The window runs from
 * the highest negative-end edge to the lowest positive-end edge (the innermost ones).
 */
import { thermalVoltageV } from "./constants";
import type { Phase } from "./ion-table";

/** The threshold concentration at which a transfer is taken to start, mol/L. */
export const DEFAULT_THRESHOLD_MOL_PER_L = 1e-4;

export type WindowSide = "negative" | "positive";

export interface SupportingIon {
  ion: string;
  charge: number;
  standardPotentialV: number;
  molPerL: number;
  phase: Phase;
}

export interface WindowEdge extends SupportingIon {
  edgeV: number;
  side: WindowSide;
  /** True for the ion that sets its side's limit. */
  limiting: boolean;
}

export interface PotentialWindow {
  negativeLimitV: number | null;
  positiveLimitV: number | null;
  /** positiveLimitV − negativeLimitV; 0 when the edges cross; null when a side is open. */
  widthV: number | null;
  limitingNegative: string | null;
  limitingPositive: string | null;
  edges: WindowEdge[];
  /** Sentences for the cases the numbers cannot say: an open side, crossing edges. */
  notes: string[];
}

/** The end of the window an ion limits, from its charge and the phase it starts in. */
export function limitedSide(charge: number, phase: Phase): WindowSide {
  return Math.sign(charge) * (phase === "aqueous" ? 1 : -1) > 0 ? "positive" : "negative";
}

/** Δ_o^w φ at which the ion reaches c_th in the other phase (see the module note). */
export function windowEdgeV(ion: SupportingIon, temperatureC: number, thresholdMolPerL: number): number {
  const slope = thermalVoltageV(temperatureC) / ion.charge;
  const ratio = ion.phase === "aqueous" ? thresholdMolPerL / ion.molPerL : ion.molPerL / thresholdMolPerL;
  return ion.standardPotentialV + slope * Math.log(ratio);
}

export interface WindowInput {
  ions: readonly SupportingIon[];
  temperatureC: number;
  thresholdMolPerL?: number;
}

export function potentialWindow(input: WindowInput): PotentialWindow {
  const threshold = input.thresholdMolPerL ?? DEFAULT_THRESHOLD_MOL_PER_L;
  const edges: WindowEdge[] = input.ions.map((ion) => ({
    ...ion,
    edgeV: windowEdgeV(ion, input.temperatureC, threshold),
    side: limitedSide(ion.charge, ion.phase),
    limiting: false,
  }));
  let negative: WindowEdge | null = null;
  let positive: WindowEdge | null = null;
  for (const edge of edges) {
    if (edge.side === "negative" && (negative === null || edge.edgeV > negative.edgeV)) negative = edge;
    if (edge.side === "positive" && (positive === null || edge.edgeV < positive.edgeV)) positive = edge;
  }
  if (negative) negative.limiting = true;
  if (positive) positive.limiting = true;

  const notes: string[] = [];
  if (!negative) {
    notes.push(
      "No listed ion can set the negative limit: it would take an anion in the water or a cation in the organic phase. " +
        "The real limit then comes from something not listed (impurities, the solvent's own ions), so Phasebook gives no number.",
    );
  }
  if (!positive) {
    notes.push(
      "No listed ion can set the positive limit: it would take a cation in the water or an anion in the organic phase. " +
        "The real limit then comes from something not listed (impurities, the solvent's own ions), so Phasebook gives no number.",
    );
  }
  let widthV: number | null = null;
  if (negative && positive) {
    widthV = positive.edgeV - negative.edgeV;
    if (widthV <= 0) {
      notes.push(
        `The edges cross: ${positive.ion} starts to transfer at ${positive.edgeV.toFixed(3)} V, below the ${negative.edgeV.toFixed(3)} V ` +
          `where ${negative.ion} does. This pair gives no polarisable window; the interface is set by the partition of these ions.`,
      );
      widthV = 0;
    }
  }
  return {
    negativeLimitV: negative ? negative.edgeV : null,
    positiveLimitV: positive ? positive.edgeV : null,
    widthV,
    limitingNegative: negative ? negative.ion : null,
    limitingPositive: positive ? positive.ion : null,
    edges,
    notes,
  };
}

/**
 * The run-plan computations as the API answers them: POST /api/run-plans/preview and
 * POST /api/run-plans/distribution call previewRunPlan and distribution with the request parsed
 * by shared/schemas/run-plans.ts and the ion table (the built-in one, or the built-in one with
 * the manager's additions). Both are pure; unknown names and broken rules throw IonTransferError.
 */
import { STANDARD_TEMPERATURE_C } from "./constants";
import { DEFAULT_SOLVENT_ID, type IonTransferTable, type Phase } from "./ion-table";
import { GIVEN_IN_REQUEST, IonTransferError, resolveIons, resolveSolvent, type IonRef, type ResolvedIon } from "./resolve-ions";
import { DEFAULT_THRESHOLD_MOL_PER_L, potentialWindow, type WindowSide } from "./window";
import {
  CURRENT_RANGE_RULE,
  halfWavePotentialV,
  microdiscSteadyStateCurrentA,
  randlesSevcikPeakCurrentA,
  suggestedCurrentRangeA,
  transferOf,
} from "./analytes";
import { distributionEquilibrium } from "./distribution";
import { potentialScale, toAppliedV, type PotentialScale } from "./scale";
import { simulateVoltammogram, type VoltammogramPoint } from "./voltammogram";

// ---------------------------------------------------------------- inputs

export interface PlanIonInput extends IonRef {
  molPerL: number;
}

export interface PlanAnalyteInput extends IonRef {
  molPerL: number;
  phase: Phase;
}

export interface PlanReferenceInput extends IonRef {
  measuredHalfWaveV: number;
}

export interface PreviewRunPlanInput {
  solvent: string;
  temperatureC?: number;
  thresholdMolPerL?: number;
  aqueous: PlanIonInput[];
  organic: PlanIonInput[];
  analytes?: PlanAnalyteInput[];
  interfaceAreaCm2?: number;
  interfaceRadiusCm?: number;
  scanRateVPerS?: number;
  reference?: PlanReferenceInput;
}

export interface DistributionIonInput extends IonRef {
  aqueousMolPerL: number;
  organicMolPerL: number;
}

export interface DistributionRequest {
  solvent?: string;
  temperatureC?: number;
  aqueousVolumeMl: number;
  organicVolumeMl: number;
  ions: DistributionIonInput[];
}

// ---------------------------------------------------------------- outputs

export interface PlanEdge {
  ion: string;
  phase: Phase;
  charge: number;
  molPerL: number;
  standardPotentialV: number;
  source: string;
  edgeV: number;
  edgeAppliedV: number | null;
  side: WindowSide;
  limiting: boolean;
}

export interface PlanWindow {
  negativeLimitV: number | null;
  positiveLimitV: number | null;
  widthV: number | null;
  limitingNegative: string | null;
  limitingPositive: string | null;
  negativeLimitAppliedV: number | null;
  positiveLimitAppliedV: number | null;
  edges: PlanEdge[];
  notes: string[];
}

export interface PlanAnalyte {
  ion: string;
  phase: Phase;
  charge: number;
  molPerL: number;
  standardPotentialV: number;
  source: string;
  /** The values used (given, tabulated or assumed — the sources say which). */
  diffusionAqueousCm2PerS: number;
  diffusionOrganicCm2PerS: number;
  diffusionAqueousSource: string;
  diffusionOrganicSource: string;
  /** The end of the window the wave lies towards when scanned from where the ion stays put. */
  transfersTowards: WindowSide;
  halfWavePotentialV: number;
  appliedHalfWaveV: number | null;
  /** True inside, false outside, null when an open side of the window leaves it undecided. */
  insideWindow: boolean | null;
  /** Magnitudes; the voltammogram carries the sign. */
  peakCurrentA: number | null;
  steadyStateCurrentA: number | null;
  suggestedCurrentRangeA: number | null;
  voltammogram: VoltammogramPoint[] | null;
  notes: string[];
}

export interface RunPlanPreview {
  solvent: { id: string; name: string };
  temperatureC: number;
  thresholdMolPerL: number;
  interfaceAreaCm2: number | null;
  interfaceRadiusCm: number | null;
  scanRateVPerS: number | null;
  window: PlanWindow;
  analytes: PlanAnalyte[];
  scale: PotentialScale | null;
  /** The range for the largest current expected from any analyte. */
  suggestedCurrentRangeA: number | null;
  conventions: string[];
  cautions: string[];
  notes: string[];
}

export interface DistributionAnswer {
  galvaniPotentialV: number;
  ions: { ion: string; aqueousMolPerL: number; organicMolPerL: number }[];
  notes: string[];
}

// ---------------------------------------------------------------- constants of the answer

/** Stated on screen and in the API description (issue 12's conventions). */
export const RUN_PLAN_CONVENTIONS: readonly string[] = Object.freeze([
  "Galvani potential difference Δ_o^w φ = φ(water) − φ(organic); standard ion-transfer potential Δ_o^w φ°_i = ΔG°tr,i(w→o)/(z_i F) (IUPAC, Pure Appl. Chem. 76 (2004) 2147).",
  "Nernst equation for ion partition: Δ_o^w φ = Δ_o^w φ°_i + (RT/z_i F)·ln(c_i^o/c_i^w), with activities taken as concentrations (no activity coefficients, no ion pairing).",
  "Constants: CODATA 2018 / SI 2019 (F = N_A·e, R = N_A·k). Standard potentials are 25 °C values; at another temperature only RT/F changes.",
  "Currents: positive when positive charge crosses from water to oil. Peak and steady-state currents are given as magnitudes.",
  "Applied potentials: E = Δ_o^w φ + offset, with E taken in the same sense as Δ_o^w φ (water against oil).",
  CURRENT_RANGE_RULE,
]);

const SOLVENT_CAUTIONS: Readonly<Record<string, readonly string[]>> = {
  dce: [
    "1,2-Dichloroethane is highly flammable, toxic, and a suspected human carcinogen: handle it in a fume hood, with gloves suited to chlorinated solvents (check the glove maker's breakthrough data).",
    "Collect the organic phase and rinses as halogenated waste.",
  ],
  nitrobenzene: ["Nitrobenzene is toxic by skin contact and inhalation and a suspected carcinogen: handle it in a fume hood, with suitable gloves."],
};
const GENERAL_CAUTION =
  "The safety data sheet, the institution's safety office and the local fire code take precedence over anything Phasebook computes.";

/** Used when no diffusion coefficient is known for either phase (typical of small ions in water). */
export const TYPICAL_DIFFUSION_CM2_PER_S = 1e-5;
const TYPICAL_DIFFUSION_SOURCE = "assumed: typical small-ion value 1 × 10⁻⁵ cm²/s, no value given or tabulated — give a measured one";

/** Phasebook's own rule of thumb for a wave that may merge with the background current. */
export const NEAR_EDGE_V = 0.1;

// ---------------------------------------------------------------- helpers

function positiveOr(value: number | undefined, fallback: number, field: string, what: string): number {
  if (value === undefined) return fallback;
  if (!Number.isFinite(value) || value <= 0) throw new IonTransferError("invalid_number", field, `The ${what} must be above zero (got ${value}).`);
  return value;
}

function optionalPositive(value: number | undefined, field: string, what: string): number | null {
  return value === undefined ? null : positiveOr(value, 0, field, what);
}

function temperatureOf(value: number | undefined): number {
  if (value === undefined) return STANDARD_TEMPERATURE_C;
  if (!Number.isFinite(value) || value < 0 || value > 100) {
    throw new IonTransferError("invalid_number", "temperatureC", `The temperature must be between 0 and 100 °C (got ${value}).`);
  }
  return value;
}

interface DiffusionPair {
  aqueous: number;
  organic: number;
  aqueousSource: string;
  organicSource: string;
  /** True when the ratio D_w/D_o was not known and was taken as 1. */
  ratioAssumed: boolean;
}

/** Both diffusion coefficients, filling an unknown one with the other (equal) or a typical value. */
function diffusionPair(ion: ResolvedIon): DiffusionPair {
  const dw = ion.diffusionAqueousCm2PerS;
  const dorg = ion.diffusionOrganicCm2PerS;
  if (dw !== null && dorg !== null) {
    return { aqueous: dw, organic: dorg, aqueousSource: ion.diffusionAqueousSource ?? GIVEN_IN_REQUEST, organicSource: ion.diffusionOrganicSource ?? GIVEN_IN_REQUEST, ratioAssumed: false };
  }
  if (dw !== null) {
    return { aqueous: dw, organic: dw, aqueousSource: ion.diffusionAqueousSource ?? GIVEN_IN_REQUEST, organicSource: "assumed equal to the aqueous value (not known)", ratioAssumed: true };
  }
  if (dorg !== null) {
    return { aqueous: dorg, organic: dorg, aqueousSource: "assumed equal to the organic value (not known)", organicSource: ion.diffusionOrganicSource ?? GIVEN_IN_REQUEST, ratioAssumed: true };
  }
  return { aqueous: TYPICAL_DIFFUSION_CM2_PER_S, organic: TYPICAL_DIFFUSION_CM2_PER_S, aqueousSource: TYPICAL_DIFFUSION_SOURCE, organicSource: TYPICAL_DIFFUSION_SOURCE, ratioAssumed: true };
}

function volts(v: number): string {
  return `${v >= 0 ? "+" : "−"}${Math.abs(v).toFixed(3)} V`;
}

// ---------------------------------------------------------------- preview

export function previewRunPlan(input: PreviewRunPlanInput, table: IonTransferTable): RunPlanPreview {
  const solvent = resolveSolvent(table, input.solvent);
  const temperatureC = temperatureOf(input.temperatureC);
  const thresholdMolPerL = positiveOr(input.thresholdMolPerL, DEFAULT_THRESHOLD_MOL_PER_L, "thresholdMolPerL", "threshold concentration");
  const areaCm2 = optionalPositive(input.interfaceAreaCm2, "interfaceAreaCm2", "interface area");
  const radiusCm = optionalPositive(input.interfaceRadiusCm, "interfaceRadiusCm", "interface radius");
  const scanRate = optionalPositive(input.scanRateVPerS, "scanRateVPerS", "scan rate");

  const aqueous = input.aqueous ?? [];
  const organic = input.organic ?? [];
  const analytes = input.analytes ?? [];
  const refs = [
    ...aqueous.map((ref, i) => ({ ref, path: `aqueous[${i}]` })),
    ...organic.map((ref, i) => ({ ref, path: `organic[${i}]` })),
    ...analytes.map((ref, i) => ({ ref, path: `analytes[${i}]` })),
    ...(input.reference ? [{ ref: input.reference as IonRef, path: "reference" }] : []),
  ];
  // One pass so that every unknown name is reported together.
  const resolved = resolveIons(solvent, refs);
  const supportCount = aqueous.length + organic.length;
  const supporting = resolved.slice(0, supportCount).map((ion, k) => {
    const fromWater = k < aqueous.length;
    const entry = fromWater ? aqueous[k] : organic[k - aqueous.length];
    const path = fromWater ? `aqueous[${k}]` : `organic[${k - aqueous.length}]`;
    return { ion, phase: (fromWater ? "aqueous" : "organic") as Phase, molPerL: positiveOr(entry.molPerL, 0, `${path}.molPerL`, `concentration of ${ion.ion}`) };
  });
  const resolvedAnalytes = resolved.slice(supportCount, supportCount + analytes.length);
  const resolvedReference = input.reference ? resolved[resolved.length - 1] : null;

  // ---- scale first, so every potential can carry its applied value
  let scale: PotentialScale | null = null;
  const notes: string[] = [];
  if (input.reference && resolvedReference) {
    if (!Number.isFinite(input.reference.measuredHalfWaveV)) {
      throw new IonTransferError("invalid_number", "reference.measuredHalfWaveV", "The measured half-wave potential must be a finite number.");
    }
    const d = diffusionPair(resolvedReference);
    const predicted = halfWavePotentialV({
      standardPotentialV: resolvedReference.standardPotentialV,
      charge: resolvedReference.charge,
      diffusionAqueousCm2PerS: d.aqueous,
      diffusionOrganicCm2PerS: d.organic,
      temperatureC,
    });
    scale = potentialScale(resolvedReference.ion, predicted, input.reference.measuredHalfWaveV);
    notes.push(
      `Applied scale from ${resolvedReference.ion}: measured E½ ${volts(input.reference.measuredHalfWaveV)}, predicted Δφ½ ${volts(predicted)}, ` +
        `so E = Δ_o^w φ ${scale.offsetV >= 0 ? "+" : "−"} ${Math.abs(scale.offsetV).toFixed(3)} V.` +
        (d.ratioAssumed ? ` The reference ion's diffusion coefficients are not both known; they were taken as equal, so its Δφ½ = Δφ°.` : ""),
    );
  } else {
    notes.push("No reference ion measured in this cell: potentials are on the Galvani scale only (give reference.ion and measuredHalfWaveV for applied values).");
  }

  // ---- window
  const win = potentialWindow({
    ions: supporting.map((s) => ({ ion: s.ion.ion, charge: s.ion.charge, standardPotentialV: s.ion.standardPotentialV, molPerL: s.molPerL, phase: s.phase })),
    temperatureC,
    thresholdMolPerL,
  });
  const window: PlanWindow = {
    negativeLimitV: win.negativeLimitV,
    positiveLimitV: win.positiveLimitV,
    widthV: win.widthV,
    limitingNegative: win.limitingNegative,
    limitingPositive: win.limitingPositive,
    negativeLimitAppliedV: toAppliedV(win.negativeLimitV, scale),
    positiveLimitAppliedV: toAppliedV(win.positiveLimitV, scale),
    edges: win.edges.map((edge, k) => ({
      ion: edge.ion,
      phase: edge.phase,
      charge: edge.charge,
      molPerL: edge.molPerL,
      standardPotentialV: edge.standardPotentialV,
      source: supporting[k].ion.source,
      edgeV: edge.edgeV,
      edgeAppliedV: toAppliedV(edge.edgeV, scale),
      side: edge.side,
      limiting: edge.limiting,
    })),
    notes: win.notes,
  };
  if (supportCount === 0) window.notes.unshift("No supporting electrolyte listed: without one the interface cannot be polarised.");

  // ---- analytes
  const planAnalytes: PlanAnalyte[] = resolvedAnalytes.map((ion, k) => {
    const entry = analytes[k];
    const path = `analytes[${k}]`;
    const molPerL = positiveOr(entry.molPerL, 0, `${path}.molPerL`, `concentration of ${ion.ion}`);
    if (entry.phase !== "aqueous" && entry.phase !== "organic") {
      throw new IonTransferError("invalid_ion", `${path}.phase`, `Say which phase ${ion.ion} starts in: "aqueous" or "organic".`);
    }
    const analyteNotes: string[] = [];
    const d = diffusionPair(ion);
    if (d.ratioAssumed) analyteNotes.push("Diffusion coefficients not known in both phases: taken as equal, so the half-wave potential equals the standard transfer potential.");
    const halfWave = halfWavePotentialV({ standardPotentialV: ion.standardPotentialV, charge: ion.charge, diffusionAqueousCm2PerS: d.aqueous, diffusionOrganicCm2PerS: d.organic, temperatureC });
    const { towards } = transferOf(ion.charge, entry.phase);

    let insideWindow: boolean | null = null;
    const { negativeLimitV: lo, positiveLimitV: hi } = window;
    if ((lo !== null && halfWave <= lo) || (hi !== null && halfWave >= hi)) insideWindow = false;
    else if (lo !== null && hi !== null) insideWindow = true;
    if (insideWindow === false) {
      const beyond = lo !== null && halfWave <= lo ? `below the negative limit (${volts(lo)}, ${window.limitingNegative})` : `above the positive limit (${volts(hi as number)}, ${window.limitingPositive})`;
      analyteNotes.push(`Transfers at ${volts(halfWave)}, ${beyond}: the supporting electrolyte's own transfer will hide it.`);
    } else if (insideWindow === null) {
      analyteNotes.push("One side of the window is open (no ion sets it), so Phasebook cannot say whether this transfer falls inside.");
    } else if ((lo !== null && halfWave - lo < NEAR_EDGE_V) || (hi !== null && hi - halfWave < NEAR_EDGE_V)) {
      analyteNotes.push(`Within ${NEAR_EDGE_V * 1000} mV of an edge of the window (Phasebook's rule of thumb): the wave may merge with the background.`);
    }

    const dStart = entry.phase === "aqueous" ? d.aqueous : d.organic;
    const peakCurrentA =
      areaCm2 !== null && scanRate !== null
        ? randlesSevcikPeakCurrentA({ charge: ion.charge, areaCm2, molPerL, diffusionCm2PerS: dStart, scanRateVPerS: scanRate, temperatureC })
        : null;
    if (areaCm2 !== null && scanRate === null) analyteNotes.push("Give a scan rate for the peak current at the large interface.");
    const steadyStateCurrentA = radiusCm !== null ? microdiscSteadyStateCurrentA({ charge: ion.charge, radiusCm, molPerL, diffusionCm2PerS: dStart }) : null;
    if (radiusCm !== null && !d.ratioAssumed && d.aqueous !== d.organic) {
      analyteNotes.push("At a micro-interface under steady state the diffusion term of the half-wave potential is (RT/zF)·ln(D_w/D_o), twice the planar one given here.");
    }
    const expected = Math.max(peakCurrentA ?? 0, steadyStateCurrentA ?? 0);
    const range = expected > 0 ? suggestedCurrentRangeA(expected) : null;
    if (expected > 0 && range === null) analyteNotes.push("The expected current needs more than the 10 mA range: lower the concentration or the area.");

    const voltammogram =
      areaCm2 !== null && scanRate !== null
        ? simulateVoltammogram({
            charge: ion.charge,
            phase: entry.phase,
            standardPotentialV: ion.standardPotentialV,
            molPerL,
            diffusionAqueousCm2PerS: d.aqueous,
            diffusionOrganicCm2PerS: d.organic,
            areaCm2,
            scanRateVPerS: scanRate,
            temperatureC,
          })
        : null;

    return {
      ion: ion.ion,
      phase: entry.phase,
      charge: ion.charge,
      molPerL,
      standardPotentialV: ion.standardPotentialV,
      source: ion.source,
      diffusionAqueousCm2PerS: d.aqueous,
      diffusionOrganicCm2PerS: d.organic,
      diffusionAqueousSource: d.aqueousSource,
      diffusionOrganicSource: d.organicSource,
      transfersTowards: towards,
      halfWavePotentialV: halfWave,
      appliedHalfWaveV: toAppliedV(halfWave, scale),
      insideWindow,
      peakCurrentA,
      steadyStateCurrentA,
      suggestedCurrentRangeA: range,
      voltammogram,
      notes: analyteNotes,
    };
  });

  const largest = Math.max(0, ...planAnalytes.map((a) => Math.max(a.peakCurrentA ?? 0, a.steadyStateCurrentA ?? 0)));
  if (analytes.length > 0 && areaCm2 === null && radiusCm === null) {
    notes.push("Give the interface area (large interface) or radius (micro-interface) for currents and a current range.");
  }
  if (temperatureC !== STANDARD_TEMPERATURE_C) {
    notes.push(`Standard transfer potentials are 25 °C values; at ${temperatureC} °C only RT/F has been changed.`);
  }
  if (resolved.some((ion) => !ion.custom && ion.source.includes("from memory"))) {
    notes.push("Some standard potentials are marked 'from memory' in their source: check them against the original before relying on the result.");
  }

  return {
    solvent: { id: solvent.id, name: solvent.name },
    temperatureC,
    thresholdMolPerL,
    interfaceAreaCm2: areaCm2,
    interfaceRadiusCm: radiusCm,
    scanRateVPerS: scanRate,
    window,
    analytes: planAnalytes,
    scale,
    suggestedCurrentRangeA: largest > 0 ? suggestedCurrentRangeA(largest) : null,
    conventions: [...RUN_PLAN_CONVENTIONS],
    cautions: [...(SOLVENT_CAUTIONS[solvent.id] ?? []), GENERAL_CAUTION],
    notes,
  };
}

// ---------------------------------------------------------------- distribution

export function distribution(input: DistributionRequest, table: IonTransferTable): DistributionAnswer {
  const refs = input.ions.map((ref, i) => ({ ref, path: `ions[${i}]` }));
  const allCustom = input.ions.every((ion) => ion.charge !== undefined || ion.standardPotentialV !== undefined);
  const solvent = resolveSolvent(table, input.solvent);
  const resolved = resolveIons(solvent, refs);
  const result = distributionEquilibrium({
    ions: resolved.map((ion, i) => ({
      ion: ion.ion,
      charge: ion.charge,
      standardPotentialV: ion.standardPotentialV,
      aqueousMolPerL: input.ions[i].aqueousMolPerL,
      organicMolPerL: input.ions[i].organicMolPerL,
    })),
    aqueousVolumeMl: input.aqueousVolumeMl,
    organicVolumeMl: input.organicVolumeMl,
    temperatureC: temperatureOf(input.temperatureC),
  });
  const notes = [...result.notes];
  if ((input.solvent === undefined || input.solvent.trim() === "") && !allCustom) {
    notes.unshift(`No solvent named: the table's values for water | ${solvent.name} (${DEFAULT_SOLVENT_ID}) were used.`);
  }
  notes.push("Activities taken as concentrations; ion pairing neglected.");
  return { galvaniPotentialV: result.galvaniPotentialV, ions: result.ions, notes };
}

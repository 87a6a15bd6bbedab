/**
 * A simulated cyclic voltammogram of a reversible ion transfer across a large (planar)
 * liquid|liquid interface.
 *
 * Model: the ion starts in phase 1 at c* (phase 2 free of it); planar semi-infinite diffusion in
 * both phases (Fick's second law, D₁ and D₂); at the interface the Nernst partition
 * c₂(0)/c₁(0) = θ(t) and continuity of flux D₁∂c₁/∂x = −D₂∂c₂/∂x (x measured into each phase).
 * This is the ion-transfer analogue of a reversible O/R couple, so its forward peak obeys the
 * Randles–Ševčík equation with D₁ (Bard & Faulkner, 2nd ed., §6.2) — the tests hold it to that.
 *
 * Numerics: dimensionless time τ = σt with σ = |z|Fv/RT and distance x√(σ/D₁); fully implicit
 * (backward Euler) finite volumes on a grid that expands geometrically away from the interface in
 * each phase, with the two phases and the interface node solved together as one tridiagonal
 * system (Thomas algorithm) every step. The interface node's control volume spans half a cell
 * on each side, which conserves the analyte exactly. Step and grid sizes were chosen so the
 * forward peak is within 0.5 % of Randles–Ševčík in a few milliseconds.
 */
import { FARADAY_C_PER_MOL, thermalVoltageV } from "./constants";
import type { Phase } from "./ion-table";
import { halfWavePotentialV, transferOf } from "./analytes";
import { IonTransferError } from "./resolve-ions";

export interface VoltammogramPoint {
  /** Δ_o^w φ in volts. */
  potentialV: number;
  /** Current in amperes; positive when positive charge crosses from water to oil. */
  currentA: number;
}

export interface VoltammogramInput {
  charge: number;
  /** The phase the ion starts in. */
  phase: Phase;
  standardPotentialV: number;
  molPerL: number;
  diffusionAqueousCm2PerS: number;
  diffusionOrganicCm2PerS: number;
  areaCm2: number;
  scanRateVPerS: number;
  temperatureC: number;
  /** Where the scan starts; default 0.3 V before Δφ½, on the side where the ion stays put. */
  startV?: number;
  /** Where the scan turns back; default 0.3 V past Δφ½. */
  switchV?: number;
  /** Potential step per time step, V (default 0.5 mV). */
  stepV?: number;
  /** Most points returned (the simulation runs finer and is thinned evenly). */
  maxPoints?: number;
}

/** How far either side of Δφ½ the default scan reaches. */
export const DEFAULT_SCAN_HALF_SPAN_V = 0.3;

/** Solves a tridiagonal system in place (a: below, b: diagonal, c: above, d: right side → solution). */
function thomas(a: Float64Array, b: Float64Array, c: Float64Array, d: Float64Array, n: number): void {
  for (let k = 1; k < n; k++) {
    const m = a[k] / b[k - 1];
    b[k] -= m * c[k - 1];
    d[k] -= m * d[k - 1];
  }
  d[n - 1] /= b[n - 1];
  for (let k = n - 2; k >= 0; k--) d[k] = (d[k] - c[k] * d[k + 1]) / b[k];
}

/** Node positions from 0 outwards: first step h0, each next step ω times longer, until past length. */
function expandingGrid(h0: number, omega: number, length: number): Float64Array {
  const xs = [0];
  let h = h0;
  while (xs[xs.length - 1] < length) {
    xs.push(xs[xs.length - 1] + h);
    h *= omega;
  }
  return Float64Array.from(xs);
}

function requirePositive(input: VoltammogramInput, field: keyof VoltammogramInput): void {
  const value = input[field];
  if (value === undefined) return;
  if (typeof value !== "number" || !Number.isFinite(value) || value <= 0) {
    throw new IonTransferError("invalid_number", field, `The simulation needs ${field} above zero (got ${String(value)}).`);
  }
}

/**
 * The voltammogram's points, from the start potential to the switching potential and back.
 * Start where the ion stays put (the defaults do): the model begins with phase 2 free of it.
 */
export function simulateVoltammogram(input: VoltammogramInput): VoltammogramPoint[] {
  const { charge, phase, molPerL, areaCm2, scanRateVPerS, temperatureC } = input;
  for (const field of ["molPerL", "areaCm2", "scanRateVPerS", "diffusionAqueousCm2PerS", "diffusionOrganicCm2PerS", "stepV", "maxPoints"] as const) {
    requirePositive(input, field);
  }
  if (!Number.isInteger(charge) || charge === 0) throw new IonTransferError("invalid_ion", "charge", "The charge must be a whole number other than zero.");
  const fromWater = phase === "aqueous";
  const d1 = fromWater ? input.diffusionAqueousCm2PerS : input.diffusionOrganicCm2PerS;
  const d2 = fromWater ? input.diffusionOrganicCm2PerS : input.diffusionAqueousCm2PerS;
  const { towards, currentSign } = transferOf(charge, phase);
  const direction = towards === "positive" ? 1 : -1;
  const halfWave = halfWavePotentialV({
    standardPotentialV: input.standardPotentialV,
    charge,
    diffusionAqueousCm2PerS: input.diffusionAqueousCm2PerS,
    diffusionOrganicCm2PerS: input.diffusionOrganicCm2PerS,
    temperatureC,
  });
  const startV = input.startV ?? halfWave - direction * DEFAULT_SCAN_HALF_SPAN_V;
  const switchV = input.switchV ?? halfWave + direction * DEFAULT_SCAN_HALF_SPAN_V;
  const stepV = input.stepV ?? 5e-4;
  const maxPoints = input.maxPoints ?? 801;

  const vt = thermalVoltageV(temperatureC);
  const n = Math.abs(charge);
  const sweep = switchV - startV;
  if (!Number.isFinite(sweep) || sweep === 0) throw new IonTransferError("invalid_number", "switchV", "The switching potential must differ from the start potential.");
  if (maxPoints < 2) throw new IonTransferError("invalid_number", "maxPoints", "Ask for at least two points.");
  const stepsOut = Math.max(1, Math.ceil(Math.abs(sweep) / stepV));
  const dE = sweep / stepsOut;
  const totalSteps = 2 * stepsOut;
  const dTau = (n * Math.abs(dE)) / vt;
  const tauTotal = dTau * totalSteps;
  const gamma = d2 / d1;

  // Grids in units of √(D₁/σ); phase 2 diffuses √γ times further in the same time.
  const h0 = 0.02;
  const omega = 1.08;
  const x1 = expandingGrid(h0, omega, 6 * Math.sqrt(tauTotal) + 1);
  const x2 = expandingGrid(h0 * Math.sqrt(gamma), omega, 6 * Math.sqrt(gamma * tauTotal) + 1);
  const N = x1.length - 1; // x1[N]: bulk of phase 1, c = 1
  const M = x2.length - 1; // x2[M]: bulk of phase 2, c = 0
  const c1 = new Float64Array(N + 1).fill(1);
  const c2 = new Float64Array(M + 1).fill(0);
  const size = M - 1 + 1 + (N - 1); // phase-2 interior, interface, phase-1 interior
  const a = new Float64Array(size);
  const b = new Float64Array(size);
  const c = new Float64Array(size);
  const d = new Float64Array(size);
  const iface = M - 1; // row of the interface unknown; phase-2 node j sits at row M-1-j, phase-1 node i at row iface+i

  // θ = c₂(0)/c₁(0): c^o/c^w = exp(zf(Δφ − Δφ°)) from water; its inverse from oil.
  const partition = (potential: number) => Math.exp((fromWater ? 1 : -1) * (charge / vt) * (potential - input.standardPotentialV));
  const currentScale = currentSign * n * FARADAY_C_PER_MOL * areaCm2 * (molPerL / 1000) * Math.sqrt(d1 * (n * scanRateVPerS) / vt);

  const points: VoltammogramPoint[] = [{ potentialV: startV, currentA: 0 }];
  const every = Math.max(1, Math.ceil(totalSteps / (maxPoints - 1)));
  const h1 = x1[1];
  const h2 = x2[1];

  for (let k = 1; k <= totalSteps; k++) {
    const potential = k <= stepsOut ? startV + k * dE : switchV - (k - stepsOut) * dE;
    const theta = partition(potential);

    for (let j = 1; j <= M - 1; j++) {
      const row = M - 1 - j;
      const hIn = x2[j] - x2[j - 1];
      const hOut = x2[j + 1] - x2[j];
      const vol = 0.5 * (hIn + hOut);
      a[row] = -gamma / hOut; // node j+1 (further out) sits one row before
      c[row] = j === 1 ? (-gamma / hIn) * theta : -gamma / hIn; // node j-1, or the interface (c₂(0) = θU)
      b[row] = vol / dTau + gamma / hOut + gamma / hIn;
      d[row] = (vol / dTau) * c2[j]; // c₂ in the bulk is 0
    }
    a[iface] = -gamma / h2;
    c[iface] = -1 / h1;
    b[iface] = h1 / (2 * dTau) + (h2 * theta) / (2 * dTau) + 1 / h1 + (gamma * theta) / h2;
    d[iface] = (h1 / (2 * dTau)) * c1[0] + (h2 / (2 * dTau)) * c2[0];
    for (let i = 1; i <= N - 1; i++) {
      const row = iface + i;
      const hIn = x1[i] - x1[i - 1];
      const hOut = x1[i + 1] - x1[i];
      const vol = 0.5 * (hIn + hOut);
      a[row] = -1 / hIn;
      c[row] = -1 / hOut;
      b[row] = vol / dTau + 1 / hIn + 1 / hOut;
      d[row] = (vol / dTau) * c1[i] + (i === N - 1 ? 1 / hOut : 0);
    }
    a[0] = 0;
    c[size - 1] = 0;
    thomas(a, b, c, d, size);

    const oldInterface = c1[0];
    for (let j = 1; j <= M - 1; j++) c2[j] = d[M - 1 - j];
    c1[0] = d[iface];
    c2[0] = theta * c1[0];
    for (let i = 1; i <= N - 1; i++) c1[i] = d[iface + i];
    // Flux leaving phase 1: through the first face, less what the interface half-cell lost.
    const psi = (c1[1] - c1[0]) / h1 - (h1 / 2) * ((c1[0] - oldInterface) / dTau);
    if (k % every === 0 || k === totalSteps) points.push({ potentialV: potential, currentA: currentScale * psi });
  }
  return points;
}

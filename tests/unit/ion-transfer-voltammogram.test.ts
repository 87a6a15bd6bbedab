import { describe, expect, it } from "vitest";
import { simulateVoltammogram, type VoltammogramInput, type VoltammogramPoint } from "@shared/domain/ion-transfer";

// Independent constants for the expected values: SI 2019 exact N_A, e, k (SI Brochure, 9th ed.).
const F = 6.02214076e23 * 1.602176634e-19;
const R = 6.02214076e23 * 1.380649e-23;
const rtOverF = (celsius: number) => (R * (celsius + 273.15)) / F;

// Randles–Ševčík, Bard & Faulkner, Electrochemical Methods, 2nd ed., eq. 6.2.19.
function randlesSevcik(charge: number, areaCm2: number, molPerL: number, d: number, v: number, celsius: number): number {
  const n = Math.abs(charge);
  return 0.4463 * n * F * areaCm2 * (molPerL / 1000) * Math.sqrt((n * F * v * d) / (R * (celsius + 273.15)));
}

/** The largest current of the forward half (before the switching potential) and of the reverse half. */
function peaks(points: VoltammogramPoint[]): { forward: VoltammogramPoint; reverse: VoltammogramPoint } {
  const half = Math.floor(points.length / 2);
  const byMagnitude = (list: VoltammogramPoint[], sign: number) => list.reduce((best, p) => (sign * p.currentA > sign * best.currentA ? p : best));
  const forwardSign = Math.sign(points.slice(0, half).reduce((s, p) => s + p.currentA, 0));
  return { forward: byMagnitude(points.slice(0, half), forwardSign), reverse: byMagnitude(points.slice(half), -forwardSign) };
}

const base: VoltammogramInput = {
  charge: 1,
  phase: "aqueous",
  standardPotentialV: 0.019,
  molPerL: 1e-3,
  diffusionAqueousCm2PerS: 8.7e-6,
  diffusionOrganicCm2PerS: 8.7e-6,
  areaCm2: 1.5,
  scanRateVPerS: 0.05,
  temperatureC: 25,
};

describe("simulateVoltammogram (reversible ion transfer, planar diffusion in both phases)", () => {
  it.each([
    ["a cation from water", { charge: 1, phase: "aqueous" }],
    ["an anion from water", { charge: -1, phase: "aqueous" }],
    ["a cation from oil", { charge: 1, phase: "organic" }],
    ["an anion from oil", { charge: -1, phase: "organic" }],
    ["a divalent cation from water", { charge: 2, phase: "aqueous" }],
    ["a cation with D_o = D_w/3", { diffusionOrganicCm2PerS: 2.9e-6 }],
    ["a cation from oil with D_o = 3·D_w, at 40 °C and 1 V/s", { phase: "organic", diffusionOrganicCm2PerS: 2.6e-5, temperatureC: 40, scanRateVPerS: 1 }],
  ] as const)("peaks within 2 per cent of Randles–Ševčík (the issue's bound; 0.5 per cent here) for %s", (_label, override) => {
    const input = { ...base, ...override };
    const dStart = input.phase === "aqueous" ? input.diffusionAqueousCm2PerS : input.diffusionOrganicCm2PerS;
    const expected = randlesSevcik(input.charge, input.areaCm2, input.molPerL, dStart, input.scanRateVPerS, input.temperatureC);
    const { forward } = peaks(simulateVoltammogram(input));
    expect(Math.abs(Math.abs(forward.currentA) / expected - 1)).toBeLessThan(0.005);
  });

  // Forward peak of a reversible wave at E½ ± 1.109 RT/(nF) (Bard & Faulkner, 2nd ed., §6.2.2, from
  // memory), with Δφ½ = Δφ° + (RT/2zF)·ln(D_w/D_o) — the same Δφ½ whichever phase the ion starts in.
  it.each([
    [1, "aqueous", 1e-5, 4e-6, 1],
    [1, "organic", 1e-5, 4e-6, -1],
    [-1, "aqueous", 1e-5, 4e-6, -1],
    [-1, "organic", 2e-5, 1e-5, 1],
    [2, "aqueous", 1e-5, 1e-5, 1],
  ] as const)("puts the forward peak of z = %s from the %s phase (D_w %s, D_o %s) 1.109 RT/zF past Δφ½", (charge, phase, dw, dorg, direction) => {
    const points = simulateVoltammogram({ ...base, charge, phase, diffusionAqueousCm2PerS: dw, diffusionOrganicCm2PerS: dorg });
    const halfWave = 0.019 + (rtOverF(25) / (2 * charge)) * Math.log(dw / dorg);
    const expected = halfWave + (direction * 1.109 * rtOverF(25)) / Math.abs(charge);
    expect(Math.abs(peaks(points).forward.potentialV - expected)).toBeLessThan(0.001);
  });

  it("gives positive current when a cation crosses from water to oil and negative current when it comes back", () => {
    const { forward, reverse } = peaks(simulateVoltammogram(base));
    expect(forward.currentA).toBeGreaterThan(0);
    expect(reverse.currentA).toBeLessThan(0);
    expect(forward.potentialV).toBeGreaterThan(reverse.potentialV);
  });

  it("gives negative current for an anion crossing from water to oil", () => {
    expect(peaks(simulateVoltammogram({ ...base, charge: -1 })).forward.currentA).toBeLessThan(0);
  });

  // A reversible wave switched well past E½ has a peak separation close to 2.22 RT/nF ≈ 57 mV at
  // 25 °C (Bard & Faulkner, 2nd ed., §6.5, from memory; 57–59 mV depending on the switching point).
  it("separates the forward and reverse peaks by about 57–60 mV for z = 1", () => {
    const { forward, reverse } = peaks(simulateVoltammogram(base));
    const separation = (forward.potentialV - reverse.potentialV) * 1000;
    expect(separation).toBeGreaterThan(56);
    expect(separation).toBeLessThan(60);
  });

  it("starts and ends at the start potential and returns at most maxPoints points", () => {
    const points = simulateVoltammogram({ ...base, maxPoints: 301 });
    expect(points.length).toBeLessThanOrEqual(301);
    expect(points[0].potentialV).toBeCloseTo(0.019 - 0.3, 9);
    expect(points[points.length - 1].potentialV).toBeCloseTo(0.019 - 0.3, 9);
    expect(Math.max(...points.map((p) => p.potentialV))).toBeCloseTo(0.019 + 0.3, 3);
  });

  it("runs a typical scan in well under 50 ms", () => {
    const times: number[] = [];
    for (let k = 0; k < 5; k++) {
      const start = performance.now();
      simulateVoltammogram(base);
      times.push(performance.now() - start);
    }
    expect(Math.min(...times)).toBeLessThan(50);
  });
});

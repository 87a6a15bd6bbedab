import { describe, expect, it } from "vitest";
import {
  CURRENT_RANGES_A,
  halfWavePotentialV,
  microdiscSteadyStateCurrentA,
  potentialScale,
  randlesSevcikPeakCurrentA,
  suggestedCurrentRangeA,
  toAppliedV,
  toGalvaniV,
  transferOf,
} from "@shared/domain/ion-transfer";

// Independent constants for the expected values: SI 2019 exact N_A, e, k (SI Brochure, 9th ed.).
const F = 6.02214076e23 * 1.602176634e-19;
const R = 6.02214076e23 * 1.380649e-23;

describe("halfWavePotentialV", () => {
  // Reversible wave, planar diffusion on both sides: Δφ½ = Δφ° + (RT/2zF)·ln(D_w/D_o), the
  // ion-transfer form of E½ = E°′ + (RT/nF)·ln(D_R/D_O)^½ (Bard & Faulkner, 2nd ed., §5.4, from memory).
  it("equals Δφ° when the diffusion coefficients are equal", () => {
    expect(halfWavePotentialV({ standardPotentialV: 0.16, charge: 1, diffusionAqueousCm2PerS: 1e-5, diffusionOrganicCm2PerS: 1e-5, temperatureC: 25 })).toBe(0.16);
  });

  it("shifts a cation by (RT/2F)·ln(D_w/D_o): +11.77 mV for D_w/D_o = 2.5 at 25 °C", () => {
    const expected = 0.1 + ((R * 298.15) / (2 * F)) * Math.log(2.5);
    const got = halfWavePotentialV({ standardPotentialV: 0.1, charge: 1, diffusionAqueousCm2PerS: 1e-5, diffusionOrganicCm2PerS: 4e-6, temperatureC: 25 });
    expect(got).toBeCloseTo(expected, 12);
    expect((got - 0.1) * 1000).toBeCloseTo(11.77, 2);
  });

  it("shifts an anion the other way, and a divalent ion by half as much", () => {
    const base = { standardPotentialV: 0, diffusionAqueousCm2PerS: 2e-5, diffusionOrganicCm2PerS: 1e-5, temperatureC: 37 };
    const shift = ((R * 310.15) / (2 * F)) * Math.log(2);
    expect(halfWavePotentialV({ ...base, charge: -1 })).toBeCloseTo(-shift, 12);
    expect(halfWavePotentialV({ ...base, charge: 2 })).toBeCloseTo(shift / 2, 12);
  });
});

describe("transferOf", () => {
  it("sends a cation in water and an anion in oil towards positive Δφ, with currents of opposite sign", () => {
    expect(transferOf(1, "aqueous")).toMatchObject({ towards: "positive", currentSign: 1, to: "organic" });
    expect(transferOf(-1, "organic")).toMatchObject({ towards: "positive", currentSign: 1, to: "aqueous" });
    expect(transferOf(-1, "aqueous")).toMatchObject({ towards: "negative", currentSign: -1 });
    expect(transferOf(1, "organic")).toMatchObject({ towards: "negative", currentSign: -1 });
  });
});

describe("randlesSevcikPeakCurrentA", () => {
  // Randles–Ševčík, Bard & Faulkner, Electrochemical Methods, 2nd ed., eq. 6.2.19:
  // i_p = 0.4463 nFAC (nFvD/RT)^½, A in cm², C in mol/cm³, D in cm²/s, v in V/s.
  it("gives the equation's value for TEA+-like transfer: 1 mM, 1.5 cm², 50 mV/s, D = 8.7e-6 cm²/s", () => {
    const expected = 0.4463 * F * 1.5 * 1e-6 * Math.sqrt((F * 0.05 * 8.7e-6) / (R * 298.15));
    const got = randlesSevcikPeakCurrentA({ charge: 1, areaCm2: 1.5, molPerL: 1e-3, diffusionCm2PerS: 8.7e-6, scanRateVPerS: 0.05, temperatureC: 25 });
    expect(got / expected).toBeCloseTo(1, 9);
  });

  // Same equation in its 25 °C numerical form, eq. 6.2.20: i_p = (2.69 × 10⁵) n^{3/2} A D^½ C v^½.
  it("agrees within 1 % with the 25 °C form 2.69 × 10⁵ n^{3/2} A D^½ C v^½, for z = ±1 and ±2", () => {
    for (const charge of [1, -1, 2, -2]) {
      const n = Math.abs(charge);
      const expected = 2.69e5 * n ** 1.5 * 0.5 * Math.sqrt(1e-5) * 2e-6 * Math.sqrt(0.1);
      const got = randlesSevcikPeakCurrentA({ charge, areaCm2: 0.5, molPerL: 2e-3, diffusionCm2PerS: 1e-5, scanRateVPerS: 0.1, temperatureC: 25 });
      expect(Math.abs(got / expected - 1)).toBeLessThan(0.01);
    }
  });

  it("grows with the square root of the scan rate and of the absolute temperature's inverse", () => {
    const base = { charge: 1, areaCm2: 1, molPerL: 1e-3, diffusionCm2PerS: 1e-5, temperatureC: 25 };
    const slow = randlesSevcikPeakCurrentA({ ...base, scanRateVPerS: 0.01 });
    const fast = randlesSevcikPeakCurrentA({ ...base, scanRateVPerS: 0.09 });
    expect(fast / slow).toBeCloseTo(3, 9);
    const warm = randlesSevcikPeakCurrentA({ ...base, scanRateVPerS: 0.01, temperatureC: 45 });
    expect(warm / slow).toBeCloseTo(Math.sqrt(298.15 / 318.15), 9);
  });
});

describe("microdiscSteadyStateCurrentA", () => {
  // Inlaid disc, i_ss = 4nFDCr (Saito 1968; Bard & Faulkner, 2nd ed., §5.3 — from memory).
  it("gives 4.82 nA for 1 mM, D = 1e-5 cm²/s and a 12.5 µm radius", () => {
    const expected = 4 * F * 1e-5 * 1e-6 * 12.5e-4;
    const got = microdiscSteadyStateCurrentA({ charge: 1, radiusCm: 12.5e-4, molPerL: 1e-3, diffusionCm2PerS: 1e-5 });
    expect(got / expected).toBeCloseTo(1, 9);
    expect(got * 1e9).toBeCloseTo(4.824, 3);
  });

  it("doubles for a divalent ion and gives a magnitude for an anion", () => {
    const one = microdiscSteadyStateCurrentA({ charge: 1, radiusCm: 1e-3, molPerL: 1e-3, diffusionCm2PerS: 1e-5 });
    expect(microdiscSteadyStateCurrentA({ charge: -2, radiusCm: 1e-3, molPerL: 1e-3, diffusionCm2PerS: 1e-5 })).toBeCloseTo(2 * one, 18);
  });
});

describe("suggestedCurrentRangeA", () => {
  it("offers the decade ranges 1 nA … 10 mA", () => {
    expect(CURRENT_RANGES_A).toEqual([1e-9, 1e-8, 1e-7, 1e-6, 1e-5, 1e-4, 1e-3, 1e-2]);
  });

  // Rule stated as common practice: the smallest decade range at least twice the expected current.
  it.each([
    [3.2e-6, 1e-5],
    [5e-6, 1e-5],
    [5.1e-6, 1e-4],
    [9.9e-6, 1e-4],
    [4.8e-9, 1e-8],
    [2e-10, 1e-9],
    [0.005, 0.01],
  ])("sets %s A on the %s A range", (expected, range) => {
    expect(suggestedCurrentRangeA(expected)).toBe(range);
  });

  it("answers null when even 10 mA has no room for it", () => {
    expect(suggestedCurrentRangeA(0.0051)).toBeNull();
  });
});

describe("potentialScale", () => {
  it("takes the offset from a measured reference half-wave and converts both ways", () => {
    // TMA+ predicted at +0.160 V, measured at +0.410 V on the potentiostat: offset +0.250 V.
    const scale = potentialScale("TMA+", 0.16, 0.41);
    expect(scale.offsetV).toBeCloseTo(0.25, 12);
    expect(toAppliedV(-0.2, scale)).toBeCloseTo(0.05, 12);
    expect(toGalvaniV(0.05, scale)).toBeCloseTo(-0.2, 12);
    expect(toAppliedV(-0.2, null)).toBeNull();
    expect(toAppliedV(null, scale)).toBeNull();
  });
});

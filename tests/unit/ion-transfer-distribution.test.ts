import { describe, expect, it } from "vitest";
import { IonTransferError, distributionEquilibrium, type PartitioningIon } from "@shared/domain/ion-transfer";

// Independent constants for the expected values: SI 2019 exact N_A, e, k (SI Brochure, 9th ed.).
const F = 6.02214076e23 * 1.602176634e-19;
const R = 6.02214076e23 * 1.380649e-23;
const fOf = (celsius: number) => F / (R * (celsius + 273.15));

function errorOf(run: () => unknown): IonTransferError {
  try {
    run();
  } catch (error) {
    if (error instanceof IonTransferError) return error;
    throw error;
  }
  throw new Error("expected an IonTransferError");
}

/** Checks Nernst partition for every ion, mass balance, and electroneutrality of each phase. */
function expectEquilibrium(ions: PartitioningIon[], vw: number, vo: number, celsius: number) {
  const result = distributionEquilibrium({ ions, aqueousVolumeMl: vw, organicVolumeMl: vo, temperatureC: celsius });
  const f = fOf(celsius);
  let chargeW = 0;
  let chargeO = 0;
  let scale = 0;
  ions.forEach((ion, i) => {
    const out = result.ions[i];
    // Nernst equation for ion partition: ln(c_o/c_w) = zF(Δφ − Δφ°)/RT
    const lnRatio = ion.charge * f * (result.galvaniPotentialV - ion.standardPotentialV);
    expect(Math.log(out.organicMolPerL / out.aqueousMolPerL), ion.ion).toBeCloseTo(lnRatio, 6);
    // mass balance
    const before = ion.aqueousMolPerL * vw + ion.organicMolPerL * vo;
    const after = out.aqueousMolPerL * vw + out.organicMolPerL * vo;
    expect(after / before, ion.ion).toBeCloseTo(1, 10);
    chargeW += ion.charge * out.aqueousMolPerL;
    chargeO += ion.charge * out.organicMolPerL;
    scale += Math.abs(ion.charge) * (out.aqueousMolPerL + out.organicMolPerL);
  });
  expect(Math.abs(chargeW) / scale).toBeLessThan(1e-9);
  expect(Math.abs(chargeO) / scale).toBeLessThan(1e-9);
  return result;
}

describe("distributionEquilibrium: one salt", () => {
  // Closed form (Hung, J. Electroanal. Chem. 115 (1980) 159; from memory, re-derived here): with one
  // salt only, electroneutrality of both phases forces c_o/c_w to be equal for cation and anion,
  // so z₊(Δφ − Δφ°₊) = z₋(Δφ − Δφ°₋) and Δφ = (z₊Δφ°₊ − z₋Δφ°₋)/(z₊ − z₋), for any volumes.
  const salt = (cw: number, co: number): PartitioningIon[] => [
    { ion: "C+", charge: 1, standardPotentialV: 0.3, aqueousMolPerL: cw, organicMolPerL: co },
    { ion: "A-", charge: -1, standardPotentialV: -0.1, aqueousMolPerL: cw, organicMolPerL: co },
  ];

  it("sits at the mean of the two standard potentials for a 1:1 salt in equal volumes: +0.100 V", () => {
    const result = expectEquilibrium(salt(0.01, 0), 10, 10, 25);
    expect(result.galvaniPotentialV).toBeCloseTo(0.1, 9);
    // c_o/c_w = exp(f(0.1 − 0.3)) for both ions; c_w = n/(V_w + K V_o).
    const k = Math.exp(fOf(25) * (0.1 - 0.3));
    expect(result.ions[0].aqueousMolPerL).toBeCloseTo((0.01 * 10) / (10 + k * 10), 12);
    expect(result.ions[0].organicMolPerL).toBeCloseTo((k * 0.01 * 10) / (10 + k * 10), 12);
  });

  it("stays there whatever the volumes and whichever phase the salt starts in", () => {
    expect(expectEquilibrium(salt(0.01, 0), 50, 2, 25).galvaniPotentialV).toBeCloseTo(0.1, 9);
    expect(expectEquilibrium(salt(0, 0.002), 1, 30, 25).galvaniPotentialV).toBeCloseTo(0.1, 9);
    expect(expectEquilibrium(salt(1e-6, 1e-6), 3, 7, 60).galvaniPotentialV).toBeCloseTo(0.1, 9);
  });

  it("weights the standard potentials by charge for a 2:1 salt: (2·Δφ°₊ + Δφ°₋)/3", () => {
    const ions: PartitioningIon[] = [
      { ion: "D2+", charge: 2, standardPotentialV: 0.4, aqueousMolPerL: 0.005, organicMolPerL: 0 },
      { ion: "A-", charge: -1, standardPotentialV: -0.2, aqueousMolPerL: 0.01, organicMolPerL: 0 },
    ];
    expect(expectEquilibrium(ions, 10, 5, 25).galvaniPotentialV).toBeCloseTo((2 * 0.4 - 0.2) / 3, 9);
  });

  it("stays right when the salt is so hydrophilic that almost none of it reaches the oil", () => {
    const ions: PartitioningIon[] = [
      { ion: "C+", charge: 1, standardPotentialV: 1.5, aqueousMolPerL: 0.1, organicMolPerL: 0 },
      { ion: "A-", charge: -1, standardPotentialV: -1.3, aqueousMolPerL: 0.1, organicMolPerL: 0 },
    ];
    const result = distributionEquilibrium({ ions, aqueousVolumeMl: 10, organicVolumeMl: 10, temperatureC: 25 });
    expect(result.galvaniPotentialV).toBeCloseTo(0.1, 9);
    expect(result.ions[0].organicMolPerL).toBeGreaterThan(0);
  });
});

describe("distributionEquilibrium: a common ion", () => {
  // The reference interface of a four-electrode cell: Q+ in both phases, its counter-ions W- held
  // in the water and O- held in the oil (Δφ° of ∓2 V). Electroneutrality fixes c_w(Q+) = c(W-)
  // and c_o(Q+) = c(O-), so the Nernst equation gives Δφ = Δφ°(Q+) + (RT/F)·ln(c_o/c_w).
  const cell = (cw: number, co: number): PartitioningIon[] => [
    { ion: "Q+", charge: 1, standardPotentialV: -0.2, aqueousMolPerL: cw, organicMolPerL: co },
    { ion: "W-", charge: -1, standardPotentialV: -2, aqueousMolPerL: cw, organicMolPerL: 0 },
    { ion: "O-", charge: -1, standardPotentialV: 2, aqueousMolPerL: 0, organicMolPerL: co },
  ];

  it.each([25, 37])("sets Δφ = Δφ°(Q+) + (RT/F)·ln(c_o/c_w) at %d °C", (celsius) => {
    const result = expectEquilibrium(cell(0.01, 0.001), 5, 5, celsius);
    expect(result.galvaniPotentialV).toBeCloseTo(-0.2 + Math.log(0.1) / fOf(celsius), 9);
    expect(result.ions[0].aqueousMolPerL).toBeCloseTo(0.01, 12);
    expect(result.ions[0].organicMolPerL).toBeCloseTo(0.001, 12);
  });

  it("moves by (RT/F)·ln 10 = 59.16 mV at 25 °C when the aqueous common-ion salt is ten times stronger", () => {
    const a = expectEquilibrium(cell(0.001, 0.001), 5, 5, 25).galvaniPotentialV;
    const b = expectEquilibrium(cell(0.01, 0.001), 5, 5, 25).galvaniPotentialV;
    expect((a - b) * 1000).toBeCloseTo(59.16, 2);
  });

  // Two partitioning cations M+ and N+ with fixed counter-ions: with u = exp(fΔφ) and
  // k_i = exp(−fΔφ°_i), water neutrality n_M/(V_w + k_M u V_o) + n_N/(V_w + k_N u V_o) = a is a
  // quadratic in u (derived here; mass balance and the Nernst equation as above).
  it("solves the exchange of two cations between phases of different volume (closed-form quadratic)", () => {
    const vw = 10;
    const vo = 4;
    const ions: PartitioningIon[] = [
      { ion: "M+", charge: 1, standardPotentialV: 0.1, aqueousMolPerL: 0.005, organicMolPerL: 0 },
      { ion: "N+", charge: 1, standardPotentialV: -0.05, aqueousMolPerL: 0, organicMolPerL: 0.002 },
      { ion: "W-", charge: -1, standardPotentialV: -2, aqueousMolPerL: 0.005, organicMolPerL: 0 },
      { ion: "O-", charge: -1, standardPotentialV: 2, aqueousMolPerL: 0, organicMolPerL: 0.002 },
    ];
    const f = fOf(25);
    const nM = 0.005 * vw;
    const nN = 0.002 * vo;
    const a = 0.005; // c_w of W-, fixed
    const kM = Math.exp(-f * 0.1);
    const kN = Math.exp(-f * -0.05);
    const qa = a * kM * kN * vo * vo;
    const qb = a * vw * vo * (kM + kN) - vo * (nM * kN + nN * kM);
    const qc = a * vw * vw - vw * (nM + nN);
    const u = (-qb + Math.sqrt(qb * qb - 4 * qa * qc)) / (2 * qa);
    const result = expectEquilibrium(ions, vw, vo, 25);
    expect(result.galvaniPotentialV).toBeCloseTo(Math.log(u) / f, 9);
  });

  it("balances a mixture of five ions of charges −2 … +2 (Nernst, mass balance, neutrality)", () => {
    const ions: PartitioningIon[] = [
      { ion: "Li+", charge: 1, standardPotentialV: 0.58, aqueousMolPerL: 0.01, organicMolPerL: 0 },
      { ion: "Cl-", charge: -1, standardPotentialV: -0.53, aqueousMolPerL: 0.01, organicMolPerL: 0 },
      { ion: "TEA+", charge: 1, standardPotentialV: 0.019, aqueousMolPerL: 0.002, organicMolPerL: 0.001 },
      { ion: "S2-", charge: -2, standardPotentialV: -0.3, aqueousMolPerL: 0.001, organicMolPerL: 0 },
      { ion: "E2+", charge: 2, standardPotentialV: -0.1, aqueousMolPerL: 0, organicMolPerL: 0.0005 },
      { ion: "TPB-", charge: -1, standardPotentialV: 0.364, aqueousMolPerL: 0, organicMolPerL: 0.002 },
    ];
    expectEquilibrium(ions, 7, 3, 20);
  });
});

describe("distributionEquilibrium: bad input", () => {
  const ions: PartitioningIon[] = [
    { ion: "C+", charge: 1, standardPotentialV: 0.3, aqueousMolPerL: 0.01, organicMolPerL: 0 },
    { ion: "A-", charge: -1, standardPotentialV: -0.1, aqueousMolPerL: 0.01, organicMolPerL: 0 },
  ];

  it("refuses a set of ions with a net charge", () => {
    const error = errorOf(() =>
      distributionEquilibrium({ ions: [ions[0], { ...ions[1], aqueousMolPerL: 0.009 }], aqueousVolumeMl: 1, organicVolumeMl: 1, temperatureC: 25 }),
    );
    expect(error.code).toBe("not_electroneutral");
  });

  it.each([
    [{ aqueousVolumeMl: 0 }, "aqueousVolumeMl"],
    [{ organicVolumeMl: -1 }, "organicVolumeMl"],
  ])("refuses %j, naming %s", (override, field) => {
    const error = errorOf(() => distributionEquilibrium({ ions, aqueousVolumeMl: 1, organicVolumeMl: 1, temperatureC: 25, ...override }));
    expect(error).toMatchObject({ code: "invalid_number", field });
  });

  it("refuses a negative concentration and an ion absent from both phases", () => {
    const negative = errorOf(() =>
      distributionEquilibrium({ ions: [{ ...ions[0], organicMolPerL: -1 }, ions[1]], aqueousVolumeMl: 1, organicVolumeMl: 1, temperatureC: 25 }),
    );
    expect(negative.field).toBe("ions[0].organicMolPerL");
    const absent = errorOf(() =>
      distributionEquilibrium({ ions: [...ions, { ion: "B-", charge: -1, standardPotentialV: 0, aqueousMolPerL: 0, organicMolPerL: 0 }], aqueousVolumeMl: 1, organicVolumeMl: 1, temperatureC: 25 }),
    );
    expect(absent.field).toBe("ions[2]");
  });
});

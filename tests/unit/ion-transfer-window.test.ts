import { describe, expect, it } from "vitest";
import {
  STANDARD_ION_TRANSFER_TABLE,
  findIon,
  limitedSide,
  potentialWindow,
  resolveSolvent,
  type SupportingIon,
} from "@shared/domain/ion-transfer";

// Independent constants for the expected values: SI 2019 exact N_A, e, k (SI Brochure, 9th ed.).
const F = 6.02214076e23 * 1.602176634e-19;
const R = 6.02214076e23 * 1.380649e-23;
const rtOverF = (celsius: number) => (R * (celsius + 273.15)) / F;

// Nernst equation for ion partition, Δφ = Δφ° + (RT/zF)·ln(c_o/c_w) (IUPAC, Pure Appl. Chem. 76
// (2004) 2147), solved for the potential where the receiving phase reaches c_th:
// an ion in water: c_w = c, c_o = c_th; an ion in oil: c_o = c, c_w = c_th.
function expectedEdge(ion: SupportingIon, celsius: number, threshold: number): number {
  const ratio = ion.phase === "aqueous" ? threshold / ion.molPerL : ion.molPerL / threshold;
  return ion.standardPotentialV + (rtOverF(celsius) / ion.charge) * Math.log(ratio);
}

// A custom 1:1 pair in each phase: a hydrophilic salt in water, a hydrophobic one in oil.
const aqueousSalt = (c: number): SupportingIon[] => [
  { ion: "M+", charge: 1, standardPotentialV: 0.55, molPerL: c, phase: "aqueous" },
  { ion: "A-", charge: -1, standardPotentialV: -0.5, molPerL: c, phase: "aqueous" },
];
const organicSalt = (c: number): SupportingIon[] => [
  { ion: "Q+", charge: 1, standardPotentialV: -0.45, molPerL: c, phase: "organic" },
  { ion: "B-", charge: -1, standardPotentialV: 0.6, molPerL: c, phase: "organic" },
];

describe("limitedSide", () => {
  // From the Nernst equation: c_o/c_w = exp(zF(Δφ − Δφ°)/RT) rises with Δφ for a cation.
  it("sends a cation in water and an anion in oil to the positive end, the other two to the negative end", () => {
    expect(limitedSide(1, "aqueous")).toBe("positive");
    expect(limitedSide(-1, "organic")).toBe("positive");
    expect(limitedSide(-1, "aqueous")).toBe("negative");
    expect(limitedSide(1, "organic")).toBe("negative");
    expect(limitedSide(2, "aqueous")).toBe("positive");
  });
});

describe("potentialWindow with custom ions (Nernst equation for ion partition)", () => {
  it("puts each edge where the Nernst equation reaches the threshold, and takes the innermost on each side", () => {
    const ions = [...aqueousSalt(0.01), ...organicSalt(0.005)];
    const win = potentialWindow({ ions, temperatureC: 25 });
    for (const edge of win.edges) expect(edge.edgeV, edge.ion).toBeCloseTo(expectedEdge(edge, 25, 1e-4), 9);
    // M+ in water: 0.55 + 0.025693·ln(0.01) = 0.4317 V; B- in oil: 0.6 − 0.025693·ln(50) = 0.4995 V → M+.
    // A- in water: −0.5 − 0.025693·ln(0.01) = −0.3817 V; Q+ in oil: −0.45 + 0.025693·ln(50) = −0.3495 V → Q+.
    expect(win.limitingPositive).toBe("M+");
    expect(win.limitingNegative).toBe("Q+");
    expect(win.positiveLimitV).toBeCloseTo(expectedEdge(ions[0], 25, 1e-4), 9);
    expect(win.negativeLimitV).toBeCloseTo(expectedEdge(ions[2], 25, 1e-4), 9);
    expect(win.widthV).toBeCloseTo((win.positiveLimitV as number) - (win.negativeLimitV as number), 12);
    expect(win.notes).toEqual([]);
  });

  it("moves the edges of a tenfold more concentrated aqueous salt inward by (RT/F)·ln 10 = 59.16 mV at 25 °C", () => {
    const dilute = potentialWindow({ ions: [...aqueousSalt(0.001), ...organicSalt(0.01)], temperatureC: 25 });
    const strong = potentialWindow({ ions: [...aqueousSalt(0.01), ...organicSalt(0.01)], temperatureC: 25 });
    const slope = rtOverF(25) * Math.log(10);
    expect(slope * 1000).toBeCloseTo(59.16, 2);
    const edge = (w: typeof dilute, ion: string) => w.edges.find((e) => e.ion === ion)?.edgeV as number;
    expect(edge(dilute, "M+") - edge(strong, "M+")).toBeCloseTo(slope, 9);
    expect(edge(strong, "A-") - edge(dilute, "A-")).toBeCloseTo(slope, 9);
  });

  it("moves an organic ion's edge outward by 59.16 mV when it is ten times more concentrated", () => {
    const dilute = potentialWindow({ ions: organicSalt(0.001), temperatureC: 25 });
    const strong = potentialWindow({ ions: organicSalt(0.01), temperatureC: 25 });
    expect((strong.positiveLimitV as number) - (dilute.positiveLimitV as number)).toBeCloseTo(-rtOverF(25) * Math.log(10), 9);
    expect((strong.negativeLimitV as number) - (dilute.negativeLimitV as number)).toBeCloseTo(rtOverF(25) * Math.log(10), 9);
  });

  it.each([5, 45])("follows RT/zF at %d °C, with the 25 °C standard potentials", (celsius) => {
    const ions = [...aqueousSalt(0.02), ...organicSalt(0.002)];
    const win = potentialWindow({ ions, temperatureC: celsius, thresholdMolPerL: 1e-5 });
    for (const edge of win.edges) expect(edge.edgeV, edge.ion).toBeCloseTo(expectedEdge(edge, celsius, 1e-5), 9);
  });

  it("moves a divalent ion's edge by half as much per decade", () => {
    const ion: SupportingIon = { ion: "D2+", charge: 2, standardPotentialV: 0.7, molPerL: 0.01, phase: "aqueous" };
    const a = potentialWindow({ ions: [ion], temperatureC: 25 }).positiveLimitV as number;
    const b = potentialWindow({ ions: [{ ...ion, molPerL: 0.1 }], temperatureC: 25 }).positiveLimitV as number;
    expect(a - b).toBeCloseTo((rtOverF(25) / 2) * Math.log(10), 9);
  });

  it("answers a side no ion can set with null and a sentence, not a number", () => {
    const win = potentialWindow({
      ions: [{ ion: "M+", charge: 1, standardPotentialV: 0.55, molPerL: 0.01, phase: "aqueous" }],
      temperatureC: 25,
    });
    expect(win.negativeLimitV).toBeNull();
    expect(win.limitingNegative).toBeNull();
    expect(win.widthV).toBeNull();
    expect(win.positiveLimitV).not.toBeNull();
    expect(win.notes.join(" ")).toMatch(/negative limit/);
  });

  it("says so when the edges cross (a common ion in both phases fixes the interface instead)", () => {
    const win = potentialWindow({
      ions: [
        { ion: "Q+", charge: 1, standardPotentialV: -0.2, molPerL: 0.01, phase: "aqueous" },
        { ion: "Q+", charge: 1, standardPotentialV: -0.2, molPerL: 0.01, phase: "organic" },
      ],
      temperatureC: 25,
    });
    expect(win.widthV).toBe(0);
    expect(win.notes.join(" ")).toMatch(/cross/);
  });
});

describe("potentialWindow with the table's ions in water | 1,2-dichloroethane", () => {
  const dce = resolveSolvent(STANDARD_ION_TRANSFER_TABLE, "dce");
  const tab = (name: string, molPerL: number, phase: "aqueous" | "organic"): SupportingIon => {
    const entry = findIon(dce, name);
    if (!entry) throw new Error(`${name} missing from the table`);
    return { ion: entry.ion, charge: entry.charge, standardPotentialV: entry.standardPotential.value, molPerL, phase };
  };
  const licl = [tab("Li+", 0.01, "aqueous"), tab("Cl-", 0.01, "aqueous")];

  // Which ion sets each edge, derived from the equation: with 10 mM salts and c_th = 0.1 mM every
  // edge sits (RT/F)·ln 100 ≈ 118 mV inside its ion's Δφ°. BTPPA+ and TB(C6F5)4- are so
  // hydrophobic (Δφ° ≈ ∓0.7 V) that Li+ (≈ +0.58 V) and Cl- (≈ −0.53 V) transfer first:
  // practitioners call this window "limited by the aqueous LiCl".
  it("limits LiCl | BTPPA TB(C6F5)4 by Li+ at the positive end and Cl- at the negative end", () => {
    const win = potentialWindow({ ions: [...licl, tab("BTPPA+", 0.01, "organic"), tab("TB(C6F5)4-", 0.01, "organic")], temperatureC: 25 });
    expect(win.limitingPositive).toBe("Li+");
    expect(win.limitingNegative).toBe("Cl-");
    expect(win.positiveLimitV).toBeCloseTo(expectedEdge(licl[0], 25, 1e-4), 9);
    expect(win.negativeLimitV).toBeCloseTo(expectedEdge(licl[1], 25, 1e-4), 9);
  });

  // TBA+ (≈ −0.23 V) and TPB- (≈ +0.36 V) are far less hydrophobic: they leave the oil long before
  // Li+ or Cl- cross, so the organic salt sets both ends — the classic narrow TBATPB window.
  it("limits LiCl | TBA TPB by TBA+ and TPB-, and is clearly narrower", () => {
    const wide = potentialWindow({ ions: [...licl, tab("BTPPA+", 0.01, "organic"), tab("TB(C6F5)4-", 0.01, "organic")], temperatureC: 25 });
    const narrow = potentialWindow({ ions: [...licl, tab("TBA+", 0.01, "organic"), tab("TPB-", 0.01, "organic")], temperatureC: 25 });
    expect(narrow.limitingNegative).toBe("TBA+");
    expect(narrow.limitingPositive).toBe("TPB-");
    expect((wide.widthV as number) - (narrow.widthV as number)).toBeGreaterThan(0.3);
    expect(wide.widthV as number).toBeGreaterThan(0.7);
  });
});

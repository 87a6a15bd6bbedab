/**
 * Storage by fire-code liquid class. Class thresholds are NFPA 30's (closed-cup flash point,
 * °F): IA FP < 73 and BP < 100; IB FP < 73 and BP ≥ 100; IC 73 ≤ FP < 100; II 100 ≤ FP < 140;
 * IIIA 140 ≤ FP < 200; IIIB FP ≥ 200. °F = °C × 9/5 + 32. The test liquids below are
 * hypothetical except 1,2-dichloroethane (flash point 13 °C closed cup and density 1.2569 g/mL,
 * Merck Index; boiling point 83.5 °C, IARC Monographs vol. 71) and diethyl ether (flash point
 * −45 °C, boiling point 34.6 °C, from memory). Each class is worked out beside its chemical.
 */
import { describe, expect, it } from "vitest";
import {
  LITRES_PER_US_GALLON,
  type StorageChemical,
  type StorageContainer,
  type StorageLocation,
  containerNanolitres,
  limitVolumeToLitres,
  litresToUsGallons,
  receiptVolumeCheck,
  storageByLiquidClass,
  storageClass,
  usGallonsToLitres,
} from "@shared/domain/storage";
import { storageLimitInput } from "@shared/schemas/storage";

const chem = (id: number, flashPointC: number | null, boilingPointC: number | null, densityGPerMl: number | null, extra: Partial<StorageChemical> = {}): StorageChemical => ({
  id,
  flashPointC,
  boilingPointC,
  densityGPerMl,
  molarMass: null,
  ...extra,
});

const CHEMICALS = {
  // FP 13 °C = 55.4 °F < 73, BP 83.5 °C = 182.3 °F ≥ 100 → IB
  dce: chem(1, 13, 83.5, 1.2569),
  // FP −45 °C = −49 °F < 73, BP 34.6 °C = 94.28 °F < 100 → IA
  ether: chem(2, -45, 34.6, 0.713),
  // FP 30 °C = 86 °F: 73 ≤ 86 < 100 → IC
  ic: chem(3, 30, 120, 0.9),
  // FP 50 °C = 122 °F: 100 ≤ 122 < 140 → II
  ii: chem(4, 50, 180, 0.9),
  // FP 80 °C = 176 °F: 140 ≤ 176 < 200 → IIIA
  iiia: chem(5, 80, 210, 1.2),
  // FP 100 °C = 212 °F ≥ 200 → IIIB
  iiib: chem(6, 100, 300, 1.1),
  // A solid with a flash point is no liquid: not counted.
  solid: chem(7, 79, 218, null, { state: "solid" }),
  // The issue's case: a category 2 liquid (FP 13 °C, BP 80 °C → IB) with no density on its record.
  noDensity: chem(8, 13, 80, null),
  // Not flammable or combustible (no flash point).
  water: chem(9, null, 100, 1),
};

// building 1 › room 2 › approved cabinet 3, shelf 4
const BASE_LOCATIONS: StorageLocation[] = [
  { id: 1, parentId: null, name: "Building" },
  { id: 2, parentId: 1, name: "Room 214" },
  { id: 3, parentId: 2, name: "Cabinet UB-1", type: "flammable_cabinet" },
  { id: 4, parentId: 2, name: "Shelf" },
];

let nextId = 1;
const box = (locationId: number | null, quantity: number, unit: string, c: StorageChemical, status?: string): StorageContainer => ({
  id: nextId++,
  locationId,
  quantity,
  unit,
  chemicalId: c.id,
  ...(status ? { status } : {}),
});

const CONTAINERS: StorageContainer[] = [
  box(3, 2500, "mL", CHEMICALS.dce), // 2.5 L IB
  box(3, 1256.9, "g", CHEMICALS.dce), // 1256.9 g ÷ 1.2569 g/mL = 1 L IB
  box(3, 0.5, "L", CHEMICALS.ether), // 0.5 L IA
  box(4, 1, "L", CHEMICALS.ic), // 1 L IC
  box(4, 4000, "mL", CHEMICALS.ii), // 4 L II
  box(4, 2000, "g", CHEMICALS.noDensity), // IB, volume unknown
  box(2, 1.2, "kg", CHEMICALS.iiia), // 1200 g ÷ 1.2 = 1000 mL IIIA
  box(2, 500, "mL", CHEMICALS.iiib), // 0.5 L IIIB
  box(2, 100, "g", CHEMICALS.solid), // not a liquid
  box(2, 5, "L", CHEMICALS.water), // not flammable
  box(2, 9, "L", CHEMICALS.dce, "empty"), // empty: holds nothing
  box(null, 9, "L", CHEMICALS.dce), // no place: counts nowhere
];

function run(limitsByLocation: Record<number, StorageLocation["limits"]> = {}, containers = CONTAINERS) {
  const locations = BASE_LOCATIONS.map((l) => ({ ...l, limits: limitsByLocation[l.id] ?? [] }));
  return storageByLiquidClass({ locations, containers, chemicals: Object.values(CHEMICALS) });
}

describe("storageClass (NFPA 30 thresholds)", () => {
  it("classes each test liquid as worked out beside it", () => {
    expect(storageClass(CHEMICALS.dce)).toBe("IB");
    expect(storageClass(CHEMICALS.ether)).toBe("IA");
    expect(storageClass(CHEMICALS.ic)).toBe("IC");
    expect(storageClass(CHEMICALS.ii)).toBe("II");
    expect(storageClass(CHEMICALS.iiia)).toBe("IIIA");
    expect(storageClass(CHEMICALS.iiib)).toBe("IIIB");
    expect(storageClass(CHEMICALS.solid)).toBeNull();
    expect(storageClass(CHEMICALS.water)).toBeNull();
    expect(storageClass({ ...CHEMICALS.dce, state: "gas" })).toBeNull();
  });
});

describe("storageByLiquidClass", () => {
  it("adds each class's litres for a location and everything inside it (hand totals beside each)", () => {
    const r = run();
    // Cabinet 3: IB 2.5 + 1 = 3.5 L; IA 0.5 L.
    expect(r.get(3)!.litresByClass).toEqual({ IA: 0.5, IB: 3.5, IC: 0, II: 0, IIIA: 0, IIIB: 0 });
    // Shelf 4: IC 1 L, II 4 L; the 2000 g without density is not in any total.
    expect(r.get(4)!.litresByClass).toEqual({ IA: 0, IB: 0, IC: 1, II: 4, IIIA: 0, IIIB: 0 });
    // Room 2 = cabinet + shelf + its own IIIA 1 L and IIIB 0.5 L; building 1 the same.
    const room = { IA: 0.5, IB: 3.5, IC: 1, II: 4, IIIA: 1, IIIB: 0.5 };
    expect(r.get(2)!.litresByClass).toEqual(room);
    expect(r.get(1)!.litresByClass).toEqual(room);
  });

  it("never drops a liquid of unknown volume: the shelf, the room and the building each report it", () => {
    const r = run();
    const unknownId = CONTAINERS[5].id;
    for (const id of [4, 2, 1]) {
      expect(r.get(id)!.unknownVolumeContainers).toBe(1);
      expect(r.get(id)!.unknownVolumeByClass.IB).toBe(1);
      expect(r.get(id)!.unknownVolumeContainerIds).toEqual([unknownId]);
    }
    expect(r.get(3)!.unknownVolumeContainers).toBe(0);
    // Containers here or inside, liquid or not; the empty one and the one with no place are out.
    expect(r.get(2)!.containerCount).toBe(10);
  });

  it("finds each limit within, over or cannot_confirm, and never 'within' when unknown volumes could pass it", () => {
    const r = run({
      2: [
        { id: 1, classes: ["IA"], maxLitres: 0.5, includesCabinets: true }, // 0.5 L exactly at the limit, no unknown IA → within
        { id: 2, classes: ["IA", "IB", "IC"], maxLitres: 10, includesCabinets: true }, // 5 L known + unknown IB → cannot_confirm
        { id: 3, classes: ["IA", "IB", "IC"], maxLitres: 4, includesCabinets: true }, // 5 L > 4 → over, whatever the unknown holds
        { id: 4, classes: ["IA", "IB", "IC"], maxLitres: 1.5, includesCabinets: false }, // cabinet left out: IC 1 L + unknown IB → cannot_confirm
        { id: 5, classes: ["II", "IIIA"], maxLitres: 5, includesCabinets: false }, // 4 + 1 = 5 L at the limit → within
      ],
      // A limit on the cabinet itself counts its own contents even without "includes cabinets": 4 L > 3.5.
      3: [{ id: 6, classes: ["IA", "IB", "IC"], maxLitres: 3.5, includesCabinets: false }],
    });
    const room = r.get(2)!.limits;
    expect(room.map((l) => [l.id, l.totalLitres, l.finding])).toEqual([
      [1, 0.5, "within"],
      [2, 5, "cannot_confirm"],
      [3, 5, "over"],
      [4, 1, "cannot_confirm"],
      [5, 5, "within"],
    ]);
    expect(room[1].unknownVolumeContainers).toBe(1);
    expect(r.get(3)!.limits[0]).toMatchObject({ id: 6, totalLitres: 4, finding: "over" });
  });

  it("leaves an unknown container out of a limit once it is in an approved cabinet the limit excludes", () => {
    const inCabinet = [box(3, 2000, "g", CHEMICALS.noDensity)];
    const r = run({ 2: [{ id: 1, classes: ["IB"], maxLitres: 1, includesCabinets: false }, { id: 2, classes: ["IB"], maxLitres: 1, includesCabinets: true }] }, inCabinet);
    expect(r.get(2)!.limits.map((l) => l.finding)).toEqual(["within", "cannot_confirm"]);
  });

  it("compares exactly: 0.1 L + 0.2 L against a 0.3 L limit is within (floats add to 0.30000000000000004)", () => {
    const r = run({ 4: [{ id: 1, classes: ["IC"], maxLitres: 0.3, includesCabinets: true }] }, [box(4, 0.1, "L", CHEMICALS.ic), box(4, 0.2, "L", CHEMICALS.ic)]);
    expect(r.get(4)!.limits[0]).toMatchObject({ totalLitres: 0.3, finding: "within" });
    const over = run({ 4: [{ id: 1, classes: ["IC"], maxLitres: 0.3, includesCabinets: true }] }, [box(4, 0.1, "L", CHEMICALS.ic), box(4, 200.001, "mL", CHEMICALS.ic)]);
    expect(over.get(4)!.limits[0].finding).toBe("over");
  });

  it("survives a cycle in the location tree", () => {
    const locations = [{ id: 1, parentId: 2 }, { id: 2, parentId: 1 }];
    const r = storageByLiquidClass({ locations, containers: [box(1, 1, "L", CHEMICALS.dce)], chemicals: [CHEMICALS.dce] });
    expect(r.get(1)!.litresByClass.IB).toBe(1);
    expect(r.get(2)!.litresByClass.IB).toBe(1);
  });

  it("reads an amount of substance as a volume only with both molar mass and density", () => {
    expect(containerNanolitres({ quantity: 1, unit: "mol" }, { densityGPerMl: 1.2569, molarMass: null })).toBeNull();
    // 1 mol × 98.95 g/mol ÷ 1.2569 g/mL = 78.725435… mL (IUPAC/CIAAW 2021 molar mass; Merck Index density)
    expect(Number(containerNanolitres({ quantity: 1, unit: "mol" }, { densityGPerMl: 1.2569, molarMass: 98.95 }))).toBeCloseTo((98.95 / 1.2569) * 1e6, 0);
  });
});

describe("US gallons (NIST Handbook 44, Appendix C: 1 US gal = 231 in³ = 3.785411784 L exactly)", () => {
  it("converts exactly both ways", () => {
    expect(LITRES_PER_US_GALLON).toBe("3.785411784");
    expect(usGallonsToLitres(1)).toBe(3.785411784);
    // 20 gal × 3.785411784 = 75.70823568 L; 60 gal (OSHA 29 CFR 1910.106 cabinet) = 227.12470704 L
    expect(usGallonsToLitres(20)).toBe(75.70823568);
    expect(usGallonsToLitres(60)).toBe(227.12470704);
    expect(litresToUsGallons(75.70823568)).toBe(20);
    expect(limitVolumeToLitres(120, "US gal")).toBe(454.24941408); // IFC class IB example, 120 gal
    expect(limitVolumeToLitres(10, "L")).toBe(10);
  });
});

describe("receiptVolumeCheck", () => {
  it("says a flammable liquid received by mass without a density leaves its volume unknown, and why", () => {
    const r = receiptVolumeCheck("g", { ...CHEMICALS.noDensity, name: "Test solvent" });
    expect(r.volumeUnknown).toBe(true);
    expect(r.nfpaClass).toBe("IB");
    expect(r.missing).toEqual(["densityGPerMl"]);
    expect(r.message).toMatch(/Test solvent is a Class IB flammable liquid/);
    expect(r.message).toMatch(/density/);
    expect(r.message).toMatch(/by volume/);
  });

  it("asks for the molar mass too when received by amount of substance", () => {
    expect(receiptVolumeCheck("mol", CHEMICALS.noDensity).missing).toEqual(["densityGPerMl", "molarMassGPerMol"]);
    expect(receiptVolumeCheck("mmol", { ...CHEMICALS.dce, molarMass: null }).missing).toEqual(["molarMassGPerMol"]);
  });

  it("has nothing to ask for a volume, a known density, a solid or a non-flammable chemical", () => {
    expect(receiptVolumeCheck("mL", CHEMICALS.noDensity).volumeUnknown).toBe(false);
    expect(receiptVolumeCheck("g", CHEMICALS.dce).volumeUnknown).toBe(false);
    expect(receiptVolumeCheck("g", CHEMICALS.solid).volumeUnknown).toBe(false);
    expect(receiptVolumeCheck("kg", { ...CHEMICALS.water, densityGPerMl: null }).volumeUnknown).toBe(false);
    // Class IIIB is a combustible liquid: it counts, so it asks too.
    expect(receiptVolumeCheck("kg", { ...CHEMICALS.iiib, densityGPerMl: null }).volumeUnknown).toBe(true);
  });
});

describe("storageLimitInput", () => {
  const ok = { classes: ["IA", "IB", "IC"], maxVolume: 20, unit: "US gal", includesCabinets: false };
  const paths = (input: unknown) => {
    const r = storageLimitInput.safeParse(input);
    return r.success ? [] : r.error.issues.map((i) => i.path.join("."));
  };

  it("accepts a limit on a group of classes in US gallons", () => {
    expect(storageLimitInput.parse(ok)).toEqual({ ...ok, note: "" });
  });

  it("names the field for an unknown class, an empty or repeated list, a bad volume or unit", () => {
    expect(paths({ ...ok, classes: ["IA", "IV"] })).toEqual(["classes.1"]);
    expect(paths({ ...ok, classes: [] })).toEqual(["classes"]);
    expect(paths({ ...ok, classes: ["IB", "IB"] })).toEqual(["classes"]);
    expect(paths({ ...ok, maxVolume: -5 })).toEqual(["maxVolume"]);
    expect(paths({ ...ok, maxVolume: 0 })).toEqual(["maxVolume"]);
    expect(paths({ ...ok, maxVolume: "20" })).toEqual(["maxVolume"]);
    expect(paths({ ...ok, unit: "gal" })).toEqual(["unit"]);
    expect(paths({ ...ok, includesCabinets: undefined })).toEqual(["includesCabinets"]);
  });

  it("says what is wrong in words", () => {
    const r = storageLimitInput.safeParse({ ...ok, unit: "gallons" });
    expect(r.success).toBe(false);
    expect(r.error!.issues[0].message).toBe('Give the volume\'s unit as "L" or "US gal"');
  });
});

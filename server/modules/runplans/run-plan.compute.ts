/**
 * A saved plan's numbers: the supporting electrolytes as ions (from the chemicals' `ions`, or a
 * salt of the ion table split into its ions), the window and analytes (previewRunPlan), what to
 * weigh for each phase from the cell's fill volumes (the solution planner, purity included), where
 * in the Stockroom it can come from, and the halogenated waste the run leaves.
 */
import type { DataSource } from "typeorm";
import { isHalogenated } from "@shared/domain/chemistry";
import { planSolution } from "@shared/domain/solutions";
import { UnitError } from "@shared/domain/units";
import { exactAmountInContainerUnit, exactAmountToNumber } from "@shared/domain/exact-amounts";
import { IonTransferError, previewRunPlan, resolveSolvent, saltIonConcentrations, type Phase, type PlanIonInput, type RunPlanPreview } from "@shared/domain/ion-transfer";
import type { RunPlanParsed, StockLineDto, WeighLineDto } from "@shared/schemas/run-plan-records";
import type { Chemical, Instrument } from "../../entities";
import type { AuthUser } from "../../middleware/auth";
import { containerPolicy } from "../stockroom";
import { loadIonTable, solventCas, type LoadedTable } from "./ion-table.queries";
import { chemicalByCas, chemicalsById, instrumentById, stockContainers, wasteContainers } from "./run-plan.queries";

export interface PlanElectrolyte {
  phase: Phase;
  label: string;
  chemicalId: number | null;
  molPerL: number;
  ions: { ion: string; molPerL: number }[];
}

export interface ComputedPlan {
  solvent: { id: string; name: string };
  electrolytes: PlanElectrolyte[];
  preview: RunPlanPreview;
  cell: Instrument | null;
  volumes: { aqueousMl: number | null; organicMl: number | null };
  weighing: WeighLineDto[];
  halogenated: boolean;
  solventChemical: Chemical | null;
}

const g = (n: number) => Number(n.toPrecision(4));

/** The ions of each electrolyte; throws IonTransferError naming the request's field. */
function electrolytesOf(input: RunPlanParsed, loaded: LoadedTable, chemicals: Map<number, Chemical>, solventId: string): PlanElectrolyte[] {
  const solvent = resolveSolvent(loaded.table, solventId);
  const out: PlanElectrolyte[] = [];
  for (const phase of ["aqueous", "organic"] as const) {
    input[phase].forEach((e, i) => {
      const field = `${phase}[${i}]`;
      if (e.chemicalId !== undefined) {
        const chem = chemicals.get(e.chemicalId);
        if (!chem) throw new IonTransferError("unknown_salt", `${field}.chemicalId`, `There is no chemical ${e.chemicalId} in the Stockroom.`);
        const ions = chem.ions ? (JSON.parse(chem.ions) as { ion: string; count: number }[]) : null;
        if (!ions) {
          throw new IonTransferError(
            "unknown_salt",
            `${field}.chemicalId`,
            `${chem.name} has no ions on record, so Phasebook cannot plan with it: the manager or the safety officer adds them on its page (e.g. Li+, Cl-).`,
          );
        }
        out.push({ phase, label: chem.name, chemicalId: chem.id, molPerL: e.molPerL, ions: ions.map((x) => ({ ion: x.ion, molPerL: x.count * e.molPerL })) });
      } else {
        const salt = e.salt as string;
        out.push({ phase, label: salt, chemicalId: null, molPerL: e.molPerL, ions: saltIonConcentrations(solvent, salt, e.molPerL, `${field}.salt`) });
      }
    });
  }
  return out;
}

/** The same ion from two electrolytes of one phase adds up. */
function phaseIons(electrolytes: PlanElectrolyte[], phase: Phase): PlanIonInput[] {
  const sums = new Map<string, number>();
  for (const e of electrolytes) if (e.phase === phase) for (const i of e.ions) sums.set(i.ion, (sums.get(i.ion) ?? 0) + i.molPerL);
  return [...sums].map(([ion, molPerL]) => ({ ion, molPerL }));
}

/** Computes a plan's chemistry and what to weigh. Throws IonTransferError for names the table does not know. */
export function computePlan(conn: DataSource, input: RunPlanParsed, loaded = loadIonTable(conn)): ComputedPlan {
  const solvent = resolveSolvent(loaded.table, input.solvent);
  const chemicalIds = [...input.aqueous, ...input.organic].flatMap((e) => (e.chemicalId === undefined ? [] : [e.chemicalId]));
  const chemicals = chemicalsById(conn, chemicalIds);
  const electrolytes = electrolytesOf(input, loaded, chemicals, solvent.id);
  const cell = instrumentById(conn, input.cellId);
  const areaCm2 = input.interfaceAreaCm2 ?? (cell?.interfaceRadiusCm ? undefined : (cell?.interfaceAreaCm2 ?? undefined));
  const radiusCm = input.interfaceRadiusCm ?? cell?.interfaceRadiusCm ?? undefined;
  const preview = previewRunPlan(
    {
      solvent: solvent.id,
      temperatureC: input.temperatureC,
      thresholdMolPerL: input.thresholdMolPerL,
      aqueous: phaseIons(electrolytes, "aqueous"),
      organic: phaseIons(electrolytes, "organic"),
      analytes: input.analytes,
      interfaceAreaCm2: areaCm2,
      interfaceRadiusCm: radiusCm,
      scanRateVPerS: input.scanRateVPerS,
      reference: input.reference,
    },
    loaded.table,
  );
  const volumes = { aqueousMl: input.aqueousVolumeMl ?? cell?.aqueousFillMl ?? null, organicMl: input.organicVolumeMl ?? cell?.organicFillMl ?? null };
  const solventChemical = chemicalByCas(conn, solventCas(loaded, solvent.id));
  const weighing: WeighLineDto[] = [];
  for (const e of electrolytes) {
    const volumeMl = e.phase === "aqueous" ? volumes.aqueousMl : volumes.organicMl;
    const chem = e.chemicalId === null ? null : (chemicals.get(e.chemicalId) ?? null);
    const purity = [...input.aqueous, ...input.organic].find((x) => x.chemicalId === e.chemicalId && e.chemicalId !== null)?.purityPercent ?? 100;
    const line: WeighLineDto = { phase: e.phase, role: "solute", chemicalId: chem?.id ?? null, name: e.label, molPerL: e.molPerL, volumeMl: volumeMl ?? 0, purityPercent: chem ? purity : null, molarMassGPerMol: chem?.molarMass ?? null, amount: null, unit: "g", note: "" };
    if (volumeMl === null) line.note = `Give the ${e.phase} volume: the cell's record has none.`;
    else if (!chem) line.note = `${e.label} is not a Stockroom chemical: prepare it (e.g. by metathesis) or ask the manager to add it, then plan from the bottle.`;
    else if (chem.molarMass === null) line.note = `${chem.name} has no molar mass on record; add its formula.`;
    else {
      const plan = planSolution({ concentrationMolPerL: e.molPerL, volumeMl, molarMassGPerMol: chem.molarMass, purityPercent: purity });
      line.amount = plan.soluteMassG;
      line.note = `${g(plan.soluteAmountMol * 1000)} mmol of a ${g(chem.molarMass)} g/mol salt at ${purity} % purity, made up to ${volumeMl} mL.`;
    }
    weighing.push(line);
  }
  if (volumes.organicMl !== null) {
    weighing.push({
      phase: "organic",
      role: "solvent",
      chemicalId: solventChemical?.id ?? null,
      name: solventChemical?.name ?? solvent.name,
      molPerL: null,
      volumeMl: volumes.organicMl,
      purityPercent: null,
      molarMassGPerMol: null,
      amount: volumes.organicMl,
      unit: "mL",
      note: solventChemical ? "The organic phase's solvent (the salt's volume neglected)." : `${solvent.name} is not in the Stockroom under its CAS number.`,
    });
  }
  let halogenated = solvent.id === "dce";
  if (solventChemical?.formula) {
    try {
      halogenated = isHalogenated(solventChemical.formula);
    } catch {
      // An unreadable formula keeps the table's answer.
    }
  }
  return { solvent: { id: solvent.id, name: solvent.name }, electrolytes, preview, cell, volumes, weighing, halogenated, solventChemical };
}

const fmt = (n: number) => Number(n.toPrecision(4)).toString();

/**
 * Where each weighed amount can come from: a bottle or vial of the chemical the person may draw
 * from, with enough free (not held for other bookings). `chosen` names a container per chemical;
 * otherwise the first with enough free (opened ones first, then the soonest expiry), or the one
 * with the most free when none has enough. `ownBookingId`'s reservations count as free.
 */
export function stockLines(conn: DataSource, actor: AuthUser, weighing: WeighLineDto[], chosen: Map<number, number> = new Map(), ownPlanHeld: Map<number, number> = new Map()): StockLineDto[] {
  const out: StockLineDto[] = [];
  const needs = new Map<number, { name: string; amount: number; unit: string }>();
  for (const w of weighing) {
    if (w.chemicalId === null || w.amount === null) continue;
    const prev = needs.get(w.chemicalId);
    needs.set(w.chemicalId, { name: w.name, amount: (prev?.amount ?? 0) + w.amount, unit: w.unit });
  }
  const chems = chemicalsById(conn, [...needs.keys()]);
  for (const [chemicalId, need] of needs) {
    const chem = chems.get(chemicalId)!;
    const line: StockLineDto = { chemicalId, name: need.name, amount: need.amount, unit: need.unit, containerId: null, containerUnit: null, amountInContainerUnit: null, freeInContainerUnit: null, enough: false, message: "" };
    const candidates = stockContainers(conn, chemicalId).filter((c) => containerPolicy.can(actor, "draw", { ...c, chemicalHoldReason: chem.onHoldReason }));
    const sized = candidates.flatMap((c) => {
      try {
        const amount = exactAmountToNumber(exactAmountInContainerUnit(need.amount, need.unit, c, chem));
        return [{ c, amount, free: Math.max(0, c.quantity - c.held + (ownPlanHeld.get(c.id) ?? 0)) }];
      } catch (e) {
        if (e instanceof UnitError) return [];
        throw e;
      }
    });
    const wanted = chosen.get(chemicalId);
    const pick = wanted !== undefined ? sized.find((s) => s.c.id === wanted) : (sized.find((s) => s.free >= s.amount) ?? [...sized].sort((a, b) => b.free - a.free)[0]);
    if (!pick) {
      line.message =
        wanted !== undefined
          ? `Container ${wanted} is not a bottle or vial of ${chem.name} you may draw from.`
          : `No bottle or vial of ${chem.name} that you may draw from is in stock.`;
    } else {
      line.containerId = pick.c.id;
      line.containerUnit = pick.c.unit;
      line.amountInContainerUnit = pick.amount;
      line.freeInContainerUnit = pick.free;
      line.enough = pick.free >= pick.amount - 1e-9;
      line.message = line.enough
        ? `From container ${pick.c.id}: ${fmt(pick.amount)} ${pick.c.unit} of ${fmt(pick.free)} ${pick.c.unit} free.`
        : `Container ${pick.c.id} has ${fmt(pick.free)} ${pick.c.unit} free; the plan needs ${fmt(pick.amount)} ${pick.c.unit}.`;
    }
    out.push(line);
  }
  return out;
}

/** The halogenated waste the run leaves (its organic phase), and whether a halogenated waste container has room. */
export function wasteOf(conn: DataSource, plan: Pick<ComputedPlan, "halogenated" | "volumes" | "solvent">) {
  const volumeMl = plan.volumes.organicMl;
  if (!plan.halogenated) {
    return { halogenated: false, volumeMl, containerId: null, roomMl: null, hasRoom: null, message: `${plan.solvent.name} is not halogenated: collect the organic phase as the safety data sheet says.` };
  }
  if (volumeMl === null) return { halogenated: true, volumeMl: null, containerId: null, roomMl: null, hasRoom: null, message: "Give the organic volume to know the halogenated waste." };
  const rooms = wasteContainers(conn).flatMap((c) => {
    let halo = false;
    try {
      halo = c.formula ? isHalogenated(c.formula) : false;
    } catch {
      halo = false;
    }
    if (!halo) return [];
    try {
      // A waste container fills: its capacity is initialQuantity, what it holds is quantity.
      const room = c.initialQuantity - c.quantity;
      const roomMl = room <= 0 ? 0 : exactAmountToNumber(exactAmountInContainerUnit(room, c.unit, { ...c, unit: "mL" }, { densityGPerMl: c.densityGPerMl, molarMass: c.molarMass }));
      return [{ id: c.id, roomMl }];
    } catch {
      return [];
    }
  });
  const best = rooms.sort((a, b) => b.roomMl - a.roomMl)[0];
  if (!best) return { halogenated: true, volumeMl, containerId: null, roomMl: null, hasRoom: false, message: `About ${fmt(volumeMl)} mL of halogenated waste, and no halogenated waste container is in use: ask the safety officer before the run.` };
  const hasRoom = best.roomMl >= volumeMl;
  return {
    halogenated: true,
    volumeMl,
    containerId: best.id,
    roomMl: best.roomMl,
    hasRoom,
    message: hasRoom
      ? `At least ${fmt(volumeMl)} mL of halogenated waste (the organic phase, plus rinses): waste container ${best.id} has room for ${fmt(best.roomMl)} mL.`
      : `At least ${fmt(volumeMl)} mL of halogenated waste, but waste container ${best.id} has room for only ${fmt(best.roomMl)} mL: arrange collection with the safety officer first.`,
  };
}

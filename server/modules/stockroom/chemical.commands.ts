/**
 * Chemicals: identity and hazard data. The service turns what a person typed into a record
 * Phasebook can compute with — a CAS number that passes its check digit, a formula that can be
 * weighed (molar mass from IUPAC atomic weights unless an override is given for a solvate),
 * H-codes that exist — and refuses with 422 naming the field otherwise. It also places a
 * chemical on hold, which stops usage of every container of it.
 */
import type { EntityManager } from "typeorm";
import { parseCas } from "@shared/domain/cas";
import { analyseFormula, FormulaError } from "@shared/domain/chemistry";
import { normaliseHCode, isHCode } from "@shared/domain/ghs-statements";
import { ChemicalIonsError, checkChemicalIons } from "@shared/domain/ion-transfer/chemical-ions";
import { isAcutelyToxic, isCarcinogen, pictogramsFor, signalWordFor } from "@shared/domain/hazards";
import type { ChemicalInput, ChemicalUpdate } from "@shared/schemas/stock";
import { Chemical } from "../../entities";
import { Conflict, NotFound, RuleBroken, type FieldError } from "../../errors";
import { serialTransaction } from "../../db/serial";
import { audit } from "../../core/audit";
import type { Deps } from "../../core/deps";

/** Fields of a chemical row computed from an input, or the field errors that stop it. */
export interface CheckedChemical {
  values: Partial<Chemical>;
  errors: FieldError[];
}

/**
 * Checks and normalises a chemical's input without touching the database; used by create,
 * update and the CSV import (which collects every row's errors before writing anything).
 * `current` is the stored record for an update.
 */
export function checkChemicalInput(input: ChemicalUpdate, current?: Chemical): CheckedChemical {
  const errors: FieldError[] = [];
  const values: Partial<Chemical> = {};
  if (input.name !== undefined) values.name = input.name;
  if (input.synonyms !== undefined) values.synonyms = JSON.stringify(input.synonyms);
  if (input.casNumber !== undefined) {
    const cas = parseCas(input.casNumber);
    if (cas.ok) values.casNumber = cas.cas;
    else errors.push({ path: "casNumber", message: cas.message });
  }

  let formulaMass: number | null | undefined;
  if (input.formula !== undefined) {
    const text = input.formula?.trim() ?? "";
    if (text === "") {
      values.formula = null;
      formulaMass = null;
    } else {
      try {
        const a = analyseFormula(text);
        values.formula = a.formula;
        formulaMass = a.molarMassGPerMol;
      } catch (e) {
        if (!(e instanceof FormulaError)) throw e;
        errors.push({ path: "formula", message: e.message });
      }
    }
  }
  if (input.molarMass !== undefined && input.molarMass !== null) {
    values.molarMass = input.molarMass;
    values.molarMassOverridden = true;
  } else if (input.molarMass === null) {
    // Clearing the override falls back to the formula's mass.
    values.molarMassOverridden = false;
    values.molarMass = formulaMass !== undefined ? formulaMass : current?.formula ? safeMass(current.formula) : null;
  } else if (formulaMass !== undefined && !(current?.molarMassOverridden ?? false)) {
    values.molarMass = formulaMass;
    values.molarMassOverridden = false;
  } else if (!current) {
    values.molarMass = formulaMass ?? null;
    values.molarMassOverridden = false;
  }

  if (input.hazardStatements !== undefined) {
    const codes: string[] = [];
    input.hazardStatements.forEach((raw, i) => {
      const code = normaliseHCode(raw);
      if (code === null || !isHCode(code)) {
        errors.push({ path: `hazardStatements.${i}`, message: `"${raw}" is not a GHS hazard statement code Phasebook knows (e.g. H225).` });
      } else if (!codes.includes(code)) codes.push(code);
    });
    values.hazardStatements = JSON.stringify(codes);
    values.pictograms = JSON.stringify(pictogramsFor(codes));
    if (input.signalWord === undefined) {
      const derived = signalWordFor(codes);
      values.signalWord = derived === "Danger" || derived === "Warning" ? derived : null;
    }
    if (input.carcinogen === undefined) values.carcinogen = isCarcinogen(codes);
    if (input.acuteToxic === undefined) values.acuteToxic = isAcutelyToxic(codes);
  }
  if (input.signalWord !== undefined) values.signalWord = input.signalWord;
  if (input.carcinogen !== undefined) values.carcinogen = input.carcinogen;
  if (input.acuteToxic !== undefined) values.acuteToxic = input.acuteToxic;
  for (const k of [
    "precautions",
    "flashPointC",
    "boilingPointC",
    "densityGPerMl",
    "storageGroup",
    "reorderPoint",
    "reorderUnit",
    "unitCostCents",
    "costUnit",
  ] as const) {
    if (input[k] !== undefined) (values as Record<string, unknown>)[k] = input[k];
  }
  if (input.ions !== undefined) {
    if (input.ions === null) values.ions = null;
    else {
      try {
        values.ions = JSON.stringify(checkChemicalIons(input.ions));
      } catch (e) {
        if (!(e instanceof ChemicalIonsError)) throw e;
        errors.push({ path: e.field, message: e.message });
      }
    }
  }
  const flash = input.flashPointC !== undefined ? input.flashPointC : current?.flashPointC;
  const boil = input.boilingPointC !== undefined ? input.boilingPointC : current?.boilingPointC;
  if (typeof flash === "number" && typeof boil === "number" && flash > boil) {
    errors.push({ path: "flashPointC", message: `A flash point (${flash} °C) above the boiling point (${boil} °C) is not possible; check both.` });
  }
  const reorder = input.reorderPoint !== undefined ? input.reorderPoint : current?.reorderPoint;
  const reorderUnit = input.reorderUnit !== undefined ? input.reorderUnit : current?.reorderUnit;
  if (reorder !== null && reorder !== undefined && !reorderUnit) {
    errors.push({ path: "reorderUnit", message: "Give the unit of the reorder point." });
  }
  const cost = input.unitCostCents !== undefined ? input.unitCostCents : current?.unitCostCents;
  const costUnit = input.costUnit !== undefined ? input.costUnit : current?.costUnit;
  if (cost !== null && cost !== undefined && !costUnit) {
    errors.push({ path: "costUnit", message: "Give the unit the cost is per (e.g. g or mL)." });
  }
  return { values, errors };
}

function safeMass(formula: string): number | null {
  try {
    return analyseFormula(formula).molarMassGPerMol;
  } catch {
    return null;
  }
}

/** Inserts a checked chemical inside the caller's transaction; 409 when the same name and CAS number exist. */
export async function insertChemical(em: EntityManager, now: Date, actorId: number | null, values: Partial<Chemical>): Promise<Chemical> {
  const dup = await em
    .getRepository(Chemical)
    .createQueryBuilder("ch")
    .where("ch.casNumber = :cas AND lower(ch.name) = lower(:name)", { cas: values.casNumber, name: values.name })
    .getOne();
  if (dup) throw new Conflict(`${values.name} (${values.casNumber}) is already on record as chemical ${dup.id}.`, "chemical_exists", { chemicalId: dup.id });
  const res = await em.insert(Chemical, { ...values, createdAt: now.toISOString() });
  const id = res.identifiers[0].id as number;
  await audit(em, now, actorId, "chemical.created", "chemical", id, { name: values.name, casNumber: values.casNumber });
  return (await em.findOneBy(Chemical, { id }))!;
}

export async function createChemical(deps: Deps, actorId: number, input: ChemicalInput): Promise<Chemical> {
  const { values, errors } = checkChemicalInput(input);
  if (errors.length) throw new RuleBroken(errors.map((e) => e.message).join(" "), errors, "invalid_chemical");
  return serialTransaction(deps.ds, (em) => insertChemical(em, deps.now(), actorId, values));
}

/** One change to one chemical in its own transaction, answering the fresh record. */
function changeChemical(deps: Deps, id: number, work: (em: EntityManager, c: Chemical, now: Date) => Promise<void>): Promise<Chemical> {
  return serialTransaction(deps.ds, async (em) => {
    const c = await em.findOneBy(Chemical, { id });
    if (!c) throw new NotFound("That chemical");
    await work(em, c, deps.now());
    return (await em.findOneBy(Chemical, { id }))!;
  });
}

export const updateChemical = (deps: Deps, actorId: number, id: number, input: ChemicalUpdate) =>
  changeChemical(deps, id, async (em, current, now) => {
    const { values, errors } = checkChemicalInput(input, current);
    if (errors.length) throw new RuleBroken(errors.map((e) => e.message).join(" "), errors, "invalid_chemical");
    if (Object.keys(values).length) await em.update(Chemical, id, values);
    await audit(em, now, actorId, "chemical.updated", "chemical", id, { fields: Object.keys(input) });
  });

/** A chemical on hold stops usage of every container of it. */
export const holdChemical = (deps: Deps, actorId: number, id: number, reason: string) =>
  changeChemical(deps, id, async (em, _c, now) => {
    await em.update(Chemical, id, { onHoldReason: reason });
    await audit(em, now, actorId, "chemical.held", "chemical", id, { reason });
  });

export const releaseChemical = (deps: Deps, actorId: number, id: number) =>
  changeChemical(deps, id, async (em, c, now) => {
    if (c.onHoldReason === null) throw new Conflict(`${c.name} is not on hold.`, "not_on_hold");
    await em.update(Chemical, id, { onHoldReason: null });
    await audit(em, now, actorId, "chemical.released", "chemical", id, { reason: c.onHoldReason });
  });

/**
 * Solution preparation. plan() is the pure contract route: the mass of the bottle's contents
 * for a target concentration and volume. prepare() does it for real in one transaction: both
 * parents are decremented (through the same withdraw() as any usage, so holds, over-draw and
 * costs follow the same rules), the new container is created at the concentration actually
 * weighed, and its lineage is written. If anything fails, nothing changes.
 */
import type { DataSource } from "typeorm";
import { actualConcentration, planSolution, SolutionError } from "@shared/domain/solutions";
import type { PrepareSolutionInput, SolutionPlanDto, SolutionPlanInput } from "@shared/schemas/stock";
import { Chemical, Container, SolutionComponent } from "../../entities";
import { RuleBroken } from "../../errors";
import { serialTransaction } from "../../db/serial";
import type { AuthUser } from "../../middleware/auth";
import { audit } from "../../core/audit";
import { newToken } from "../../core/tokens";
import type { Deps } from "../../core/deps";
import { recordMovement, requireLocation, withdraw } from "./container.commands";
import { containerRow } from "./container.queries";

function solutionProblem(e: SolutionError, fieldMap: Record<string, string> = {}): RuleBroken {
  const path = fieldMap[e.field] ?? e.field;
  return new RuleBroken(e.message, [{ path, message: e.message }], e.code);
}

function molarMassOf(chem: Chemical | null, field: string): number {
  if (!chem) throw new RuleBroken("There is no such chemical.", [{ path: field, message: "Choose an existing chemical." }], "unknown_chemical");
  if (!chem.molarMass) {
    const msg = `${chem.name} has no molar mass: enter its formula or molar mass on the chemical's record first.`;
    throw new RuleBroken(msg, [{ path: field, message: msg }], "needs_molar_mass");
  }
  return chem.molarMass;
}

/** "10 mM", "0.25 M": how a chemist writes a concentration on a label. */
export function formatConcentration(molPerL: number): string {
  const fmt = (n: number) => Number(n.toPrecision(3)).toString();
  return molPerL < 0.1 ? `${fmt(molPerL * 1000)} mM` : `${fmt(molPerL)} M`;
}

/** Contract POST /api/solutions/plan: a pure computation from the chemical's molar mass; changes nothing. */
export async function planSolutionFor(ds: DataSource, input: SolutionPlanInput): Promise<SolutionPlanDto> {
  const chem = await ds.getRepository(Chemical).findOneBy({ id: input.soluteChemicalId });
  const molarMassGPerMol = molarMassOf(chem, "soluteChemicalId");
  try {
    const p = planSolution({ concentrationMolPerL: input.concentrationMolPerL, volumeMl: input.volumeMl, molarMassGPerMol, purityPercent: input.purityPercent });
    return { soluteChemicalId: input.soluteChemicalId, molarMassGPerMol, purityPercent: input.purityPercent ?? 100, ...p };
  } catch (e) {
    if (e instanceof SolutionError) throw solutionProblem(e, { molarMassGPerMol: "soluteChemicalId" });
    throw e;
  }
}

export async function prepareSolution({ ds, now }: Deps, actor: AuthUser, input: PrepareSolutionInput) {
  if (input.soluteContainerId === input.solventContainerId) {
    throw new RuleBroken("The solute and the solvent must come from different containers.", [
      { path: "solventContainerId", message: "Choose a different container for the solvent." },
    ]);
  }
  return serialTransaction(ds, async (em) => {
    const soluteC = await em.findOneBy(Container, { id: input.soluteContainerId });
    const solventC = await em.findOneBy(Container, { id: input.solventContainerId });
    if (!soluteC) throw new RuleBroken(`There is no container ${input.soluteContainerId}.`, [{ path: "soluteContainerId", message: "Choose an existing container." }], "unknown_container");
    if (!solventC) throw new RuleBroken(`There is no container ${input.solventContainerId}.`, [{ path: "solventContainerId", message: "Choose an existing container." }], "unknown_container");
    const soluteChem = (await em.findOneBy(Chemical, { id: soluteC.chemicalId }))!;
    const solventChem = (await em.findOneBy(Chemical, { id: solventC.chemicalId }))!;
    const molarMassGPerMol = molarMassOf(soluteChem, "soluteContainerId");
    const locationId = input.locationId === undefined || input.locationId === null ? solventC.locationId : await requireLocation(em, input.locationId, "locationId");

    let planned;
    let concentration;
    try {
      planned = planSolution({ concentrationMolPerL: input.concentrationMolPerL, volumeMl: input.volumeMl, molarMassGPerMol, purityPercent: input.purityPercent });
      const massG = input.massWeighedG ?? planned.soluteMassG;
      concentration = actualConcentration({ massWeighedG: massG, volumeMl: input.volumeMl, molarMassGPerMol, purityPercent: input.purityPercent });
    } catch (e) {
      if (e instanceof SolutionError) throw solutionProblem(e, { molarMassGPerMol: "soluteContainerId" });
      throw e;
    }
    const massG = input.massWeighedG ?? planned.soluteMassG;

    const t = now();
    const solute = await withdraw(em, t, actor, soluteC.id, massG, "g", {
      bookingId: input.bookingId,
      note: "solution preparation (solute)",
      fields: { amount: input.massWeighedG === undefined ? "concentrationMolPerL" : "massWeighedG", unit: "soluteContainerId", container: "soluteContainerId" },
    });
    const solvent = await withdraw(em, t, actor, solventC.id, planned.solventVolumeMl, "mL", {
      bookingId: input.bookingId,
      note: "solution preparation (solvent)",
      fields: { amount: "volumeMl", unit: "solventContainerId", container: "solventContainerId" },
    });

    const at = t.toISOString();
    const label = input.label?.trim() || `${formatConcentration(concentration)} ${soluteChem.name} in ${solventChem.name}`;
    const res = await em.insert(Container, {
      chemicalId: soluteChem.id,
      kind: "solution",
      quantity: input.volumeMl,
      initialQuantity: input.volumeMl,
      unit: "mL",
      locationId,
      status: "in_use",
      openedAt: at,
      expiresAt: input.expiresAt ?? null,
      retestAt: null,
      groupId: null,
      organisation: null,
      labelToken: newToken(18),
      supplier: `Prepared by ${actor.name}`,
      lot: label.slice(0, 200),
      priceCents: null,
      concentrationMolPerL: concentration,
      holdReason: null,
      createdAt: at,
    });
    const id = res.identifiers[0].id as number;
    await em.insert(SolutionComponent, [
      { solutionContainerId: id, parentContainerId: soluteC.id, role: "solute", amount: solute.amountInContainerUnit, unit: soluteC.unit },
      { solutionContainerId: id, parentContainerId: solventC.id, role: "solvent", amount: solvent.amountInContainerUnit, unit: solventC.unit },
    ]);
    await recordMovement(em, t, { containerId: id, from: null, to: locationId, userId: actor.id, kind: "prepared", note: label });
    await audit(em, t, actor.id, "solution.prepared", "container", id, {
      soluteContainerId: soluteC.id,
      solventContainerId: solventC.id,
      massWeighedG: massG,
      volumeMl: input.volumeMl,
      targetMolPerL: input.concentrationMolPerL,
      actualMolPerL: concentration,
    });
    return {
      container: containerRow(em.connection, id),
      plan: { soluteChemicalId: soluteChem.id, molarMassGPerMol, purityPercent: input.purityPercent ?? 100, ...planned },
      massWeighedG: massG,
      actualConcentrationMolPerL: concentration,
      parents: [containerRow(em.connection, soluteC.id), containerRow(em.connection, solventC.id)],
    };
  });
}


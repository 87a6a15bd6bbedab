/**
 * The manager adds to the ion table: a water | solvent pair, or an ion's standard transfer
 * potential for a solvent, each with the published source of the value. Audited; the built-in
 * table itself is code and changes only with a release.
 */
import { normaliseIonName, resolveSolvent } from "@shared/domain/ion-transfer";
import type { addIonInput, addSolventInput } from "@shared/schemas/ion-table";
import type { z } from "zod";
import { IonTransferIon, IonTransferSolvent } from "../../entities";
import { Conflict, RuleBroken } from "../../errors";
import { serialTransaction } from "../../db/serial";
import { audit } from "../../core/audit";
import type { Deps } from "../../core/deps";
import type { AuthUser } from "../../middleware/auth";
import { loadIonTable } from "./ion-table.queries";
import { withIonProblems } from "./ion-problem";

export async function addSolvent(deps: Deps, actor: AuthUser, input: z.output<typeof addSolventInput>): Promise<void> {
  await serialTransaction(deps.ds, async (em) => {
    const loaded = loadIonTable(em.connection);
    const clash = loaded.table.find((s) => [s.id, s.name, ...s.aliases].some((n) => [input.id, input.name, ...input.aliases].some((m) => m.trim().toLowerCase() === n.trim().toLowerCase())));
    if (clash) throw new Conflict(`The ion table already has ${clash.name} (id "${clash.id}"); add ions to it instead.`, "solvent_exists", { solvent: clash.id });
    const now = deps.now();
    await em.insert(IonTransferSolvent, {
      key: input.id,
      name: input.name,
      aliases: JSON.stringify(input.aliases),
      casNumber: input.casNumber?.trim() || null,
      source: input.source,
      createdById: actor.id,
      createdAt: now.toISOString(),
    });
    await audit(em, now, actor.id, "ion_table.solvent_added", "ion_transfer_solvent", null, { id: input.id, name: input.name, source: input.source });
  });
}

export async function addIon(deps: Deps, actor: AuthUser, input: z.output<typeof addIonInput>): Promise<{ solvent: string }> {
  return serialTransaction(deps.ds, async (em) => {
    const loaded = loadIonTable(em.connection);
    const solvent = withIonProblems(() => resolveSolvent(loaded.table, input.solvent));
    const ion = normaliseIonName(input.ion);
    if (Math.sign(input.charge) !== (ion.endsWith("+") ? 1 : -1)) {
      throw new RuleBroken(`${ion} is written as ${ion.endsWith("+") ? "a cation" : "an anion"} but given the charge ${input.charge}.`, [{ path: "charge", message: "The charge's sign must match the ion's name." }], "invalid_ion");
    }
    if (loaded.added.has(`${solvent.id}|${ion}`)) {
      throw new Conflict(`${ion} has already been added for water | ${solvent.name}.`, "ion_exists", { solvent: solvent.id, ion });
    }
    const now = deps.now();
    await em.insert(IonTransferIon, {
      solventKey: solvent.id,
      ion,
      name: input.name,
      charge: input.charge,
      standardPotentialV: input.standardPotentialV,
      source: input.source,
      diffusionAqueousCm2PerS: input.diffusionAqueousCm2PerS,
      diffusionOrganicCm2PerS: input.diffusionOrganicCm2PerS,
      createdById: actor.id,
      createdAt: now.toISOString(),
    });
    const replaces = solvent.ions.some((i) => i.ion === ion);
    await audit(em, now, actor.id, "ion_table.ion_added", "ion_transfer_ion", null, { solvent: solvent.id, ion, standardPotentialV: input.standardPotentialV, source: input.source, replaces });
    return { solvent: solvent.id };
  });
}

/** Setups: named sets of instruments booked together (a potentiostat with an interface cell). The manager keeps them. */
import { In, type EntityManager } from "typeorm";
import type { SetupDto, SetupParsed } from "@shared/schemas/setups";
import { Instrument, Setup, SetupInstrument } from "../../entities";
import { NotFound, RuleBroken } from "../../errors";
import { serialTransaction } from "../../db/serial";
import type { AuthUser } from "../../middleware/auth";
import { audit } from "../../core/audit";
import type { Deps } from "../../core/deps";

/** The instrument ids, each once; 422 naming the unknown ones. */
async function knownInstruments(em: EntityManager, ids: number[]): Promise<number[]> {
  const unique = [...new Set(ids)];
  const found = await em.findBy(Instrument, { id: In(unique) });
  const missing = unique.filter((id) => !found.some((i) => i.id === id));
  if (missing.length) throw new RuleBroken("Unknown instrument.", [{ path: "instrumentIds", message: `No instrument with id ${missing.join(", ")}` }]);
  return unique;
}

/** Adds a setup, or replaces setup `id`'s name, description and instruments. */
export async function saveSetup(deps: Deps, actor: AuthUser, input: SetupParsed, id?: number): Promise<SetupDto> {
  const ids = await knownInstruments(deps.ds.manager, input.instrumentIds);
  return serialTransaction(deps.ds, async (em) => {
    const now = deps.now();
    let setupId = id;
    if (setupId) {
      if (!(await em.findOneBy(Setup, { id: setupId }))) throw new NotFound("That setup");
      await em.update(Setup, setupId, { name: input.name, description: input.description });
      await em.delete(SetupInstrument, { setupId });
    } else {
      setupId = (await em.insert(Setup, { name: input.name, description: input.description, createdAt: now.toISOString() })).identifiers[0].id as number;
    }
    await em.insert(SetupInstrument, ids.map((instrumentId, position) => ({ setupId, instrumentId, position })));
    await audit(em, now, actor.id, id ? "setup.changed" : "setup.created", "setup", setupId, { name: input.name, instrumentIds: ids });
    return { id: setupId, name: input.name, description: input.description, instrumentIds: ids };
  });
}

export async function removeSetup(deps: Deps, actor: AuthUser, id: number): Promise<void> {
  await serialTransaction(deps.ds, async (em) => {
    if (!(await em.findOneBy(Setup, { id }))) throw new NotFound("That setup");
    await em.delete(SetupInstrument, { setupId: id });
    await em.delete(Setup, { id });
    await audit(em, deps.now(), actor.id, "setup.deleted", "setup", id, {});
  });
}

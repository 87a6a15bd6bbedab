/** Setups: named sets of instruments booked together (a potentiostat with an interface cell). */
import { In, type DataSource } from "typeorm";
import type { SetupDto, SetupParsed } from "@shared/schemas/setups";
import { Instrument, Setup, SetupInstrument } from "../entities";
import { NotFound, RuleBroken } from "../errors";
import { serialTransaction } from "../db/serial";
import type { AuthUser } from "../middleware/auth";
import { audit } from "../core/audit";

type Parsed = SetupParsed;

export function createSetupService(deps: { ds: DataSource; now: () => Date }) {
  const { ds } = deps;

  async function checkInstruments(ids: number[]) {
    const unique = [...new Set(ids)];
    const found = await ds.getRepository(Instrument).findBy({ id: In(unique) });
    const missing = unique.filter((id) => !found.some((i) => i.id === id));
    if (missing.length) throw new RuleBroken("Unknown instrument.", [{ path: "instrumentIds", message: `No instrument with id ${missing.join(", ")}` }]);
    return unique;
  }

  return {
    async list(): Promise<SetupDto[]> {
      const setups = await ds.getRepository(Setup).find({ order: { name: "ASC" } });
      const links = await ds.getRepository(SetupInstrument).find({ order: { position: "ASC" } });
      return setups.map((s) => ({
        id: s.id,
        name: s.name,
        description: s.description,
        instrumentIds: links.filter((l) => l.setupId === s.id).map((l) => l.instrumentId),
      }));
    },

    async save(actor: AuthUser, input: Parsed, id?: number): Promise<SetupDto> {
      const ids = await checkInstruments(input.instrumentIds);
      return serialTransaction(ds, async (em) => {
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
    },

    async remove(actor: AuthUser, id: number): Promise<void> {
      await serialTransaction(ds, async (em) => {
        if (!(await em.findOneBy(Setup, { id }))) throw new NotFound("That setup");
        await em.delete(SetupInstrument, { setupId: id });
        await em.delete(Setup, { id });
        await audit(em, deps.now(), actor.id, "setup.deleted", "setup", id, {});
      });
    },
  };
}

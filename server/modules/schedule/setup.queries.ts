/** Setups with their instruments in order, for the booking form and the manager's editor. */
import type { DataSource } from "typeorm";
import type { SetupDto } from "@shared/schemas/setups";
import { Setup, SetupInstrument } from "../../entities";

export async function listSetups(ds: DataSource): Promise<SetupDto[]> {
  const setups = await ds.getRepository(Setup).find({ order: { name: "ASC" } });
  const links = await ds.getRepository(SetupInstrument).find({ order: { position: "ASC" } });
  return setups.map((s) => ({
    id: s.id,
    name: s.name,
    description: s.description,
    instrumentIds: links.filter((l) => l.setupId === s.id).map((l) => l.instrumentId),
  }));
}

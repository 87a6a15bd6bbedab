/**
 * Locations (building › room › cabinet or shelf) and the storage limits the safety office
 * enters on them. A location cannot become its own ancestor, and one that still holds
 * containers or sub-locations cannot be deleted.
 */
import type { DataSource } from "typeorm";
import type { LocationInput, LocationUpdate } from "@shared/schemas/stock";
import { Location } from "../../entities";
import { Conflict, NotFound, RuleBroken } from "../../errors";
import { serialTransaction } from "../../db/serial";
import { audit } from "../../core/audit";
import type { Deps } from "../../core/deps";

const LEVEL_ORDER = { building: 0, room: 1, cabinet: 2, shelf: 3 } as const;

/** Every location, in id order (the table is small: a building's rooms and cabinets). */
export const allLocations = (ds: DataSource) => ds.getRepository(Location).find({ order: { id: "ASC" } });

async function checkParent(all: Location[], id: number | null, parentId: number | null | undefined, level: Location["level"]) {
  if (parentId === null || parentId === undefined) return;
  const parent = all.find((l) => l.id === parentId);
  if (!parent) throw new RuleBroken(`There is no location ${parentId}.`, [{ path: "parentId", message: "Choose an existing location." }]);
  if (LEVEL_ORDER[parent.level] >= LEVEL_ORDER[level]) {
    throw new RuleBroken(`A ${level} cannot sit inside a ${parent.level}.`, [{ path: "parentId", message: `A ${level} goes inside a larger place than a ${parent.level}.` }]);
  }
  // Walk up from the new parent: meeting the location itself would make a loop.
  let at: Location | undefined = parent;
  for (let i = 0; at && i < 50; i++) {
    if (at.id === id) throw new RuleBroken("A location cannot be inside itself.", [{ path: "parentId", message: "Choose a parent outside this location." }]);
    at = at.parentId === null ? undefined : all.find((l) => l.id === at!.parentId);
  }
}

export async function createLocation({ ds, now }: Deps, actorId: number, input: LocationInput): Promise<Location> {
  return serialTransaction(ds, async (em) => {
    const locations = await em.find(Location);
    await checkParent(locations, null, input.parentId, input.level);
    const res = await em.insert(Location, {
      parentId: input.parentId ?? null,
      level: input.level,
      name: input.name,
      type: input.type,
      limitNote: input.limitNote,
    });
    const id = res.identifiers[0].id as number;
    await audit(em, now(), actorId, "location.created", "location", id, { name: input.name });
    return (await em.findOneBy(Location, { id }))!;
  });
}

export async function updateLocation({ ds, now }: Deps, actorId: number, id: number, input: LocationUpdate): Promise<Location> {
  return serialTransaction(ds, async (em) => {
    const locations = await em.find(Location);
    const current = locations.find((l) => l.id === id);
    if (!current) throw new NotFound("That location");
    const parentId = input.parentId !== undefined ? input.parentId : current.parentId;
    await checkParent(locations, id, parentId, input.level ?? current.level);
    const values: Omit<Partial<Location>, "parent"> = {};
    for (const k of ["parentId", "level", "name", "type", "limitNote"] as const) {
      if (input[k] !== undefined) (values as Record<string, unknown>)[k] = input[k];
    }
    if (Object.keys(values).length) await em.update(Location, id, values);
    await audit(em, now(), actorId, "location.updated", "location", id, {
      before: { name: current.name, parentId: current.parentId, limitNote: current.limitNote },
      changes: values,
    });
    return (await em.findOneBy(Location, { id }))!;
  });
}

export async function removeLocation({ ds, now }: Deps, actorId: number, id: number): Promise<void> {
  await serialTransaction(ds, async (em) => {
    const l = await em.findOneBy(Location, { id });
    if (!l) throw new NotFound("That location");
    const [{ n }] = (await em.query(`SELECT COUNT(*) AS n FROM containers WHERE locationId = ? AND status NOT IN ('empty','disposed')`, [id])) as { n: number }[];
    if (Number(n) > 0) throw new Conflict(`${l.name} still holds ${n} container(s); move them first.`, "location_in_use");
    const [{ k }] = (await em.query(`SELECT COUNT(*) AS k FROM locations WHERE parentId = ?`, [id])) as { k: number }[];
    if (Number(k) > 0) throw new Conflict(`${l.name} has ${k} location(s) inside it; remove or move them first.`, "location_has_children");
    // Emptied and disposed containers keep their history but lose the place.
    await em.query(`UPDATE containers SET locationId = NULL WHERE locationId = ?`, [id]);
    await em.query(`UPDATE instruments SET locationId = NULL WHERE locationId = ?`, [id]);
    await em.delete(Location, id);
    await audit(em, now(), actorId, "location.deleted", "location", id, { name: l.name });
  });
}


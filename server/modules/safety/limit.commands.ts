/**
 * Storage limits on locations, kept by the safety office: a set of fire-code liquid classes and
 * the most litres of them allowed, typed in litres or US gallons (1 US gal = 3.785411784 L
 * exactly) and kept in litres, with whether approved cabinets inside count toward it.
 */
import type { EntityManager } from "typeorm";
import { limitVolumeToLitres } from "@shared/domain/storage";
import type { StorageLimitInput } from "@shared/schemas/storage";
import { Location, LocationLimit } from "../../entities";
import { NotFound } from "../../errors";
import { serialTransaction } from "../../db/serial";
import { audit } from "../../core/audit";
import type { Deps } from "../../core/deps";
import type { AuthUser } from "../../middleware/auth";

const values = (input: StorageLimitInput) => ({
  classes: JSON.stringify(input.classes),
  maxLitres: limitVolumeToLitres(input.maxVolume, input.unit),
  enteredVolume: input.maxVolume,
  enteredUnit: input.unit,
  includesCabinets: input.includesCabinets,
  note: input.note,
});

async function requireLocation(em: EntityManager, id: number): Promise<void> {
  if (!(await em.existsBy(Location, { id }))) throw new NotFound("That location");
}

export async function addLimit(deps: Deps, actor: AuthUser, locationId: number, input: StorageLimitInput): Promise<LocationLimit> {
  return serialTransaction(deps.ds, async (em) => {
    await requireLocation(em, locationId);
    const res = await em.insert(LocationLimit, { locationId, ...values(input), createdAt: deps.now().toISOString() });
    const id = res.identifiers[0].id as number;
    await audit(em, deps.now(), actor.id, "location.limit_added", "location", locationId, { limitId: id, ...input });
    return em.findOneByOrFail(LocationLimit, { id });
  });
}

export async function replaceLimit(deps: Deps, actor: AuthUser, locationId: number, limitId: number, input: StorageLimitInput): Promise<LocationLimit> {
  return serialTransaction(deps.ds, async (em) => {
    const before = await em.findOneBy(LocationLimit, { id: limitId, locationId });
    if (!before) throw new NotFound("That limit");
    await em.update(LocationLimit, limitId, values(input));
    await audit(em, deps.now(), actor.id, "location.limit_changed", "location", locationId, { limitId, before: { classes: before.classes, maxLitres: before.maxLitres, includesCabinets: before.includesCabinets }, after: input });
    return em.findOneByOrFail(LocationLimit, { id: limitId });
  });
}

export async function removeLimit(deps: Deps, actor: AuthUser, locationId: number, limitId: number): Promise<void> {
  await serialTransaction(deps.ds, async (em) => {
    const before = await em.findOneBy(LocationLimit, { id: limitId, locationId });
    if (!before) throw new NotFound("That limit");
    await em.delete(LocationLimit, limitId);
    await audit(em, deps.now(), actor.id, "location.limit_removed", "location", locationId, { limitId, classes: before.classes, maxLitres: before.maxLitres });
  });
}

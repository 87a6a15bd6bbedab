/** Locations and their storage limits: everyone reads them; the safety office and the manager change them. */
import { Router } from "express";
import { idParam } from "@shared/schemas/common";
import { locationInput, locationUpdate, type LocationInput, type LocationUpdate } from "@shared/schemas/stock";
import type { Ctx } from "../context";
import { currentUser, requireAuth, requireRole } from "../middleware/auth";
import { body, params, validate } from "../middleware/validate";
import { locationPaths, presentLocation } from "../presenters/stock.presenter";
import type { Location } from "../entities";

const LIMIT_KEEPERS = ["safety_officer", "manager"] as const;

export function createLocationsRouter(ctx: Ctx): Router {
  const r = Router();
  const locations = ctx.services.locations;
  const present = async (l: Location) => presentLocation(l, locationPaths(await locations.all()).get(l.id) ?? l.name);

  r.get("/", requireAuth, async (_req, res) => {
    const all = await locations.all();
    const paths = locationPaths(all);
    const items = all.map((l) => presentLocation(l, paths.get(l.id) ?? l.name)).sort((a, b) => a.path.localeCompare(b.path, "en"));
    res.json({ items, total: items.length });
  });

  r.post("/", requireRole(...LIMIT_KEEPERS), validate({ body: locationInput }), async (req, res) => {
    res.status(201).json({ location: await present(await locations.create(currentUser(req).id, body<LocationInput>(req))) });
  });

  r.patch("/:id", requireRole(...LIMIT_KEEPERS), validate({ params: idParam, body: locationUpdate }), async (req, res) => {
    res.json({ location: await present(await locations.update(currentUser(req).id, params<{ id: number }>(req).id, body<LocationUpdate>(req))) });
  });

  r.delete("/:id", requireRole(...LIMIT_KEEPERS), validate({ params: idParam }), async (req, res) => {
    await locations.remove(currentUser(req).id, params<{ id: number }>(req).id);
    res.status(204).end();
  });

  return r;
}

/** Locations and their storage limits: everyone reads them; the safety office and the manager change them. */
import { z } from "zod";
import { idParam, pageOf } from "@shared/schemas/common";
import { locationDto, locationInput, locationUpdate } from "@shared/schemas/stock";
import type { DataSource } from "typeorm";
import { LocationLimit, type Location } from "../../entities";
import { route } from "../../http/route-table";
import { allLocations, createLocation, removeLocation, updateLocation } from "./location.commands";
import { locationPaths, presentLocation } from "./stock.presenter";

const LIMIT_KEEPERS = ["safety_officer", "manager"] as const;
const one = z.object({ location: locationDto });

async function present(ds: DataSource, l: Location) {
  return presentLocation(l, locationPaths(await allLocations(ds)).get(l.id) ?? l.name, await ds.getRepository(LocationLimit).findBy({ locationId: l.id }));
}

export const locationRoutes = [
  route({
    method: "get",
    path: "/locations",
    summary: "Every location as building › room › cabinet, with its storage limits",
    access: "signed_in",
    output: pageOf(locationDto),
    handler: async ({ ctx }) => {
      const all = await allLocations(ctx.ds);
      const paths = locationPaths(all);
      const limits = await ctx.ds.getRepository(LocationLimit).find({ order: { id: "ASC" } });
      const items = all
        .map((l) => presentLocation(l, paths.get(l.id) ?? l.name, limits.filter((x) => x.locationId === l.id)))
        .sort((a, b) => a.path.localeCompare(b.path, "en"));
      return { items, total: items.length };
    },
  }),
  route({
    method: "post",
    path: "/locations",
    summary: "Add a location",
    access: LIMIT_KEEPERS,
    body: locationInput,
    status: 201,
    output: one,
    handler: async ({ ctx, actor, body }) => ({ location: await present(ctx.ds, await createLocation(ctx, actor.id, body)) }),
  }),
  route({
    method: "patch",
    path: "/locations/:id",
    summary: "Change a location or its limits",
    access: LIMIT_KEEPERS,
    params: idParam,
    body: locationUpdate,
    output: one,
    handler: async ({ ctx, actor, params, body }) => ({ location: await present(ctx.ds, await updateLocation(ctx, actor.id, params.id, body)) }),
  }),
  route({
    method: "delete",
    path: "/locations/:id",
    summary: "Remove an empty location",
    access: LIMIT_KEEPERS,
    params: idParam,
    status: 204,
    handler: async ({ ctx, actor, params }) => {
      await removeLocation(ctx, actor.id, params.id);
    },
  }),
];

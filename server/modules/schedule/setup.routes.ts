/** Setups: everyone signed in reads them (the booking form offers them); the manager keeps them. */
import { z } from "zod";
import { idParam, pageOf } from "@shared/schemas/common";
import { setupDto, setupInput } from "@shared/schemas/setups";
import { route } from "../../http/route-table";
import { listSetups } from "./setup.queries";
import { removeSetup, saveSetup } from "./setup.commands";

const one = z.object({ setup: setupDto });

export const setupRoutes = [
  route({
    method: "get",
    path: "/setups",
    summary: "Named sets of instruments booked together",
    access: "signed_in",
    output: pageOf(setupDto),
    handler: async ({ ctx }) => {
      const items = await listSetups(ctx.ds);
      return { items, total: items.length };
    },
  }),
  route({
    method: "post",
    path: "/setups",
    summary: "Add a setup (at least two instruments)",
    access: ["manager"],
    body: setupInput,
    status: 201,
    output: one,
    handler: async ({ ctx, actor, body }) => ({ setup: await saveSetup(ctx, actor, body) }),
  }),
  route({
    method: "put",
    path: "/setups/:id",
    summary: "Replace a setup's name, description and instruments",
    access: ["manager"],
    params: idParam,
    body: setupInput,
    output: one,
    handler: async ({ ctx, actor, params, body }) => ({ setup: await saveSetup(ctx, actor, body, params.id) }),
  }),
  route({
    method: "delete",
    path: "/setups/:id",
    summary: "Remove a setup (bookings made with it keep their instruments)",
    access: ["manager"],
    params: idParam,
    status: 204,
    handler: async ({ ctx, actor, params }) => {
      await removeSetup(ctx, actor, params.id);
    },
  }),
];

/** Setups: named sets of instruments booked together. */
import { z } from "zod";
import { id } from "./common";

export const setupInput = z.object({
  name: z.string().trim().min(1, "Give the setup a name").max(120),
  description: z.string().trim().max(500).default(""),
  instrumentIds: z.array(id()).min(2, "A setup holds at least two instruments").max(10),
});
export type SetupInput = z.input<typeof setupInput>;
export type SetupParsed = z.output<typeof setupInput>;

export const setupDto = z.object({
  id: z.number(),
  name: z.string(),
  description: z.string(),
  instrumentIds: z.array(z.number()),
});
export type SetupDto = z.infer<typeof setupDto>;

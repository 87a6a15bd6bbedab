/**
 * The ion table as the API serves it (GET /api/ion-transfer/solvents, GET /api/ion-transfer/ions)
 * and the manager's additions (POST the same paths), each with the published source of its value.
 * Also the ions a Stockroom chemical gives when it dissolves (LiCl → Li+ + Cl−), kept on the chemical.
 */
import { z } from "zod";
import { ionCharge, ionSymbol } from "./ions";

const source = z
  .string({ message: "Name the published source of the value" })
  .trim()
  .min(10, "Name the published source (authors, journal, volume, year, page), at least 10 characters")
  .max(1000);

export const sourcedNumberDto = z.object({ value: z.number(), source: z.string() });

export const ionEntryDto = z.object({
  ion: z.string(),
  name: z.string(),
  charge: z.number(),
  standardPotential: sourcedNumberDto,
  diffusionAqueous: sourcedNumberDto.nullable(),
  diffusionOrganic: sourcedNumberDto.nullable(),
  /** True when the source was not re-read while the value was entered ("from memory"). */
  fromMemory: z.boolean(),
  /** "table": Phasebook's built-in table; "added": added by the manager. */
  origin: z.enum(["table", "added"]),
});
export type IonEntryDto = z.infer<typeof ionEntryDto>;

export const solventDto = z.object({
  id: z.string(),
  name: z.string(),
  aliases: z.array(z.string()),
  ionCount: z.number(),
  /** CAS number of the organic solvent, so a plan can find it in the Stockroom; null when unknown. */
  casNumber: z.string().nullable(),
  origin: z.enum(["table", "added"]),
  source: z.string().nullable(),
});
export type SolventDto = z.infer<typeof solventDto>;

export const solventsAnswer = z.object({ items: z.array(solventDto), conventions: z.array(z.string()) });
export const ionsQuery = z.object({ solvent: z.string().trim().min(1, "Name the solvent, e.g. dce").max(60).optional() });
export const ionsAnswer = z.object({ solvent: z.object({ id: z.string(), name: z.string() }), items: z.array(ionEntryDto) });

/** POST /api/ion-transfer/solvents (manager). */
export const addSolventInput = z.object({
  id: z
    .string({ message: "Give the solvent a short id, e.g. tft" })
    .trim()
    .toLowerCase()
    .regex(/^[a-z][a-z0-9-]{1,29}$/, "A short id of 2–30 lower-case letters, digits or '-', starting with a letter, e.g. tft"),
  name: z.string({ message: "Name the solvent" }).trim().min(2, "Name the solvent").max(120),
  aliases: z.array(z.string().trim().min(1).max(60)).max(10).default([]),
  casNumber: z.string().trim().max(20).nullable().default(null),
  source: source,
});
export type AddSolventInput = z.input<typeof addSolventInput>;

/** POST /api/ion-transfer/ions (manager): one ion's standard transfer potential for one solvent. */
export const addIonInput = z.object({
  solvent: z.string({ message: "Name the solvent, e.g. dce" }).trim().min(1, "Name the solvent, e.g. dce").max(60),
  ion: ionSymbol,
  name: z.string().trim().max(120).default(""),
  charge: ionCharge,
  standardPotentialV: z
    .number({ message: "Enter the standard transfer potential in volts" })
    .refine(Number.isFinite, "Enter a finite number")
    .min(-3, "The standard transfer potential must be between −3 V and +3 V")
    .max(3, "The standard transfer potential must be between −3 V and +3 V"),
  source,
  diffusionAqueousCm2PerS: z.number().gt(0, "A diffusion coefficient must be above zero").max(1e-2).nullable().default(null),
  diffusionOrganicCm2PerS: z.number().gt(0, "A diffusion coefficient must be above zero").max(1e-2).nullable().default(null),
});
export type AddIonInput = z.input<typeof addIonInput>;

/**
 * Storage limits by fire-code liquid class (see shared/domain/storage.ts): what the safety office
 * types for a location, and what the Safety review sends back per location. Each error names its
 * field, so the form can put it under the right control and the API can answer 400 with the path.
 */
import { z } from "zod";
import { LIMIT_VOLUME_UNITS, NFPA_CLASSES } from "../domain/storage";
import type { NfpaClass } from "../domain/hazards";

const classList = NFPA_CLASSES.join(", ");

export const nfpaClassSchema = z.enum(NFPA_CLASSES as [NfpaClass, ...NfpaClass[]], {
  message: `Choose a liquid class: one of ${classList}`,
});

export const storageLimitInput = z.object({
  classes: z
    .array(nfpaClassSchema, { message: `Choose the liquid classes the limit adds up (${classList})` })
    .min(1, "Choose at least one liquid class")
    .refine((list) => new Set(list).size === list.length, "Name each liquid class once"),
  maxVolume: z
    .number({ message: "Enter the largest volume allowed as a number" })
    .refine(Number.isFinite, "The largest volume must be a finite number")
    .positive("The largest volume must be above zero")
    .max(1e6, "The largest volume must be at most 1,000,000"),
  unit: z.enum(LIMIT_VOLUME_UNITS, { message: 'Give the volume\'s unit as "L" or "US gal"' }),
  includesCabinets: z.boolean({ message: "Say whether containers in approved cabinets inside count toward the limit" }),
  note: z.string().trim().max(1000, "Keep the note under 1000 characters").default(""),
});
export type StorageLimitInput = z.infer<typeof storageLimitInput>;

export const limitFinding = z.enum(["within", "over", "cannot_confirm"]);

export const LIMIT_FINDING_LABELS: Record<z.infer<typeof limitFinding>, string> = {
  within: "Within limit",
  over: "Over limit",
  cannot_confirm: "Cannot confirm: volume unknown",
};

const litresByClass = z.object({ IA: z.number(), IB: z.number(), IC: z.number(), II: z.number(), IIIA: z.number(), IIIB: z.number() });

export const storageLimitResultDto = z.object({
  id: z.number(),
  classes: z.array(nfpaClassSchema),
  maxLitres: z.number(),
  includesCabinets: z.boolean(),
  totalLitres: z.number(),
  finding: limitFinding,
});
export type StorageLimitResultDto = z.infer<typeof storageLimitResultDto>;

/** What GET /api/safety/locations adds to each location (issue 11's contract). */
export const locationClassTotals = z.object({
  litresByClass,
  unknownVolumeContainers: z.number().int().min(0),
  limits: z.array(storageLimitResultDto),
});
export type LocationClassTotals = z.infer<typeof locationClassTotals>;

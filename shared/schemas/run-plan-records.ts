/**
 * Run plans as records (issue 12): a plan is saved, attached to a booking of a potentiostat and
 * an interface cell, and reserves what it needs from the Stockroom. The electrolytes come from
 * chemicals on the shelf (their `ions`) or from the ion table by a salt's name ("BTPPA TB(C6F5)4").
 */
import { z } from "zod";
import { id, pageQuery } from "./common";
import { reservationDto } from "./stock";
import { phase, planAnalyteInput, planReferenceInput, runPlanPreviewDto } from "./run-plans";

const finite = (what: string) => z.number({ message: `Enter the ${what} as a number` }).refine(Number.isFinite, `The ${what} must be a finite number`);
const aboveZero = (what: string, max: number) => finite(what).gt(0, `The ${what} must be above zero`).max(max, `The ${what} must be at most ${max}`);

/** One supporting electrolyte of one phase: a chemical in stock, or a salt from the ion table by name. */
export const electrolyteInput = z
  .object({
    chemicalId: id("Choose a chemical from the Stockroom").optional(),
    salt: z.string().trim().min(1, "Name the salt, e.g. BTPPA TB(C6F5)4").max(60).optional(),
    molPerL: aboveZero("concentration", 10),
    purityPercent: finite("purity").gt(0, "The purity must be above 0 %").max(100, "The purity must be at most 100 %").optional(),
  })
  .superRefine((v, ctx) => {
    if ((v.chemicalId === undefined) === (v.salt === undefined)) {
      ctx.addIssue({ code: "custom", path: ["chemicalId"], message: "Choose a chemical from the Stockroom or name a salt from the ion table (one of the two)" });
    }
  });
export type ElectrolyteInput = z.input<typeof electrolyteInput>;

export const runPlanInput = z.object({
  title: z.string({ message: "Give the plan a title" }).trim().min(1, "Give the plan a title").max(200),
  solvent: z.string({ message: "Name the organic solvent, e.g. dce" }).trim().min(1, "Name the organic solvent, e.g. dce").max(60),
  temperatureC: finite("temperature").min(0, "The temperature must be between 0 and 100 °C").max(100, "The temperature must be between 0 and 100 °C").optional(),
  thresholdMolPerL: aboveZero("threshold concentration", 1).optional(),
  /** The interface cell whose record gives the area or radius and the fill volumes. */
  cellId: id("Choose an interface cell").nullable().optional(),
  interfaceAreaCm2: aboveZero("interface area", 1000).optional(),
  interfaceRadiusCm: aboveZero("interface radius", 10).optional(),
  aqueousVolumeMl: aboveZero("aqueous volume", 10_000).optional(),
  organicVolumeMl: aboveZero("organic volume", 10_000).optional(),
  scanRateVPerS: aboveZero("scan rate", 1000).optional(),
  aqueous: z.array(electrolyteInput).min(1, "Choose the aqueous supporting electrolyte").max(6),
  organic: z.array(electrolyteInput).min(1, "Choose the organic supporting electrolyte").max(6),
  analytes: z.array(planAnalyteInput).max(10).default([]),
  reference: planReferenceInput.optional(),
  notes: z.string().trim().max(2000).default(""),
});
export type RunPlanInput = z.input<typeof runPlanInput>;
export type RunPlanParsed = z.output<typeof runPlanInput>;

export const reserveInput = z.object({
  bookingId: id("Choose one of your bookings"),
  /** Which container to take each chemical from; the planner chooses where left out. */
  containers: z.array(z.object({ chemicalId: id(), containerId: id() })).max(20).default([]),
});
export type ReserveInput = z.input<typeof reserveInput>;

export const runPlanListQuery = pageQuery.extend({ bookingId: id().optional(), mine: z.enum(["true", "false"]).optional() });

export const RUN_PLAN_ACTIONS = ["see", "edit", "attach", "release"] as const;
export const runPlanAbilities = z.object(Object.fromEntries(RUN_PLAN_ACTIONS.map((a) => [a, z.boolean()])) as Record<(typeof RUN_PLAN_ACTIONS)[number], z.ZodBoolean>);
export type RunPlanAbilities = z.infer<typeof runPlanAbilities>;

export const weighLineDto = z.object({
  phase,
  role: z.enum(["solute", "solvent"]),
  chemicalId: z.number().nullable(),
  name: z.string(),
  molPerL: z.number().nullable(),
  volumeMl: z.number(),
  purityPercent: z.number().nullable(),
  molarMassGPerMol: z.number().nullable(),
  /** What to weigh (g) or measure (mL); null when Phasebook cannot say (no molar mass, not in stock). */
  amount: z.number().nullable(),
  unit: z.enum(["g", "mL"]),
  note: z.string(),
});
export type WeighLineDto = z.infer<typeof weighLineDto>;

export const stockLineDto = z.object({
  chemicalId: z.number(),
  name: z.string(),
  amount: z.number(),
  unit: z.string(),
  containerId: z.number().nullable(),
  containerUnit: z.string().nullable(),
  amountInContainerUnit: z.number().nullable(),
  freeInContainerUnit: z.number().nullable(),
  enough: z.boolean(),
  message: z.string(),
});
export type StockLineDto = z.infer<typeof stockLineDto>;

export const wasteDto = z.object({
  halogenated: z.boolean(),
  volumeMl: z.number().nullable(),
  containerId: z.number().nullable(),
  roomMl: z.number().nullable(),
  hasRoom: z.boolean().nullable(),
  message: z.string(),
});

export const planElectrolyteDto = z.object({
  phase,
  label: z.string(),
  chemicalId: z.number().nullable(),
  molPerL: z.number(),
  ions: z.array(z.object({ ion: z.string(), molPerL: z.number() })),
});

export const runPlanBookingDto = z.object({ id: z.number(), start: z.string(), end: z.string(), status: z.string(), instruments: z.array(z.string()) });
export const runPlanCellDto = z.object({
  id: z.number(),
  name: z.string(),
  interfaceAreaCm2: z.number().nullable(),
  interfaceRadiusCm: z.number().nullable(),
  aqueousFillMl: z.number().nullable(),
  organicFillMl: z.number().nullable(),
});

export const runPlanDto = z.object({
  id: z.number(),
  title: z.string(),
  authorId: z.number(),
  authorName: z.string(),
  createdAt: z.string(),
  updatedAt: z.string(),
  input: runPlanInput,
  booking: runPlanBookingDto.nullable(),
  cell: runPlanCellDto.nullable(),
  electrolytes: z.array(planElectrolyteDto),
  /** The computation; null with `problem` when the stored plan cannot be computed now (an ion no longer known). */
  preview: runPlanPreviewDto.nullable(),
  problem: z.string().nullable(),
  volumes: z.object({ aqueousMl: z.number().nullable(), organicMl: z.number().nullable() }),
  weighing: z.array(weighLineDto),
  stock: z.array(stockLineDto),
  waste: wasteDto,
  reservations: z.array(reservationDto),
  cautions: z.array(z.string()),
  abilities: runPlanAbilities,
});
export type RunPlanDto = z.infer<typeof runPlanDto>;

export const runPlanSummaryDto = z.object({
  id: z.number(),
  title: z.string(),
  authorName: z.string(),
  solvent: z.string(),
  bookingId: z.number().nullable(),
  cellName: z.string().nullable(),
  heldReservations: z.number(),
  createdAt: z.string(),
  abilities: runPlanAbilities,
});
export type RunPlanSummaryDto = z.infer<typeof runPlanSummaryDto>;

export const oneRunPlan = z.object({ runPlan: runPlanDto });

/**
 * Run plans' contract: POST /api/run-plans/preview and POST /api/run-plans/distribution
 * (issue 12). The schemas check shape and ranges, so a bad number answers 400 naming its field;
 * names the ion table must look up (solvent, ions) are checked by the domain, whose
 * IonTransferError the server answers 422 with the unknown names and the known ones.
 *
 * Wherever an ion is named, a custom one may be given inline instead by adding its charge and
 * standard transfer potential: { ion: "X+", charge: 1, standardPotentialV: -0.30, … }.
 */
import { z } from "zod";
import { ionCharge } from "./ions";
import type {
  DistributionAnswer,
  DistributionRequest,
  PreviewRunPlanInput,
  RunPlanPreview,
} from "../domain/ion-transfer/run-plan";

const finite = (what: string) =>
  z.number({ message: `Enter the ${what} as a number` }).refine(Number.isFinite, `The ${what} must be a finite number`);
const aboveZero = (what: string, max: number) =>
  finite(what).gt(0, `The ${what} must be above zero`).max(max, `The ${what} must be at most ${max}`);

/** mol/L: above zero; 10 mol/L is beyond any supporting electrolyte. */
const molPerL = (what = "concentration") => aboveZero(what, 10);
/** mol/L that may be zero (an ion present in only one phase of a distribution). */
const molPerLOrZero = (what: string) => finite(what).min(0, `The ${what} cannot be negative`).max(10, `The ${what} must be at most 10`);
const diffusion = (what: string) => aboveZero(what, 1e-2).optional();

const ionName = z
  .string({ message: "Name the ion, e.g. Li+ or TB(C6F5)4-" })
  .trim()
  .min(1, "Name the ion, e.g. Li+ or TB(C6F5)4-")
  .max(40, "An ion's name is at most 40 characters");

/** The fields that name an ion or define a custom one. */
const ionRefShape = {
  ion: ionName,
  charge: ionCharge.optional(),
  standardPotentialV: finite("standard transfer potential").min(-3, "The standard transfer potential must be between −3 V and +3 V").max(3, "The standard transfer potential must be between −3 V and +3 V").optional(),
};
const diffusionShape = {
  diffusionAqueousCm2PerS: diffusion("aqueous diffusion coefficient"),
  diffusionOrganicCm2PerS: diffusion("organic diffusion coefficient"),
};

/** A custom ion gives both its charge and its standard potential, or neither (a table ion). */
function customIonComplete(value: { charge?: number; standardPotentialV?: number }, ctx: z.RefinementCtx): void {
  if (value.charge !== undefined && value.standardPotentialV === undefined) {
    ctx.addIssue({ code: "custom", path: ["standardPotentialV"], message: "A custom ion needs its standard transfer potential (V) as well as its charge" });
  }
  if (value.standardPotentialV !== undefined && value.charge === undefined) {
    ctx.addIssue({ code: "custom", path: ["charge"], message: "A custom ion needs its charge as well as its standard transfer potential" });
  }
}

export const PHASES = ["aqueous", "organic"] as const;
export const phase = z.enum(PHASES, { message: 'Say "aqueous" or "organic"' });

export const planIonInput = z.object({ ...ionRefShape, ...diffusionShape, molPerL: molPerL() }).superRefine(customIonComplete);
export const planAnalyteInput = z
  .object({ ...ionRefShape, ...diffusionShape, molPerL: molPerL(), phase })
  .superRefine(customIonComplete);
export const planReferenceInput = z
  .object({ ...ionRefShape, ...diffusionShape, measuredHalfWaveV: finite("measured half-wave potential").min(-5).max(5) })
  .superRefine(customIonComplete);

const solventName = z.string({ message: "Name the organic solvent, e.g. dce" }).trim().min(1, "Name the organic solvent, e.g. dce").max(60);
const temperatureC = finite("temperature").min(0, "The temperature must be between 0 and 100 °C").max(100, "The temperature must be between 0 and 100 °C");

export const runPlanPreviewInput = z.object({
  solvent: solventName,
  temperatureC: temperatureC.optional(),
  thresholdMolPerL: aboveZero("threshold concentration", 1).optional(),
  aqueous: z.array(planIonInput).max(20, "At most 20 aqueous ions"),
  organic: z.array(planIonInput).max(20, "At most 20 organic ions"),
  analytes: z.array(planAnalyteInput).max(20, "At most 20 analytes").optional(),
  interfaceAreaCm2: aboveZero("interface area", 1000).optional(),
  interfaceRadiusCm: aboveZero("interface radius", 10).optional(),
  scanRateVPerS: aboveZero("scan rate", 1000).optional(),
  reference: planReferenceInput.optional(),
});
export type RunPlanPreviewInput = z.input<typeof runPlanPreviewInput>;
export type RunPlanPreviewParsed = z.output<typeof runPlanPreviewInput>;

export const distributionIonInput = z
  .object({ ...ionRefShape, aqueousMolPerL: molPerLOrZero("aqueous concentration"), organicMolPerL: molPerLOrZero("organic concentration") })
  .superRefine(customIonComplete)
  .refine((ion) => ion.aqueousMolPerL > 0 || ion.organicMolPerL > 0, {
    message: "Give the ion a concentration above zero in at least one phase",
    path: ["aqueousMolPerL"],
  });

export const distributionInput = z.object({
  solvent: solventName.optional(),
  temperatureC: temperatureC.optional(),
  aqueousVolumeMl: aboveZero("aqueous volume", 1e6),
  organicVolumeMl: aboveZero("organic volume", 1e6),
  ions: z.array(distributionIonInput).min(2, "List at least a cation and an anion").max(20, "At most 20 ions"),
});
export type DistributionInput = z.input<typeof distributionInput>;
export type DistributionParsed = z.output<typeof distributionInput>;

// ---------------------------------------------------------------- answers

const windowSide = z.enum(["negative", "positive"]);
const voltammogramPoint = z.object({ potentialV: z.number(), currentA: z.number() });

export const planEdgeDto = z.object({
  ion: z.string(),
  phase,
  charge: z.number(),
  molPerL: z.number(),
  standardPotentialV: z.number(),
  source: z.string(),
  edgeV: z.number(),
  edgeAppliedV: z.number().nullable(),
  side: windowSide,
  limiting: z.boolean(),
});

export const planWindowDto = z.object({
  negativeLimitV: z.number().nullable(),
  positiveLimitV: z.number().nullable(),
  widthV: z.number().nullable(),
  limitingNegative: z.string().nullable(),
  limitingPositive: z.string().nullable(),
  negativeLimitAppliedV: z.number().nullable(),
  positiveLimitAppliedV: z.number().nullable(),
  edges: z.array(planEdgeDto),
  notes: z.array(z.string()),
});

export const planAnalyteDto = z.object({
  ion: z.string(),
  phase,
  charge: z.number(),
  molPerL: z.number(),
  standardPotentialV: z.number(),
  source: z.string(),
  diffusionAqueousCm2PerS: z.number(),
  diffusionOrganicCm2PerS: z.number(),
  diffusionAqueousSource: z.string(),
  diffusionOrganicSource: z.string(),
  transfersTowards: windowSide,
  halfWavePotentialV: z.number(),
  appliedHalfWaveV: z.number().nullable(),
  insideWindow: z.boolean().nullable(),
  peakCurrentA: z.number().nullable(),
  steadyStateCurrentA: z.number().nullable(),
  suggestedCurrentRangeA: z.number().nullable(),
  voltammogram: z.array(voltammogramPoint).nullable(),
  notes: z.array(z.string()),
});

export const potentialScaleDto = z.object({
  referenceIon: z.string(),
  measuredHalfWaveV: z.number(),
  predictedHalfWaveV: z.number(),
  offsetV: z.number(),
});

export const runPlanPreviewDto = z.object({
  solvent: z.object({ id: z.string(), name: z.string() }),
  temperatureC: z.number(),
  thresholdMolPerL: z.number(),
  interfaceAreaCm2: z.number().nullable(),
  interfaceRadiusCm: z.number().nullable(),
  scanRateVPerS: z.number().nullable(),
  window: planWindowDto,
  analytes: z.array(planAnalyteDto),
  scale: potentialScaleDto.nullable(),
  suggestedCurrentRangeA: z.number().nullable(),
  conventions: z.array(z.string()),
  cautions: z.array(z.string()),
  notes: z.array(z.string()),
});
export type RunPlanPreviewDto = z.infer<typeof runPlanPreviewDto>;

export const distributionDto = z.object({
  galvaniPotentialV: z.number(),
  ions: z.array(z.object({ ion: z.string(), aqueousMolPerL: z.number(), organicMolPerL: z.number() })),
  notes: z.array(z.string()),
});
export type DistributionDto = z.infer<typeof distributionDto>;

// Compile-time checks that the contract and the domain agree in both directions: a parsed
// request is what the domain takes, and the domain's answer is what the DTO describes.
type Assignable<From extends To, To> = From;
type _PreviewInputFits = Assignable<RunPlanPreviewParsed, PreviewRunPlanInput>;
type _DistributionInputFits = Assignable<DistributionParsed, DistributionRequest>;
type _PreviewAnswerFits = Assignable<RunPlanPreview, RunPlanPreviewDto>;
type _DistributionAnswerFits = Assignable<DistributionAnswer, DistributionDto>;

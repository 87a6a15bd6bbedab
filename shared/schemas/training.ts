/** Training records and training requests. */
import { z } from "zod";
import { isoDateTime, pageQuery, id as idSchema, wholeNumber } from "./common";

const id = idSchema();

export const TRAINING_STATE_LABELS = { current: "Current", expiring: "Expiring", expired: "Expired", none: "Revoked" } as const;

export const grantTrainingInput = z.object({
  userId: id,
  instrumentId: id,
  /** null: never expires. */
  expiresAt: isoDateTime.nullable().default(null),
  afterHours: z.boolean().default(false),
  notes: z.string().trim().max(500).default(""),
});
export type GrantTrainingInput = z.input<typeof grantTrainingInput>;
export type GrantTrainingParsed = z.output<typeof grantTrainingInput>;

export const trainingListQuery = pageQuery.extend({
  userId: id.optional(),
  instrumentId: id.optional(),
  /** Only current records that expire within this many days. */
  expiringWithinDays: wholeNumber(1, 365, "number of days").optional(),
  includeRevoked: z.enum(["true", "false"]).transform((v) => v === "true").optional(),
  limit: wholeNumber(1, 1000, "limit").default(500),
});
export type TrainingListQuery = z.infer<typeof trainingListQuery>;

/** What the signed-in person may do to a training record (the training policy's answer). */
export const trainingAbilities = z.object({ view: z.boolean(), revoke: z.boolean() });

export const trainingDto = z.object({
  id: z.number(),
  userId: z.number(),
  userName: z.string(),
  userEmail: z.string(),
  instrumentId: z.number(),
  instrumentName: z.string(),
  grantedAt: z.string(),
  expiresAt: z.string().nullable(),
  afterHours: z.boolean(),
  revokedAt: z.string().nullable(),
  notes: z.string(),
  state: z.enum(["current", "expiring", "expired", "none"]),
  abilities: trainingAbilities,
});
export type TrainingDto = z.infer<typeof trainingDto>;

export const trainingRequestInput = z.object({
  instrumentId: id,
  note: z.string().trim().max(500).default(""),
});
export type TrainingRequestInput = z.input<typeof trainingRequestInput>;

export const closeTrainingRequestInput = z.object({ outcome: z.enum(["granted", "dismissed"]) });

export const trainingRequestDto = z.object({
  id: z.number(),
  userId: z.number(),
  userName: z.string(),
  instrumentId: z.number(),
  instrumentName: z.string(),
  note: z.string(),
  status: z.enum(["open", "granted", "dismissed"]),
  createdAt: z.string(),
  abilities: z.object({ view: z.boolean(), close: z.boolean() }),
});
export type TrainingRequestDto = z.infer<typeof trainingRequestDto>;

export const trainingRequestListQuery = z.object({ status: z.enum(["open", "granted", "dismissed"]).optional() });

/** POST /api/training/requests answers the new request's id and state. */
export const trainingRequestCreated = z.object({ request: z.object({ id: z.number(), status: z.literal("open"), instrumentId: z.number() }) });
/** POST /api/training/requests/:id/close answers the request's new state. */
export const trainingRequestClosed = z.object({ request: z.object({ id: z.number(), status: z.enum(["granted", "dismissed"]) }) });

/** Someone the manager may train: an active person with the member role. */
export const trainablePersonDto = z.object({ id: z.number(), name: z.string(), email: z.string() });
export type TrainablePersonDto = z.infer<typeof trainablePersonDto>;

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
});
export type TrainingRequestDto = z.infer<typeof trainingRequestDto>;

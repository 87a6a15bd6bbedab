/** Training records and requests → the DTOs of shared/schemas/training, with the viewer's abilities. */
import { trainingState } from "@shared/domain/booking-rules";
import type { TrainingDto, TrainingRequestDto } from "@shared/schemas/training";
import type { AuthUser } from "../../middleware/auth";
import { trainingPolicy, trainingRequestPolicy } from "./training.policy";
import type { TrainingRequestRow, TrainingRow } from "./training.queries";

export function presentTraining(r: TrainingRow, now: Date, viewer: AuthUser): TrainingDto {
  return {
    ...r,
    afterHours: Boolean(r.afterHours),
    state: trainingState({ expiresAt: r.expiresAt ? new Date(r.expiresAt) : null, revoked: r.revokedAt !== null }, now),
    abilities: trainingPolicy.abilities(viewer, r),
  };
}

export function presentTrainingRequest(r: TrainingRequestRow, viewer: AuthUser): TrainingRequestDto {
  return { ...r, abilities: trainingRequestPolicy.abilities(viewer, r) };
}

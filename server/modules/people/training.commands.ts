/**
 * Training records (grant, renew, revoke) and members' training requests. A grant closes the
 * person's open request for that instrument; every change is audited. The training policy
 * decides on each record.
 */
import { IsNull, type EntityManager } from "typeorm";
import type { GrantTrainingParsed } from "@shared/schemas/training";
import { Instrument, TrainingRecord, TrainingRequest, User } from "../../entities";
import { NotFound, RuleBroken } from "../../errors";
import { serialTransaction } from "../../db/serial";
import type { AuthUser } from "../../middleware/auth";
import { audit } from "../../core/audit";
import { enqueueMail } from "../../core/outbox";
import type { PeopleDeps } from "./people.deps";
import { managerEmails } from "./training.queries";
import { trainingAskPolicy, trainingPolicy, trainingRequestPolicy } from "./training.policy";

async function requireInstrument(em: EntityManager, id: number): Promise<Instrument> {
  const instrument = await em.findOneBy(Instrument, { id });
  if (!instrument) throw new RuleBroken("Unknown instrument.", [{ path: "instrumentId", message: "No such instrument" }]);
  return instrument;
}

/** Writes the grant: renews the person's live record on that instrument, or adds one. Answers its id and whether it was a renewal. */
async function writeGrant(em: EntityManager, now: Date, actor: AuthUser, input: GrantTrainingParsed): Promise<{ id: number; renewed: boolean }> {
  const fields = { grantedAt: now.toISOString(), expiresAt: input.expiresAt, afterHours: input.afterHours, notes: input.notes, grantedById: actor.id, expiryNoticeSentAt: null };
  const existing = await em.findOneBy(TrainingRecord, { userId: input.userId, instrumentId: input.instrumentId, revokedAt: IsNull() });
  if (existing) {
    await em.update(TrainingRecord, existing.id, fields);
    return { id: existing.id, renewed: true };
  }
  const res = await em.insert(TrainingRecord, { ...fields, userId: input.userId, instrumentId: input.instrumentId, revokedAt: null });
  return { id: res.identifiers[0].id as number, renewed: false };
}

/** Grants training, or renews the person's live record on that instrument; closes their open request and mails them. */
export async function grantTraining(deps: PeopleDeps, actor: AuthUser, input: GrantTrainingParsed): Promise<number> {
  return serialTransaction(deps.ds, async (em) => {
    const now = deps.now();
    const user = await em.findOneBy(User, { id: input.userId });
    if (!user) throw new RuleBroken("Unknown person.", [{ path: "userId", message: "No such person" }]);
    const instrument = await requireInstrument(em, input.instrumentId);
    if (input.expiresAt && new Date(input.expiresAt).getTime() <= now.getTime()) {
      throw new RuleBroken("The expiry must lie in the future.", [{ path: "expiresAt", message: "Choose a future date" }]);
    }
    const { id, renewed } = await writeGrant(em, now, actor, input);
    await audit(em, now, actor.id, renewed ? "training.renewed" : "training.granted", "training_record", id, {
      userId: input.userId,
      instrumentId: input.instrumentId,
      expiresAt: input.expiresAt,
      afterHours: input.afterHours,
    });
    const open = await em.findBy(TrainingRequest, { userId: input.userId, instrumentId: input.instrumentId, status: "open" });
    for (const r of open) await em.update(TrainingRequest, r.id, { status: "granted", closedAt: now.toISOString(), closedById: actor.id });
    await enqueueMail(em, now, {
      to: user.email,
      subject: `Training recorded: ${instrument.name}`,
      text: [
        `You are now trained on ${instrument.name}${input.afterHours ? ", with an after-hours endorsement" : ""}.`,
        input.expiresAt ? `The record expires on ${input.expiresAt.slice(0, 10)}.` : "The record does not expire.",
        `Book it: ${deps.config.PUBLIC_URL}/schedule`,
      ].join("\n"),
    });
    return id;
  });
}

/** Revokes a record; the reason replaces its notes and goes into the audit log. */
export async function revokeTraining(deps: PeopleDeps, actor: AuthUser, id: number, reason: string): Promise<void> {
  await serialTransaction(deps.ds, async (em) => {
    const now = deps.now();
    const rec = await em.findOneBy(TrainingRecord, { id });
    if (!rec) throw new NotFound("That training record");
    trainingPolicy.authorize(actor, "revoke", rec);
    await em.update(TrainingRecord, id, { revokedAt: now.toISOString(), notes: reason });
    await audit(em, now, actor.id, "training.revoked", "training_record", id, { userId: rec.userId, instrumentId: rec.instrumentId, reason });
  });
}

/** The signed-in person asks for training on an instrument; the managers are mailed. */
export async function askForTraining(deps: PeopleDeps, actor: AuthUser, instrumentId: number, note: string): Promise<number> {
  return serialTransaction(deps.ds, async (em) => {
    const now = deps.now();
    const instrument = await requireInstrument(em, instrumentId);
    const open = await em.findOneBy(TrainingRequest, { userId: actor.id, instrumentId, status: "open" });
    trainingAskPolicy.authorize(actor, "ask", { instrumentId, openRequestId: open?.id ?? null });
    const res = await em.insert(TrainingRequest, { userId: actor.id, instrumentId, note, status: "open", createdAt: now.toISOString(), closedAt: null, closedById: null });
    const rid = res.identifiers[0].id as number;
    await audit(em, now, actor.id, "training.requested", "training_request", rid, { instrumentId });
    for (const to of await managerEmails(em)) {
      await enqueueMail(em, now, {
        to,
        subject: `Training request: ${actor.name} on ${instrument.name}`,
        text: `${actor.name} asks for training on ${instrument.name}.${note ? `\nNote: ${note}` : ""}\nTraining records: ${deps.config.PUBLIC_URL}/training`,
      });
    }
    return rid;
  });
}

export async function closeTrainingRequest(deps: PeopleDeps, actor: AuthUser, id: number, outcome: "granted" | "dismissed"): Promise<void> {
  await serialTransaction(deps.ds, async (em) => {
    const now = deps.now();
    const r = await em.findOneBy(TrainingRequest, { id });
    if (!r) throw new NotFound("That training request");
    trainingRequestPolicy.authorize(actor, "close", r);
    await em.update(TrainingRequest, id, { status: outcome, closedAt: now.toISOString(), closedById: actor.id });
    await audit(em, now, actor.id, `training_request.${outcome}`, "training_request", id, { userId: r.userId, instrumentId: r.instrumentId });
  });
}

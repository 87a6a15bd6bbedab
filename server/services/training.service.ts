/**
 * Training records (grant, renew, revoke) and members' training requests. A grant closes the
 * person's open request for that instrument; every change is audited.
 */
import { IsNull, type DataSource } from "typeorm";
import { trainingState } from "@shared/domain/booking-rules";
import type { GrantTrainingParsed, TrainingDto, TrainingListQuery, TrainingRequestDto } from "@shared/schemas/training";
import { Instrument, TrainingRecord, TrainingRequest, User } from "../entities";
import { Conflict, NotFound, RuleBroken } from "../errors";
import { serialTransaction } from "../db/serial";
import { hasRole, type AuthUser } from "../middleware/auth";
import { audit } from "../core/audit";
import { enqueueMail } from "../core/outbox";

const DAY_MS = 24 * 3600 * 1000;

interface RecordRow {
  id: number;
  userId: number;
  userName: string;
  userEmail: string;
  instrumentId: number;
  instrumentName: string;
  grantedAt: string;
  expiresAt: string | null;
  afterHours: number;
  revokedAt: string | null;
  notes: string;
}

export function presentTraining(r: RecordRow, now: Date): TrainingDto {
  return {
    ...r,
    afterHours: Boolean(r.afterHours),
    state: trainingState({ expiresAt: r.expiresAt ? new Date(r.expiresAt) : null, revoked: r.revokedAt !== null }, now),
  };
}

export function createTrainingService(deps: { ds: DataSource; now: () => Date; publicUrl: string }) {
  const { ds } = deps;

  return {
    async list(viewer: AuthUser, q: TrainingListQuery): Promise<{ items: TrainingDto[]; total: number }> {
      const now = deps.now();
      const where: string[] = [];
      const args: unknown[] = [];
      // Members see their own records; managers everyone's.
      const userId = hasRole(viewer, "manager") ? q.userId : viewer.id;
      if (userId) {
        where.push("t.userId = ?");
        args.push(userId);
      }
      if (q.instrumentId) {
        where.push("t.instrumentId = ?");
        args.push(q.instrumentId);
      }
      if (!q.includeRevoked) where.push("t.revokedAt IS NULL");
      if (q.expiringWithinDays) {
        where.push("t.revokedAt IS NULL AND t.expiresAt IS NOT NULL AND t.expiresAt > ? AND t.expiresAt <= ?");
        args.push(now.toISOString(), new Date(now.getTime() + q.expiringWithinDays * DAY_MS).toISOString());
      }
      const clause = where.length ? `WHERE ${where.join(" AND ")}` : "";
      const rows: RecordRow[] = await ds.query(
        `SELECT t.id, t.userId, u.name AS userName, u.email AS userEmail, t.instrumentId, i.name AS instrumentName, t.grantedAt, t.expiresAt,
                t.afterHours, t.revokedAt, t.notes
         FROM training_records t JOIN users u ON u.id = t.userId JOIN instruments i ON i.id = t.instrumentId
         ${clause} ORDER BY COALESCE(t.expiresAt, '9999') ASC, u.name LIMIT ? OFFSET ?`,
        [...args, q.limit, q.offset],
      );
      const total = Number(
        (await ds.query(`SELECT COUNT(*) n FROM training_records t ${clause}`, args))[0].n,
      );
      return { items: rows.map((r) => presentTraining(r, now)), total };
    },

    /** Grants training, or renews the person's live record on that instrument. */
    async grant(actor: AuthUser, input: GrantTrainingParsed): Promise<number> {
      return serialTransaction(ds, async (em) => {
        const now = deps.now();
        const user = await em.findOneBy(User, { id: input.userId });
        if (!user) throw new RuleBroken("Unknown person.", [{ path: "userId", message: "No such person" }]);
        const instrument = await em.findOneBy(Instrument, { id: input.instrumentId });
        if (!instrument) throw new RuleBroken("Unknown instrument.", [{ path: "instrumentId", message: "No such instrument" }]);
        if (input.expiresAt && new Date(input.expiresAt).getTime() <= now.getTime()) {
          throw new RuleBroken("The expiry must lie in the future.", [{ path: "expiresAt", message: "Choose a future date" }]);
        }
        const existing = await em.findOneBy(TrainingRecord, { userId: input.userId, instrumentId: input.instrumentId, revokedAt: IsNull() });
        let id: number;
        if (existing) {
          await em.update(TrainingRecord, existing.id, {
            grantedAt: now.toISOString(),
            expiresAt: input.expiresAt,
            afterHours: input.afterHours,
            notes: input.notes,
            grantedById: actor.id,
            expiryNoticeSentAt: null,
          });
          id = existing.id;
        } else {
          const res = await em.insert(TrainingRecord, {
            userId: input.userId,
            instrumentId: input.instrumentId,
            grantedAt: now.toISOString(),
            expiresAt: input.expiresAt,
            afterHours: input.afterHours,
            revokedAt: null,
            grantedById: actor.id,
            notes: input.notes,
            expiryNoticeSentAt: null,
          });
          id = res.identifiers[0].id as number;
        }
        await audit(em, now, actor.id, existing ? "training.renewed" : "training.granted", "training_record", id, {
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
            `Book it: ${deps.publicUrl}/schedule`,
          ].join("\n"),
        });
        return id;
      });
    },

    async revoke(actor: AuthUser, id: number, reason: string): Promise<void> {
      await serialTransaction(ds, async (em) => {
        const now = deps.now();
        const rec = await em.findOneBy(TrainingRecord, { id });
        if (!rec) throw new NotFound("That training record");
        if (rec.revokedAt) throw new Conflict("This training record is already revoked.");
        await em.update(TrainingRecord, id, { revokedAt: now.toISOString(), notes: reason });
        await audit(em, now, actor.id, "training.revoked", "training_record", id, { userId: rec.userId, instrumentId: rec.instrumentId, reason });
      });
    },

    async get(id: number): Promise<TrainingDto> {
      const rows: RecordRow[] = await ds.query(
        `SELECT t.id, t.userId, u.name AS userName, u.email AS userEmail, t.instrumentId, i.name AS instrumentName, t.grantedAt, t.expiresAt,
                t.afterHours, t.revokedAt, t.notes
         FROM training_records t JOIN users u ON u.id = t.userId JOIN instruments i ON i.id = t.instrumentId WHERE t.id = ?`,
        [id],
      );
      if (!rows[0]) throw new NotFound("That training record");
      return presentTraining(rows[0], deps.now());
    },

    async requests(viewer: AuthUser, status?: string): Promise<TrainingRequestDto[]> {
      const where: string[] = [];
      const args: unknown[] = [];
      if (!hasRole(viewer, "manager")) {
        where.push("r.userId = ?");
        args.push(viewer.id);
      }
      if (status) {
        where.push("r.status = ?");
        args.push(status);
      }
      return ds.query(
        `SELECT r.id, r.userId, u.name AS userName, r.instrumentId, i.name AS instrumentName, r.note, r.status, r.createdAt
         FROM training_requests r JOIN users u ON u.id = r.userId JOIN instruments i ON i.id = r.instrumentId
         ${where.length ? `WHERE ${where.join(" AND ")}` : ""} ORDER BY r.id DESC LIMIT 500`,
        args,
      );
    },

    async request(viewer: AuthUser, instrumentId: number, note: string): Promise<number> {
      return serialTransaction(ds, async (em) => {
        const now = deps.now();
        const instrument = await em.findOneBy(Instrument, { id: instrumentId });
        if (!instrument) throw new RuleBroken("Unknown instrument.", [{ path: "instrumentId", message: "No such instrument" }]);
        if (await em.findOneBy(TrainingRequest, { userId: viewer.id, instrumentId, status: "open" })) {
          throw new Conflict("You have already asked for training on this instrument.", "request_open");
        }
        const res = await em.insert(TrainingRequest, { userId: viewer.id, instrumentId, note, status: "open", createdAt: now.toISOString(), closedAt: null, closedById: null });
        const rid = res.identifiers[0].id as number;
        await audit(em, now, viewer.id, "training.requested", "training_request", rid, { instrumentId });
        const managers: { email: string }[] = await em.query(
          `SELECT u.email FROM users u JOIN user_roles r ON r.userId = u.id WHERE r.role = 'manager' AND u.active = 1`,
        );
        for (const m of managers) {
          await enqueueMail(em, now, {
            to: m.email,
            subject: `Training request: ${viewer.name} on ${instrument.name}`,
            text: `${viewer.name} asks for training on ${instrument.name}.${note ? `\nNote: ${note}` : ""}\nTraining records: ${deps.publicUrl}/training`,
          });
        }
        return rid;
      });
    },

    async closeRequest(actor: AuthUser, id: number, outcome: "granted" | "dismissed"): Promise<void> {
      await serialTransaction(ds, async (em) => {
        const now = deps.now();
        const r = await em.findOneBy(TrainingRequest, { id });
        if (!r) throw new NotFound("That training request");
        if (r.status !== "open") throw new Conflict("This request is already closed.");
        await em.update(TrainingRequest, id, { status: outcome, closedAt: now.toISOString(), closedById: actor.id });
        await audit(em, now, actor.id, `training_request.${outcome}`, "training_request", id, { userId: r.userId, instrumentId: r.instrumentId });
      });
    },
  };
}

export type TrainingService = ReturnType<typeof createTrainingService>;

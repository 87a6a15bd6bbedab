/**
 * Reads of training: the records (filtered, one page), one record, members' requests, the people
 * a manager may train and whom to tell of a request. Every SQL string that reads training lives here.
 */
import type { DataSource, EntityManager } from "typeorm";
import type { TrainablePersonDto, TrainingListQuery } from "@shared/schemas/training";
import { NotFound } from "../../errors";

const DAY_MS = 24 * 3600 * 1000;

/** A training record with its person's and instrument's names. */
export interface TrainingRow {
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

export interface TrainingRequestRow {
  id: number;
  userId: number;
  userName: string;
  instrumentId: number;
  instrumentName: string;
  note: string;
  status: "open" | "granted" | "dismissed";
  createdAt: string;
}

const RECORD_SELECT = `SELECT t.id, t.userId, u.name AS userName, u.email AS userEmail, t.instrumentId, i.name AS instrumentName, t.grantedAt, t.expiresAt,
        t.afterHours, t.revokedAt, t.notes
   FROM training_records t JOIN users u ON u.id = t.userId JOIN instruments i ON i.id = t.instrumentId`;

/**
 * Records soonest to expire first. `userId` is whose records the training policy lets the viewer
 * see (undefined: everyone's).
 */
export async function listTraining(ds: DataSource, now: Date, userId: number | undefined, q: TrainingListQuery): Promise<{ items: TrainingRow[]; total: number }> {
  const where: string[] = [];
  const args: unknown[] = [];
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
  const items: TrainingRow[] = await ds.query(`${RECORD_SELECT} ${clause} ORDER BY COALESCE(t.expiresAt, '9999') ASC, u.name LIMIT ? OFFSET ?`, [...args, q.limit, q.offset]);
  const total = Number((await ds.query(`SELECT COUNT(*) n FROM training_records t ${clause}`, args))[0].n);
  return { items, total };
}

export async function trainingRecord(ds: DataSource | EntityManager, id: number): Promise<TrainingRow> {
  const rows: TrainingRow[] = await ds.query(`${RECORD_SELECT} WHERE t.id = ?`, [id]);
  if (!rows[0]) throw new NotFound("That training record");
  return rows[0];
}

/** Newest first; `userId` as the training policy allows (undefined: everyone's). */
export function listTrainingRequests(ds: DataSource, userId: number | undefined, status?: string): Promise<TrainingRequestRow[]> {
  const where: string[] = [];
  const args: unknown[] = [];
  if (userId) {
    where.push("r.userId = ?");
    args.push(userId);
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
}

/** The people a manager may train: everyone active with the member role. */
export function trainablePeople(ds: DataSource): Promise<TrainablePersonDto[]> {
  return ds.query(
    `SELECT DISTINCT u.id, u.name, u.email FROM users u JOIN user_roles r ON r.userId = u.id WHERE r.role = 'member' AND u.active = 1 ORDER BY u.name`,
  );
}

/** Whom a training request is mailed to: the active managers. */
export async function managerEmails(em: EntityManager): Promise<string[]> {
  const rows: { email: string }[] = await em.query(`SELECT u.email FROM users u JOIN user_roles r ON r.userId = u.id WHERE r.role = 'manager' AND u.active = 1`);
  return rows.map((r) => r.email);
}

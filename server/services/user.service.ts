/**
 * People and their sign-in: credentials, roles, activation, password change and single-use
 * reset links. Deactivating a person or changing a password ends their other sessions.
 */
import crypto from "node:crypto";
import bcrypt from "bcryptjs";
import type { DataSource, EntityManager } from "typeorm";
import type { Role } from "@shared/schemas/auth";
import type { CreateUserInput, UpdateUserInput, UserListQuery } from "@shared/schemas/users";
import { PasswordReset, User, UserRole } from "../entities";
import { Conflict, NotFound, RuleBroken } from "../errors";
import { endSessionsOf } from "../auth/session-store";
import { audit } from "../core/audit";
import { enqueueMail } from "../core/outbox";
import { serialTransaction } from "../db/serial";
import { prepared } from "../db/prepared";
import { newToken } from "../core/tokens";
import type { AuthUser } from "../middleware/auth";

/** bcrypt cost; 10 or more as the foundation asks, 12 is common practice for interactive sign-in. */
export const BCRYPT_COST = 12;
const RESET_TTL_MS = 60 * 60 * 1000;
/** Compared against when the e-mail is unknown, so both failures take the same time. */
const DUMMY_HASH = bcrypt.hashSync("phasebook-timing-equaliser", BCRYPT_COST);

export interface UserServiceDeps {
  ds: DataSource;
  now: () => Date;
  publicUrl: string;
  facilityName?: string;
  bcryptCost?: number;
}

export function hashPassword(password: string, cost = BCRYPT_COST): Promise<string> {
  return bcrypt.hash(password, cost);
}

function sha256(s: string): string {
  return crypto.createHash("sha256").update(s).digest("hex");
}

export function createUserService(deps: UserServiceDeps) {
  const { ds, now } = deps;
  const cost = deps.bcryptCost ?? BCRYPT_COST;
  const users = () => ds.getRepository(User);

  async function findById(id: number): Promise<User | null> {
    return users().findOne({ where: { id } });
  }

  /**
   * The signed-in person of a session, read afresh on every request (so a deactivation or a role
   * change shows on the very next one) with one prepared statement: the TypeORM entity with its
   * eager roles cost several times the whole rest of a signed-in request. Null when unknown or
   * deactivated.
   */
  function signedIn(id: number): AuthUser | null {
    const row = prepared(
      ds,
      `SELECT u.id, u.email, u.name, u.active, u.groupId, u.organisation,
              (SELECT group_concat(r.role, ',') FROM user_roles r WHERE r.userId = u.id) AS roles,
              (SELECT group_concat(g.id, ',') FROM research_groups g WHERE g.leadId = u.id) AS leadOf
         FROM users u WHERE u.id = ?`,
    ).get(id) as { id: number; email: string; name: string; active: number; groupId: number | null; organisation: string | null; roles: string | null; leadOf: string | null } | undefined;
    if (!row || !row.active) return null;
    return {
      id: row.id,
      email: row.email,
      name: row.name,
      roles: (row.roles ? (row.roles.split(",") as Role[]) : []).sort(),
      groupId: row.groupId,
      leadOf: row.leadOf ? row.leadOf.split(",").map(Number) : [],
      organisation: row.organisation,
    };
  }

  /** The person for these credentials, or null; unknown e-mail and wrong password look alike. */
  async function verifyCredentials(email: string, password: string): Promise<User | null> {
    const user = await users().findOne({ where: { email: email.trim().toLowerCase() } });
    const ok = await bcrypt.compare(password, user?.passwordHash ?? DUMMY_HASH);
    if (!user || !ok || !user.active) return null;
    return user;
  }

  async function list(q: UserListQuery): Promise<{ items: User[]; total: number }> {
    const qb = users().createQueryBuilder("u").leftJoinAndSelect("u.roleRows", "r").orderBy("u.name", "ASC");
    if (q.q) qb.where("(u.name LIKE :q OR u.email LIKE :q)", { q: `%${q.q}%` });
    const [items, total] = await qb.skip(q.offset).take(q.limit).getManyAndCount();
    return { items, total };
  }

  async function setRoles(em: EntityManager, userId: number, roles: Role[]): Promise<void> {
    await em.delete(UserRole, { userId });
    await em.insert(
      UserRole,
      [...new Set(roles)].map((role) => ({ userId, role })),
    );
  }

  async function create(actorId: number | null, input: CreateUserInput): Promise<User> {
    const passwordHash = await hashPassword(input.password ?? newToken(), cost);
    const id = await serialTransaction(ds, async (em) => {
      const exists = await em.findOne(User, { where: { email: input.email } });
      if (exists) throw new Conflict("Someone with this e-mail address already has an account.", "email_taken");
      const t = now().toISOString();
      const res = await em.insert(User, {
        email: input.email,
        name: input.name,
        passwordHash,
        active: true,
        departmentId: input.departmentId ?? null,
        groupId: input.groupId ?? null,
        calendarToken: newToken(24),
        createdAt: t,
        updatedAt: t,
      });
      const userId = res.identifiers[0].id as number;
      await setRoles(em, userId, input.roles);
      await audit(em, now(), actorId, "user.created", "user", userId, { email: input.email, roles: input.roles });
      if (!input.password) await issueReset(em, userId, input.email, "welcome");
      return userId;
    });
    return (await findById(id))!;
  }

  async function update(actorId: number, id: number, input: UpdateUserInput): Promise<User> {
    await serialTransaction(ds, async (em) => {
      const user = await em.findOne(User, { where: { id } });
      if (!user) throw new NotFound("That person");
      if (actorId === id && input.active === false) {
        throw new RuleBroken("You cannot deactivate your own account.", [{ path: "active", message: "Ask another administrator." }]);
      }
      if (actorId === id && input.roles && !input.roles.includes("admin") && user.roles.includes("admin")) {
        throw new RuleBroken("You cannot remove your own administrator role.", [{ path: "roles", message: "Ask another administrator." }]);
      }
      const patch: { updatedAt: string; name?: string; active?: boolean; departmentId?: number | null; groupId?: number | null } = { updatedAt: now().toISOString() };
      if (input.name !== undefined) patch.name = input.name;
      if (input.active !== undefined) patch.active = input.active;
      if (input.departmentId !== undefined) patch.departmentId = input.departmentId;
      if (input.groupId !== undefined) patch.groupId = input.groupId;
      await em.update(User, id, patch);
      if (input.roles) await setRoles(em, id, input.roles);
      await audit(em, now(), actorId, input.active === false ? "user.deactivated" : "user.updated", "user", id, { ...input });
    });
    if (input.active === false) await endSessionsOf(ds, id);
    return (await findById(id))!;
  }

  async function changePassword(userId: number, current: string, next: string, keepSid?: string): Promise<void> {
    const user = await findById(userId);
    if (!user) throw new NotFound("That person");
    if (!(await bcrypt.compare(current, user.passwordHash))) {
      throw new RuleBroken("The current password is not right.", [{ path: "currentPassword", message: "This is not your current password." }]);
    }
    const passwordHash = await hashPassword(next, cost);
    await serialTransaction(ds, async (em) => {
      await em.update(User, userId, { passwordHash, updatedAt: now().toISOString() });
      await audit(em, now(), userId, "user.password_changed", "user", userId);
    });
    await endSessionsOf(ds, userId, keepSid);
  }

  async function issueReset(em: EntityManager, userId: number, email: string, kind: "reset" | "welcome"): Promise<void> {
    const token = newToken();
    const t = now();
    await em.insert(PasswordReset, {
      userId,
      tokenHash: sha256(token),
      expiresAt: new Date(t.getTime() + RESET_TTL_MS).toISOString(),
      usedAt: null,
      createdAt: t.toISOString(),
    });
    const link = `${deps.publicUrl}/reset-password/${token}`;
    await enqueueMail(em, t, {
      to: email,
      subject: kind === "welcome" ? "Your Phasebook account: choose a password" : "Reset your Phasebook password",
      text:
        (kind === "welcome"
          ? `An account has been made for you in Phasebook, the ${deps.facilityName ?? "facility"}'s booking and stock portal.\n\n`
          : "Someone (hopefully you) asked to reset your Phasebook password.\n\n") +
        `Choose a password here within the next hour:\n${link}\n\nThe link works once. If you did not ask for this, ignore this mail.`,
    });
  }

  /** Always succeeds from the caller's view, so the answer does not reveal who has an account. */
  async function requestReset(email: string): Promise<void> {
    const user = await users().findOne({ where: { email: email.toLowerCase() } });
    if (!user || !user.active) return;
    await serialTransaction(ds, (em) => issueReset(em, user.id, user.email, "reset"));
  }

  async function confirmReset(token: string, newPassword: string): Promise<void> {
    const passwordHash = await hashPassword(newPassword, cost);
    const userId = await serialTransaction(ds, async (em) => {
      const row = await em.findOne(PasswordReset, { where: { tokenHash: sha256(token) } });
      const t = now();
      if (!row || row.usedAt || new Date(row.expiresAt) <= t) {
        throw new RuleBroken("This reset link has expired or was already used; ask for a new one.", [
          { path: "token", message: "Expired or already used." },
        ], "reset_link_invalid");
      }
      await em.update(PasswordReset, row.id, { usedAt: t.toISOString() });
      await em.update(User, row.userId, { passwordHash, updatedAt: t.toISOString() });
      await audit(em, t, row.userId, "user.password_reset", "user", row.userId);
      return row.userId;
    });
    await endSessionsOf(ds, userId);
  }

  return { findById, signedIn, verifyCredentials, list, create, update, changePassword, requestReset, confirmReset };
}

export type UserService = ReturnType<typeof createUserService>;

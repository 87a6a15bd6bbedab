/**
 * Passwords: checking credentials at sign-in, a person changing their own, and single-use reset
 * links by e-mail (also the welcome mail of a new account).
 *
 * Following OWASP's Authentication and Forgot Password Cheat Sheets and NIST SP 800-63B:
 * - an unknown e-mail is compared against a stand-in hash of the configured cost, a known one
 *   against its own hash: one bcrypt comparison of the same cost either way (a stored hash of
 *   another cost is made again at the configured cost on its next successful sign-in, OWASP
 *   Password Storage Cheat Sheet, "Upgrading the work factor");
 * - a new password passes password-rules.ts (§5.1.1.2);
 * - a successful change or reset ends every other reset link of the person and mails them a
 *   notice; a change ends their other sessions (the one making it stays signed in, on a new
 *   session id), a reset ends all of them (OWASP Session Management Cheat Sheet, "Renew the
 *   Session ID After Any Privilege Level Change" and "Automatic Session Expiration").
 */
import crypto from "node:crypto";
import type { DataSource, EntityManager } from "typeorm";
import type { ChangePasswordInput, ResetConfirmInput } from "@shared/schemas/auth";
import { PasswordReset, User } from "../../entities";
import { NotFound, RuleBroken } from "../../errors";
import { serialTransaction } from "../../db/serial";
import { audit } from "../../core/audit";
import { enqueueMail } from "../../core/outbox";
import { newToken } from "../../core/tokens";
import { BCRYPT_COST, checkPassword, hashPassword, type PasswordCheck } from "../../core/passwords";
import type { AuthUser } from "../../middleware/auth";
import type { PeopleDeps } from "./people.deps";
import { checkNewPassword } from "./password-rules";
import { endSessionsOf } from "./session-store";
import { findUser, findUserByEmail } from "./user.queries";

export { hashPassword };

const RESET_TTL_MS = 60 * 60 * 1000;

function sha256(s: string): string {
  return crypto.createHash("sha256").update(s).digest("hex");
}

export interface CredentialsVerdict {
  /** The person, when the password is right and they may sign in. */
  user: User | null;
  /** The bcrypt work done: which hash was compared, at which cost. */
  check: PasswordCheck;
}

/**
 * The person for these credentials, or null; an unknown e-mail, a wrong password and a
 * deactivated account look alike and cost the same comparison.
 */
export async function checkCredentials(deps: { ds: DataSource; bcryptCost?: number }, email: string, password: string): Promise<CredentialsVerdict> {
  const cost = deps.bcryptCost ?? BCRYPT_COST;
  const user = await findUserByEmail(deps.ds, email);
  const check = await checkPassword(password, user?.passwordHash ?? null, cost);
  if (!user || !check.ok || !user.active) return { user: null, check };
  if (check.rehash) {
    const passwordHash = await hashPassword(password, cost);
    // Only if the hash is still the one just checked: a change made meanwhile wins.
    await deps.ds.query(`UPDATE users SET passwordHash = ? WHERE id = ? AND passwordHash = ?`, [passwordHash, user.id, user.passwordHash]);
  }
  return { user, check };
}

/** Marks every unused reset link of the person used: after a change or a reset none of them works. */
async function endResetLinks(em: EntityManager, userId: number, at: Date): Promise<void> {
  await em.query(`UPDATE password_resets SET usedAt = ? WHERE userId = ? AND usedAt IS NULL`, [at.toISOString(), userId]);
}

/** Tells the person their password changed, so a change they did not make does not go unnoticed. */
async function mailChangeNotice(em: EntityManager, deps: PeopleDeps, email: string, how: "changed" | "reset", at: Date): Promise<void> {
  await enqueueMail(em, at, {
    to: email,
    subject: "Your Phasebook password was changed",
    text:
      `The password of your Phasebook account (${email}) was ${how === "reset" ? "set through a reset link" : "changed"} at ${at.toISOString()} (UTC). ` +
      `${how === "reset" ? "Every session signed in with the old password has ended" : "Your other sessions have ended"}, and older reset links no longer work.\n\n` +
      `If this was not you, ask for a new password at once at ${deps.config.PUBLIC_URL}/forgot-password and tell the ${deps.config.FACILITY_NAME}'s administrator.`,
  });
}

/** The new password's rules, before any other work: a refusal costs no bcrypt and no attempt. */
export function checkNewPasswordOf(deps: PeopleDeps, email: string, newPassword: string, field = "newPassword"): void {
  checkNewPassword(newPassword, { email, facilityName: deps.config.FACILITY_NAME }, field);
}

/**
 * The signed-in person changes their own password; their other sessions and reset links end.
 * The caller then gives the session making the change a new id.
 */
export async function changePassword(deps: PeopleDeps, actor: AuthUser, input: ChangePasswordInput, keepSid?: string): Promise<void> {
  const user = await findUser(deps.ds, actor.id);
  if (!user) throw new NotFound("That person");
  checkNewPasswordOf(deps, user.email, input.newPassword);
  const current = await checkPassword(input.currentPassword, user.passwordHash, deps.bcryptCost ?? BCRYPT_COST);
  if (!current.ok) {
    throw new RuleBroken("The current password is not right.", [{ path: "currentPassword", message: "This is not your current password." }], "current_password_wrong");
  }
  const passwordHash = await hashPassword(input.newPassword, deps.bcryptCost);
  await serialTransaction(deps.ds, async (em) => {
    const t = deps.now();
    await em.update(User, user.id, { passwordHash, updatedAt: t.toISOString() });
    await endResetLinks(em, user.id, t);
    await audit(em, t, user.id, "user.password_changed", "user", user.id);
    await mailChangeNotice(em, deps, user.email, "changed", t);
  });
  await endSessionsOf(deps.ds, user.id, keepSid);
}

/** Stores a single-use link (only its hash) and mails it: a reset, or a new account's welcome. */
export async function issueReset(em: EntityManager, deps: PeopleDeps, person: { id: number; email: string }, kind: "reset" | "welcome"): Promise<void> {
  const token = newToken();
  const t = deps.now();
  await em.insert(PasswordReset, {
    userId: person.id,
    tokenHash: sha256(token),
    expiresAt: new Date(t.getTime() + RESET_TTL_MS).toISOString(),
    usedAt: null,
    createdAt: t.toISOString(),
  });
  const link = `${deps.config.PUBLIC_URL}/reset-password/${token}`;
  await enqueueMail(em, t, {
    to: person.email,
    subject: kind === "welcome" ? "Your Phasebook account: choose a password" : "Reset your Phasebook password",
    text:
      (kind === "welcome"
        ? `An account has been made for you in Phasebook, the ${deps.config.FACILITY_NAME}'s booking and stock portal.\n\n`
        : "Someone (hopefully you) asked to reset your Phasebook password.\n\n") +
      `Choose a password here within the next hour:\n${link}\n\nThe link works once. If you did not ask for this, ignore this mail.`,
  });
}

/** Always succeeds from the caller's view, so the answer does not reveal who has an account. */
export async function requestReset(deps: PeopleDeps, email: string): Promise<void> {
  const user = await findUserByEmail(deps.ds, email);
  if (!user || !user.active) return;
  await serialTransaction(deps.ds, (em) => issueReset(em, deps, user, "reset"));
}

const linkInvalid = () =>
  new RuleBroken("This reset link has expired or was already used; ask for a new one.", [{ path: "token", message: "Expired or already used." }], "reset_link_invalid");

/** Sets the password from a reset link; every other link and every session of the person end. */
export async function confirmReset(deps: PeopleDeps, input: ResetConfirmInput): Promise<void> {
  const tokenHash = sha256(input.token);
  const usable = (row: PasswordReset | null): row is PasswordReset => !!row && !row.usedAt && new Date(row.expiresAt) > deps.now();
  const link = await deps.ds.getRepository(PasswordReset).findOne({ where: { tokenHash } });
  if (!usable(link)) throw linkInvalid();
  const person = await findUser(deps.ds, link.userId);
  if (!person) throw linkInvalid();
  checkNewPasswordOf(deps, person.email, input.newPassword);
  const passwordHash = await hashPassword(input.newPassword, deps.bcryptCost);
  await serialTransaction(deps.ds, async (em) => {
    // Again inside the transaction: two uses of one link at once must not both succeed.
    const row = await em.findOne(PasswordReset, { where: { tokenHash } });
    if (!usable(row)) throw linkInvalid();
    const t = deps.now();
    await em.update(User, row.userId, { passwordHash, updatedAt: t.toISOString() });
    await endResetLinks(em, row.userId, t);
    await audit(em, t, row.userId, "user.password_reset", "user", row.userId);
    await mailChangeNotice(em, deps, person.email, "reset", t);
  });
  await endSessionsOf(deps.ds, person.id);
}

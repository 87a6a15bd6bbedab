/**
 * Passwords: checking credentials at sign-in, a person changing their own, and single-use reset
 * links by e-mail (also the welcome mail of a new account). A changed or reset password ends the
 * person's other sessions.
 */
import crypto from "node:crypto";
import bcrypt from "bcryptjs";
import type { DataSource, EntityManager } from "typeorm";
import type { ChangePasswordInput, ResetConfirmInput } from "@shared/schemas/auth";
import { PasswordReset, User } from "../../entities";
import { NotFound, RuleBroken } from "../../errors";
import { serialTransaction } from "../../db/serial";
import { audit } from "../../core/audit";
import { enqueueMail } from "../../core/outbox";
import { newToken } from "../../core/tokens";
import { BCRYPT_COST, hashPassword } from "../../core/passwords";

export { BCRYPT_COST, hashPassword };
import type { AuthUser } from "../../middleware/auth";
import type { PeopleDeps } from "./people.deps";
import { endSessionsOf } from "./session-store";
import { findUser, findUserByEmail } from "./user.queries";

const RESET_TTL_MS = 60 * 60 * 1000;
/** Compared against when the e-mail is unknown, so both failures take the same time. */
const DUMMY_HASH = bcrypt.hashSync("phasebook-timing-equaliser", BCRYPT_COST);

function sha256(s: string): string {
  return crypto.createHash("sha256").update(s).digest("hex");
}

/** The person for these credentials, or null; unknown e-mail and wrong password look alike. */
export async function verifyCredentials(ds: DataSource, email: string, password: string): Promise<User | null> {
  const user = await findUserByEmail(ds, email);
  const ok = await bcrypt.compare(password, user?.passwordHash ?? DUMMY_HASH);
  if (!user || !ok || !user.active) return null;
  return user;
}

/** The signed-in person changes their own password; their other sessions end, this one stays. */
export async function changePassword(deps: PeopleDeps, actor: AuthUser, input: ChangePasswordInput, keepSid?: string): Promise<void> {
  const user = await findUser(deps.ds, actor.id);
  if (!user) throw new NotFound("That person");
  if (!(await bcrypt.compare(input.currentPassword, user.passwordHash))) {
    throw new RuleBroken("The current password is not right.", [{ path: "currentPassword", message: "This is not your current password." }]);
  }
  const passwordHash = await hashPassword(input.newPassword, deps.bcryptCost);
  await serialTransaction(deps.ds, async (em) => {
    await em.update(User, user.id, { passwordHash, updatedAt: deps.now().toISOString() });
    await audit(em, deps.now(), user.id, "user.password_changed", "user", user.id);
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

export async function confirmReset(deps: PeopleDeps, input: ResetConfirmInput): Promise<void> {
  const passwordHash = await hashPassword(input.newPassword, deps.bcryptCost);
  const userId = await serialTransaction(deps.ds, async (em) => {
    const row = await em.findOne(PasswordReset, { where: { tokenHash: sha256(input.token) } });
    const t = deps.now();
    if (!row || row.usedAt || new Date(row.expiresAt) <= t) {
      throw new RuleBroken("This reset link has expired or was already used; ask for a new one.", [{ path: "token", message: "Expired or already used." }], "reset_link_invalid");
    }
    await em.update(PasswordReset, row.id, { usedAt: t.toISOString() });
    await em.update(User, row.userId, { passwordHash, updatedAt: t.toISOString() });
    await audit(em, t, row.userId, "user.password_reset", "user", row.userId);
    return row.userId;
  });
  await endSessionsOf(deps.ds, userId);
}

/**
 * The first administrator (and anyone else) from the command line: a person with their roles
 * and no usable password, plus a one-time link to choose one. The link is the password-reset
 * link: a row in password_resets with the sha256 of a random token and an expiry, the same
 * rows the reset flow writes, so POST /api/auth/password-reset/confirm with the token sets the
 * password. Depends on entities and core only, so it works while the People area moves.
 */
import crypto from "node:crypto";
import { z } from "zod";
import type { DataSource } from "typeorm";
import { createUserInput } from "@shared/schemas/users";
import { PasswordReset, User, UserRole } from "../entities";
import { audit } from "../core/audit";
import { newToken } from "../core/tokens";
import { hashPassword } from "../core/passwords";
import { Refusal } from "./cli";

export const newPersonInput = createUserInput.pick({ email: true, name: true, roles: true }).extend({
  /** How long the link works; a first administrator may need a day to get to it. */
  validHours: z.number().int().min(1, "at least 1 hour").max(24 * 14, "at most 14 days"),
});
export type NewPersonInput = z.input<typeof newPersonInput>;

export interface CreatedPerson {
  userId: number;
  email: string;
  roles: string[];
  /** The one-time link to choose a password: PUBLIC_URL/reset-password/<token>. */
  link: string;
  token: string;
  expiresAt: string;
}

export async function createPersonWithLink(ds: DataSource, raw: NewPersonInput, opts: { now: Date; publicUrl: string }): Promise<CreatedPerson> {
  const parsed = newPersonInput.safeParse(raw);
  if (!parsed.success) {
    const option: Record<string, string> = { email: "--email", name: "--name", roles: "--role", validHours: "--valid-hours" };
    const what = parsed.error.issues.map((i) => `${option[String(i.path[0])] ?? String(i.path[0])}: ${i.message}`).join("; ");
    throw new Refusal(`Nobody was created: ${what}.`, 2);
  }
  const input = parsed.data;
  const roles = [...new Set(input.roles)].sort();
  // Nobody knows this password: the person signs in only after choosing one through the link.
  // The configured cost (core/passwords.ts), as every stored hash: a wrong guess costs the same.
  const passwordHash = await hashPassword(newToken(32));
  const token = newToken();
  const at = opts.now.toISOString();
  const expiresAt = new Date(opts.now.getTime() + input.validHours * 3600_000).toISOString();
  const userId = await ds.transaction(async (em) => {
    if (await em.findOne(User, { where: { email: input.email } })) {
      throw new Refusal(`Someone with the e-mail address ${input.email} already has an account; nobody was created.`);
    }
    const res = await em.insert(User, {
      email: input.email,
      name: input.name,
      passwordHash,
      active: true,
      departmentId: null,
      groupId: null,
      organisation: null,
      calendarToken: newToken(24),
      createdAt: at,
      updatedAt: at,
    });
    const id = res.identifiers[0].id as number;
    await em.insert(
      UserRole,
      roles.map((role) => ({ userId: id, role })),
    );
    await em.insert(PasswordReset, {
      userId: id,
      tokenHash: crypto.createHash("sha256").update(token).digest("hex"),
      expiresAt,
      usedAt: null,
      createdAt: at,
    });
    await audit(em, opts.now, null, "user.created", "user", id, { email: input.email, roles, via: "command line" });
    return id;
  });
  return { userId, email: input.email, roles, token, link: `${opts.publicUrl}/reset-password/${token}`, expiresAt };
}

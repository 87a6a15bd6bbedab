/** Test data factories: each test makes the records it needs. */
import type { DataSource } from "typeorm";
import type { Role } from "@shared/schemas/auth";
import { User, UserRole } from "../../server/entities";
import { hashPassword } from "../../server/modules/people";
import { newToken } from "../../server/core/tokens";

export const TEST_PASSWORD = "correct-horse-battery";
let seq = 0;
let cachedHash: string | null = null;

export async function makeUser(
  ds: DataSource,
  opts: { roles?: Role[]; email?: string; name?: string; active?: boolean; password?: string; groupId?: number | null; organisation?: string | null } = {},
): Promise<User> {
  seq += 1;
  const passwordHash = opts.password ? await hashPassword(opts.password, 10) : (cachedHash ??= await hashPassword(TEST_PASSWORD, 10));
  const t = new Date().toISOString();
  const res = await ds.getRepository(User).insert({
    email: opts.email ?? `person${seq}-${Date.now()}@kestrelbay.example`,
    name: opts.name ?? `Test Person ${seq}`,
    passwordHash,
    active: opts.active ?? true,
    departmentId: null,
    groupId: opts.groupId ?? null,
    organisation: opts.organisation ?? null,
    calendarToken: newToken(24),
    createdAt: t,
    updatedAt: t,
  });
  const id = res.identifiers[0].id as number;
  await ds.getRepository(UserRole).insert((opts.roles ?? ["member"]).map((role) => ({ userId: id, role })));
  return (await ds.getRepository(User).findOneBy({ id }))!;
}

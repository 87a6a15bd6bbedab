/** Factories for Schedule tests: instruments with rules, accounts with members, training records. */
import type { DataSource } from "typeorm";
import { Account, AccountMember, Instrument, TrainingRecord } from "../../server/entities";
import { newToken } from "../../server/core/tokens";

let seq = 0;

export const OFFICE_HOURS = {
  mon: [{ from: "08:00", to: "18:00" }],
  tue: [{ from: "08:00", to: "18:00" }],
  wed: [{ from: "08:00", to: "18:00" }],
  thu: [{ from: "08:00", to: "18:00" }],
  fri: [{ from: "08:00", to: "18:00" }],
};

type InstrumentFields = Omit<Instrument, "bookableHours" | "location">;
type AccountFields = Omit<Account, "department" | "owner">;

export async function makeInstrument(ds: DataSource, over: Partial<InstrumentFields> & { bookableHours?: object } = {}): Promise<Instrument> {
  seq += 1;
  const { bookableHours, ...rest } = over;
  const res = await ds.getRepository(Instrument).insert({
    name: `Test instrument ${seq}-${Date.now()}`,
    kind: "interface_cell",
    status: "in_service",
    trainingRequired: true,
    requiresApproval: false,
    cleaningBufferMinutes: 0,
    minLeadMinutes: 0,
    maxLengthMinutes: 480,
    afterHoursAllowed: false,
    labelToken: newToken(24),
    createdAt: new Date().toISOString(),
    ...rest,
    bookableHours: JSON.stringify(bookableHours ?? OFFICE_HOURS),
  });
  return (await ds.getRepository(Instrument).findOneBy({ id: res.identifiers[0].id as number }))!;
}

export async function makeAccount(ds: DataSource, members: number[], over: Partial<AccountFields> = {}): Promise<Account> {
  seq += 1;
  const res = await ds.getRepository(Account).insert({
    code: `TEST-${seq}-${Date.now()}`,
    name: `Test account ${seq}`,
    kind: "internal",
    customerClass: "internal",
    departmentId: null,
    ownerId: null,
    validFrom: null,
    validTo: null,
    active: true,
    createdAt: new Date().toISOString(),
    ...over,
  });
  const id = res.identifiers[0].id as number;
  if (members.length) await ds.getRepository(AccountMember).insert(members.map((userId) => ({ accountId: id, userId, monthlyCapCents: null })));
  return (await ds.getRepository(Account).findOneBy({ id }))!;
}

export async function train(
  ds: DataSource,
  userId: number,
  instrumentId: number,
  opts: { expiresAt?: string | null; afterHours?: boolean; revokedAt?: string | null } = {},
): Promise<TrainingRecord> {
  const res = await ds.getRepository(TrainingRecord).insert({
    userId,
    instrumentId,
    grantedAt: "2026-01-01T00:00:00.000Z",
    expiresAt: opts.expiresAt === undefined ? "2028-01-01T00:00:00.000Z" : opts.expiresAt,
    afterHours: opts.afterHours ?? false,
    revokedAt: opts.revokedAt ?? null,
    grantedById: null,
    notes: "",
  });
  return (await ds.getRepository(TrainingRecord).findOneBy({ id: res.identifiers[0].id as number }))!;
}

/**
 * Reads of accounts: the list (members: what they may charge today; owners: theirs; the manager:
 * all), one account, who may charge it, and its adjustments. Whether the caller sees a record
 * and may act on it is the account policy's to say; every read here asks it.
 */
import { In, type DataSource, type EntityManager } from "typeorm";
import type { AccountDto, AccountMemberDto, AdjustmentDto } from "@shared/schemas/recharge";
import { Account, AccountMember, User } from "../../entities";
import { NotFound } from "../../errors";
import type { AuthUser } from "../../middleware/auth";
import { accountPolicy, listsAccount, type AccountWithMembership } from "./account.policy";
import { presentAccount, presentMember } from "./recharge.presenter";
import { facilityToday, type RechargeDeps } from "./recharge-deps";

type Membership = { monthlyCapCents: number | null; exceptionReason: string | null };

/** The account as its policy decides on it, with the actor's membership (and cap) on it. */
export interface AccountRecord extends AccountWithMembership {
  membership: Membership | null;
}

/** Active and within its validity dates on the given local date. */
export function isChargeable(a: Account, today: string): boolean {
  return a.active && (a.validFrom == null || a.validFrom <= today) && (a.validTo == null || today <= a.validTo);
}

/** The account as the policy sees it, with the actor's membership of it. */
export function accountRecord(a: Account, today: string, membership: Membership | null): AccountRecord {
  return {
    account: { id: a.id, code: a.code, kind: a.kind, organisation: a.organisation, ownerId: a.ownerId, chargeable: isChargeable(a, today) },
    membership,
  };
}

/** Every account the person is a member of, with their cap and any exception. */
async function membershipsOf(em: EntityManager, userId: number): Promise<Map<number, Membership>> {
  const rows = await em.getRepository(AccountMember).findBy({ userId });
  return new Map(rows.map((m) => [m.accountId, { monthlyCapCents: m.monthlyCapCents, exceptionReason: m.exceptionReason }]));
}

export async function membershipOf(em: EntityManager, accountId: number, userId: number): Promise<AccountMember | null> {
  return em.getRepository(AccountMember).findOneBy({ accountId, userId });
}

/** The account (404 when there is none) and the record its policy decides on, for this actor. */
export async function findAccount(em: EntityManager, actor: AuthUser, id: number, today: string): Promise<{ row: Account; record: AccountRecord }> {
  const row = await em.getRepository(Account).findOneBy({ id });
  if (!row) throw new NotFound("That account");
  const m = await membershipOf(em, id, actor.id);
  return { row, record: accountRecord(row, today, m ? { monthlyCapCents: m.monthlyCapCents, exceptionReason: m.exceptionReason } : null) };
}

/** The account, if the actor may see it (404 otherwise, as if it did not exist). */
export async function visibleAccount(em: EntityManager, actor: AuthUser, id: number, today: string): Promise<{ row: Account; record: AccountRecord }> {
  const found = await findAccount(em, actor, id, today);
  accountPolicy.authorize(actor, "view", found.record);
  return found;
}

/** Accounts as the actor sees them: owner names, the actor's own cap, and the abilities. */
export async function presentAccounts(em: EntityManager, actor: AuthUser, rows: { row: Account; record: AccountRecord }[]): Promise<AccountDto[]> {
  const ownerIds = [...new Set(rows.map((r) => r.row.ownerId).filter((x): x is number => x != null))];
  const owners = new Map<number, string>(ownerIds.length ? (await em.getRepository(User).findBy({ id: In(ownerIds) })).map((u) => [u.id, u.name]) : []);
  return rows.map(({ row, record }) =>
    presentAccount(row, {
      ownerName: row.ownerId == null ? null : (owners.get(row.ownerId) ?? null),
      chargeable: record.account.chargeable === true,
      myMembership: record.membership,
      abilities: accountPolicy.abilities(actor, record),
    }),
  );
}

/** GET /api/accounts: the manager every account, an owner theirs (open or closed), a member those they may charge today. */
export async function listAccounts(deps: RechargeDeps, actor: AuthUser, q: { limit: number; offset: number }): Promise<{ items: AccountDto[]; total: number }> {
  const em = deps.ds.manager;
  const today = facilityToday(deps);
  const all = await em.getRepository(Account).find({ order: { kind: "ASC", code: "ASC" } });
  const mine = await membershipsOf(em, actor.id);
  const visible = all.map((row) => ({ row, record: accountRecord(row, today, mine.get(row.id) ?? null) })).filter((r) => listsAccount(actor, r.record));
  return { items: await presentAccounts(em, actor, visible.slice(q.offset, q.offset + q.limit)), total: visible.length };
}

export async function getAccount(deps: RechargeDeps, actor: AuthUser, id: number): Promise<AccountDto> {
  const found = await visibleAccount(deps.ds.manager, actor, id, facilityToday(deps));
  return (await presentAccounts(deps.ds.manager, actor, [found]))[0];
}

/** One member of an account as the member list shows them; null when not a member. */
export async function memberOf(em: EntityManager, accountId: number, userId: number): Promise<AccountMemberDto | null> {
  const rows: Parameters<typeof presentMember>[0][] = await em.query(
    `SELECT m.userId AS userId, u.name AS name, u.email AS email, m.monthlyCapCents AS monthlyCapCents, m.exceptionReason AS exceptionReason
     FROM account_members m JOIN users u ON u.id = m.userId WHERE m.accountId = ? AND m.userId = ?`,
    [accountId, userId],
  );
  return rows.length ? presentMember(rows[0]) : null;
}

/** Who may charge the account, with their caps and any exception; for its group lead and the manager. */
export async function listMembers(deps: RechargeDeps, actor: AuthUser, id: number): Promise<AccountMemberDto[]> {
  const { record } = await visibleAccount(deps.ds.manager, actor, id, facilityToday(deps));
  accountPolicy.authorize(actor, "manageMembers", record);
  const rows: Parameters<typeof presentMember>[0][] = await deps.ds.query(
    `SELECT m.userId AS userId, u.name AS name, u.email AS email, m.monthlyCapCents AS monthlyCapCents, m.exceptionReason AS exceptionReason
     FROM account_members m JOIN users u ON u.id = m.userId WHERE m.accountId = ? ORDER BY u.name`,
    [id],
  );
  return rows.map(presentMember);
}

/** The manager's credits and charges on an account, newest first, with the final run that billed each. */
export async function listAdjustments(deps: RechargeDeps, actor: AuthUser, id: number): Promise<AdjustmentDto[]> {
  const { record } = await visibleAccount(deps.ds.manager, actor, id, facilityToday(deps));
  accountPolicy.authorize(actor, "adjust", record);
  return adjustmentsOf(deps.ds, id);
}

async function adjustmentsOf(ds: DataSource, id: number): Promise<AdjustmentDto[]> {
  const rows: Record<string, unknown>[] = await ds.query(
    `SELECT a.id, a.accountId, a.amountCents, a.reason, a.period, a.createdAt,
       (SELECT cl.runId FROM charge_lines cl JOIN billing_runs r ON r.id = cl.runId WHERE r.status = 'final' AND cl.adjustmentId = a.id LIMIT 1) AS billedRunId
     FROM billing_adjustments a WHERE a.accountId = ? ORDER BY a.id DESC`,
    [id],
  );
  return rows.map((r) => ({
    id: Number(r.id),
    accountId: Number(r.accountId),
    amountCents: Number(r.amountCents),
    reason: String(r.reason),
    period: String(r.period),
    createdAt: String(r.createdAt),
    billedRunId: r.billedRunId == null ? null : Number(r.billedRunId),
  }));
}

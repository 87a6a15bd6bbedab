/**
 * Billing accounts: who sees which (members: what they may charge; group leads: what they own;
 * the manager: all), who may charge an account and up to what monthly cap (decided by its owning
 * group lead, or the manager), and the manager's credits and adjustments.
 */
import type { DataSource } from "typeorm";
import { DateTime } from "luxon";
import type {
  AccountCreateInput,
  AccountDto,
  AccountMemberDto,
  AccountUpdateInput,
  AdjustmentDto,
  AdjustmentInput,
} from "@shared/schemas/recharge";
import { In } from "typeorm";
import { Account, AccountMember, BillingAdjustment, BillingRun, User } from "../../entities";
import { Conflict, NotFound, RuleBroken } from "../../errors";
import { serialTransaction } from "../../db/serial";
import { type AuthUser, hasRole } from "../../middleware/auth";
import { audit } from "../../core/audit";

export interface AccountsDeps {
  ds: DataSource;
  tz: string;
  now: () => Date;
}

export function createAccountsService(deps: AccountsDeps) {
  const { ds, tz } = deps;
  const today = () => DateTime.fromJSDate(deps.now(), { zone: tz }).toISODate()!;
  const currentPeriod = () => DateTime.fromJSDate(deps.now(), { zone: tz }).toFormat("yyyy-MM");

  function chargeable(a: Account): boolean {
    const d = today();
    return a.active && (a.validFrom == null || a.validFrom <= d) && (a.validTo == null || d <= a.validTo);
  }

  async function present(user: AuthUser, accounts: Account[]): Promise<AccountDto[]> {
    const ownerIds = [...new Set(accounts.map((a) => a.ownerId).filter((x): x is number => x != null))];
    const owners = new Map<number, string>(ownerIds.length ? (await ds.getRepository(User).findBy({ id: In(ownerIds) })).map((u) => [u.id, u.name]) : []);
    const mine = new Map((await ds.getRepository(AccountMember).findBy({ userId: user.id })).map((m) => [m.accountId, m.monthlyCapCents]));
    const manager = hasRole(user, "manager");
    return accounts.map((a) => ({
      id: a.id,
      code: a.code,
      name: a.name,
      kind: a.kind,
      customerClass: a.customerClass,
      departmentId: a.departmentId,
      ownerId: a.ownerId,
      ownerName: a.ownerId == null ? null : (owners.get(a.ownerId) ?? null),
      validFrom: a.validFrom,
      validTo: a.validTo,
      organisation: a.organisation,
      billingEmail: a.billingEmail,
      active: a.active,
      chargeable: chargeable(a),
      ...(mine.has(a.id) ? { myMonthlyCapCents: mine.get(a.id) ?? null } : {}),
      canManageMembers: manager || (a.ownerId === user.id && hasRole(user, "group_lead")),
    }));
  }

  /** The account, if the caller may manage who charges it (owner or manager); 404 otherwise. */
  async function manageable(user: AuthUser, id: number): Promise<Account> {
    const a = await ds.getRepository(Account).findOneBy({ id });
    if (!a || !(hasRole(user, "manager") || (a.ownerId === user.id && hasRole(user, "group_lead")))) throw new NotFound("That account");
    return a;
  }

  return {
    chargeable,

    /**
     * Members see the accounts they may charge today; group leads also those they own (open or
     * closed); the manager sees every account.
     */
    async list(user: AuthUser, q: { limit: number; offset: number }): Promise<{ items: AccountDto[]; total: number }> {
      const all = await ds.getRepository(Account).find({ order: { kind: "ASC", code: "ASC" } });
      let visible: Account[];
      if (hasRole(user, "manager")) visible = all;
      else {
        const memberOf = new Set((await ds.getRepository(AccountMember).findBy({ userId: user.id })).map((m) => m.accountId));
        const lead = hasRole(user, "group_lead");
        visible = all.filter((a) => (lead && a.ownerId === user.id) || (memberOf.has(a.id) && chargeable(a)));
      }
      return { items: await present(user, visible.slice(q.offset, q.offset + q.limit)), total: visible.length };
    },

    async get(user: AuthUser, id: number): Promise<AccountDto> {
      const a = await ds.getRepository(Account).findOneBy({ id });
      if (!a) throw new NotFound("That account");
      const member = (await ds.getRepository(AccountMember).countBy({ accountId: id, userId: user.id })) > 0;
      if (!(hasRole(user, "manager") || a.ownerId === user.id || member)) throw new NotFound("That account");
      return (await present(user, [a]))[0];
    },

    async create(actor: AuthUser, input: AccountCreateInput): Promise<AccountDto> {
      const a = await serialTransaction(ds, async (em) => {
        if (await em.findOne(Account, { where: { code: input.code } })) throw new Conflict(`An account with code ${input.code} exists.`, "code_taken");
        if (input.validFrom && input.validTo && input.validTo < input.validFrom) {
          throw new RuleBroken("The account must close after it opens.", [{ path: "validTo", message: "Close after it opens" }]);
        }
        const saved = await em.save(Account, {
          code: input.code,
          name: input.name,
          kind: input.kind,
          customerClass: input.kind === "internal" ? "internal" : input.customerClass,
          departmentId: input.departmentId ?? null,
          ownerId: input.ownerId ?? null,
          validFrom: input.validFrom ?? null,
          validTo: input.validTo ?? null,
          organisation: input.organisation ?? null,
          billingEmail: input.billingEmail ?? null,
          paymentCustomerId: null,
          active: true,
          createdAt: deps.now().toISOString(),
        });
        await audit(em, deps.now(), actor.id, "account.created", "account", saved.id, { ...input });
        return saved;
      });
      return (await present(actor, [a]))[0];
    },

    async update(actor: AuthUser, id: number, input: AccountUpdateInput): Promise<AccountDto> {
      const a = await serialTransaction(ds, async (em) => {
        const row = await em.findOne(Account, { where: { id } });
        if (!row) throw new NotFound("That account");
        const next = { ...row, ...Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined)) } as Account;
        if (next.validFrom && next.validTo && next.validTo < next.validFrom) {
          throw new RuleBroken("The account must close after it opens.", [{ path: "validTo", message: "Close after it opens" }]);
        }
        await em.save(Account, next);
        await audit(em, deps.now(), actor.id, "account.changed", "account", id, { ...input });
        return next;
      });
      return (await present(actor, [a]))[0];
    },

    async members(user: AuthUser, id: number): Promise<AccountMemberDto[]> {
      await manageable(user, id);
      const rows: AccountMemberDto[] = await ds.query(
        `SELECT m.userId AS userId, u.name AS name, u.email AS email, m.monthlyCapCents AS monthlyCapCents
         FROM account_members m JOIN users u ON u.id = m.userId WHERE m.accountId = ? ORDER BY u.name`,
        [id],
      );
      return rows.map((r) => ({ ...r, userId: Number(r.userId), monthlyCapCents: r.monthlyCapCents == null ? null : Number(r.monthlyCapCents) }));
    },

    async addMember(actor: AuthUser, id: number, email: string, monthlyCapCents: number | null): Promise<{ member: AccountMemberDto; created: boolean }> {
      const account = await manageable(actor, id);
      if (!chargeable(account)) {
        throw new RuleBroken("This account is closed or past its validity dates; nobody new may charge it.", [{ path: "accountId", message: "Account not valid today" }], "account_not_valid");
      }
      return serialTransaction(ds, async (em) => {
        const u = await em.findOne(User, { where: { email: email.toLowerCase() } });
        if (!u || !u.active) throw new NotFound("A person with that e-mail address");
        const existing = await em.findOne(AccountMember, { where: { accountId: id, userId: u.id } });
        await em.save(AccountMember, { accountId: id, userId: u.id, monthlyCapCents });
        await audit(em, deps.now(), actor.id, existing ? "account.member_changed" : "account.member_added", "account", id, { userId: u.id, monthlyCapCents });
        return { member: { userId: u.id, name: u.name, email: u.email, monthlyCapCents }, created: !existing };
      });
    },

    async updateMember(actor: AuthUser, id: number, userId: number, monthlyCapCents: number | null): Promise<AccountMemberDto> {
      await manageable(actor, id);
      return serialTransaction(ds, async (em) => {
        const m = await em.findOne(AccountMember, { where: { accountId: id, userId } });
        if (!m) throw new NotFound("That person on this account");
        await em.update(AccountMember, { accountId: id, userId }, { monthlyCapCents });
        await audit(em, deps.now(), actor.id, "account.member_changed", "account", id, { userId, monthlyCapCents });
        const u = await em.findOneOrFail(User, { where: { id: userId } });
        return { userId, name: u.name, email: u.email, monthlyCapCents };
      });
    },

    async removeMember(actor: AuthUser, id: number, userId: number): Promise<void> {
      await manageable(actor, id);
      await serialTransaction(ds, async (em) => {
        const r = await em.delete(AccountMember, { accountId: id, userId });
        if (!r.affected) throw new NotFound("That person on this account");
        await audit(em, deps.now(), actor.id, "account.member_removed", "account", id, { userId });
      });
    },

    /** A credit or charge with a reason; it lands on the first run for its month that is not final yet. */
    async addAdjustment(actor: AuthUser, id: number, input: AdjustmentInput): Promise<AdjustmentDto> {
      return serialTransaction(ds, async (em) => {
        const account = await em.findOne(Account, { where: { id } });
        if (!account) throw new NotFound("That account");
        let period = input.period ?? currentPeriod();
        // A final month is locked: the adjustment moves to the next month that is still open.
        const finals = new Set((await em.find(BillingRun, { where: { status: "final" } })).map((r) => r.period));
        while (finals.has(period)) period = DateTime.fromFormat(period, "yyyy-MM").plus({ months: 1 }).toFormat("yyyy-MM");
        const saved = await em.save(BillingAdjustment, {
          accountId: id,
          amountCents: input.amountCents,
          reason: input.reason,
          period,
          createdById: actor.id,
          createdAt: deps.now().toISOString(),
        });
        await audit(em, deps.now(), actor.id, "billing.adjustment_added", "account", id, { adjustmentId: saved.id, amountCents: input.amountCents, reason: input.reason, period });
        return { id: saved.id, accountId: id, amountCents: saved.amountCents, reason: saved.reason, period, createdAt: saved.createdAt, billedRunId: null };
      });
    },

    async adjustments(id: number): Promise<AdjustmentDto[]> {
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
    },
  };
}

export type AccountsService = ReturnType<typeof createAccountsService>;

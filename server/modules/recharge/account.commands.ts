/**
 * Changes to billing accounts: the manager opens and changes them and enters credits and
 * adjustments; the owning group lead (or the manager) decides who may charge an account and up
 * to what monthly cap. Each change is one serialised transaction that reads the account, asks
 * the account policy and writes, with its audit entry.
 */
import { DateTime } from "luxon";
import type { AccountCreateInput, AccountDto, AccountMemberDto, AccountMemberInput, AccountUpdateInput, AdjustmentDto, AdjustmentInput } from "@shared/schemas/recharge";
import { Account, AccountMember, BillingAdjustment, BillingRun, User } from "../../entities";
import { Conflict, NotFound, RuleBroken } from "../../errors";
import { serialTransaction } from "../../db/serial";
import { PolicyDenied } from "../../core/policy";
import type { AuthUser } from "../../middleware/auth";
import { audit } from "../../core/audit";
import { accountPolicy, admitMember } from "./account.policy";
import { accountRecord, memberOf, membershipOf, presentAccounts, visibleAccount } from "./account.queries";
import { facilityMonth, facilityToday, type RechargeDeps } from "./recharge-deps";

function checkDates(validFrom: string | null | undefined, validTo: string | null | undefined): void {
  if (validFrom && validTo && validTo < validFrom) {
    throw new RuleBroken("The account must close after it opens.", [{ path: "validTo", message: "Close after it opens" }]);
  }
}

/** POST /api/accounts (the manager; the route's role gate says so). */
export async function createAccount(deps: RechargeDeps, actor: AuthUser, input: AccountCreateInput): Promise<AccountDto> {
  return serialTransaction(deps.ds, async (em) => {
    if (await em.findOne(Account, { where: { code: input.code } })) throw new Conflict(`An account with code ${input.code} exists.`, "code_taken");
    checkDates(input.validFrom, input.validTo);
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
    return (await presentAccounts(em, actor, [{ row: saved, record: accountRecord(saved, facilityToday(deps), null) }]))[0];
  });
}

export async function updateAccount(deps: RechargeDeps, actor: AuthUser, id: number, input: AccountUpdateInput): Promise<AccountDto> {
  return serialTransaction(deps.ds, async (em) => {
    const today = facilityToday(deps);
    const { row, record } = await visibleAccount(em, actor, id, today);
    accountPolicy.authorize(actor, "edit", record);
    const next = { ...row, ...Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined)) } as Account;
    checkDates(next.validFrom, next.validTo);
    await em.save(Account, next);
    await audit(em, deps.now(), actor.id, "account.changed", "account", id, { ...input });
    return (await presentAccounts(em, actor, [{ row: next, record: accountRecord(next, today, record.membership) }]))[0];
  });
}

/**
 * Lets a person charge the account (or changes their cap when they already may). The person must
 * be of the account's organisation unless the manager states an exception (account policy's
 * admitMember); the exception is kept on the membership and in the audit log.
 */
export async function addMember(deps: RechargeDeps, actor: AuthUser, id: number, input: AccountMemberInput): Promise<{ member: AccountMemberDto; created: boolean }> {
  return serialTransaction(deps.ds, async (em) => {
    const { record } = await visibleAccount(em, actor, id, facilityToday(deps));
    accountPolicy.authorize(actor, "addMember", record);
    if (input.exceptionReason) accountPolicy.authorize(actor, "makeException", record);
    const person = await em.findOne(User, { where: { email: input.email.toLowerCase() } });
    if (!person || !person.active) throw new NotFound("A person with that e-mail address");
    const existing = await membershipOf(em, id, person.id);
    const admission = admitMember(actor, record, person, { exceptionReason: input.exceptionReason, existingException: existing?.exceptionReason });
    if (admission.denial) throw new PolicyDenied(admission.denial);
    const monthlyCapCents = input.monthlyCapCents ?? null;
    await em.save(AccountMember, { accountId: id, userId: person.id, monthlyCapCents, exceptionReason: admission.exceptionReason });
    await audit(em, deps.now(), actor.id, existing ? "account.member_changed" : "account.member_added", "account", id, {
      userId: person.id,
      monthlyCapCents,
      ...(admission.exceptionReason ? { exceptionReason: admission.exceptionReason, personOrganisation: person.organisation } : {}),
    });
    return { member: (await memberOf(em, id, person.id))!, created: !existing };
  });
}

/** Changes (or removes, with null) a member's monthly cap. */
export async function updateMember(deps: RechargeDeps, actor: AuthUser, id: number, userId: number, monthlyCapCents: number | null): Promise<AccountMemberDto> {
  return serialTransaction(deps.ds, async (em) => {
    const { record } = await visibleAccount(em, actor, id, facilityToday(deps));
    accountPolicy.authorize(actor, "manageMembers", record);
    if (!(await membershipOf(em, id, userId))) throw new NotFound("That person on this account");
    await em.update(AccountMember, { accountId: id, userId }, { monthlyCapCents });
    await audit(em, deps.now(), actor.id, "account.member_changed", "account", id, { userId, monthlyCapCents });
    return (await memberOf(em, id, userId))!;
  });
}

export async function removeMember(deps: RechargeDeps, actor: AuthUser, id: number, userId: number): Promise<void> {
  await serialTransaction(deps.ds, async (em) => {
    const { record } = await visibleAccount(em, actor, id, facilityToday(deps));
    accountPolicy.authorize(actor, "manageMembers", record);
    const r = await em.delete(AccountMember, { accountId: id, userId });
    if (!r.affected) throw new NotFound("That person on this account");
    await audit(em, deps.now(), actor.id, "account.member_removed", "account", id, { userId });
  });
}

/** A credit or charge with a reason; it lands on the first run for its month that is not final yet. */
export async function addAdjustment(deps: RechargeDeps, actor: AuthUser, id: number, input: AdjustmentInput): Promise<AdjustmentDto> {
  return serialTransaction(deps.ds, async (em) => {
    const { record } = await visibleAccount(em, actor, id, facilityToday(deps));
    accountPolicy.authorize(actor, "adjust", record);
    let period = input.period ?? facilityMonth(deps);
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
}

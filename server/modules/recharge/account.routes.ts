/**
 * Accounts: the list as the contract states it (members: what they may charge; group leads:
 * what they own; the manager: all), one account, who may charge it and up to what monthly cap,
 * and the manager's credits and adjustments. Which account a person sees or changes is the
 * account policy's to say; the queries and commands ask it.
 */
import { idParam } from "@shared/schemas/common";
import {
  accountCreateInput,
  accountListQuery,
  accountMemberInput,
  accountMemberPage,
  accountMemberResponse,
  accountMemberUpdateInput,
  accountPage,
  accountResponse,
  accountUpdateInput,
  adjustmentPage,
  adjustmentInput,
  adjustmentResponse,
  memberParams,
} from "@shared/schemas/recharge";
import { route, WRITTEN } from "../../http/route-table";
import { getAccount, listAccounts, listAdjustments, listMembers } from "./account.queries";
import { addAdjustment, addMember, createAccount, removeMember, updateAccount, updateMember } from "./account.commands";

const MEMBER_DECIDERS = ["group_lead", "manager"] as const;

export const accountRoutes = [
  route({
    method: "get",
    path: "/accounts",
    summary: "The accounts the caller may charge (members), owns (group leads), or all (manager)",
    access: "signed_in",
    query: accountListQuery,
    output: accountPage,
    handler: ({ ctx, actor, query }) => listAccounts(ctx, actor, query),
  }),
  route({
    method: "post",
    path: "/accounts",
    summary: "Open an account (cost centre, grant or external customer)",
    access: ["manager"],
    body: accountCreateInput,
    status: 201,
    output: accountResponse,
    handler: async ({ ctx, actor, body }) => ({ account: await createAccount(ctx, actor, body) }),
  }),
  route({
    method: "get",
    path: "/accounts/:id",
    summary: "One account",
    description: "404 for an account the caller neither owns nor may charge (unless manager).",
    access: "signed_in",
    policy: "account.view",
    params: idParam,
    output: accountResponse,
    handler: async ({ ctx, actor, params }) => ({ account: await getAccount(ctx, actor, params.id) }),
  }),
  route({
    method: "patch",
    path: "/accounts/:id",
    summary: "Change an account (name, owner, validity, billing address, open or closed)",
    access: ["manager"],
    policy: "account.edit",
    params: idParam,
    body: accountUpdateInput,
    output: accountResponse,
    handler: async ({ ctx, actor, params, body }) => ({ account: await updateAccount(ctx, actor, params.id, body) }),
  }),
  route({
    method: "get",
    path: "/accounts/:id/members",
    summary: "Who may charge an account, with their monthly caps and any exception",
    access: MEMBER_DECIDERS,
    policy: "account.manageMembers",
    params: idParam,
    output: accountMemberPage,
    handler: async ({ ctx, actor, params }) => {
      const items = await listMembers(ctx, actor, params.id);
      return { items, total: items.length };
    },
  }),
  route({
    method: "post",
    path: "/accounts/:id/members",
    summary: "Let a person (by e-mail) charge an account, with an optional monthly cap",
    description:
      "201 when added, 200 when the person already could (their cap is changed). A group lead adds only people of the account's organisation " +
      "(422 `external_person_internal_account`, `internal_person_external_account` or `other_organisation` otherwise); the manager may add " +
      "them all the same by sending `exceptionReason` (a group lead who sends it gets 403 `exception_manager_only`). A reason where no " +
      "exception is needed is not kept. 422 `account_not_valid` for a closed account.",
    access: MEMBER_DECIDERS,
    policy: "account.addMember",
    params: idParam,
    body: accountMemberInput,
    status: 201,
    output: accountMemberResponse,
    handler: async ({ ctx, actor, params, body, res }) => {
      const { member, created } = await addMember(ctx, actor, params.id, body);
      if (created) return { member };
      res.status(200).json({ member });
      return WRITTEN;
    },
  }),
  route({
    method: "patch",
    path: "/accounts/:id/members/:userId",
    summary: "Change (or lift, with null) a member's monthly cap",
    access: MEMBER_DECIDERS,
    policy: "account.manageMembers",
    params: memberParams,
    body: accountMemberUpdateInput,
    output: accountMemberResponse,
    handler: async ({ ctx, actor, params, body }) => ({ member: await updateMember(ctx, actor, params.id, params.userId, body.monthlyCapCents) }),
  }),
  route({
    method: "delete",
    path: "/accounts/:id/members/:userId",
    summary: "Stop a person charging an account",
    access: MEMBER_DECIDERS,
    policy: "account.manageMembers",
    params: memberParams,
    handler: ({ ctx, actor, params }) => removeMember(ctx, actor, params.id, params.userId),
  }),
  route({
    method: "get",
    path: "/accounts/:id/adjustments",
    summary: "An account's credits and adjustments, with the final run that billed each",
    access: ["manager"],
    policy: "account.adjust",
    params: idParam,
    output: adjustmentPage,
    handler: async ({ ctx, actor, params }) => {
      const items = await listAdjustments(ctx, actor, params.id);
      return { items, total: items.length };
    },
  }),
  route({
    method: "post",
    path: "/accounts/:id/adjustments",
    summary: "Enter a credit (negative) or charge with a reason; it is billed in the next month not yet final",
    access: ["manager"],
    policy: "account.adjust",
    params: idParam,
    body: adjustmentInput,
    status: 201,
    output: adjustmentResponse,
    handler: async ({ ctx, actor, params, body }) => ({ adjustment: await addAdjustment(ctx, actor, params.id, body) }),
  }),
];

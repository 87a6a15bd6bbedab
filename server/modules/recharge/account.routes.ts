/**
 * Accounts: the list as API.md states it (members: what they may charge; group leads: what they
 * own; manager: all), who may charge an account and with what monthly cap, and the manager's
 * credits and adjustments.
 */
import { Router } from "express";
import { idParam } from "@shared/schemas/common";
import {
  accountCreateInput,
  accountListQuery,
  accountMemberInput,
  accountMemberUpdateInput,
  accountUpdateInput,
  adjustmentInput,
  memberParams,
  type AccountCreateInput,
  type AccountMemberInput,
  type AccountMemberUpdateInput,
  type AccountUpdateInput,
  type AdjustmentInput,
} from "@shared/schemas/recharge";
import type { Ctx } from "../../context";
import { currentUser, requireAuth, requireRole } from "../../middleware/auth";
import { body, params, query, validate } from "../../middleware/validate";

export function createAccountsRouter(ctx: Ctx): Router {
  const r = Router();
  const accounts = ctx.services.accounts;

  r.get("/", requireAuth, validate({ query: accountListQuery }), async (req, res) => {
    res.json(await accounts.list(currentUser(req), query<{ limit: number; offset: number }>(req)));
  });

  r.post("/", requireRole("manager"), validate({ body: accountCreateInput }), async (req, res) => {
    res.status(201).json({ account: await accounts.create(currentUser(req), body<AccountCreateInput>(req)) });
  });

  r.get("/:id", requireAuth, validate({ params: idParam }), async (req, res) => {
    res.json({ account: await accounts.get(currentUser(req), params<{ id: number }>(req).id) });
  });

  r.patch("/:id", requireRole("manager"), validate({ params: idParam, body: accountUpdateInput }), async (req, res) => {
    res.json({ account: await accounts.update(currentUser(req), params<{ id: number }>(req).id, body<AccountUpdateInput>(req)) });
  });

  r.get("/:id/members", requireRole("group_lead", "manager"), validate({ params: idParam }), async (req, res) => {
    const items = await accounts.members(currentUser(req), params<{ id: number }>(req).id);
    res.json({ items, total: items.length });
  });

  r.post("/:id/members", requireRole("group_lead", "manager"), validate({ params: idParam, body: accountMemberInput }), async (req, res) => {
    const input = body<AccountMemberInput>(req);
    const { member, created } = await accounts.addMember(currentUser(req), params<{ id: number }>(req).id, input.email, input.monthlyCapCents ?? null);
    res.status(created ? 201 : 200).json({ member });
  });

  r.patch("/:id/members/:userId", requireRole("group_lead", "manager"), validate({ params: memberParams, body: accountMemberUpdateInput }), async (req, res) => {
    const p = params<{ id: number; userId: number }>(req);
    res.json({ member: await accounts.updateMember(currentUser(req), p.id, p.userId, body<AccountMemberUpdateInput>(req).monthlyCapCents) });
  });

  r.delete("/:id/members/:userId", requireRole("group_lead", "manager"), validate({ params: memberParams }), async (req, res) => {
    const p = params<{ id: number; userId: number }>(req);
    await accounts.removeMember(currentUser(req), p.id, p.userId);
    res.status(204).end();
  });

  r.get("/:id/adjustments", requireRole("manager"), validate({ params: idParam }), async (req, res) => {
    const items = await accounts.adjustments(params<{ id: number }>(req).id);
    res.json({ items, total: items.length });
  });

  r.post("/:id/adjustments", requireRole("manager"), validate({ params: idParam, body: adjustmentInput }), async (req, res) => {
    res.status(201).json({ adjustment: await accounts.addAdjustment(currentUser(req), params<{ id: number }>(req).id, body<AdjustmentInput>(req)) });
  });

  return r;
}

/**
 * GET /api/accounts: the accounts the caller may charge (members), owns (group leads) or all
 * (managers). Kept minimal for the booking form; Recharge builds the rest of the accounts area.
 */
import { Router } from "express";
import type { Ctx } from "../context";
import { currentUser, hasRole, requireAuth } from "../middleware/auth";

interface AccountRow {
  id: number;
  code: string;
  name: string;
  kind: string;
  customerClass: string;
  active: number;
  validFrom: string | null;
  validTo: string | null;
  ownerId: number | null;
  member: number;
}

export function createAccountsRouter(ctx: Ctx): Router {
  const r = Router();
  r.get("/", requireAuth, async (req, res) => {
    const me = currentUser(req);
    const all = hasRole(me, "manager");
    const rows: AccountRow[] = await ctx.ds.query(
      `SELECT a.id, a.code, a.name, a.kind, a.customerClass, a.active, a.validFrom, a.validTo, a.ownerId,
              EXISTS (SELECT 1 FROM account_members m WHERE m.accountId = a.id AND m.userId = ?) AS member
       FROM accounts a
       WHERE ? OR a.ownerId = ? OR EXISTS (SELECT 1 FROM account_members m WHERE m.accountId = a.id AND m.userId = ?)
       ORDER BY a.code`,
      [me.id, all ? 1 : 0, me.id, me.id],
    );
    const today = ctx.now().toISOString().slice(0, 10);
    const items = rows.map((a) => ({
      id: a.id,
      code: a.code,
      name: a.name,
      kind: a.kind,
      customerClass: a.customerClass,
      active: Boolean(a.active),
      validFrom: a.validFrom,
      validTo: a.validTo,
      owned: a.ownerId === me.id,
      /** Whether the caller can charge a booking to it today. */
      chargeable: Boolean(a.active) && (!a.validTo || a.validTo >= today) && (!a.validFrom || a.validFrom <= today),
    }));
    res.json({ items, total: items.length });
  });
  return r;
}

/**
 * The figures on each role's start page. Thin for now; the schedule, stockroom and safety
 * work fill in their parts as they land.
 */
import type { Ctx } from "../context";
import type { AuthUser } from "../middleware/auth";
import { safetyLocationTotals } from "./safety.service";

export async function dashboardFor(ctx: Ctx, user: AuthUser, sections: { manager: boolean; safety: boolean }) {
  const now = ctx.now();
  const soon = new Date(now.getTime() + 30 * 24 * 3600 * 1000).toISOString();
  const today = now.toISOString().slice(0, 10);
  const one = async (sql: string, args: unknown[] = []) => Number((await ctx.ds.query(sql, args))[0]?.n ?? 0);
  const out: Record<string, unknown> = { member: { nextBookings: [] as unknown[] } };
  if (sections.manager) {
    out.manager = {
      pendingApprovals: 0,
      trainingExpiringSoon: await one(
        `SELECT COUNT(*) n FROM training_records WHERE revokedAt IS NULL AND expiresAt IS NOT NULL AND expiresAt > ? AND expiresAt <= ?`,
        [now.toISOString(), soon],
      ),
      instrumentsOutOfService: await one(`SELECT COUNT(*) n FROM instruments WHERE status = 'under_maintenance'`),
    };
  }
  if (sections.safety) {
    out.safety = {
      expiredContainers: await one(
        `SELECT COUNT(*) n FROM containers WHERE status NOT IN ('empty','disposed') AND expiresAt IS NOT NULL AND expiresAt < ?`,
        [today],
      ),
      onHold: await one(`SELECT COUNT(*) n FROM containers WHERE status = 'on_hold'`),
      locationsOverLimit: (await safetyLocationTotals(ctx.ds)).filter((l) => l.overLimit).length,
      expiringSoon: await one(
        `SELECT COUNT(*) n FROM containers WHERE status NOT IN ('empty','disposed') AND expiresAt IS NOT NULL AND expiresAt >= ? AND expiresAt <= ?`,
        [today, soon.slice(0, 10)],
      ),
      chemicalsOnHold: await one(`SELECT COUNT(*) n FROM chemicals WHERE onHoldReason IS NOT NULL`),
    };
  }
  void user;
  return out;
}

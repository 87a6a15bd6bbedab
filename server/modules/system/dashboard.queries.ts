/**
 * The figures on each role's start page: a member's next bookings, the manager's queue and
 * expiring training; the stockroom and safety work fill in their parts.
 */
import type { BookingStatus } from "@shared/schemas/bookings";
import type { DashboardDto } from "@shared/schemas/dashboard";
import type { Ctx } from "../../context";
import type { AuthUser } from "../../middleware/auth";
import { safetyLocationTotals } from "../safety";

export async function dashboardFor(ctx: Ctx, user: AuthUser, sections: { manager: boolean; safety: boolean }): Promise<DashboardDto> {
  const now = ctx.now();
  const soon = new Date(now.getTime() + 30 * 24 * 3600 * 1000).toISOString();
  const today = now.toISOString().slice(0, 10);
  const one = async (sql: string, args: unknown[] = []) => Number((await ctx.ds.query(sql, args))[0]?.n ?? 0);
  const next: { id: number; status: BookingStatus; start: string; end: string; instruments: string | null }[] = await ctx.ds.query(
    `SELECT b.id, b.status, b.startsAt AS start, b.endsAt AS "end",
            (SELECT group_concat(i.name, '|') FROM booking_instruments bi JOIN instruments i ON i.id = bi.instrumentId WHERE bi.bookingId = b.id) AS instruments
     FROM bookings b WHERE b.userId = ? AND b.status IN ('requested','confirmed','in_progress') AND b.endMs > ? ORDER BY b.startMs LIMIT 5`,
    [user.id, now.getTime()],
  );
  const nextBookings = next.map(({ instruments, ...b }) => ({ ...b, instrumentNames: (instruments ?? "").split("|").filter(Boolean).sort() }));
  const out: DashboardDto = { member: { nextBookings } };
  if (sections.manager) {
    out.manager = {
      pendingApprovals: await one(`SELECT COUNT(*) n FROM bookings WHERE status = 'requested' AND endMs > ?`, [now.getTime()]),
      openTrainingRequests: await one(`SELECT COUNT(*) n FROM training_requests WHERE status = 'open'`),
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
  return out;
}

/**
 * The facility's booking policy (late-cancellation window, no-show grace, check-in opening),
 * kept as one settings row so the manager can change it without a deploy.
 */
import type { EntityManager } from "typeorm";
import { DEFAULT_BOOKING_POLICY, bookingPolicy, type BookingPolicy } from "@shared/schemas/bookings";
import { Setting } from "../entities";

export const BOOKING_POLICY_KEY = "booking_policy";

export async function readBookingPolicy(em: EntityManager): Promise<BookingPolicy> {
  const row = await em.findOneBy(Setting, { key: BOOKING_POLICY_KEY });
  if (!row) return DEFAULT_BOOKING_POLICY;
  const parsed = bookingPolicy.partial().safeParse(JSON.parse(row.value));
  return { ...DEFAULT_BOOKING_POLICY, ...(parsed.success ? parsed.data : {}) };
}

export async function writeBookingPolicy(em: EntityManager, policy: BookingPolicy): Promise<void> {
  await em.save(Setting, { key: BOOKING_POLICY_KEY, value: JSON.stringify(policy) });
}

/** Who may open each area of the client: the routes' guards, the menu, and the server's page boot. */
import type { Role } from "./schemas/auth";

/** The route guard for each area uses the same roles as its menu entry (src/layouts/nav-items.ts). */
export const AREA_ROLES = {
  training: ["manager"],
  recharge: ["manager", "group_lead"],
  safety: ["manager", "safety_officer"],
  admin: ["admin"],
} as const satisfies Record<string, readonly Role[]>;
export type Area = keyof typeof AREA_ROLES;

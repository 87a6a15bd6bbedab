/**
 * What each role sees in the navigation. Everyone signed in gets the bench work; the other
 * roles add their areas. This only shapes the menu: the server checks every request itself.
 */
import type { Role } from "@shared/schemas/auth";
import { AREA_ROLES } from "@shared/areas";
import { paths } from "@/config/paths";
import { hasRole } from "@/lib/auth";
import type { NavIconName } from "./nav-icons";

export type NavGroup = "work" | "facility" | "admin";

export interface NavItem {
  /** Also the `data-testid="nav-<slug>"` the browser tests use. */
  slug: string;
  label: string;
  to: string;
  icon: NavIconName;
  group: NavGroup;
  /** Any one of these roles shows the item; absent means everyone signed in. */
  roles?: readonly Role[];
}

export const NAV_GROUP_LABELS: Record<NavGroup, string> = {
  work: "Bench",
  facility: "Facility",
  admin: "Administration",
};

/** The route guard for each area uses the same roles as its menu entry (the server's page boot too). */
export { AREA_ROLES };

export const NAV_ITEMS: readonly NavItem[] = [
  { slug: "home", label: "Home", to: paths.home.getHref(), icon: "home", group: "work" },
  { slug: "schedule", label: "Schedule", to: paths.schedule.getHref(), icon: "schedule", group: "work" },
  { slug: "bookings", label: "My bookings", to: paths.myBookings.getHref(), icon: "bookings", group: "work" },
  { slug: "instruments", label: "Instruments", to: paths.instruments.getHref(), icon: "instruments", group: "work" },
  { slug: "stockroom", label: "Stockroom", to: paths.stockroom.getHref(), icon: "stockroom", group: "work" },
  { slug: "charges", label: "My charges", to: paths.myCharges.getHref(), icon: "recharge", group: "work" },
  { slug: "scan", label: "Scan", to: paths.scan.getHref(), icon: "scan", group: "work" },
  { slug: "training", label: "Training", to: paths.training.getHref(), icon: "training", group: "facility", roles: AREA_ROLES.training },
  {
    slug: "recharge",
    label: "Recharge",
    to: paths.recharge.getHref(),
    icon: "recharge",
    group: "facility",
    roles: AREA_ROLES.recharge,
  },
  {
    slug: "safety",
    label: "Safety review",
    to: paths.safety.getHref(),
    icon: "safety",
    group: "facility",
    roles: AREA_ROLES.safety,
  },
  { slug: "people", label: "People", to: paths.admin.people.getHref(), icon: "people", group: "admin", roles: AREA_ROLES.admin },
  { slug: "system", label: "System", to: paths.admin.mailbox.getHref(), icon: "mailbox", group: "admin", roles: AREA_ROLES.admin },
];

export function navItemsFor(user: { roles: Role[] } | null | undefined): NavItem[] {
  if (!user) return [];
  return NAV_ITEMS.filter((item) => !item.roles || hasRole(user, ...item.roles));
}

/**
 * The frame around every signed-in screen: a compact top bar (mark, who is signed in, sign-out)
 * and the navigation for the person's roles. On a phone the navigation folds behind a menu
 * button, while Scan stays one tap away in the top bar for work at the bench. The navigation's
 * column runs the full height of the page (its list stays in view while the page scrolls), and
 * a thin bar under the top bar shows that the next screen is on its way.
 */
import { useState } from "react";
import { Link, NavLink, Outlet, useNavigation } from "react-router-dom";
import { ROLE_LABELS } from "@shared/schemas/auth";
import { paths } from "@/config/paths";
import { useLogout, useUser } from "@/lib/auth";
import { cn } from "@/lib/cn";
import { Button, buttonClasses } from "@/components/ui/button";
import { Wordmark } from "@/components/brand/wordmark";
import { NAV_GROUP_LABELS, navItemsFor, type NavGroup } from "./nav-items";
import { NavIcon } from "./nav-icons";
import { PublicDemoBanner } from "./public-demo-banner";

const GROUP_ORDER: NavGroup[] = ["work", "facility", "admin"];

export function AppShell() {
  const { data: user } = useUser();
  const logout = useLogout();
  const [menuOpen, setMenuOpen] = useState(false);
  const items = navItemsFor(user);
  const closeMenu = () => setMenuOpen(false);
  const navigating = useNavigation().state === "loading";

  return (
    <div className="flex min-h-screen flex-col">
      <a
        href="#main"
        className="sr-only z-50 rounded bg-white px-3 py-2 text-aqueous-800 focus:not-sr-only focus:fixed focus:left-2 focus:top-2"
      >
        Skip to content
      </a>

      <PublicDemoBanner />

      <header className="sticky top-0 z-30 flex h-12 items-center gap-2 border-b border-grey-200 bg-white/95 px-3 backdrop-blur md:px-4">
        <button
          type="button"
          className="inline-flex size-8 items-center justify-center rounded-md text-grey-700 hover:bg-grey-100 md:hidden"
          aria-expanded={menuOpen}
          aria-controls="app-nav"
          onClick={() => setMenuOpen((open) => !open)}
        >
          <span className="sr-only">{menuOpen ? "Close menu" : "Open menu"}</span>
          <svg viewBox="0 0 20 20" className="size-5" fill="none" stroke="currentColor" strokeWidth="1.6" aria-hidden="true">
            {menuOpen ? <path d="M5 5l10 10M15 5 5 15" /> : <path d="M3.5 6h13M3.5 10h13M3.5 14h13" />}
          </svg>
        </button>

        <Link to={paths.home.getHref()} className="rounded-md no-underline" onClick={closeMenu}>
          <Wordmark />
        </Link>

        <div className="flex-1" />

        <Link
          to={paths.scan.getHref()}
          data-testid="quick-scan"
          onClick={closeMenu}
          className={buttonClasses("primary", "sm", "md:hidden")}
        >
          <NavIcon name="scan" />
          Scan
        </Link>

        {user && (
          <Link
            to={paths.profile.getHref()}
            onClick={closeMenu}
            className="hidden min-w-0 flex-col rounded-md px-2 py-0.5 text-right leading-tight text-grey-800 no-underline hover:bg-grey-100 sm:flex"
            title="Your profile"
          >
            <span className="truncate text-sm font-medium">{user.name}</span>
            <span className="truncate text-xs text-grey-500">{user.roles.map((r) => ROLE_LABELS[r]).join(" · ")}</span>
          </Link>
        )}

        <Button
          variant="ghost"
          size="sm"
          data-testid="sign-out"
          loading={logout.isPending}
          onClick={() => logout.mutate()}
          title={logout.isError ? "Signing out failed; try again" : undefined}
        >
          Sign out
        </Button>
      </header>

      {navigating && (
        <div className="pointer-events-none sticky top-12 z-30 h-0.5 w-full overflow-hidden bg-aqueous-100" data-testid="navigation-progress">
          <div className="h-full w-1/3 animate-pulse bg-aqueous-600" />
        </div>
      )}

      <div className="flex flex-1">
        <nav
          id="app-nav"
          aria-label="Main"
          className={cn(
            "border-grey-200 bg-white md:block md:w-52 md:shrink-0 md:border-r",
            menuOpen ? "fixed inset-x-0 bottom-0 top-12 z-20 block overflow-y-auto" : "hidden",
          )}
        >
          <div className="flex flex-col gap-4 px-2 py-3 md:sticky md:top-12 md:max-h-[calc(100vh-3rem)] md:overflow-y-auto">
            {GROUP_ORDER.map((group) => {
              const groupItems = items.filter((i) => i.group === group);
              if (groupItems.length === 0) return null;
              return (
                <div key={group}>
                  <p className="px-2 pb-1 text-[11px] font-semibold uppercase tracking-wider text-grey-500">
                    {NAV_GROUP_LABELS[group]}
                  </p>
                  <ul className="flex flex-col gap-px">
                    {groupItems.map((item) => (
                      <li key={item.slug}>
                        <NavLink
                          to={item.to}
                          end={item.to === paths.home.getHref()}
                          data-testid={`nav-${item.slug}`}
                          onClick={closeMenu}
                          className={({ isActive }) =>
                            cn(
                              "flex items-center gap-2 rounded-md border-l-2 px-2 py-1.5 no-underline",
                              isActive
                                ? "border-aqueous-600 bg-aqueous-50 font-medium text-aqueous-900"
                                : "border-transparent text-grey-700 hover:bg-grey-100 hover:text-grey-900",
                            )
                          }
                        >
                          <NavIcon name={item.icon} />
                          {item.label}
                        </NavLink>
                      </li>
                    ))}
                  </ul>
                </div>
              );
            })}
            {user && (
              <div className="border-t border-grey-200 px-2 pt-3 sm:hidden">
                <Link to={paths.profile.getHref()} onClick={closeMenu} className="text-sm">
                  {user.name} · profile
                </Link>
              </div>
            )}
          </div>
        </nav>

        <main id="main" tabIndex={-1} aria-busy={navigating || undefined} className="min-w-0 flex-1 px-4 py-4 focus:outline-none md:px-6 md:py-5">
          <div className="mx-auto max-w-6xl">
            <Outlet />
          </div>
        </main>
      </div>
    </div>
  );
}

/**
 * Every API router and where it is mounted. The role-matrix test reads this table, so a new
 * route without a row in the matrix fails the tests.
 */
import type { Router } from "express";
import type { Ctx } from "../context";
import { createInstrumentsRouter } from "./instruments.router";
import { createBookingsRouter } from "./bookings.router";
import { createCalendarRouter } from "./calendar.router";
import { createReportsRouter } from "./reports.router";
import { createSetupsRouter } from "./setups.router";

export function apiRouters(ctx: Ctx): { path: string; router: Router }[] {
  return [
    { path: "/instruments", router: createInstrumentsRouter(ctx) },
    { path: "/bookings", router: createBookingsRouter(ctx) },
    { path: "/setups", router: createSetupsRouter(ctx) },
    { path: "/calendar", router: createCalendarRouter(ctx) },
    { path: "/reports", router: createReportsRouter(ctx) },
  ];
}

/** Lists "METHOD /api/path" for every route of a mounted router (Express 5 router stack). */
export function listRoutes(mounts: { path: string; router: Router }[]): string[] {
  const out: string[] = [];
  for (const { path, router } of mounts) {
    for (const layer of (router as unknown as { stack: { route?: { path: string; methods: Record<string, boolean> } }[] }).stack) {
      if (!layer.route) continue;
      for (const m of Object.keys(layer.route.methods)) {
        if (m === "_all") continue;
        out.push(`${m.toUpperCase()} /api${path}${layer.route.path === "/" ? "" : layer.route.path}`);
      }
    }
  }
  return out;
}

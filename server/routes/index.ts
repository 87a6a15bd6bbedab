/**
 * Every API router and where it is mounted. The role-matrix test reads this table, so a new
 * route without a row in the matrix fails the tests.
 */
import type { Router } from "express";
import type { Ctx } from "../context";
import { createDepartmentsRouter, createGroupsRouter } from "./org.router";
import { createUsersRouter } from "./users.router";
import { createAccountsRouter } from "./accounts.router";
import { createTrainingRouter } from "./training.router";
import { createBillingRouter } from "./billing.router";
import { createRatesRouter } from "./rates.router";
import { createWebhooksRouter } from "./webhooks.router";

export function apiRouters(ctx: Ctx): { path: string; router: Router }[] {
  return [
    { path: "/users", router: createUsersRouter(ctx) },
    { path: "/departments", router: createDepartmentsRouter(ctx) },
    { path: "/groups", router: createGroupsRouter(ctx) },
    { path: "/training", router: createTrainingRouter(ctx) },
    { path: "/accounts", router: createAccountsRouter(ctx) },
    { path: "/rates", router: createRatesRouter(ctx) },
    { path: "/billing", router: createBillingRouter(ctx) },
    { path: "/webhooks", router: createWebhooksRouter(ctx) },
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

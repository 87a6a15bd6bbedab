/**
 * Builds Express routers from the modules' route tables: access check (401/403), then input
 * validation (400 naming each field), then the handler, whose answer is sent as JSON with the
 * declared status. Routes are grouped by their first path segment so a request only walks the
 * routes of its own resource, as hand-mounted routers did.
 */
import { Router, type RequestHandler } from "express";
import type { ZodType } from "zod";
import type { Ctx } from "../context";
import { requireAuth, requireRole } from "../middleware/auth";
import { BadRequest, type FieldError } from "../errors";
import { zodFieldErrors } from "../middleware/problem";
import { WRITTEN, type AnyRoute, type RouteTable } from "./route-table";

export interface Mount {
  /** Mount point under /api, e.g. "/containers". */
  path: string;
  router: Router;
}

function accessGuard(r: AnyRoute): RequestHandler[] {
  if (r.access === "public") return [];
  if (r.access === "signed_in") return [requireAuth];
  return [requireRole(...r.access)];
}

function parse(schema: ZodType | undefined, raw: unknown, prefix: string, errors: FieldError[]): unknown {
  if (!schema) return undefined;
  const result = schema.safeParse(raw);
  if (result.success) return result.data;
  errors.push(...zodFieldErrors(result.error, prefix));
  return undefined;
}

/**
 * Tests build the app with `checkResponses`: every JSON answer is then parsed with the route's
 * declared output schema, so the published description cannot drift from what is sent.
 */
function checkAnswer(r: AnyRoute, answer: unknown): void {
  if (!r.output) return;
  const result = r.output.safeParse(answer);
  if (!result.success) {
    throw new Error(`${r.method.toUpperCase()} /api${r.path} answered outside its declared output schema: ${JSON.stringify(result.error.issues.slice(0, 5))}`);
  }
}

function handlerFor(ctx: Ctx, r: AnyRoute): RequestHandler {
  const status = r.status ?? 200;
  return async (req, res) => {
    const errors: FieldError[] = [];
    const params = parse(r.params, req.params, "params", errors);
    const query = parse(r.query, req.query, "query", errors);
    const body = parse(r.body, req.body ?? {}, "", errors);
    if (errors.length) throw new BadRequest("Some fields are missing or malformed.", errors);
    const answer = await r.handler({ ctx, actor: req.user, params, query, body, req, res });
    if (answer === WRITTEN || res.headersSent) return;
    // A handler may set another status itself (health answers 503 when the database does not).
    const chosen = res.statusCode !== 200 ? res.statusCode : status;
    if (answer === undefined) {
      res.status(chosen === 200 ? 204 : chosen).end();
      return;
    }
    if (ctx.checkResponses) checkAnswer(r, answer);
    res.status(chosen).json(answer);
  };
}

/** The first segment of a path ("/containers/:id" → "/containers"); "/labels.pdf" stays whole. */
function mountOf(path: string): string {
  const first = path.split("/")[1] ?? "";
  return `/${first}`;
}

export function buildMounts(ctx: Ctx, tables: RouteTable[]): Mount[] {
  const mounts = new Map<string, Router>();
  for (const table of tables) {
    for (const r of table.routes) {
      const at = mountOf(r.path);
      let router = mounts.get(at);
      if (!router) {
        router = Router();
        mounts.set(at, router);
      }
      const rest = r.path.slice(at.length) || "/";
      router[r.method](rest, ...accessGuard(r), ...(r.before ?? []), handlerFor(ctx, r));
    }
  }
  return [...mounts].map(([path, router]) => ({ path, router }));
}

/** Lists "METHOD /api/path" for every route of a mounted router (Express 5 router stack), for the role-matrix test. */
export function listRoutes(mounts: Mount[]): string[] {
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

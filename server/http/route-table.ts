/**
 * Routes declared once. Each module lists its routes in one typed table: method, path, who may
 * call it (access), the policy action that decides on the record, the input schemas and the
 * output schema. The router (router.ts), the role matrix (tests) and the OpenAPI description
 * (openapi.ts) are all built from these tables, so they cannot drift apart.
 */
import type { Request, Response } from "express";
import type { z, ZodType } from "zod";
import type { Role } from "@shared/schemas/auth";
import type { Ctx } from "../context";
import type { AuthUser } from "../middleware/auth";

export type Method = "get" | "post" | "put" | "patch" | "delete";

/** "public": anyone, signed in or not; "signed_in": every role; otherwise the roles allowed. */
export type Access = "public" | "signed_in" | readonly Role[];

type Out<S> = S extends ZodType ? z.output<S> : undefined;

export interface HandlerInput<A extends Access, P, Q, B> {
  ctx: Ctx;
  /** The signed-in person; only a public route may be called without one. */
  actor: A extends "public" ? AuthUser | undefined : AuthUser;
  params: Out<P>;
  query: Out<Q>;
  body: Out<B>;
  req: Request;
  res: Response;
}

/** A response that is not JSON (a file, a calendar, a redirect) is written by the handler itself. */
export const WRITTEN = Object.freeze({ writtenByHandler: true } as const);

export interface RouteSpec<A extends Access = Access, P = unknown, Q = unknown, B = unknown, O = unknown> {
  method: Method;
  /** Express path under /api, e.g. "/containers/:id/move". */
  path: string;
  summary: string;
  description?: string;
  access: A;
  /** The policy action that decides on the record ("container.move"), called by the command. */
  policy?: string;
  params?: P;
  query?: Q;
  body?: B;
  /** The success status (200 unless said otherwise). */
  status?: number;
  /** JSON answer's schema; leave out for 204 and for routes that write a file (then say `produces`). */
  output?: O;
  /** Media type of a non-JSON answer (text/csv, application/pdf, text/calendar…). */
  produces?: string;
  /** Media type of a non-JSON request body (text/csv, multipart/form-data). */
  consumes?: string;
  /** Middleware that must run before validation (rate limits, file uploads). */
  before?: import("express").RequestHandler[];
  handler: (input: HandlerInput<A, P, Q, B>) => Promise<HandlerResult<O>> | HandlerResult<O>;
}

type HandlerResult<O> = O extends ZodType ? z.input<O> | typeof WRITTEN : void | typeof WRITTEN;

/** Declares one route, keeping its schemas' types for the handler. */
export function route<const A extends Access, P extends ZodType | undefined = undefined, Q extends ZodType | undefined = undefined, B extends ZodType | undefined = undefined, O extends ZodType | undefined = undefined>(
  spec: RouteSpec<A, P, Q, B, O>,
): AnyRoute {
  return spec as unknown as AnyRoute;
}

/** A route of any shape, as the router and the description generator see it. */
export type AnyRoute = RouteSpec<Access, ZodType | undefined, ZodType | undefined, ZodType | undefined, ZodType | undefined> & {
  handler: (input: HandlerInput<Access, unknown, unknown, unknown>) => unknown;
};

/** A module's table: its name (a tag in the API description) and its routes in matching order. */
export interface RouteTable {
  module: string;
  description: string;
  routes: AnyRoute[];
}

/** "METHOD /api/path" of a route, as the role matrix and the API description name it. */
export function routeKey(r: Pick<AnyRoute, "method" | "path">): string {
  return `${r.method.toUpperCase()} /api${r.path}`;
}

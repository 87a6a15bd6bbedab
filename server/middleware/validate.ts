/**
 * Parses body, query and params with the shared zod schemas before a handler runs; malformed
 * input becomes a 400 problem naming each field. Handlers read the parsed values from req.valid.
 */
import type { RequestHandler } from "express";
import type { ZodType } from "zod";
import { BadRequest } from "../errors";
import { zodFieldErrors } from "./problem";

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      valid: { body?: unknown; query?: unknown; params?: unknown };
    }
  }
}

export function validate(schemas: { body?: ZodType; query?: ZodType; params?: ZodType }): RequestHandler {
  return (req, _res, next) => {
    const valid: Express.Request["valid"] = {};
    const errors = [];
    for (const part of ["params", "query", "body"] as const) {
      const schema = schemas[part];
      if (!schema) continue;
      const raw = part === "body" ? (req.body ?? {}) : req[part];
      const r = schema.safeParse(raw);
      if (r.success) valid[part] = r.data;
      else errors.push(...zodFieldErrors(r.error, part === "body" ? "" : part));
    }
    if (errors.length) throw new BadRequest("Some fields are missing or malformed.", errors);
    req.valid = valid;
    next();
  };
}

/** Typed access to what validate() parsed. */
export function body<T>(req: Express.Request): T {
  return req.valid.body as T;
}
export function query<T>(req: Express.Request): T {
  return req.valid.query as T;
}
export function params<T>(req: Express.Request): T {
  return req.valid.params as T;
}

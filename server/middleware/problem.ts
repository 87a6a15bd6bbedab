/**
 * The one error handler and the JSON 404 under /api. Everything leaves as RFC 9457 problem JSON;
 * unexpected errors are logged and answered 500 without the stack.
 */
import type { ErrorRequestHandler, RequestHandler, Response } from "express";
import { ZodError } from "zod";
import { AppError, type FieldError } from "../errors";

const TITLES: Record<number, string> = {
  400: "Malformed request",
  401: "Not signed in",
  403: "Not allowed",
  404: "Not found",
  409: "Conflict",
  413: "Too large",
  415: "Unsupported media type",
  422: "Breaks a rule",
  429: "Too many requests",
  500: "Server error",
};

export function sendProblem(
  res: Response,
  status: number,
  code: string,
  detail: string,
  errors?: FieldError[],
  extra?: Record<string, unknown>,
): void {
  res
    .status(status)
    .type("application/problem+json")
    .send(
      JSON.stringify({
        type: `https://phasebook.invalid/problems/${code}`,
        title: TITLES[status] ?? "Error",
        status,
        detail,
        code,
        ...(errors && errors.length ? { errors } : {}),
        ...(extra ?? {}),
      }),
    );
}

export function zodFieldErrors(err: ZodError, prefix = ""): FieldError[] {
  return err.issues.map((i) => ({
    path: [prefix, ...i.path.map(String)].filter(Boolean).join("."),
    message: i.message,
  }));
}

export const apiNotFound: RequestHandler = (req, res) => {
  sendProblem(res, 404, "no_such_route", `There is no ${req.method} ${req.originalUrl.split("?")[0]} in the API.`);
};

export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  if (res.headersSent) return;
  if (err instanceof AppError) {
    return sendProblem(res, err.status, err.code, err.message, err.errors, err.extra);
  }
  if (err instanceof ZodError) {
    return sendProblem(res, 400, "invalid_input", "Some fields are missing or malformed.", zodFieldErrors(err));
  }
  const e = err as { type?: string; status?: number; code?: string; message?: string };
  if (e.type === "entity.too.large") return sendProblem(res, 413, "too_large", "The request body is too large.");
  if (e.type === "entity.parse.failed") return sendProblem(res, 400, "malformed_json", "The request body is not valid JSON.");
  if (e.type === "encoding.unsupported" || e.type === "charset.unsupported")
    return sendProblem(res, 415, "unsupported_encoding", e.message ?? "Unsupported encoding.");
  if (e.code === "EBADCSRFTOKEN" || e.code === "csrf_invalid")
    return sendProblem(res, 403, "csrf_invalid", "The form's security token is missing or stale; reload and try again.");
  if (e.code === "LIMIT_FILE_SIZE") return sendProblem(res, 413, "too_large", "The file is too large.");
  if (e.code === "SQLITE_CONSTRAINT_UNIQUE" || /UNIQUE constraint failed/.test(e.message ?? "")) {
    return sendProblem(res, 409, "already_exists", "A record with these details already exists.");
  }
  if (typeof e.status === "number" && e.status >= 400 && e.status < 500) {
    return sendProblem(res, e.status, "client_error", e.message ?? "Bad request.");
  }
  req.log?.error({ err }, "unhandled error");
  return sendProblem(res, 500, "internal", "Something went wrong on our side. The error has been logged.");
};

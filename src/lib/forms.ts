/** Helpers that put the server's field errors back onto react-hook-form fields (STYLE.md habit 6). */
import type { FieldValues, Path, UseFormSetError } from "react-hook-form";
import { ApiError } from "./api-client";

/**
 * Sets each server field error on the matching form field ("roles.0" lands on "roles").
 * Returns true when at least one error found its field, so the caller can skip a general message.
 */
export function applyServerFieldErrors<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fields: readonly Path<T>[],
): boolean {
  if (!(error instanceof ApiError)) return false;
  let mapped = false;
  for (const [path, message] of Object.entries(error.fieldErrors)) {
    const field = fields.find((f) => path === f || path.startsWith(`${f}.`));
    if (!field) continue;
    setError(field, { type: "server", message }, { shouldFocus: !mapped });
    mapped = true;
  }
  return mapped;
}

/** A sentence for an error that did not belong to any one field. */
export function describeError(error: unknown): string {
  if (error instanceof ApiError) {
    if (error.status === 0) return error.message;
    if (error.status === 403) return error.message || "You are not allowed to do this.";
    if (error.status === 429) return tooManyRequests(error.retryAfterSeconds);
    if (error.status >= 500) return "Phasebook's server ran into a problem. Try again in a moment.";
    return error.message;
  }
  if (error instanceof Error) return error.message;
  return "Something went wrong.";
}

export function tooManyRequests(retryAfterSeconds: number | undefined): string {
  if (!retryAfterSeconds) return "Too many attempts. Wait a few minutes and try again.";
  const minutes = Math.ceil(retryAfterSeconds / 60);
  return `Too many attempts. Try again in ${minutes === 1 ? "a minute" : `${minutes} minutes`}.`;
}

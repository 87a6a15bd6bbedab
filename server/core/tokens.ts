/** Random, unguessable tokens for labels, calendar feeds, reset links and sessions. */
import crypto from "node:crypto";

export function newToken(bytes = 32): string {
  return crypto.randomBytes(bytes).toString("base64url");
}

/**
 * Production refuses to start while an active account still has the demo password, which the
 * README publishes. A bcrypt comparison costs about a second at cost 12 on a small machine, so
 * the fingerprints (sha256) of hashes already found not to be the demo password are kept in a
 * settings row: a restart compares only passwords set since the last check.
 */
import crypto from "node:crypto";
import bcrypt from "bcryptjs";
import type { DataSource } from "typeorm";
import { DEMO_PASSWORD } from "../db/seed/demo-people";

export const DEMO_PASSWORD_CHECK_KEY = "demo_password_checked";

const fingerprint = (hash: string) => crypto.createHash("sha256").update(hash).digest("hex");

/** E-mail addresses of the active accounts whose password is the demo password, sorted. */
export async function accountsWithDemoPassword(ds: DataSource, password = DEMO_PASSWORD): Promise<string[]> {
  const rows: { email: string; passwordHash: string }[] = await ds.query(`SELECT email, passwordHash FROM users WHERE active = 1 ORDER BY email`);
  const stored: { value: string }[] = await ds.query(`SELECT value FROM settings WHERE "key" = ?`, [DEMO_PASSWORD_CHECK_KEY]);
  const known = new Set<string>(stored.length ? (JSON.parse(stored[0].value) as { notDemo?: string[] }).notDemo ?? [] : []);
  const verdict = new Map<string, boolean>();
  const found: string[] = [];
  for (const row of rows) {
    const fp = fingerprint(row.passwordHash);
    if (!verdict.has(fp)) verdict.set(fp, known.has(fp) ? false : await bcrypt.compare(password, row.passwordHash));
    if (verdict.get(fp)) found.push(row.email);
  }
  // Only the current accounts' fingerprints are kept, so the row does not grow with every change.
  const notDemo = [...verdict].filter(([, isDemo]) => !isDemo).map(([fp]) => fp).sort();
  await ds.query(`INSERT INTO settings ("key", value) VALUES (?, ?) ON CONFLICT("key") DO UPDATE SET value = excluded.value`, [
    DEMO_PASSWORD_CHECK_KEY,
    JSON.stringify({ notDemo }),
  ]);
  return found;
}

export function demoPasswordRefusal(emails: string[]): string {
  return (
    `Phasebook will not start in production while ${emails.length === 1 ? "this account still has" : "these accounts still have"} the published demo password: ${emails.join(", ")}. ` +
    "Start on a new database for real use (npm run user:create makes the first administrator), or start once with DEMO_SEED=1 (a public demo) and change or deactivate " +
    (emails.length === 1 ? "it." : "them.")
  );
}

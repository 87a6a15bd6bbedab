/**
 * What the bench scripts share: a signed-in session for the load generator, and V8's CPU profiler
 * for BENCH_PROFILE runs.
 */
import fs from "node:fs";
import path from "node:path";
import { ApiClient } from "../tests/support/http-client";

/** A signed-in person's cookie header and CSRF token, as autocannon and fetch send them. */
export interface BenchSession {
  cookie: string;
  csrf: string;
}

/** Signs in through the API, then takes the session's CSRF token (the one the server pairs with the new session). */
export async function benchSignIn(base: string, email: string, password: string): Promise<BenchSession> {
  const client = new ApiClient(base);
  const r = await client.login(email, password);
  if (r.status !== 200) throw new Error(`bench sign-in as ${email} failed: ${r.status} ${JSON.stringify(r.body)}`);
  const csrf = await client.fetchCsrf();
  return { cookie: client.cookieHeader, csrf };
}

/** Starts V8's CPU profiler in this process; the returned function stops it and gives the profile. */
export async function startProfiler(): Promise<() => Promise<object>> {
  const { Session } = await import("node:inspector/promises");
  const session = new Session();
  session.connect();
  await session.post("Profiler.enable");
  await session.post("Profiler.start");
  return async () => (await session.post("Profiler.stop")).profile;
}

/** Writes a profile as `<dir>/<name>-<time>.cpuprofile` (open it in Chromium's DevTools). */
export function writeProfile(dir: string, name: string, profile: object): void {
  const out = path.resolve(dir, `${name}-${Date.now()}.cpuprofile`);
  fs.mkdirSync(path.dirname(out), { recursive: true });
  fs.writeFileSync(out, JSON.stringify(profile));
}

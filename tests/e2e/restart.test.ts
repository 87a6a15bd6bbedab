/** Stop and start again on the same data folder: data and sessions survive, nothing is seeded twice. */
import { afterAll, describe, expect, it } from "vitest";
import { startServer, DEMO_PASSWORD, type RunningServer } from "../support/e2e";
import { ApiClient } from "../support/http-client";

let server: RunningServer | undefined;
afterAll(async () => {
  await server?.stop();
});

async function counts(c: ApiClient) {
  const people = await c.get("/api/users?limit=1");
  const instruments = await c.get("/api/instruments?limit=1");
  return { people: people.body.total as number, instruments: instruments.body.total as number };
}

describe("restarting Phasebook", () => {
  it("keeps data and sign-ins, and seeds the demo only once", async () => {
    server = await startServer();
    const dir = server.dir;
    expect(server.output()).toMatch(/demo scenario seeded/);
    const c = new ApiClient(server.url);
    expect((await c.login("admin@kestrelbay.example", DEMO_PASSWORD)).status).toBe(200);
    const before = await counts(c);
    expect(before.people).toBeGreaterThanOrEqual(7);
    expect(before.instruments).toBeGreaterThanOrEqual(6);
    await server.stop();

    server = await startServer({ dir });
    expect(server.output()).not.toMatch(/demo scenario seeded/);
    const again = new ApiClient(server.url);
    Object.assign(again, { cookies: (c as unknown as { cookies: Map<string, string> }).cookies });
    const me = await again.get("/api/auth/me");
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe("admin@kestrelbay.example");
    expect(await counts(again)).toEqual(before);
  });
});

import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { AuditEntry } from "../../server/entities";

let t: TestApp;
let admin: ApiClient;
let adminId: number;
beforeAll(async () => {
  t = await startTestApp();
  const a = await makeUser(t.ds, { roles: ["admin"], email: "root@kestrelbay.example" });
  adminId = a.id;
  admin = new ApiClient(t.url);
  await admin.login(a.email, TEST_PASSWORD);
});
afterAll(async () => {
  await t.close();
});

describe("POST /api/users", () => {
  it("adds a person with roles, who receives a link to choose a password", async () => {
    const r = await admin.post("/api/users", { email: "New.Student@KestrelBay.example", name: "Noor Haddad", roles: ["member"] });
    expect(r.status).toBe(201);
    expect(r.body.user).toMatchObject({ email: "new.student@kestrelbay.example", name: "Noor Haddad", roles: ["member"], active: true });
    const outbox = await t.ds.query(`SELECT "to", subject FROM outbound_mail WHERE "to" = ?`, ["new.student@kestrelbay.example"]);
    expect(outbox).toHaveLength(1);
    expect(outbox[0].subject).toMatch(/choose a password/);
  });

  it("answers 409 for an e-mail already taken", async () => {
    await admin.post("/api/users", { email: "twice@kestrelbay.example", name: "Once", roles: ["member"] });
    const r = await admin.post("/api/users", { email: "twice@kestrelbay.example", name: "Twice", roles: ["member"] });
    expect(r.status).toBe(409);
  });

  it("answers 400 naming the bad fields", async () => {
    const r = await admin.post("/api/users", { email: "not-an-email", name: "", roles: ["wizard"] });
    expect(r.status).toBe(400);
    expect(r.body.errors.map((e: { path: string }) => e.path).sort()).toEqual(["email", "name", "roles.0"]);
  });
});

describe("PATCH /api/users/:id", () => {
  it("sets roles, and the person's next request sees them", async () => {
    const u = await makeUser(t.ds, { roles: ["member"], email: "promoted@kestrelbay.example" });
    const c = new ApiClient(t.url);
    await c.login(u.email, TEST_PASSWORD);
    const r = await admin.patch(`/api/users/${u.id}`, { roles: ["member", "safety_officer"] });
    expect(r.status).toBe(200);
    expect(r.body.user.roles).toEqual(["member", "safety_officer"]);
    expect((await c.get("/api/auth/me")).body.user.roles).toEqual(["member", "safety_officer"]);
  });

  it("deactivates a person: their sessions end and they cannot sign in", async () => {
    const u = await makeUser(t.ds, { roles: ["member"], email: "leaving@kestrelbay.example" });
    const c = new ApiClient(t.url);
    await c.login(u.email, TEST_PASSWORD);
    expect((await c.get("/api/auth/me")).status).toBe(200);
    const r = await admin.patch(`/api/users/${u.id}`, { active: false });
    expect(r.status).toBe(200);
    expect(r.body.user.active).toBe(false);
    expect((await c.get("/api/auth/me")).status).toBe(401);
    expect((await new ApiClient(t.url).login(u.email, TEST_PASSWORD)).status).toBe(401);
    const audit = await t.ds.getRepository(AuditEntry).findOneBy({ action: "user.deactivated", entityId: u.id });
    expect(audit?.actorId).toBe(adminId);
  });

  it("will not let an administrator deactivate themself", async () => {
    const r = await admin.patch(`/api/users/${adminId}`, { active: false });
    expect(r.status).toBe(422);
    expect(r.body.errors[0].path).toBe("active");
  });

  it("answers 404 for someone who does not exist", async () => {
    expect((await admin.patch(`/api/users/424242`, { name: "Ghost" })).status).toBe(404);
  });
});

describe("GET /api/users", () => {
  it("lists people with a total and filters by text", async () => {
    await makeUser(t.ds, { name: "Zebulon Findable", email: "zeb@kestrelbay.example" });
    const r = await admin.get("/api/users?q=Zebulon&limit=5");
    expect(r.status).toBe(200);
    expect(r.body.total).toBe(1);
    expect(r.body.items[0].email).toBe("zeb@kestrelbay.example");
  });
});

describe("sessions survive a restart of the app", () => {
  it("keeps a person signed in when a new app instance opens the same database", async () => {
    const u = await makeUser(t.ds, { email: "steady@kestrelbay.example" });
    const c = new ApiClient(t.url);
    await c.login(u.email, TEST_PASSWORD);
    const { createApp } = await import("../../server/app");
    const second = createApp({ ...t.ctx, staticDir: null, quiet: true });
    const server = await new Promise<import("node:http").Server>((resolve) => {
      const s = second.app.listen(0, "127.0.0.1", () => resolve(s));
    });
    try {
      const port = (server.address() as import("node:net").AddressInfo).port;
      const res = await fetch(`http://127.0.0.1:${port}/api/auth/me`, { headers: { cookie: c.cookieHeader } });
      expect(res.status).toBe(200);
    } finally {
      await new Promise((r) => server.close(r));
    }
  });
});

describe("the facility's name", () => {
  it("comes from FACILITY_NAME into the welcome mail", async () => {
    const other = await startTestApp({ env: { FACILITY_NAME: "Biphasic Electrochemistry Lab" } });
    try {
      const a = await makeUser(other.ds, { roles: ["admin"], email: "root2@kestrelbay.example" });
      const c = new ApiClient(other.url);
      await c.login(a.email, TEST_PASSWORD);
      expect((await c.get("/api/facility")).body.name).toBe("Biphasic Electrochemistry Lab");
      await c.post("/api/users", { email: "welcome@kestrelbay.example", name: "Ines Welcome", roles: ["member"] });
      const [mail] = await other.ds.query(`SELECT text FROM outbound_mail WHERE "to" = ?`, ["welcome@kestrelbay.example"]);
      expect(mail.text).toContain("the Biphasic Electrochemistry Lab's booking and stock portal");
    } finally {
      await other.close();
    }
  });
});

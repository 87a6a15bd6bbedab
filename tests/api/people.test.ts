/**
 * The People area after issue 9: strict ids on training, the training and user policies'
 * answers and abilities, a person's organisation, and the declared answers of the area's routes.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { userAdminDto, type UserAdminDto } from "@shared/schemas/users";
import { trainingDto, trainingRequestDto } from "@shared/schemas/training";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeAccount, makeInstrument } from "../support/billing-factories";
import { routeKey } from "../../server/http/route-table";
import type { User } from "../../server/entities";

let t: TestApp;
let admin: User;
let member: User;
let manager: User;
let adminApi: ApiClient;
let memberApi: ApiClient;
let managerApi: ApiClient;

async function signedIn(u: User): Promise<ApiClient> {
  const c = new ApiClient(t.url);
  expect((await c.login(u.email, TEST_PASSWORD)).status).toBe(200);
  return c;
}

const count = async (table: string): Promise<number> => (await t.ds.query(`SELECT COUNT(*) AS n FROM ${table}`))[0].n;

beforeAll(async () => {
  t = await startTestApp();
  admin = await makeUser(t.ds, { roles: ["admin"], name: "Ada Admin" });
  member = await makeUser(t.ds, { roles: ["member"], name: "Milo Member" });
  manager = await makeUser(t.ds, { roles: ["manager", "member"], name: "Mara Manager" });
  adminApi = await signedIn(admin);
  memberApi = await signedIn(member);
  managerApi = await signedIn(manager);
});
afterAll(async () => {
  await t.close();
});

describe("POST /api/training: ids are strict", () => {
  it.each([
    ["true", true],
    ["1.5", 1.5],
    ['"1e3"', "1e3"],
    ["-1", -1],
    ["0", 0],
    ['"12abc"', "12abc"],
  ])("answers 400 naming userId for %s, and grants nothing", async (_label, userId) => {
    const cell = await makeInstrument(t.ds);
    const before = await count("training_records");
    const r = await managerApi.post("/api/training", { userId, instrumentId: cell.id });
    expect(r.status).toBe(400);
    expect(r.body.errors.map((e: { path: string }) => e.path)).toEqual(["userId"]);
    expect(await count("training_records")).toBe(before);
  });

  it("accepts the id as a string of digits", async () => {
    const cell = await makeInstrument(t.ds);
    const r = await managerApi.post("/api/training", { userId: String(member.id), instrumentId: String(cell.id) });
    expect(r.status).toBe(201);
    expect(r.body.record).toMatchObject({ userId: member.id, instrumentId: cell.id, state: "current" });
  });

  it("answers 400 naming the id of a path too", async () => {
    const r = await managerApi.post("/api/training/1.5/revoke", { reason: "Wrong cell" });
    expect(r.status).toBe(400);
    expect(r.body.errors.map((e: { path: string }) => e.path)).toEqual(["params.id"]);
  });
});

describe("training records carry the training policy's abilities", () => {
  it("lets the manager revoke a live record once; the second revoke is a 409 and the record says it can no longer be revoked", async () => {
    const cell = await makeInstrument(t.ds);
    const granted = await managerApi.post("/api/training", { userId: member.id, instrumentId: cell.id });
    expect(trainingDto.parse(granted.body.record).abilities).toEqual({ view: true, revoke: true });

    const revoked = await managerApi.post(`/api/training/${granted.body.record.id}/revoke`, { reason: "Left the sash open" });
    expect(revoked.status).toBe(200);
    expect(revoked.body.record).toMatchObject({ state: "none", notes: "Left the sash open", abilities: { view: true, revoke: false } });

    const again = await managerApi.post(`/api/training/${granted.body.record.id}/revoke`, { reason: "Twice" });
    expect(again.status).toBe(409);
    expect(again.body.code).toBe("already_revoked");
    const [row] = await t.ds.query(`SELECT notes FROM training_records WHERE id = ?`, [granted.body.record.id]);
    expect(row.notes).toBe("Left the sash open");
  });

  it("shows a member their own records, which they may not revoke", async () => {
    const cell = await makeInstrument(t.ds);
    await managerApi.post("/api/training", { userId: member.id, instrumentId: cell.id });
    const mine = await memberApi.get(`/api/training?instrumentId=${cell.id}`);
    expect(mine.status).toBe(200);
    expect(mine.body.items).toHaveLength(1);
    expect(mine.body.items[0]).toMatchObject({ userId: member.id, abilities: { view: true, revoke: false } });
  });

  it("answers a member who asks for someone else's records with their own only", async () => {
    const other = await makeUser(t.ds, { roles: ["member"] });
    const cell = await makeInstrument(t.ds);
    await managerApi.post("/api/training", { userId: other.id, instrumentId: cell.id });
    const r = await memberApi.get(`/api/training?userId=${other.id}&instrumentId=${cell.id}`);
    expect(r.body.items).toEqual([]);
  });
});

describe("training requests", () => {
  it("lets anyone signed in ask once, the manager close it once, and says who may close it", async () => {
    const cell = await makeInstrument(t.ds);
    const ask = await memberApi.post("/api/training/requests", { instrumentId: cell.id, note: "For the DCE|water runs" });
    expect(ask.status).toBe(201);
    expect(ask.body).toEqual({ request: { id: expect.any(Number), status: "open", instrumentId: cell.id } });
    const twice = await memberApi.post("/api/training/requests", { instrumentId: cell.id });
    expect(twice.status).toBe(409);
    expect(twice.body.code).toBe("request_open");

    const mine = (await memberApi.get("/api/training/requests?status=open")).body.items.find((r: { id: number }) => r.id === ask.body.request.id);
    expect(trainingRequestDto.parse(mine).abilities).toEqual({ view: true, close: false });
    const queue = (await managerApi.get("/api/training/requests?status=open")).body.items.find((r: { id: number }) => r.id === ask.body.request.id);
    expect(queue.abilities).toEqual({ view: true, close: true });

    const closed = await managerApi.post(`/api/training/requests/${ask.body.request.id}/close`, { outcome: "dismissed" });
    expect(closed.body).toEqual({ request: { id: ask.body.request.id, status: "dismissed" } });
    const again = await managerApi.post(`/api/training/requests/${ask.body.request.id}/close`, { outcome: "granted" });
    expect(again.status).toBe(409);
    expect(again.body.code).toBe("request_closed");
    const [row] = await t.ds.query(`SELECT status FROM training_requests WHERE id = ?`, [ask.body.request.id]);
    expect(row.status).toBe("dismissed");
  });
});

describe("a person's organisation", () => {
  it("is set when adding a person, shown to the administrator and carried by the person's session", async () => {
    const r = await adminApi.post("/api/users", {
      email: "r.okafor@tidewater.example",
      name: "Rita Okafor",
      roles: ["member"],
      password: "a-long-enough-password",
      organisation: "  Tidewater Metals Recovery Ltd ",
    });
    expect(r.status).toBe(201);
    expect(userAdminDto.parse(r.body.user).organisation).toBe("Tidewater Metals Recovery Ltd");
    const c = new ApiClient(t.url);
    await c.login("r.okafor@tidewater.example", "a-long-enough-password");
    expect((await c.get("/api/auth/me")).body.user.organisation).toBe("Tidewater Metals Recovery Ltd");
  });

  it("is changed and cleared by PATCH; an empty one is the host institution's (null)", async () => {
    const u = await makeUser(t.ds, { roles: ["member"] });
    const set = await adminApi.patch(`/api/users/${u.id}`, { organisation: "Northcape University" });
    expect(set.body.user.organisation).toBe("Northcape University");
    const cleared = await adminApi.patch(`/api/users/${u.id}`, { organisation: "" });
    expect(cleared.status).toBe(200);
    expect(cleared.body.user.organisation).toBeNull();
    const [row] = await t.ds.query(`SELECT organisation FROM users WHERE id = ?`, [u.id]);
    expect(row.organisation).toBeNull();
  });

  it("answers 400 for an organisation that is not text", async () => {
    const r = await adminApi.post("/api/users", { email: "x@kestrelbay.example", name: "X", roles: ["member"], organisation: 7 });
    expect(r.status).toBe(400);
    expect(r.body.errors.map((e: { path: string }) => e.path)).toEqual(["organisation"]);
  });

  it("is found by the people filter", async () => {
    await makeUser(t.ds, { name: "Findable Guest" }).then((u) => adminApi.patch(`/api/users/${u.id}`, { organisation: "Heron Coast Analytics" }));
    const r = await adminApi.get("/api/users?q=Heron%20Coast");
    expect(r.body.items.map((u: { name: string }) => u.name)).toEqual(["Findable Guest"]);
  });

  it("offers the organisations of external accounts and of people, once each", async () => {
    await makeAccount(t.ds, { kind: "external", organisation: "Sandpiper Catalysts Inc" });
    await makeAccount(t.ds, { kind: "internal", organisation: null });
    const guest = await makeUser(t.ds);
    await adminApi.patch(`/api/users/${guest.id}`, { organisation: "Avocet Instruments" });
    await adminApi.patch(`/api/users/${(await makeUser(t.ds)).id}`, { organisation: "Sandpiper Catalysts Inc" });
    const r = await adminApi.get("/api/users/organisations");
    expect(r.status).toBe(200);
    expect(r.body.items).toEqual(expect.arrayContaining(["Avocet Instruments", "Sandpiper Catalysts Inc"]));
    expect(new Set(r.body.items).size).toBe(r.body.items.length);
    expect((await memberApi.get("/api/users/organisations")).status).toBe(403);
  });
});

describe("the user policy on people rows", () => {
  it("tells the administrator they may not deactivate themself or drop their own Administrator role, and may for others", async () => {
    const other = await makeUser(t.ds, { roles: ["admin"] });
    const page = await adminApi.get("/api/users?limit=500");
    const rows = new Map<number, UserAdminDto>(page.body.items.map((u: unknown) => userAdminDto.parse(u)).map((u: UserAdminDto) => [u.id, u]));
    expect(rows.get(admin.id)?.abilities).toEqual({ edit: true, deactivate: false, reactivate: false, removeAdminRole: false });
    expect(rows.get(other.id)?.abilities).toEqual({ edit: true, deactivate: true, reactivate: false, removeAdminRole: true });
    expect(rows.get(member.id)?.abilities).toMatchObject({ deactivate: true, removeAdminRole: false });
  });

  it("refuses to remove one's own Administrator role with 422 naming roles, and changes nothing", async () => {
    const r = await adminApi.patch(`/api/users/${admin.id}`, { roles: ["member"], name: "Renamed" });
    expect(r.status).toBe(422);
    expect(r.body.code).toBe("own_admin_role");
    expect(r.body.errors[0].path).toBe("roles");
    const [row] = await t.ds.query(`SELECT name FROM users WHERE id = ?`, [admin.id]);
    expect(row.name).toBe("Ada Admin");
    expect((await adminApi.get("/api/auth/me")).body.user.roles).toEqual(["admin"]);
  });

  it("lets an administrator remove another administrator's role", async () => {
    const other = await makeUser(t.ds, { roles: ["admin", "member"] });
    const r = await adminApi.patch(`/api/users/${other.id}`, { roles: ["member"] });
    expect(r.status).toBe(200);
    expect(r.body.user.roles).toEqual(["member"]);
  });

  it("reactivates a deactivated person, who can sign in again", async () => {
    const u = await makeUser(t.ds, { roles: ["member"], active: false });
    const row = (await adminApi.get(`/api/users?q=${encodeURIComponent(u.email)}`)).body.items[0];
    expect(row.abilities).toMatchObject({ deactivate: false, reactivate: true });
    expect((await adminApi.patch(`/api/users/${u.id}`, { active: true })).status).toBe(200);
    expect((await new ApiClient(t.url).login(u.email, TEST_PASSWORD)).status).toBe(200);
  });
});

describe("the People route table's declared answers", () => {
  it("answers every GET route with the shape its declaration names", async () => {
    const table = t.tables.find((x) => x.module === "people")!;
    const as: Record<string, ApiClient> = { admin: adminApi, manager: managerApi };
    const gets = table.routes.filter((r) => r.method === "get" && r.output);
    expect(gets.map(routeKey).sort()).toEqual(
      ["GET /api/auth/csrf", "GET /api/auth/me", "GET /api/departments", "GET /api/groups", "GET /api/training", "GET /api/training/people", "GET /api/training/requests", "GET /api/users", "GET /api/users/organisations"].sort(),
    );
    for (const r of gets) {
      const client = Array.isArray(r.access) ? as[r.access[0]] : managerApi;
      const answer = await client.get(`/api${r.path}`);
      expect(answer.status, r.path).toBe(200);
      const parsed = r.output!.safeParse(answer.body);
      expect(parsed.success, `${r.path}: ${parsed.error?.message}`).toBe(true);
    }
  });
});

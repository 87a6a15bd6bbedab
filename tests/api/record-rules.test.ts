/**
 * The six cases found by trying the demo as a new user would (issue 9), each answered as decided,
 * through every route that reaches the same change: the Stockroom's and the Scan page's alike.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, TEST_NOW, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { seedDemo } from "../../server/db/seed/demo";
import { AccountMember, Container, ContainerMovement, Instrument, TrainingRecord } from "../../server/entities";

let t: TestApp;
const DEMO_PASSWORD = "phasebook-demo";
const who: Record<string, ApiClient> = {};

async function as(email: string): Promise<ApiClient> {
  const c = new ApiClient(t.url);
  expect((await c.login(email, DEMO_PASSWORD)).status, email).toBe(200);
  return c;
}

beforeAll(async () => {
  t = await startTestApp({ deps: { rateLimits: { login: { windowMs: 60_000, limit: 1000 } } } });
  await seedDemo(t.ds, { now: new Date(TEST_NOW), bcryptCost: t.ctx.bcryptCost });
  for (const [k, email] of Object.entries({
    buyer: "buyer@tidewater.example",
    member: "member@kestrelbay.example",
    lead: "lead@kestrelbay.example",
    manager: "manager@kestrelbay.example",
  })) who[k] = await as(email);
});
afterAll(async () => {
  await t.close();
});

const heldBottle = () => t.ds.getRepository(Container).createQueryBuilder("c").where("c.holdReason LIKE 'Cap liner cracked%'").getOneOrFail();

describe("the cases of issue 9, on the demo data", () => {
  it("1. the external customer cannot move the dichloroethane bottle on hold (Stockroom route and Scan route alike)", async () => {
    const c = await heldBottle();
    const elsewhere = (await t.ds.query(`SELECT id FROM locations WHERE id <> ? ORDER BY id LIMIT 1`, [c.locationId]))[0].id as number;
    for (const path of [`/api/containers/${c.id}/move`, `/api/scan-actions/containers/${c.id}/move`]) {
      const r = await who.buyer.post(path, { locationId: elsewhere });
      expect(r.status, path).toBe(403);
      expect(r.body.detail).toMatch(/Tidewater|external customer|own organisation/);
    }
    expect((await t.ds.getRepository(Container).findOneByOrFail({ id: c.id })).locationId).toBe(c.locationId);
    expect(await t.ds.getRepository(ContainerMovement).countBy({ containerId: c.id, kind: "moved" })).toBe(0);
  });

  it("2. a member of one group may not draw from, move or empty another group's container, through either route", async () => {
    const other = (await t.ds.query(
      `SELECT c.id, c.locationId, c.unit FROM containers c JOIN users u ON u.email = 'member@kestrelbay.example'
        WHERE c.groupId IS NOT NULL AND c.groupId <> u.groupId AND c.status IN ('sealed','in_use') AND c.kind = 'bottle' LIMIT 1`,
    ))[0] as { id: number; locationId: number; unit: string } | undefined;
    expect(other, "the demo has another group's bottle").toBeDefined();
    const elsewhere = (await t.ds.query(`SELECT id FROM locations WHERE id <> ? ORDER BY id LIMIT 1`, [other!.locationId]))[0].id as number;
    const tries: [string, object][] = [
      [`/api/containers/${other!.id}/usage`, { amount: 1, unit: other!.unit }],
      [`/api/containers/${other!.id}/move`, { locationId: elsewhere }],
      [`/api/scan-actions/containers/${other!.id}/move`, { locationId: elsewhere }],
      [`/api/containers/${other!.id}/empty`, {}],
      [`/api/scan-actions/containers/${other!.id}/empty`, { wasteNote: "" }],
    ];
    for (const [path, body] of tries) {
      const r = await who.member.post(path, body);
      expect({ path, status: r.status, code: r.body.code }).toEqual({ path, status: 403, code: "not_your_container" });
    }
    const listed = (await who.member.get(`/api/containers/${other!.id}`)).body.container.abilities;
    expect(listed).toMatchObject({ draw: false, move: false, markEmpty: false });
  });

  it("3. the external customer reports a fault on potentiostat 1 (202, stored and mailed) but cannot take it out of service", async () => {
    const p = await t.ds.getRepository(Instrument).findOneOrFail({ where: { kind: "potentiostat", status: "in_service" }, order: { id: "ASC" } });
    const r = await who.buyer.post(`/api/scan-actions/instruments/${p.id}/fault`, { note: "No reading on the reference channel" });
    expect(r.status).toBe(202);
    expect(r.body.record.status).toBe("in_service");
    expect(r.body.record.openFaults).toEqual([expect.objectContaining({ note: "No reading on the reference channel" })]);
    const viaInstrument = await who.buyer.post(`/api/instruments/${p.id}/faults`, { note: "Still no reading" });
    expect(viaInstrument.status).toBe(202);
    expect((await who.buyer.patch(`/api/instruments/${p.id}`, { status: "under_maintenance" })).status).toBe(403);
    expect((await t.ds.getRepository(Instrument).findOneByOrFail({ id: p.id })).status).toBe("in_service");
    const mail = await t.ds.query(`SELECT "to" FROM outbound_mail WHERE subject LIKE ?`, [`Fault reported: ${p.name}%`]);
    expect(mail.map((m: { to: string }) => m.to)).toContain("manager@kestrelbay.example");
  });

  it("4. the external customer reads a container's chemical, quantity and place, but not who used it, on which account or at what cost", async () => {
    const used = (await t.ds.query(
      `SELECT cu.containerId AS id FROM container_usages cu JOIN containers c ON c.id = cu.containerId WHERE c.groupId IS NOT NULL AND cu.costCents IS NOT NULL LIMIT 1`,
    ))[0].id as number;
    const r = await who.buyer.get(`/api/containers/${used}`);
    expect(r.status).toBe(200);
    expect(r.body.historyShown).toBe(false);
    expect(r.body.chemical.name).toBeTruthy();
    expect(r.body.usages.length).toBeGreaterThan(0);
    for (const u of r.body.usages) expect(u).toMatchObject({ userName: null, accountId: null, costCents: null, bookingId: null });
    const owner = await who.member.get(`/api/containers/${used}`);
    expect(owner.body.historyShown || owner.body.usages.some((u: { userName: string | null }) => u.userName !== null)).toBe(true);
  });

  it("5. a group lead cannot add the external customer to an internal grant (422 with a code), and the customer cannot book on it", async () => {
    const grant = (await t.ds.query(`SELECT id FROM accounts WHERE code = 'CHEM-7720-ITG'`))[0].id as number;
    const add = await who.lead.post(`/api/accounts/${grant}/members`, { email: "buyer@tidewater.example" });
    expect(add.status).toBe(422);
    expect(add.body.code).toBe("external_person_internal_account");
    expect(await t.ds.getRepository(AccountMember).countBy({ accountId: grant })).toBe(2);
    // Even a membership made before the rule (written directly here) does not let the customer charge it.
    const buyerId = (await t.ds.query(`SELECT id FROM users WHERE email = 'buyer@tidewater.example'`))[0].id as number;
    await t.ds.getRepository(AccountMember).insert({ accountId: grant, userId: buyerId, monthlyCapCents: null, exceptionReason: null });
    const trained = await t.ds.getRepository(TrainingRecord).findOneBy({ userId: buyerId });
    const instrumentId = trained?.instrumentId ?? (await t.ds.getRepository(Instrument).findOneOrFail({ where: { kind: "potentiostat" }, order: { id: "ASC" } })).id;
    const start = new Date(new Date(TEST_NOW).getTime() + 14 * 24 * 3600_000);
    start.setUTCHours(14, 0, 0, 0);
    const booking = await who.buyer.post("/api/bookings", { instrumentIds: [instrumentId], start: start.toISOString(), end: new Date(start.getTime() + 3600_000).toISOString(), accountId: grant, purpose: "test" });
    expect(booking.status).toBe(403);
    expect(booking.body.code).toBe("account_not_allowed");
  });

  it("6. ids are strict: userId true (or 1.5, \"1e3\", -1) is 400 naming the field, and nothing is granted", async () => {
    const before = await t.ds.getRepository(TrainingRecord).count();
    for (const userId of [true, 1.5, "1e3", -1]) {
      const r = await who.manager.post("/api/training", { userId, instrumentId: 1 });
      expect(r.status, JSON.stringify(userId)).toBe(400);
      expect(r.body.errors.map((e: { path: string }) => e.path)).toContain("userId");
    }
    expect(await t.ds.getRepository(TrainingRecord).count()).toBe(before);
  });
});

import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, TEST_NOW, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeBooking, makeCabinet, makeContainer, makeDichloroethane, makeGroup, makeInstrument } from "../support/label-factories";
import { AuditEntry, Container, Instrument, type Chemical, type Location, type User } from "../../server/entities";

let t: TestApp;
let member: ApiClient;
let otherMember: ApiClient;
let manager: ApiClient;
let safety: ApiClient;
let memberUser: User;
let chem: Chemical;
let cabinet: Location;

async function signedIn(u: User): Promise<ApiClient> {
  const c = new ApiClient(t.url);
  expect((await c.login(u.email, TEST_PASSWORD)).status).toBe(200);
  return c;
}

beforeAll(async () => {
  t = await startTestApp();
  memberUser = await makeUser(t.ds, { roles: ["member"] });
  member = await signedIn(memberUser);
  otherMember = await signedIn(await makeUser(t.ds, { roles: ["member"] }));
  manager = await signedIn(await makeUser(t.ds, { roles: ["manager", "member"], email: "manager-scan@kestrelbay.example" }));
  safety = await signedIn(await makeUser(t.ds, { roles: ["safety_officer"], email: "safety-scan@kestrelbay.example" }));
  chem = await makeDichloroethane(t.ds);
  cabinet = await makeCabinet(t.ds);
});
afterAll(async () => {
  await t.close();
});

const auditOf = (action: string, entityId: number) =>
  t.ds.getRepository(AuditEntry).findBy({ action, entityId });

describe("GET /api/scan/:labelToken", () => {
  it("answers a container's label with its type, id, record page and what the bench needs", async () => {
    const c = await makeContainer(t.ds, { chemicalId: chem.id, locationId: cabinet.id, quantity: 480 });
    const r = await member.get(`/api/scan/${c.labelToken}`);
    expect(r.status).toBe(200);
    expect(r.body).toMatchObject({ type: "container", id: c.id, url: `/stockroom/containers/${c.id}` });
    expect(r.body.record).toMatchObject({
      name: "1,2-Dichloroethane",
      quantity: 480,
      unit: "mL",
      signalWord: "Danger",
      hazardStatements: ["H225", "H302", "H315", "H319", "H335", "H350"],
      location: expect.stringMatching(/Chemistry Building \d+ › Room 214 › Flammables cabinet F1/),
      abilities: expect.objectContaining({ draw: true, move: true, markEmpty: true }),
    });
    // Flame, exclamation mark and health hazard for these codes (UN GHS Annex 1, as in shared/domain/hazards).
    expect(r.body.record.pictograms).toEqual(["GHS02", "GHS07", "GHS08"]);
  });

  it("gives the bench the cautions for a volatile chlorinated solvent, a fume hood among them", async () => {
    const c = await makeContainer(t.ds, { chemicalId: chem.id, locationId: cabinet.id, quantity: 100 });
    const r = await member.get(`/api/scan/${c.labelToken}`);
    const said = (r.body.record.cautions as string[]).join(" ");
    expect(said).toContain("Work in a fume hood");
    expect(said).toContain("May cause cancer");
    expect(said).toContain("halogenated solvent waste");
  });

  it("answers an instrument's label with its type, id and record page", async () => {
    const i = await makeInstrument(t.ds, "potentiostat");
    const r = await member.get(`/api/scan/${i.labelToken}`);
    expect(r.status).toBe(200);
    expect(r.body).toMatchObject({ type: "instrument", id: i.id, url: `/instruments/${i.id}`, record: { kind: "potentiostat", status: "in_service" } });
  });

  it("answers 404 label_unknown for a well-shaped code that no label carries", async () => {
    const r = await member.get(`/api/scan/${"A".repeat(32)}`);
    expect(r.status).toBe(404);
    expect(r.body.code).toBe("label_unknown");
  });

  it("answers 404 label_malformed for codes of the wrong shape, such as a database id", async () => {
    for (const bad of ["1", "short-code", "x".repeat(65), "abc%2Fdef%2Fghi%2Fjkl%2Fmnopq"]) {
      const r = await member.get(`/api/scan/${bad}`);
      expect(r.status, bad).toBe(404);
      expect(r.body.code, bad).toBe("label_malformed");
    }
  });

  it("answers 401 to someone not signed in, without saying whether the code exists", async () => {
    const c = await makeContainer(t.ds, { chemicalId: chem.id });
    const r = await new ApiClient(t.url).get(`/api/scan/${c.labelToken}`);
    expect(r.status).toBe(401);
  });

  it("shows the scanner's own current booking of an instrument and someone else's next one as a busy block", async () => {
    const cell = await makeInstrument(t.ds, "interface_cell");
    const now = Date.parse(TEST_NOW);
    const mine = await makeBooking(t.ds, {
      userId: memberUser.id,
      instrumentIds: [cell.id],
      start: new Date(now - 30 * 60_000).toISOString(),
      end: new Date(now + 60 * 60_000).toISOString(),
    });
    const otherUser = await makeUser(t.ds, { roles: ["member"], name: "Somebody Else" });
    await makeBooking(t.ds, {
      userId: otherUser.id,
      instrumentIds: [cell.id],
      start: new Date(now + 120 * 60_000).toISOString(),
      end: new Date(now + 240 * 60_000).toISOString(),
    });
    const r = await member.get(`/api/scan/${cell.labelToken}`);
    expect(r.body.record.currentBooking).toMatchObject({ id: mine.id, mine: true });
    expect(r.body.record.nextBooking).toMatchObject({ id: null, mine: false, who: null });
    const asManager = await manager.get(`/api/scan/${cell.labelToken}`);
    expect(asManager.body.record.nextBooking).toMatchObject({ who: "Somebody Else", mine: false });
  });
});

describe("POST /api/labels/:type/:id/reissue", () => {
  it("gives the container a new code; the old code then answers 404 label_replaced and the history keeps it", async () => {
    const c = await makeContainer(t.ds, { chemicalId: chem.id });
    const r = await safety.post(`/api/labels/container/${c.id}/reissue`, { reason: "Label soaked in solvent" });
    expect(r.status).toBe(200);
    expect(r.body.token).not.toBe(c.labelToken);
    expect(r.body.url).toBe(`http://phasebook.test/s/${r.body.token}`);

    const old = await member.get(`/api/scan/${c.labelToken}`);
    expect(old.status).toBe(404);
    expect(old.body).toMatchObject({ code: "label_replaced", replacedAt: TEST_NOW, labelledType: "container" });
    expect(old.body.detail).toMatch(/replaced on 2026-12-02/);

    const fresh = await member.get(`/api/scan/${r.body.token}`);
    expect(fresh.body).toMatchObject({ type: "container", id: c.id });

    const h = await safety.get(`/api/labels/container/${c.id}/history`);
    expect(h.body.items).toEqual([
      { retiredAt: TEST_NOW, retiredBy: expect.any(String), reason: "Label soaked in solvent", tokenPrefix: c.labelToken.slice(0, 6) },
    ]);
    expect(await auditOf("label.reissued", c.id)).toHaveLength(1);
  });

  it("re-issues an instrument's label too", async () => {
    const i = await makeInstrument(t.ds, "potentiostat");
    const r = await manager.post(`/api/labels/instrument/${i.id}/reissue`, {});
    expect(r.status).toBe(200);
    const old = await member.get(`/api/scan/${i.labelToken}`);
    expect(old.status).toBe(404);
    expect(old.body).toMatchObject({ code: "label_replaced", labelledType: "instrument" });
  });

  it("is refused to a member with 403, and answers 404 for a record that does not exist", async () => {
    const c = await makeContainer(t.ds, { chemicalId: chem.id });
    expect((await member.post(`/api/labels/container/${c.id}/reissue`, {})).status).toBe(403);
    expect((await manager.post(`/api/labels/container/999999/reissue`, {})).status).toBe(404);
  });
});

describe("container quick actions", () => {
  it("reports a problem to the safety officers through the outbox and the audit log", async () => {
    const c = await makeContainer(t.ds, { chemicalId: chem.id });
    const r = await member.post(`/api/scan-actions/containers/${c.id}/problem`, { note: "Cap cracked, smells of solvent" });
    expect(r.status).toBe(200);
    const mail = await t.ds.query(`SELECT "to", subject, text FROM outbound_mail WHERE subject LIKE ?`, [`%container ${c.id}`]);
    expect(mail.map((m: { to: string }) => m.to)).toContain("safety-scan@kestrelbay.example");
    expect(mail[0].text).toMatch(/Cap cracked/);
    expect(await auditOf("container.problem_reported", c.id)).toHaveLength(1);
  });

  it("answers 400 when the problem is not described", async () => {
    const c = await makeContainer(t.ds, { chemicalId: chem.id });
    const r = await member.post(`/api/scan-actions/containers/${c.id}/problem`, { note: "" });
    expect(r.status).toBe(400);
    expect(r.body.errors[0].path).toBe("note");
  });

  it("moves shared stock to another location and logs where from and where to", async () => {
    const c = await makeContainer(t.ds, { chemicalId: chem.id, locationId: cabinet.id });
    const hood = await makeCabinet(t.ds, "Fume hood H2");
    const r = await member.post(`/api/scan-actions/containers/${c.id}/move`, { locationId: hood.id });
    expect(r.status).toBe(200);
    expect(r.body.record.location).toMatch(/Fume hood H2$/);
    const [entry] = await auditOf("container.moved", c.id);
    expect(JSON.parse(entry.detail)).toEqual({ from: cabinet.id, to: hood.id });
  });

  it("refuses with 403 to move, empty or dispose of another group's container, and lets the safety officer do it", async () => {
    const group = await makeGroup(t.ds);
    const c = await makeContainer(t.ds, { chemicalId: chem.id, groupId: group.id });
    expect((await member.post(`/api/scan-actions/containers/${c.id}/move`, { locationId: cabinet.id })).status).toBe(403);
    expect((await member.post(`/api/scan-actions/containers/${c.id}/empty`, {})).status).toBe(403);
    expect((await member.post(`/api/scan-actions/containers/${c.id}/dispose`, { wasteNote: "halogenated waste drum" })).status).toBe(403);
    expect((await member.get(`/api/scan/${c.labelToken}`)).body.record.abilities).toMatchObject({ move: false, markEmpty: false, dispose: false, draw: false, reportProblem: true });
    expect((await safety.post(`/api/scan-actions/containers/${c.id}/move`, { locationId: cabinet.id })).status).toBe(200);
  });

  it("offers every location by its full path to move to", async () => {
    const r = await member.get("/api/scan-actions/locations");
    expect(r.status).toBe(200);
    expect(r.body.items).toContainEqual({ id: cabinet.id, path: expect.stringMatching(/› Room 214 › Flammables cabinet F1$/) });
  });

  it("answers 422 for a location that does not exist", async () => {
    const c = await makeContainer(t.ds, { chemicalId: chem.id });
    expect((await member.post(`/api/scan-actions/containers/${c.id}/move`, { locationId: 999999 })).status).toBe(422);
  });

  it("marks a container empty: quantity 0, status empty, the waste note and the halogenated flag in the audit", async () => {
    const c = await makeContainer(t.ds, { chemicalId: chem.id, quantity: 12 });
    const r = await member.post(`/api/scan-actions/containers/${c.id}/empty`, { wasteNote: "Rinsate to halogenated waste" });
    expect(r.status).toBe(200);
    expect(r.body.record).toMatchObject({ status: "empty", quantity: 0 });
    const [entry] = await auditOf("container.emptied", c.id);
    // C2H4Cl2 holds carbon and chlorine: halogenated organic waste.
    expect(JSON.parse(entry.detail)).toMatchObject({ quantityBefore: 12, wasteNote: "Rinsate to halogenated waste", halogenated: true });
    expect((await member.post(`/api/scan-actions/containers/${c.id}/empty`, {})).status).toBe(409);
  });

  it("lets only the stock keepers dispose of a container, with a waste note, once", async () => {
    const c = await makeContainer(t.ds, { chemicalId: chem.id });
    expect((await member.post(`/api/scan-actions/containers/${c.id}/dispose`, { wasteNote: "Halogenated waste drum W3" })).status).toBe(403);
    expect((await safety.post(`/api/scan-actions/containers/${c.id}/dispose`, {})).status).toBe(400);
    const r = await safety.post(`/api/scan-actions/containers/${c.id}/dispose`, { wasteNote: "Halogenated waste drum W3" });
    expect(r.status).toBe(200);
    expect((await t.ds.getRepository(Container).findOneByOrFail({ id: c.id })).status).toBe("disposed");
    expect((await safety.post(`/api/scan-actions/containers/${c.id}/dispose`, { wasteNote: "again" })).status).toBe(409);
    const [entry] = await auditOf("container.disposed", c.id);
    expect(JSON.parse(entry.detail)).toMatchObject({ wasteNote: "Halogenated waste drum W3", halogenated: true });
  });

  it("refuses with 403 a member emptying a container on hold, saying it is on hold; the safety officer releases it first", async () => {
    const c = await makeContainer(t.ds, { chemicalId: chem.id, status: "on_hold" });
    const r = await member.post(`/api/scan-actions/containers/${c.id}/empty`, {});
    expect(r.status).toBe(403);
    expect(r.body.code).toBe("container_on_hold");
    expect(r.body.detail).toMatch(/on hold/);
    const s = await safety.post(`/api/scan-actions/containers/${c.id}/empty`, {});
    expect(s.status).toBe(409);
    expect(s.body.code).toBe("container_on_hold");
  });

  it("answers 404 for a container that does not exist", async () => {
    expect((await member.post(`/api/scan-actions/containers/999999/problem`, { note: "Where is it?" })).status).toBe(404);
  });
});

describe("instrument quick actions", () => {
  it("records that an interface cell was cleaned, and shows when", async () => {
    const cell = await makeInstrument(t.ds, "interface_cell");
    const r = await member.post(`/api/scan-actions/instruments/${cell.id}/cleaned`, { note: "Acetone, then dried" });
    expect(r.status).toBe(200);
    expect(r.body.record.lastCleanedAt).toBe(TEST_NOW);
    expect(await auditOf("instrument.cleaned", cell.id)).toHaveLength(1);
  });

  it("answers 422 when cleaning is recorded on a potentiostat", async () => {
    const p = await makeInstrument(t.ds, "potentiostat");
    expect((await member.post(`/api/scan-actions/instruments/${p.id}/cleaned`, {})).status).toBe(422);
  });

  it("stores a fault report (202), shows it on the instrument and e-mails the managers, leaving the status to the manager", async () => {
    const p = await makeInstrument(t.ds, "potentiostat");
    const r = await member.post(`/api/scan-actions/instruments/${p.id}/fault`, { note: "Reference lead reads open circuit" });
    expect(r.status).toBe(202);
    expect(r.body.record.status).toBe("in_service");
    expect(r.body.record.openFaults).toEqual([expect.objectContaining({ note: "Reference lead reads open circuit" })]);
    expect(r.body.record.abilities).toMatchObject({ reportFault: true, takeOutOfService: false });
    expect((await t.ds.getRepository(Instrument).findOneByOrFail({ id: p.id })).status).toBe("in_service");
    const mail = await t.ds.query(`SELECT "to", text FROM outbound_mail WHERE subject LIKE ?`, [`%${p.name}%`]);
    expect(mail.map((m: { to: string }) => m.to)).toEqual(["manager-scan@kestrelbay.example"]);
    expect(mail[0].text).toMatch(/Reference lead reads open circuit/);
    const [entry] = await auditOf("instrument.fault_reported", p.id);
    expect(JSON.parse(entry.detail)).toMatchObject({ note: "Reference lead reads open circuit", status: "in_service" });
  });

  it("answers 409 to a fault report on a retired instrument", async () => {
    const p = await makeInstrument(t.ds, "potentiostat");
    await t.ds.getRepository(Instrument).update(p.id, { status: "retired" });
    expect((await otherMember.post(`/api/scan-actions/instruments/${p.id}/fault`, { note: "Broken display" })).status).toBe(409);
  });
});

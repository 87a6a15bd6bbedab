/**
 * Run plans as records (issue 12): a plan from bottles on the shelf, attached to a booking of a
 * potentiostat and an interface cell, lists what to weigh from the cell's fill volumes (the solution
 * planner: m = c·V·M ÷ purity), reserves it in named containers, and the Stockroom honours the
 * reservation: a second person cannot draw it (409 naming the container and what is free),
 * cancelling releases it, checking in turns it into usage, reserving more than the stock holds is
 * 409 naming the container and what is left. Fixed clock: 2 December 2026, 11:00 in Halifax.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, type TestApp } from "../support/test-app";
import { ApiClient } from "../support/http-client";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeAccount, makeInstrument, train } from "../support/schedule-factories";
import { ContainerUsage, type User } from "../../server/entities";

// LiCl: 6.94 + 35.45 = 42.39 g/mol (IUPAC/CIAAW 2021 abridged atomic weights, Li 6.94, Cl 35.45).
const LICL_G_PER_MOL = 42.39;

let t: TestApp;
let keeper: ApiClient;
let owner: ApiClient;
let other: ApiClient;
let ownerUser: User;
let accountId: number;
let potentiostatId: number;
let cellId: number;
let cellLabel: string;
let liclId: number;
let dceId: number;

const dec = (day: number, hhmm: string) => `2026-12-${String(day).padStart(2, "0")}T${hhmm}:00-04:00`;

async function receive(chemicalId: number, quantity: number, unit: string, kind = "bottle") {
  const r = await keeper.post("/api/containers/receive", { chemicalId, count: 1, quantity, unit, kind, supplier: "Harbourline Scientific Supply", lot: "T-1" });
  expect(r.status, r.text).toBe(201);
  return r.body.containers[0] as { id: number };
}

beforeAll(async () => {
  t = await startTestApp();
  const k = await makeUser(t.ds, { roles: ["manager", "member"] });
  ownerUser = await makeUser(t.ds, { roles: ["member"], name: "Ola Owner" });
  const o2 = await makeUser(t.ds, { roles: ["member"], name: "Otto Other" });
  keeper = new ApiClient(t.url);
  owner = new ApiClient(t.url);
  other = new ApiClient(t.url);
  await keeper.login(k.email, TEST_PASSWORD);
  await owner.login(ownerUser.email, TEST_PASSWORD);
  await other.login(o2.email, TEST_PASSWORD);
  accountId = (await makeAccount(t.ds, [ownerUser.id, o2.id])).id;
  potentiostatId = (await makeInstrument(t.ds, { kind: "potentiostat", fourElectrode: true })).id;
  const cell = await makeInstrument(t.ds, { kind: "interface_cell", interfaceAreaCm2: 1.53, aqueousFillMl: 5, organicFillMl: 4 });
  cellId = cell.id;
  cellLabel = cell.labelToken;
  for (const u of [ownerUser, o2]) for (const i of [potentiostatId, cellId]) await train(t.ds, u.id, i);
  const licl = await keeper.post("/api/chemicals", { name: "Lithium chloride", casNumber: "7447-41-8", formula: "LiCl", unitCostCents: 70, costUnit: "g", ions: [{ ion: "Li+", charge: 1, count: 1 }, { ion: "Cl-", charge: -1, count: 1 }] });
  expect(licl.status, licl.text).toBe(201);
  liclId = licl.body.chemical.id;
  const dce = await keeper.post("/api/chemicals", { name: "1,2-Dichloroethane", casNumber: "107-06-2", formula: "C2H4Cl2", densityGPerMl: 1.2569, flashPointC: 13, boilingPointC: 83.5, hazardStatements: ["H225", "H350"] });
  expect(dce.status, dce.text).toBe(201);
  dceId = dce.body.chemical.id;
  await receive(dceId, 500, "mL");
  await receive(dceId, 1000, "mL", "waste");
});
afterAll(async () => {
  await t.close();
});

/** A plan for the test cell: LiCl from the shelf in water, BTPPA TB(C6F5)4 from the ion table in DCE. */
async function makePlan(api: ApiClient, liclMolPerL: number) {
  const r = await api.post("/api/run-plans", {
    title: "TEA+ transfer, LiCl | BTPPA TB(C6F5)4",
    solvent: "dce",
    cellId,
    scanRateVPerS: 0.02,
    aqueous: [{ chemicalId: liclId, molPerL: liclMolPerL, purityPercent: 99 }],
    organic: [{ salt: "BTPPA TB(C6F5)4", molPerL: 0.005 }],
    analytes: [{ ion: "TEA+", molPerL: 0.0005, phase: "aqueous" }],
  });
  expect(r.status, r.text).toBe(201);
  return r.body.runPlan;
}

async function book(api: ApiClient, day: number) {
  const r = await api.post("/api/bookings", { instrumentIds: [potentiostatId, cellId], start: dec(day, "10:00"), end: dec(day, "12:00"), accountId, purpose: "Ion transfer" });
  expect(r.status, r.text).toBe(201);
  return r.body.booking.id as number;
}

describe("chemicals that are electrolytes", () => {
  it("say which ions they give, edited by the stock keepers; a formula unit must be neutral", async () => {
    expect((await owner.get(`/api/chemicals/${liclId}`)).body.chemical.ions).toEqual([{ ion: "Li+", charge: 1, count: 1 }, { ion: "Cl-", charge: -1, count: 1 }]);
    const bad = await keeper.patch(`/api/chemicals/${liclId}`, { ions: [{ ion: "Li+", charge: 1, count: 2 }, { ion: "Cl-", charge: -1, count: 1 }] });
    expect(bad.status).toBe(422);
    expect(bad.body.errors[0].path).toBe("ions");
    expect((await owner.patch(`/api/chemicals/${liclId}`, { ions: null })).status).toBe(403);
  });
});

describe("interface cells", () => {
  it("carry a radius and the fill volume of each phase, which the manager edits", async () => {
    const r = await keeper.patch(`/api/instruments/${cellId}`, { aqueousFillMl: 5, organicFillMl: 4, interfaceRadiusCm: null });
    expect(r.status, r.text).toBe(200);
    expect(r.body.instrument).toEqual(expect.objectContaining({ aqueousFillMl: 5, organicFillMl: 4, interfaceRadiusCm: null }));
    expect((await keeper.patch(`/api/instruments/${cellId}`, { organicFillMl: 0 })).status).toBe(400);
  });
});

describe("a saved plan", () => {
  it("lists what to weigh for each phase from the cell's volumes, with purity, and the halogenated waste", async () => {
    const plan = await makePlan(owner, 0.01);
    const licl = plan.weighing.find((w: { chemicalId: number | null }) => w.chemicalId === liclId);
    // 0.01 mol/L × 5 mL × 42.39 g/mol ÷ 0.99 = 2.141 mg (the solution planner's equation).
    expect(Math.abs(licl.amount / ((0.01 * 5 * LICL_G_PER_MOL) / 1000 / 0.99) - 1)).toBeLessThan(1e-3);
    expect(plan.weighing.find((w: { role: string }) => w.role === "solvent")).toEqual(expect.objectContaining({ chemicalId: dceId, amount: 4, unit: "mL" }));
    expect(plan.weighing.find((w: { name: string }) => w.name === "BTPPA TB(C6F5)4").amount).toBeNull();
    expect(plan.preview.window.limitingPositive).toBe("Li+");
    expect(plan.preview.analytes[0].peakCurrentA).toBeGreaterThan(0);
    expect(plan.waste).toEqual(expect.objectContaining({ halogenated: true, volumeMl: 4, hasRoom: true }));
    expect(plan.cautions.join(" ")).toMatch(/fume hood/);
    expect(plan.abilities).toEqual({ see: true, edit: true, attach: true, release: false });
  });

  it("is not shown to another member (404), and refuses an electrolyte without ions or an unknown salt naming the field", async () => {
    const plan = await makePlan(owner, 0.01);
    expect((await other.get(`/api/run-plans/${plan.id}`)).status).toBe(404);
    expect((await keeper.get(`/api/run-plans/${plan.id}`)).status).toBe(200);
    const dceAsSalt = await owner.post("/api/run-plans", { title: "x", solvent: "dce", aqueous: [{ chemicalId: dceId, molPerL: 0.01 }], organic: [{ salt: "TBA TPB", molPerL: 0.01 }] });
    expect(dceAsSalt.status).toBe(422);
    expect(dceAsSalt.body.errors[0].path).toBe("aqueous.0.chemicalId");
    const unknown = await owner.post("/api/run-plans", { title: "x", solvent: "dce", aqueous: [{ chemicalId: liclId, molPerL: 0.01 }], organic: [{ salt: "XYZ Q", molPerL: 0.01 }] });
    expect(unknown.status).toBe(422);
    expect(unknown.body.code).toBe("unknown_salt");
    expect(unknown.body.errors[0].path).toBe("organic.0.salt");
  });
});

describe("reservations", () => {
  it("a plan attached to a booking reserves its stock; a second person cannot draw it; the owner's draws count against it; cancelling releases it", async () => {
    const bottle = await receive(liclId, 0.25, "g");
    // 1 mol/L × 5 mL × 42.39 g/mol ÷ 0.99 = 0.2141 g of the 0.25 g bottle.
    const plan = await makePlan(owner, 1);
    const bookingId = await book(owner, 9);
    const r = await owner.post(`/api/run-plans/${plan.id}/reserve`, { bookingId, containers: [{ chemicalId: liclId, containerId: bottle.id }] });
    expect(r.status, r.text).toBe(200);
    const held = r.body.runPlan.reservations.find((x: { containerId: number }) => x.containerId === bottle.id);
    expect(held.state).toBe("held");
    expect(Math.abs(held.amount - (1 * 5 * LICL_G_PER_MOL) / 1000 / 0.99)).toBeLessThan(1e-4);
    expect(r.body.runPlan.booking.id).toBe(bookingId);
    expect(r.body.runPlan.abilities.release).toBe(true);

    // The Stockroom shows the reserved and free amounts.
    const shown = await other.get(`/api/containers/${bottle.id}`);
    expect(shown.body.container.reservedQuantity).toBeCloseTo(held.amount, 6);
    expect(shown.body.container.freeQuantity).toBeCloseTo(0.25 - held.amount, 6);
    expect(shown.body.reservations[0]).toEqual(expect.objectContaining({ bookingId, state: "held" }));

    // Someone else may take what is free, not what is held.
    const refused = await other.post(`/api/containers/${bottle.id}/usage`, { amount: 0.1, unit: "g" });
    expect(refused.status).toBe(409);
    expect(refused.body.code).toBe("reserved_for_booking");
    expect(refused.body.detail).toContain(`Container ${bottle.id} has 0.0359`);
    expect(refused.body.free).toBeCloseTo(0.25 - held.amount, 9);
    expect((await other.post(`/api/containers/${bottle.id}/usage`, { amount: 20, unit: "mg" })).status).toBe(200);

    // The booking's owner draws on the booking: it counts against the reservation.
    const drawn = await owner.post(`/api/containers/${bottle.id}/usage`, { amount: 0.1, unit: "g", bookingId });
    expect(drawn.status, drawn.text).toBe(200);
    const after = (await owner.get(`/api/run-plans/${plan.id}`)).body.runPlan.reservations.find((x: { containerId: number }) => x.containerId === bottle.id);
    expect(after.drawn).toBeCloseTo(0.1, 9);

    // Cancelling the booking releases what is left.
    expect((await owner.post(`/api/bookings/${bookingId}/cancel`, {})).status).toBe(200);
    const released = (await owner.get(`/api/run-plans/${plan.id}`)).body.runPlan.reservations.find((x: { containerId: number }) => x.containerId === bottle.id);
    expect(released.state).toBe("released");
    expect((await other.get(`/api/containers/${bottle.id}`)).body.container.reservedQuantity).toBe(0);
    expect((await other.post(`/api/containers/${bottle.id}/usage`, { amount: 0.1, unit: "g" })).status).toBe(200);
  });

  it("checking in turns the reservation into usage on the booking", async () => {
    const bottle = await receive(liclId, 10, "g");
    const plan = await makePlan(owner, 0.1);
    const bookingId = await book(owner, 8);
    const r = await owner.post(`/api/run-plans/${plan.id}/reserve`, { bookingId, containers: [{ chemicalId: liclId, containerId: bottle.id }] });
    expect(r.status, r.text).toBe(200);
    // The Scan page of the cell shows the plan of its next booking to the booking's owner, not to others.
    const scanned = await owner.get(`/api/scan/${cellLabel}`);
    expect(scanned.body.record.nextBooking.id).toBe(bookingId);
    expect(scanned.body.record.runPlans).toEqual([expect.objectContaining({ id: plan.id, bookingId, heldReservations: 2 })]);
    expect((await other.get(`/api/scan/${cellLabel}`)).body.record.runPlans).toEqual([]);
    t.clock.set("2026-12-08T14:05:00.000Z");
    try {
      const checkIn = await owner.post(`/api/bookings/${bookingId}/check-in`, {});
      expect(checkIn.status, checkIn.text).toBe(200);
    } finally {
      t.clock.set("2026-12-02T15:00:00.000Z");
    }
    const reservations = (await owner.get(`/api/run-plans/${plan.id}`)).body.runPlan.reservations;
    expect(reservations.every((x: { state: string }) => x.state === "used")).toBe(true);
    const usages = await t.ds.getRepository(ContainerUsage).findBy({ bookingId });
    const licl = usages.find((u) => u.containerId === bottle.id)!;
    expect(licl.amountInContainerUnit).toBeCloseTo((0.1 * 5 * LICL_G_PER_MOL) / 1000 / 0.99, 6);
    expect(licl.accountId).toBe(accountId);
    expect((await owner.get(`/api/containers/${bottle.id}`)).body.container.quantity).toBeCloseTo(10 - licl.amountInContainerUnit, 6);
    // 4 mL of 1,2-dichloroethane for the organic phase was reserved and used as well.
    expect(usages.some((u) => u.unit === "mL" && Math.abs(u.amountInContainerUnit - 4) < 1e-9)).toBe(true);
  });

  it("answers 409 naming the container and what is left when the plan needs more than it holds, and reserves nothing", async () => {
    const small = await receive(liclId, 0.05, "g");
    const plan = await makePlan(owner, 1);
    const bookingId = await book(owner, 10);
    const r = await owner.post(`/api/run-plans/${plan.id}/reserve`, { bookingId, containers: [{ chemicalId: liclId, containerId: small.id }] });
    expect(r.status).toBe(409);
    expect(r.body.code).toBe("not_enough_free");
    expect(r.body.detail).toContain(`Container ${small.id}`);
    expect(r.body.left).toBeCloseTo(0.05, 9);
    const after = (await owner.get(`/api/run-plans/${plan.id}`)).body.runPlan;
    expect(after.reservations).toEqual([]);
    expect(after.booking).toBeNull();
  });

  it("keeps a plan that holds stock from being edited until its author, the booking's owner or the manager releases it", async () => {
    const bottle = await receive(liclId, 5, "g");
    const plan = await makePlan(owner, 0.01);
    const bookingId = await book(owner, 15);
    expect((await owner.post(`/api/run-plans/${plan.id}/reserve`, { bookingId, containers: [{ chemicalId: liclId, containerId: bottle.id }] })).status).toBe(200);
    const edit = await owner.request("PUT", `/api/run-plans/${plan.id}`, { json: { ...plan.input, title: "Changed" } });
    expect(edit.status).toBe(409);
    expect(edit.body.code).toBe("plan_has_reservations");
    expect((await owner.post(`/api/run-plans/${plan.id}/reserve`, { bookingId })).status).toBe(409);
    expect((await other.post(`/api/run-plans/${plan.id}/release`)).status).toBe(404);
    const released = await keeper.post(`/api/run-plans/${plan.id}/release`);
    expect(released.status, released.text).toBe(200);
    expect(released.body.runPlan.reservations.every((r: { state: string }) => r.state === "released")).toBe(true);
    expect(released.body.runPlan.abilities).toEqual({ see: true, edit: true, attach: true, release: false });
    const edited = await owner.request("PUT", `/api/run-plans/${plan.id}`, { json: { ...plan.input, title: "Changed" } });
    expect(edited.status, edited.text).toBe(200);
    expect(edited.body.runPlan.title).toBe("Changed");
  });

  it("reserves only for the caller's own booking with a potentiostat and a cell", async () => {
    const plan = await makePlan(owner, 0.01);
    const othersBooking = await book(other, 11);
    const r = await owner.post(`/api/run-plans/${plan.id}/reserve`, { bookingId: othersBooking });
    expect(r.status).toBe(422);
    expect(r.body.errors[0].path).toBe("bookingId");
    const onlyCell = await other.post("/api/bookings", { instrumentIds: [cellId], start: dec(14, "10:00"), end: dec(14, "11:00"), accountId });
    const mine = await owner.post("/api/bookings", { instrumentIds: [potentiostatId], start: dec(14, "13:00"), end: dec(14, "14:00"), accountId });
    expect(onlyCell.status).toBe(201);
    const noCell = await owner.post(`/api/run-plans/${plan.id}/reserve`, { bookingId: mine.body.booking.id });
    expect(noCell.status).toBe(422);
    expect(noCell.body.code).toBe("booking_needs_cell");
  });
});

/**
 * The HTTP contract of API.md, exercised the way an outside script uses it: against Phasebook
 * started as `npm start` starts it (demo seed, local fakes), with a cookie and the CSRF token
 * from GET /api/auth/csrf, reading only the fields the contract names.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DateTime } from "luxon";
import Papa from "papaparse";
import { startServer, DEMO_PASSWORD, type RunningServer } from "../support/e2e";
import { ApiClient } from "../support/http-client";

let server: RunningServer;
const as: Record<string, ApiClient> = {};

async function signedIn(email: string): Promise<ApiClient> {
  const c = new ApiClient(server.url);
  const token = await c.get("/api/auth/csrf");
  c.csrf = token.body.token;
  const r = await c.login(email, DEMO_PASSWORD);
  expect(r.status, `sign-in of ${email}`).toBe(200);
  return c;
}

beforeAll(async () => {
  server = await startServer();
  for (const who of ["member", "member2", "manager", "safety"]) as[who] = await signedIn(`${who}@kestrelbay.example`);
});
afterAll(async () => {
  await server?.stop();
});

describe("health and session", () => {
  it("answers health, and me for a signed-in script", async () => {
    expect((await new ApiClient(server.url).get("/api/health")).body).toEqual({ status: "ok", db: "ok" });
    const me = await as.member.get("/api/auth/me");
    expect(me.body.user).toMatchObject({ email: "member@kestrelbay.example", roles: expect.arrayContaining(["member"]) });
  });
});

describe("instruments and bookings", () => {
  let potentiostat: number;
  let cell: number;
  let accountId: number;
  let slot: { start: string; end: string };

  beforeAll(async () => {
    const me = (await as.member.get("/api/auth/me")).body.user;
    const instruments = (await as.member.get("/api/instruments?limit=200")).body.items as {
      id: number; kind: string; status: string; requiresApproval: boolean; cleaningBufferMinutes: number;
    }[];
    const training = (await as.member.get(`/api/training?userId=${me.id}`)).body.items as { instrumentId: number; state: string }[];
    const trained = new Set(training.filter((t) => t.state === "current" || t.state === "expiring").map((t) => t.instrumentId));
    const pick = (kind: string) => instruments.find((i) => i.kind === kind && i.status === "in_service" && trained.has(i.id))!.id;
    potentiostat = pick("potentiostat");
    cell = pick("interface_cell");
    const accounts = (await as.member.get("/api/accounts")).body.items as { id: number; kind: string }[];
    accountId = accounts.find((a) => a.kind === "internal")!.id;
    // A Wednesday six weeks ahead, 10:00–12:00 in the facility's zone: clear of the demo's bookings.
    const day = DateTime.now().setZone("America/Halifax").plus({ weeks: 6 }).set({ weekday: 3, hour: 10, minute: 0, second: 0, millisecond: 0 });
    slot = { start: day.toISO()!, end: day.plus({ hours: 2 }).toISO()! };
  });

  it("lists instruments with the contract's fields", async () => {
    const r = await as.member.get("/api/instruments");
    expect(r.status).toBe(200);
    expect(r.body.total).toBeGreaterThanOrEqual(6);
    for (const i of r.body.items) {
      expect(i).toMatchObject({ id: expect.any(Number), name: expect.any(String), status: expect.any(String), requiresApproval: expect.any(Boolean), cleaningBufferMinutes: expect.any(Number) });
      expect(["potentiostat", "interface_cell", "support"]).toContain(i.kind);
    }
  });

  it("books a potentiostat and a cell together, refuses the same slot with 409, and books nothing then", async () => {
    const made = await as.member.post("/api/bookings", { instrumentIds: [potentiostat, cell], ...slot, accountId, purpose: "Ion transfer of TBA+ across water | DCE" });
    expect(made.status, made.text).toBe(201);
    expect(["confirmed", "requested"]).toContain(made.body.booking.status);
    expect([...made.body.booking.instrumentIds].sort()).toEqual([potentiostat, cell].sort());

    const again = await as.member.post("/api/bookings", { instrumentIds: [potentiostat], ...slot, accountId, purpose: "again" });
    expect(again.status).toBe(409);
    expect(again.headers.get("content-type")).toMatch(/application\/problem\+json/);

    const window = `from=${encodeURIComponent(slot.start)}&to=${encodeURIComponent(slot.end)}`;
    const listed = (await as.member.get(`/api/bookings?${window}&instrumentId=${potentiostat}`)).body.items;
    expect(listed).toHaveLength(1);

    const cancelled = await as.member.post(`/api/bookings/${made.body.booking.id}/cancel`, {});
    expect(cancelled.status).toBe(200);
  });

  it("answers 403 to someone not trained on the instruments", async () => {
    const accounts = (await as.member2.get("/api/accounts")).body.items as { id: number }[];
    const r = await as.member2.post("/api/bookings", { instrumentIds: [potentiostat], ...slot, accountId: accounts[0]?.id ?? accountId, purpose: "untrained" });
    expect(r.status).toBe(403);
  });

  it("answers 422 naming the field when the end is before the start", async () => {
    const r = await as.member.post("/api/bookings", { instrumentIds: [potentiostat], start: slot.end, end: slot.start, accountId, purpose: "backwards" });
    expect(r.status).toBe(422);
    expect(r.body.errors.map((e: { path: string }) => e.path)).toContain("end");
  });

  it("serves the member's bookings as an iCalendar feed at the secret URL", async () => {
    const { url } = (await as.member.get("/api/calendar/me")).body;
    const path = new URL(url).pathname;
    const feed = await fetch(server.url + path);
    expect(feed.status).toBe(200);
    expect(feed.headers.get("content-type")).toMatch(/text\/calendar/);
    const text = await feed.text();
    expect(text.startsWith("BEGIN:VCALENDAR\r\n")).toBe(true);
    expect(text).toContain("BEGIN:VEVENT");
  });
});

describe("stock", () => {
  it("knows 1,2-dichloroethane's hazards and classes (UN GHS 2.6: FP 13 °C, IBP 83.5 °C → category 2; NFPA 30: IB)", async () => {
    const r = await as.member.get("/api/chemicals?limit=200");
    const dce = r.body.items.find((c: { casNumber: string }) => c.casNumber === "107-06-2");
    expect(dce).toMatchObject({ ghsFlammableCategory: 2, nfpaClass: "IB", signalWord: "Danger" });
    expect(dce.hazardStatements).toEqual(expect.arrayContaining(["H225", "H350"]));
    // IUPAC/CIAAW 2021 abridged weights: C2H4Cl2 = 2(12.011) + 4(1.008) + 2(35.45) = 98.954
    expect(dce.molarMass).toBeCloseTo(98.95, 2);
  });

  it("logs usage from a container the member may use, and plans a solution", async () => {
    const chems = (await as.member.get("/api/chemicals?limit=200")).body.items as { id: number; casNumber: string }[];
    const licl = chems.find((c) => c.casNumber === "7447-41-8")!;
    const containers = (await as.member.get(`/api/containers?chemicalId=${licl.id}&status=in_use`)).body.items as { id: number; quantity: number; unit: string }[];
    const bottle = containers.find((c) => c.unit === "g" && c.quantity > 1) ?? containers[0];
    const used = await as.member.post(`/api/containers/${bottle.id}/usage`, { amount: 250, unit: "mg" });
    expect(used.status, used.text).toBe(200);
    expect(used.body.container.quantity).toBeCloseTo(bottle.quantity - (bottle.unit === "g" ? 0.25 : 250), 6);

    const tooMuch = await as.member.post(`/api/containers/${bottle.id}/usage`, { amount: 1000, unit: "kg" });
    expect(tooMuch.status).toBe(422);

    // Worked by hand: c × V × M = 0.010 mol/L × 0.100 L × 42.39 g/mol (CIAAW 2021 abridged: Li 6.94 + Cl 35.45) = 42.39 mg.
    const plan = await as.member.post("/api/solutions/plan", { soluteChemicalId: licl.id, concentrationMolPerL: 0.01, volumeMl: 100 });
    expect(plan.status).toBe(200);
    expect(plan.body.soluteMassG).toBeCloseTo(0.04239, 5);
  });

  it("opens a container's record from its label token, and 404s an unknown one", async () => {
    const containers = (await as.member.get("/api/containers?limit=1")).body.items as { id: number; labelToken: string }[];
    const r = await as.member.get(`/api/scan/${containers[0].labelToken}`);
    expect(r.status).toBe(200);
    expect(r.body).toMatchObject({ type: "container", id: containers[0].id, url: expect.any(String) });
    expect((await as.member.get("/api/scan/AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA")).status).toBe(404);
  });

  it("prints labels as a PDF for the safety officer", async () => {
    const containers = (await as.safety.get("/api/containers?limit=2")).body.items as { id: number }[];
    const r = await as.safety.get(`/api/labels.pdf?containerIds=${containers.map((c) => c.id).join(",")}`);
    expect(r.status).toBe(200);
    expect(r.headers.get("content-type")).toMatch(/application\/pdf/);
    expect(r.text.startsWith("%PDF-")).toBe(true);
  });

  it("shows the demo's over-limit cabinet in the safety totals", async () => {
    const r = await as.safety.get("/api/safety/locations");
    expect(r.status).toBe(200);
    expect(r.body.items.some((l: { overLimit: boolean }) => l.overLimit)).toBe(true);
    expect((await as.member.get("/api/safety/locations")).status).toBe(403);
  });
});

describe("recharge", () => {
  it("bills last month once, with a journal that adds up to the internal statements", async () => {
    const period = DateTime.now().setZone("America/Halifax").minus({ months: 1 }).toFormat("yyyy-MM");
    const run = await as.manager.post("/api/billing/runs", { period });
    expect(run.status, run.text).toBe(201);
    expect(run.body.run.period).toBe(period);
    const statements = run.body.run.statements as { accountId: number; total: number; currency: string; lines: unknown[] }[];
    expect(statements.length).toBeGreaterThan(0);

    expect((await as.manager.post("/api/billing/runs", { period })).status).toBe(409);

    const accounts = (await as.manager.get("/api/accounts?limit=500")).body.items as { id: number; kind: string }[];
    const internal = new Set(accounts.filter((a) => a.kind === "internal").map((a) => a.id));
    const internalTotal = statements.filter((s) => internal.has(s.accountId)).reduce((a, s) => a + s.total, 0);
    const csv = await as.manager.get(`/api/billing/runs/${run.body.run.id}/journal.csv`);
    expect(csv.status).toBe(200);
    // Double entry (issue 11): each internal account debited, the recovery account credited; the debits add up to the internal total, and so do the credits.
    const parsed = Papa.parse<Record<string, string>>(csv.text, { header: true, skipEmptyLines: true });
    expect(parsed.meta.fields).toEqual(expect.arrayContaining(["account", "debit", "credit", "currency", "description"]));
    const sum = (column: string) => parsed.data.reduce((a, row) => a + Math.round(Number(row[column] || "0") * 100), 0);
    expect(sum("debit")).toBe(internalTotal);
    expect(sum("credit")).toBe(internalTotal);
  });

  it("refuses a payment webhook with a bad signature", async () => {
    const r = await fetch(`${server.url}/api/webhooks/stripe`, {
      method: "POST",
      headers: { "content-type": "application/json", "stripe-signature": "t=1,v1=deadbeef" },
      body: JSON.stringify({ id: "evt_forged", type: "invoice.paid" }),
    });
    expect(r.status).toBe(400);
  });
});

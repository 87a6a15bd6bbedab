/**
 * A member books a slot by selecting it on the Schedule, the manager approves it in the queue,
 * the member sees it confirmed, and the mails reach the fake mailbox. A browser in another time
 * zone still sees and books the facility's local hours. Managers keep setups, the booking policy
 * and instruments from their own screens.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { DateTime } from "luxon";
import { launchBrowser, signIn, startServer, type RunningServer } from "../support/e2e";
import { ApiClient } from "../support/http-client";

let server: RunningServer;
let browser: Browser;

beforeAll(async () => {
  server = await startServer();
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

const MEMBER = "member@kestrelbay.example";
const MANAGER = "manager@kestrelbay.example";

const FACILITY_TZ = "America/Halifax";

/** A browser context whose own clock is in `timezoneId`; the Schedule must not depend on it. */
async function newPage(timezoneId = FACILITY_TZ): Promise<Page> {
  const context = await browser.newContext({ viewport: { width: 1400, height: 1000 }, timezoneId, locale: "en-GB" });
  return context.newPage();
}

/** Drags over the time grid from one slot to another in one day's column. */
async function selectRange(page: Page, date: string, from: string, lastSlot: string) {
  // The pointer works only inside the viewport: bring the range into view first.
  await page.locator(`td.fc-timegrid-slot-lane[data-time="${lastSlot}"]`).scrollIntoViewIfNeeded();
  const column = await page.locator(`td.fc-timegrid-col[data-date="${date}"]`).boundingBox();
  const top = await page.locator(`td.fc-timegrid-slot-lane[data-time="${from}"]`).boundingBox();
  const bottom = await page.locator(`td.fc-timegrid-slot-lane[data-time="${lastSlot}"]`).boundingBox();
  if (!column || !top || !bottom) throw new Error("The time grid is not on the page");
  const x = column.x + column.width / 2;
  await page.mouse.move(x, top.y + top.height / 2);
  await page.mouse.down();
  await page.mouse.move(x, (top.y + bottom.y) / 2, { steps: 4 });
  await page.mouse.move(x, bottom.y + bottom.height / 2, { steps: 4 });
  await page.mouse.up();
}

describe("booking through the Schedule with the manager's approval", () => {
  it("books by selection, is approved in the queue, shows as confirmed, and mails everyone", async () => {
    // The micro-interface cell needs approval; the manager first trains the demo member on it.
    const managerApi = new ApiClient(server.url);
    expect((await managerApi.login(MANAGER, "phasebook-demo")).status).toBe(200);
    const instruments = (await managerApi.get("/api/instruments?limit=100")).body.items as { id: number; name: string; requiresApproval: boolean }[];
    const micro = instruments.find((i) => /Micro-interface/.test(i.name))!;
    expect(micro.requiresApproval).toBe(true);
    const users = await managerApi.get("/api/training/people");
    const member = (users.body.items as { id: number; email: string }[]).find((u) => u.email === MEMBER)!;
    expect((await managerApi.post("/api/training", { userId: member.id, instrumentId: micro.id, expiresAt: new Date(Date.now() + 200 * 86_400_000).toISOString() })).status).toBe(201);

    const page = await newPage();
    await signIn(page, server.url, MEMBER);
    await page.goto(`${server.url}/schedule`);
    await page.selectOption('[data-testid="filter-instrument"]', String(micro.id));
    await page.locator("[data-testid='schedule-next']").click();
    await page.locator("[data-testid='schedule-next']").click();
    const thursday = await page.locator("th.fc-col-header-cell").nth(3).getAttribute("data-date");
    expect(thursday).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    await selectRange(page, thursday!, "10:00:00", "11:30:00");

    const form = page.locator('[data-testid="booking-form"]');
    await form.waitFor();
    expect(await form.locator(`input[type="checkbox"][value="${micro.id}"]`).isChecked()).toBe(true);
    await page.fill('[data-testid="booking-purpose"]', "Steady-state transfer of TEA+ at the micro-interface");
    await page.click('[data-testid="booking-submit"]');
    await expect.poll(() => page.getByText(/Request sent/).count(), { timeout: 15_000 }).toBeGreaterThan(0);
    // The new block says its state in words.
    await expect.poll(() => page.locator(".fc-event", { hasText: "Requested" }).count()).toBeGreaterThan(0);

    const managerPage = await newPage();
    await signIn(managerPage, server.url, MANAGER);
    await managerPage.goto(`${server.url}/schedule/approvals`);
    const row = managerPage.locator("tr", { hasText: "Priya Nandakumar" }).filter({ hasText: "Micro-interface" });
    await row.first().waitFor();
    await row.first().getByRole("button", { name: "Approve" }).click();
    await expect.poll(() => managerPage.getByText(/Approved: Priya Nandakumar/).count(), { timeout: 15_000 }).toBeGreaterThan(0);

    await page.goto(`${server.url}/bookings`);
    const mine = page.locator("tr", { hasText: "Micro-interface" });
    await mine.first().waitFor();
    expect(await mine.first().textContent()).toContain("Confirmed");

    // The outbox delivers every few seconds; the fake mailbox then lists the messages.
    const subjects = async () => {
      const r = await fetch(`${server.mailboxUrl}/messages`);
      return ((await r.json()) as { items: { subject: string; to: string[] }[] }).items.map((m) => `${m.to.join(",")} ${m.subject}`);
    };
    await expect
      .poll(subjects, { timeout: 30_000, interval: 1000 })
      .toEqual(
        expect.arrayContaining([
          expect.stringMatching(new RegExp(`${MEMBER} Booking request received: Micro-interface`)),
          expect.stringMatching(new RegExp(`${MANAGER} Approval needed: Priya Nandakumar`)),
          expect.stringMatching(new RegExp(`${MEMBER} Booking confirmed: Micro-interface`)),
        ]),
      );
    await page.context().close();
    await managerPage.context().close();
  });
});

describe("the Schedule seen from a browser in another time zone", () => {
  it("shows and books the facility's local hours when the browser's clock is in Berlin", async () => {
    const managerApi = new ApiClient(server.url);
    expect((await managerApi.login(MANAGER, "phasebook-demo")).status).toBe(200);
    const users = await managerApi.get("/api/training/people");
    const member = (users.body.items as { id: number; email: string }[]).find((u) => u.email === MEMBER)!;

    // The page shows the third week from now; pick an instrument that confirms at once and is free all that week.
    const weekStart = DateTime.now().setZone(FACILITY_TZ).startOf("week").plus({ weeks: 3 });
    const from = weekStart.toUTC().toISO()!;
    const to = weekStart.plus({ weeks: 1 }).toUTC().toISO()!;
    const all = (await managerApi.get("/api/instruments?limit=100")).body.items as { id: number; name: string; kind: string; status: string; requiresApproval: boolean }[];
    let chosen: (typeof all)[number] | undefined;
    for (const i of all.filter((x) => x.status === "in_service" && !x.requiresApproval && x.kind === "potentiostat")) {
      const r = await managerApi.get(`/api/bookings?instrumentId=${i.id}&from=${encodeURIComponent(from)}&to=${encodeURIComponent(to)}`);
      if (r.body.total === 0) {
        chosen = i;
        break;
      }
    }
    expect(chosen, "a potentiostat free for a whole week").toBeDefined();
    expect((await managerApi.post("/api/training", { userId: member.id, instrumentId: chosen!.id, expiresAt: new Date(Date.now() + 200 * 86_400_000).toISOString() })).status).toBe(201);

    const page = await newPage("Europe/Berlin");
    await signIn(page, server.url, MEMBER);
    // The browser really is on Berlin's clock.
    expect(await page.evaluate(() => Intl.DateTimeFormat().resolvedOptions().timeZone)).toBe("Europe/Berlin");
    await page.goto(`${server.url}/schedule`);
    expect(await page.locator('[data-testid="schedule-zone"]').textContent()).toContain("America/Halifax");
    await page.selectOption('[data-testid="filter-instrument"]', String(chosen!.id));
    for (let n = 0; n < 3; n += 1) await page.locator("[data-testid='schedule-next']").click();
    const tuesday = await page.locator("th.fc-col-header-cell").nth(1).getAttribute("data-date");
    expect(tuesday).toBe(weekStart.plus({ days: 1 }).toISODate());

    // 14:00–15:30 on the grid are Halifax hours: the form says so and the booking lands there.
    await selectRange(page, tuesday!, "14:00:00", "15:00:00");
    const form = page.locator('[data-testid="booking-form"]');
    await form.waitFor();
    expect(await page.inputValue('[data-testid="booking-start"]')).toBe(`${tuesday}T14:00`);
    expect(await page.inputValue('[data-testid="booking-end"]')).toBe(`${tuesday}T15:30`);
    await page.fill('[data-testid="booking-purpose"]', "Cyclic voltammetry of ferrocene in DCE, booked from abroad");
    await page.click('[data-testid="booking-submit"]');
    await expect.poll(() => page.getByText(/Booked: confirmed/).count(), { timeout: 15_000 }).toBeGreaterThan(0);
    await expect.poll(() => page.locator(".fc-event", { hasText: "14:00" }).filter({ hasText: "Confirmed" }).count()).toBeGreaterThan(0);

    const memberApi = new ApiClient(server.url);
    await memberApi.login(MEMBER, "phasebook-demo");
    const mine = (await memberApi.get(`/api/bookings?mine=true&instrumentId=${chosen!.id}&from=${encodeURIComponent(from)}&to=${encodeURIComponent(to)}`)).body
      .items as { id: number; start: string; end: string }[];
    expect(mine).toHaveLength(1);
    const expectedStart = DateTime.fromISO(`${tuesday}T14:00`, { zone: FACILITY_TZ });
    expect(new Date(mine[0]!.start).getTime()).toBe(expectedStart.toMillis());
    expect(new Date(mine[0]!.end).getTime()).toBe(expectedStart.plus({ minutes: 90 }).toMillis());

    // My bookings shows the same local hours, labelled with the facility zone's short name.
    await page.goto(`${server.url}/bookings`);
    const row = page.locator("tr", { hasText: chosen!.name });
    await row.first().waitFor();
    const short = expectedStart.setLocale("en-US").offsetNameShort!;
    expect(await row.first().textContent()).toMatch(new RegExp(`14:00 – 15:30 ${short}`));

    // Cancelling asks first, in the page's own dialog: "Keep it" changes nothing, then it cancels.
    const dialog = page.locator('[data-testid="confirm-dialog"]');
    await row.first().getByRole("button", { name: "Cancel" }).click();
    await dialog.waitFor();
    expect(await page.locator("dialog[open]").textContent()).toContain(chosen!.name);
    await page.click('[data-testid="confirm-dialog-keep"]');
    await dialog.waitFor({ state: "hidden" });
    expect((await memberApi.get(`/api/bookings/${mine[0]!.id}`)).body.booking.status).toBe("confirmed");
    await row.first().getByRole("button", { name: "Cancel" }).click();
    await page.click('[data-testid="confirm-dialog-go"]');
    await expect.poll(() => page.getByText("Cancel: done.").count()).toBeGreaterThan(0);
    await expect.poll(async () => (await memberApi.get(`/api/bookings/${mine[0]!.id}`)).body.booking.status).toBe("cancelled");
    await page.context().close();
  });
});

describe("the manager's Schedule screens", () => {
  it("adds an instrument, groups it into a setup, sets the booking policy, and retires it", async () => {
    const page = await newPage();
    await signIn(page, server.url, MANAGER);
    await page.goto(`${server.url}/instruments`);
    await page.click('[data-testid="add-instrument"]');
    const name = `Bench potentiostat ${Date.now()}`;
    await page.fill('[data-testid="instrument-name"]', name);
    await page.click('[data-testid="instrument-add-submit"]');
    await page.waitForURL(/\/instruments\/\d+$/);
    await expect.poll(() => page.getByRole("heading", { name }).count()).toBeGreaterThan(0);
    const id = Number(page.url().split("/").pop());

    await page.goto(`${server.url}/schedule/settings`);
    await page.click('[data-testid="add-setup"]');
    await page.fill('[data-testid="setup-name"]', `Bench pair ${id}`);
    const form = page.locator('[data-testid="setup-form"]');
    await form.locator(`input[type="checkbox"][value="${id}"]`).check();
    // One instrument is not a setup: the shared schema says why before anything is sent.
    await page.click('[data-testid="setup-save"]');
    await expect.poll(() => form.getByText("A setup holds at least two instruments").count()).toBeGreaterThan(0);
    await form.locator(`input[type="checkbox"]:not([value="${id}"])`).first().check();
    await page.click('[data-testid="setup-save"]');
    await expect.poll(() => page.locator('[data-testid="setups-editor"] tr', { hasText: `Bench pair ${id}` }).count()).toBe(1);

    await page.fill('[data-testid="policy-late-cancel"]', "48");
    await page.click('[data-testid="policy-save"]');
    await expect.poll(() => page.getByText(/Saved. The new policy applies/).count()).toBeGreaterThan(0);
    const api = new ApiClient(server.url);
    await api.login(MANAGER, "phasebook-demo");
    expect((await api.get("/api/bookings/policy")).body.policy.lateCancelHours).toBe(48);

    await page.goto(`${server.url}/instruments/${id}`);
    await page.click('[data-testid="retire-instrument"]');
    await page.fill('[data-testid="retire-note"]', "Replaced by the new bench unit");
    await page.click('[data-testid="retire-confirm"]');
    await expect.poll(async () => (await api.get(`/api/instruments/${id}`)).body.instrument.status).toBe("retired");
    await page.context().close();
  });
});

describe("fault reports on the instrument page", () => {
  it("lets the external customer report a fault without service controls, and the manager close it", async () => {
    const managerApi = new ApiClient(server.url);
    await managerApi.login(MANAGER, "phasebook-demo");
    const made = await managerApi.post("/api/instruments", { name: `Fault-test cell ${Date.now()}`, kind: "interface_cell" });
    expect(made.status).toBe(201);
    const id = made.body.instrument.id as number;

    // Anyone signed in reports; only the manager's page offers closing and the service controls.
    const buyer = await newPage();
    await signIn(buyer, server.url, "buyer@tidewater.example");
    await buyer.goto(`${server.url}/instruments/${id}`);
    const form = buyer.locator('[data-testid="report-fault-form"]');
    await form.waitFor();
    expect(await buyer.locator('[data-testid="service-status-controls"]').count()).toBe(0);
    expect(await buyer.locator('[data-testid="retire-instrument"]').count()).toBe(0);
    await form.locator("textarea").fill("Luggin capillary tip is chipped");
    await form.getByRole("button", { name: "Report the fault" }).click();
    await expect.poll(() => buyer.getByText("Reported. The manager has been told.").count()).toBeGreaterThan(0);
    await expect.poll(() => buyer.locator('[data-testid="instrument-faults"]').getByText("Luggin capillary tip is chipped").count()).toBe(1);
    expect(await buyer.getByRole("button", { name: "Close…" }).count()).toBe(0);
    expect((await managerApi.get(`/api/instruments/${id}`)).body.instrument.status).toBe("in_service");
    await buyer.context().close();

    const page = await newPage();
    await signIn(page, server.url, MANAGER);
    await page.goto(`${server.url}/instruments/${id}`);
    await page.locator('[data-testid="service-status-controls"]').waitFor();
    await page.getByRole("button", { name: "Close…" }).click();
    const close = page.locator('form[data-testid^="close-fault-form-"]');
    await close.locator("textarea").fill("Replaced the capillary");
    await close.getByRole("button", { name: "Close the report" }).click();
    await expect.poll(() => page.getByText("No open fault reports.").count()).toBe(1);
    await page.click('[data-testid="take-out-of-service"]');
    await expect.poll(async () => (await managerApi.get(`/api/instruments/${id}`)).body.instrument.status).toBe("under_maintenance");
    await page.locator('[data-testid="return-to-service"]').waitFor();
    await page.context().close();
  });
});

describe("the manager's training screens", () => {
  it("counts open training requests on the start page and revokes training through a dialog that asks why", async () => {
    const managerApi = new ApiClient(server.url);
    await managerApi.login(MANAGER, "phasebook-demo");
    const instruments = (await managerApi.get("/api/instruments?limit=100")).body.items as { id: number; name: string; status: string }[];
    const target = instruments.find((i) => i.status === "in_service")!;
    const people = (await managerApi.get("/api/training/people")).body.items as { id: number; email: string; name: string }[];
    const newcomer = people.find((p) => p.email === "member2@kestrelbay.example")!;

    // member2 is trained on nothing in the demo; they ask, and the manager's start page counts it.
    const asker = new ApiClient(server.url);
    await asker.login(newcomer.email, "phasebook-demo");
    expect((await asker.post("/api/training/requests", { instrumentId: target.id, note: "First run next month" })).status).toBe(201);
    const open = ((await managerApi.get("/api/training/requests?status=open")).body.items as unknown[]).length;

    const page = await newPage();
    await signIn(page, server.url, MANAGER);
    const tile = page.locator('[data-testid="stat-training-requests"]');
    await tile.waitFor();
    expect(await tile.textContent()).toContain(String(open));
    expect(await tile.textContent()).toContain("Members asking for training");

    // A record to revoke: grant it through the API, then revoke it on the Training page.
    const granted = await managerApi.post("/api/training", { userId: newcomer.id, instrumentId: target.id, expiresAt: new Date(Date.now() + 90 * 86_400_000).toISOString() });
    expect(granted.status).toBe(201);
    await page.goto(`${server.url}/training`);
    const row = page.locator("tr", { hasText: newcomer.name }).filter({ hasText: target.name }).filter({ has: page.getByRole("button", { name: "Revoke…" }) });
    await row.first().getByRole("button", { name: "Revoke…" }).click();
    const dialog = page.locator('[data-testid="revoke-dialog"]');
    await dialog.waitFor();
    // No reason, no revoke.
    expect(await page.locator('[data-testid="revoke-confirm"]').isDisabled()).toBe(true);
    await page.fill('[data-testid="revoke-reason"]', "Left the group");
    await page.click('[data-testid="revoke-confirm"]');
    await dialog.waitFor({ state: "hidden" });
    const records = (await managerApi.get(`/api/training?userId=${newcomer.id}&instrumentId=${target.id}&includeRevoked=true`)).body.items as { state: string; revokedAt: string | null; notes: string }[];
    expect(records.some((r) => r.revokedAt !== null && r.notes === "Left the group")).toBe(true);
    await page.context().close();
  });

  it("shows a phone the week as a list, books from it, and draws the calendar when asked", async () => {
    const context = await browser.newContext({ viewport: { width: 412, height: 915 }, isMobile: true, hasTouch: true, timezoneId: FACILITY_TZ, locale: "en-GB" });
    const page = await context.newPage();
    const asked: string[] = [];
    page.on("request", (r) => asked.push(new URL(r.url()).pathname));
    await signIn(page, server.url, MEMBER);
    await page.goto(`${server.url}/schedule`);
    const show = page.locator('[data-testid="show-grid"]');
    await show.waitFor({ timeout: 20_000 });
    expect(await page.locator('[data-testid="schedule-week-list"]').count()).toBe(1);
    expect(await page.locator(".fc").count()).toBe(0);
    expect(asked.some((p) => /\/assets\/schedule-grid-/.test(p))).toBe(false);
    // "Book a slot" works without the grid.
    await page.locator('[data-testid="book-slot"]').click();
    await page.getByRole("dialog", { name: "Book this slot" }).waitFor();
    await page.keyboard.press("Escape");
    await show.click();
    await page.locator(".fc").first().waitFor({ timeout: 20_000 });
    expect(await page.locator('[data-testid="schedule-week-list"]').count()).toBe(0);
    await context.close();
  });
});

/**
 * A member books a slot by selecting it on the Schedule, the manager approves it in the queue,
 * the member sees it confirmed, and the mails reach the fake mailbox.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
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

async function newPage(): Promise<Page> {
  // The facility's zone, so the calendar's hours are the instruments' bookable hours.
  const context = await browser.newContext({ viewport: { width: 1400, height: 1000 }, timezoneId: "America/Halifax" });
  return context.newPage();
}

/** Drags over the time grid from one slot to another in one day's column. */
async function selectRange(page: Page, date: string, from: string, lastSlot: string) {
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
    await page.locator(".fc-next-button").click();
    await page.locator(".fc-next-button").click();
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

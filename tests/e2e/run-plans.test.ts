/**
 * Run plans in the browser over the demo, on a phone-sized screen: the PhD student books a
 * potentiostat with an interface cell, plans a run starting from the lithium chloride bottle on
 * the shelf (water) and BTPPA TB(C6F5)4 from the ion table (1,2-dichloroethane), sees the picture
 * (the window's edges labelled Cl⁻ and Li⁺), saves the plan, reserves its stock for the booking,
 * and finds the reservation in the Stockroom and the plan on My bookings.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DateTime } from "luxon";
import type { Browser, Page } from "playwright-core";
import { launchBrowser, signIn, startServer, type RunningServer } from "../support/e2e";

let server: RunningServer;
let browser: Browser;

beforeAll(async () => {
  server = await startServer();
  browser = await launchBrowser();
}, 90_000);
afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

/** Books the first free weekday morning 8–20 days ahead on a potentiostat and a cell, through the API as the page's person. */
async function bookRun(page: Page): Promise<number> {
  return page.evaluate(async (starts: string[]) => {
    const json = async (r: Response) => (await r.json()) as any;
    const { token } = await json(await fetch("/api/auth/csrf"));
    const instruments = (await json(await fetch("/api/instruments?limit=100"))).items as { id: number; name: string; kind: string }[];
    const accounts = (await json(await fetch("/api/accounts"))).items as { id: number }[];
    const tern = instruments.find((i) => i.name.startsWith("Tern"))!;
    const cell = instruments.find((i) => i.name.startsWith("Interface cell A"))!;
    for (const start of starts) {
      const end = new Date(new Date(start).getTime() + 2 * 3_600_000).toISOString();
      const r = await fetch("/api/bookings", {
        method: "POST",
        headers: { "content-type": "application/json", "x-csrf-token": token },
        body: JSON.stringify({ instrumentIds: [tern.id, cell.id], start, end, accountId: accounts[0].id, purpose: "TEA+ transfer" }),
      });
      if (r.status === 201) return (await json(r)).booking.id as number;
    }
    throw new Error("no free slot");
  }, candidateStarts());
}

function candidateStarts(): string[] {
  const out: string[] = [];
  for (let d = 8; d <= 20; d++) {
    const day = DateTime.now().setZone("America/Halifax").plus({ days: d }).set({ hour: 13, minute: 0, second: 0, millisecond: 0 });
    if (day.weekday <= 5) out.push(day.toISO() as string);
  }
  return out;
}

async function optionValue(page: Page, selector: string, startsWith: string): Promise<string> {
  await expect.poll(() => page.locator(`${selector} option`).count()).toBeGreaterThan(2);
  return page.$eval(selector, (el, prefix) => [...(el as HTMLSelectElement).options].find((o) => o.text.startsWith(prefix))?.value ?? "", startsWith);
}

describe("run plans", () => {
  it("plans from the bottle on the shelf, shows the picture and reserves the stock for the booking", async () => {
    const context = await browser.newContext({ viewport: { width: 412, height: 915 }, isMobile: true, hasTouch: true });
    const page = await context.newPage();
    try {
      await signIn(page, server.url, "member@kestrelbay.example");
      const bookingId = await bookRun(page);

      // My bookings offers to plan the run.
      await page.goto(`${server.url}/bookings`);
      const row = page.locator(`[data-testid="my-booking-${bookingId}"]`);
      await row.getByRole("link", { name: "Plan the run" }).click();
      await page.waitForURL((u) => u.pathname === "/run-plans/new");

      // Water: the lithium chloride bottle from the Stockroom; oil: BTPPA TB(C6F5)4 from the ion table (the default).
      const licl = await optionValue(page, '[data-testid="electrolyte-aqueous-0"]', "Lithium chloride");
      expect(licl).toMatch(/^stock:\d+$/);
      await page.selectOption('[data-testid="electrolyte-aqueous-0"]', licl);
      expect(await page.$eval('[data-testid="electrolyte-organic-0"]', (el) => (el as HTMLSelectElement).value)).toBe("salt:BTPPA TB(C6F5)4");
      await page.fill('input[placeholder^="e.g. TEA"]', "TEA+ transfer at water | DCE");

      // The picture: the window's edges labelled by the ions that set them, the analyte's voltammogram, and words for it.
      const picture = page.locator('[data-testid="run-plan-picture"]');
      await expect.poll(() => picture.locator('[data-testid="edge-negative"]').textContent(), { timeout: 15_000 }).toContain("Cl⁻");
      expect(await picture.locator('[data-testid="edge-positive"]').textContent()).toContain("Li⁺");
      expect(await picture.locator('[data-testid="voltammogram"]').count()).toBe(1);
      expect(await picture.locator("figcaption").textContent()).toContain("TEA⁺ from the aqueous phase transfers at");
      expect(await page.locator('[data-testid="run-plan-conventions"]').textContent()).toContain("Pure Appl. Chem. 76 (2004) 2147");

      await page.getByRole("button", { name: "Save the plan" }).click();
      await page.waitForURL((u) => /^\/run-plans\/\d+$/.test(u.pathname), { timeout: 15_000 });
      const planId = Number(new URL(page.url()).pathname.split("/").pop());

      // What to weigh, the stock it comes from, the waste and the cautions.
      await expect.poll(() => page.locator('[data-testid="weigh-line"]').first().textContent()).toContain("Lithium chloride");
      expect(await page.locator('[data-testid="stock-lines"]').textContent()).toContain("From container");
      expect(await page.locator('[data-testid="waste-line"]').textContent()).toContain("halogenated waste");
      expect(await page.locator('[data-testid="run-plan-cautions"]').textContent()).toContain("fume hood");

      // Reserve for the booking.
      await expect.poll(() => page.locator('[data-testid="reserve-booking"] option').count()).toBeGreaterThan(0);
      await page.selectOption('[data-testid="reserve-booking"]', String(bookingId));
      await page.getByRole("button", { name: "Reserve the stock" }).click();
      await expect.poll(() => page.locator('[data-testid="reservation-row"]').count(), { timeout: 15_000 }).toBeGreaterThan(0);
      expect(await page.locator('[data-testid="reservation-row"]').first().textContent()).toContain("held");

      // The Stockroom shows the reservation on the container; My bookings links the plan.
      const plan = await page.evaluate(async (id) => (await (await fetch(`/api/run-plans/${id}`)).json()).runPlan, planId);
      const liclReservation = plan.reservations.find((r: { chemicalName: string }) => r.chemicalName === "Lithium chloride");
      await page.goto(`${server.url}/stockroom/containers/${liclReservation.containerId}`);
      await expect.poll(() => page.locator('[data-testid="container-reserved"]').textContent()).toContain("reserved for booked runs");
      await page.goto(`${server.url}/bookings`);
      await expect.poll(() => page.locator(`[data-testid="my-booking-${bookingId}"] [data-testid="booking-run-plans"]`).textContent()).toContain("TEA+ transfer at water | DCE");
    } finally {
      await context.close();
    }
  }, 120_000);
});

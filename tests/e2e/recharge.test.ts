/**
 * The manager bills last month in the browser: finalises the run, downloads the finance journal
 * (whose amounts add up to the internal statements), sees Tidewater's invoice open, pays it on
 * the fake payment service's hosted page, and sees the statement turn to paid. On the accounts
 * tab, a group lead cannot put the external customer on an internal grant; the manager can, by
 * saying why, and the member list shows the exception.
 */
import fs from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DateTime } from "luxon";
import type { Browser, Page } from "playwright-core";
import { launchBrowser, signIn, startServer, type RunningServer } from "../support/e2e";

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

describe("a month of recharge billing in the browser", () => {
  it("finalises last month, downloads the journal, and follows Tidewater's invoice from open to paid", async () => {
    const period = DateTime.now().setZone("America/Halifax").minus({ months: 1 }).toFormat("yyyy-MM");
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 }, acceptDownloads: true });
    const page = await context.newPage();
    try {
      await signIn(page, server.url, "manager@kestrelbay.example");
      await page.click('[data-testid="nav-recharge"]');
      await page.fill('[data-testid="run-period"]', period);
      await page.click('[data-testid="finalise-button"]');

      const status = page.locator('[data-testid="invoice-status-EXT-0001-TMR"]');
      await expect.poll(() => status.textContent(), { timeout: 20_000 }).toBe("open");

      const [download] = await Promise.all([page.waitForEvent("download"), page.click('[data-testid="journal-link"]')]);
      const csv = fs.readFileSync((await download.path())!, "utf8").trim().split("\r\n");
      expect(csv[0]).toBe("period,cost_centre,department,amount,currency,description");
      expect(csv.length).toBeGreaterThan(1);
      expect(csv.slice(1).every((row) => row.startsWith(`${period},`))).toBe(true);
      const journalCents = csv.slice(1).reduce((a, row) => a + Math.round(Number(row.split(",")[3]) * 100), 0);
      const runs = await page.evaluate(async () => (await (await fetch("/api/billing/runs")).json()) as { items: { id: number }[] });
      const run = await page.evaluate(async (id) => (await (await fetch(`/api/billing/runs/${id}`)).json()) as { run: { statements: { accountKind: string; total: number }[] } }, runs.items[0].id);
      expect(journalCents).toBe(run.run.statements.filter((s) => s.accountKind === "internal").reduce((a, s) => a + s.total, 0));

      const href = await page.locator('[data-testid="invoice-link-EXT-0001-TMR"]').getAttribute("href");
      expect(href?.startsWith(`${server.paymentsUrl}/invoices/`)).toBe(true);
      const payPage = await context.newPage();
      await payPage.goto(href!);
      await payPage.getByRole("button", { name: "Pay now" }).click();
      await expect.poll(() => payPage.getByText("Paid").count(), { timeout: 15_000 }).toBeGreaterThan(0);
      await payPage.close();

      await expect.poll(() => status.textContent(), { timeout: 20_000 }).toBe("paid");
    } finally {
      await context.close();
    }
  });

  it("shows the manager revenue and payments outstanding, the group lead their accounts' spend, and a member their own charges", async () => {
    // Runs after the test above: last month is final.
    const period = DateTime.now().setZone("America/Halifax").minus({ months: 1 }).toFormat("yyyy-MM");
    const as = async (email: string, look: (page: Page) => Promise<void>) => {
      const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
      const page = await context.newPage();
      try {
        await signIn(page, server.url, email);
        await look(page);
      } finally {
        await context.close();
      }
    };
    await as("manager@kestrelbay.example", async (page) => {
      await page.click('[data-testid="nav-recharge"]');
      await page.click('[data-testid="recharge-tab-spend"]');
      await expect.poll(() => page.getByRole("table", { name: "Revenue by month" }).getByRole("row", { name: new RegExp(period) }).count(), { timeout: 15_000 }).toBe(1);
      await expect.poll(() => page.getByRole("table", { name: "Revenue by department" }).getByRole("row", { name: /External customers/ }).count()).toBe(1);
      await expect.poll(() => page.getByRole("table", { name: "Invoices not yet paid" }).isVisible()).toBe(true);
    });
    await as("lead@kestrelbay.example", async (page) => {
      await page.click('[data-testid="nav-recharge"]');
      await page.click('[data-testid="recharge-tab-spend"]');
      await expect.poll(() => page.getByRole("table", { name: "Spend per account and member" }).getByRole("row", { name: new RegExp(period) }).count(), { timeout: 15_000 }).toBeGreaterThan(0);
      // Revenue is the manager's view alone.
      expect(await page.getByRole("table", { name: "Revenue by month" }).count()).toBe(0);
    });
    await as("member@kestrelbay.example", async (page) => {
      expect(await page.locator('[data-testid="nav-recharge"]').count()).toBe(0);
      await page.click('[data-testid="nav-charges"]');
      await expect.poll(() => page.getByRole("table", { name: "My charges" }).getByRole("row", { name: new RegExp(period) }).count(), { timeout: 15_000 }).toBeGreaterThan(0);
    });
  });
  it("refuses the group lead an external customer on an internal grant, and lets the manager add them as a stated exception", async () => {
    const addBuyer = async (page: Page) => {
      await page.getByRole("row", { name: /CHEM-4410-SIG/ }).getByRole("button", { name: "Manage" }).click();
      await page.getByLabel("Add a person (e-mail)").fill("buyer@tidewater.example");
      await page.getByRole("button", { name: "Allow to charge" }).click();
      await expect.poll(() => page.getByRole("alert").filter({ hasText: "Tidewater" }).count(), { timeout: 15_000 }).toBe(1);
    };
    const as = async (email: string, look: (page: Page) => Promise<void>) => {
      const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
      const page = await context.newPage();
      try {
        await signIn(page, server.url, email);
        await page.click('[data-testid="nav-recharge"]');
        await page.click('[data-testid="recharge-tab-accounts"]');
        await look(page);
      } finally {
        await context.close();
      }
    };
    await as("lead@kestrelbay.example", async (page) => {
      await addBuyer(page);
      // The exception is the manager's to make: the group lead is not offered it.
      expect(await page.getByLabel("Exception: why").count()).toBe(0);
    });
    await as("manager@kestrelbay.example", async (page) => {
      await addBuyer(page);
      await page.getByLabel("Exception: why").fill("Joint corrosion study with Tidewater, agreed with the PI");
      await page.getByRole("button", { name: "Allow as an exception" }).click();
      const row = page.getByRole("table", { name: "People who may charge this account" }).getByRole("row", { name: /Elena Marsh/ });
      await expect.poll(() => row.textContent(), { timeout: 15_000 }).toContain("Joint corrosion study with Tidewater");
    });
  });
});

/**
 * The manager opens Recharge on the demo's billed month (the month before last: statements with
 * their lines' quantity, unit and unit price, one invoice paid), then bills last month in the
 * browser: finalises the run, downloads the double-entry finance journal (debits and credits
 * each add up to the internal statements), sees Tidewater's invoice open, pays it on the fake
 * payment service's hosted page, and sees the statement turn to paid. A voided run offers its
 * reversing journal. On the accounts
 * tab, a group lead cannot put the external customer on an internal grant; the manager can, by
 * saying why, and the member list shows the exception.
 */
import fs from "node:fs";
import Papa from "papaparse";
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
      // The demo's billed month is open on arrival: Northcape's invoice paid, each statement's lines with their figures.
      const billed = DateTime.now().setZone("America/Halifax").minus({ months: 2 }).toFormat("yyyy-MM");
      await expect.poll(() => page.locator(`[data-testid="run-${billed}"]`).count(), { timeout: 15_000 }).toBe(1);
      await expect.poll(() => page.locator('[data-testid="invoice-status-EXT-0002-NCU"]').textContent(), { timeout: 15_000 }).toBe("paid");
      await page.getByRole("button", { name: /^Show the \d+ lines of CHEM-4410-SIG$/ }).click();
      const lines = page.getByRole("table", { name: `Lines of CHEM-4410-SIG, ${billed}` });
      for (const column of ["Quantity", "Unit", "Unit price", "Amount"]) expect(await lines.getByRole("columnheader", { name: column, exact: true }).count()).toBe(1);
      expect(await lines.getByRole("cell", { name: "h", exact: true }).count()).toBeGreaterThan(0);

      await page.fill('[data-testid="run-period"]', period);
      await page.click('[data-testid="finalise-button"]');

      const status = page.locator('[data-testid="invoice-status-EXT-0001-TMR"]');
      await expect.poll(() => status.textContent(), { timeout: 20_000 }).toBe("open");

      const [download] = await Promise.all([page.waitForEvent("download"), page.click('[data-testid="journal-link"]')]);
      expect(download.suggestedFilename()).toBe(`journal-${period}.csv`);
      const csv = Papa.parse<Record<string, string>>(fs.readFileSync((await download.path())!, "utf8"), { header: true, skipEmptyLines: true });
      expect(csv.meta.fields).toEqual(["period", "account", "department", "debit", "credit", "currency", "description"]);
      expect(csv.data.length).toBeGreaterThan(1);
      expect(csv.data.every((row) => row.period === period)).toBe(true);
      const sum = (column: string) => csv.data.reduce((a, row) => a + Math.round(Number(row[column] || "0") * 100), 0);
      const runs = await page.evaluate(async () => (await (await fetch("/api/billing/runs")).json()) as { items: { id: number }[] });
      const run = await page.evaluate(async (id) => (await (await fetch(`/api/billing/runs/${id}`)).json()) as { run: { statements: { accountKind: string; total: number }[] } }, runs.items[0].id);
      const internalTotal = run.run.statements.filter((s) => s.accountKind === "internal").reduce((a, s) => a + s.total, 0);
      expect(sum("debit")).toBe(internalTotal);
      expect(sum("credit")).toBe(internalTotal);

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
  it("offers a voided run's reversing journal for download, with debit and credit swapped", async () => {
    // A month of no demo use, billed and voided through the API; the page offers its reversal from the run's abilities.
    const period = DateTime.now().setZone("America/Halifax").minus({ months: 4 }).toFormat("yyyy-MM");
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 }, acceptDownloads: true });
    const page = await context.newPage();
    try {
      await signIn(page, server.url, "manager@kestrelbay.example");
      const voided = await page.evaluate(async (p) => {
        const token = ((await (await fetch("/api/auth/csrf")).json()) as { token: string }).token;
        const post = (url: string, body: object) => fetch(url, { method: "POST", headers: { "content-type": "application/json", "x-csrf-token": token }, body: JSON.stringify(body) });
        const run = ((await (await post("/api/billing/runs", { period: p })).json()) as { run: { id: number } }).run;
        await post(`/api/billing/runs/${run.id}/void`, { reason: "Billed by mistake in a test" });
        return run.id;
      }, period);
      await page.click('[data-testid="nav-recharge"]');
      await page.locator(`[data-testid="run-${period}"]`).getByRole("button", { name: "Open" }).click();
      await expect.poll(() => page.locator('[data-testid="reversal-link"]').count(), { timeout: 15_000 }).toBe(1);
      expect(await page.locator('[data-testid="journal-link"]').textContent()).toBe("Journal, void (CSV)");
      const [download] = await Promise.all([page.waitForEvent("download"), page.click('[data-testid="reversal-link"]')]);
      expect(download.suggestedFilename()).toBe(`journal-${period}-reversal.csv`);
      const csv = Papa.parse<Record<string, string>>(fs.readFileSync((await download.path())!, "utf8"), { header: true, skipEmptyLines: true });
      expect(csv.meta.fields).toEqual(["period", "account", "department", "debit", "credit", "currency", "description"]);
      const sum = (column: string) => csv.data.reduce((a, row) => a + Math.round(Number(row[column] || "0") * 100), 0);
      expect(sum("debit")).toBe(sum("credit"));
      expect(voided).toBeGreaterThan(0);
    } finally {
      await context.close();
    }
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

/**
 * The Stockroom in the browser over the demo scenario: the PhD student prepares a solution from
 * a lithium chloride bottle and a 1,2-dichloroethane bottle and sees both parents decremented
 * and the new container with its lineage; the safety officer's review shows the over-limit
 * under-bench cabinet.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
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

async function optionValue(page: Page, selectTestId: string, startsWith: string): Promise<string> {
  await expect.poll(() => page.locator(`[data-testid="${selectTestId}"] option`).count()).toBeGreaterThan(2);
  return page.$eval(
    `[data-testid="${selectTestId}"]`,
    (el, prefix) => [...(el as HTMLSelectElement).options].find((o) => o.text.startsWith(prefix))?.value ?? "",
    startsWith,
  );
}

async function quantityOf(page: Page, id: string): Promise<number> {
  return page.evaluate(async (cid) => (await (await fetch(`/api/containers/${cid}`)).json()).container.quantity as number, id);
}

describe("the Stockroom", () => {
  it("prepares a solution from two containers: both parents decremented, the new container with its lineage", async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    try {
      await signIn(page, server.url, "member@kestrelbay.example");
      await page.click('[data-testid="nav-stockroom"]');
      await page.click('[data-testid="prepare-solution-link"]');
      const soluteId = await optionValue(page, "solute-select", "Lithium chloride");
      const solventId = await optionValue(page, "solvent-select", "1,2-Dichloroethane");
      expect(soluteId).not.toBe("");
      expect(solventId).not.toBe("");
      const soluteBefore = await quantityOf(page, soluteId);
      const solventBefore = await quantityOf(page, solventId);

      await page.selectOption('[data-testid="solute-select"]', soluteId);
      await page.selectOption('[data-testid="solvent-select"]', solventId);
      // The person is about to handle 1,2-dichloroethane: its statements, pictogram names, a fume hood and the precedence sentence.
      const cautions = page.locator('[data-testid="prepare-cautions"]');
      await expect.poll(() => cautions.textContent()).toContain("Work in a fume hood");
      expect(await cautions.textContent()).toContain("H350");
      expect(await cautions.textContent()).toContain("Flame (GHS02)");
      expect(await page.locator('[data-testid="precedence-caution"]').textContent()).toContain(
        "the local fire code, the institution's safety office and the safety data sheet, which take precedence",
      );
      await page.fill('input[name="concentrationMmolPerL"]', "10");
      await page.fill('input[name="volumeMl"]', "100");
      // 10 mmol/L × 0.100 L × 42.39 g/mol = 42.39 mg (reference worked example).
      await expect.poll(() => page.locator('[data-testid="plan-mass"]').textContent()).toBe("42.39 mg");
      await page.fill('[data-testid="mass-weighed"]', "43.0");
      await page.click('[data-testid="prepare-submit"]');
      await page.waitForURL((u) => /\/stockroom\/containers\/\d+$/.test(u.pathname), { timeout: 15_000 });

      const lineage = page.locator('[data-testid="lineage"]');
      await expect.poll(() => lineage.textContent()).toContain(`Lithium chloride #${soluteId}`);
      expect(await lineage.textContent()).toContain(`1,2-Dichloroethane #${solventId}`);
      expect(await page.locator('[data-testid="container-quantity"]').textContent()).toBe("100 mL");
      await expect.poll(() => page.locator('[data-testid="hazard-panel"]').textContent()).toContain("take precedence over anything Phasebook computes");

      expect(await quantityOf(page, soluteId)).toBeCloseTo(soluteBefore - 0.043, 9);
      expect(await quantityOf(page, solventId)).toBeCloseTo(solventBefore - 100, 9);
    } finally {
      await context.close();
    }
  }, 60_000);

  it("lets the safety officer print labels for a selection of containers", async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    try {
      await signIn(page, server.url, "safety@kestrelbay.example");
      await page.click('[data-testid="nav-stockroom"]');
      const boxes = page.locator('[data-testid^="select-container-"]');
      await expect.poll(() => boxes.count(), { timeout: 15_000 }).toBeGreaterThan(1);
      await boxes.nth(0).check();
      await boxes.nth(1).check();
      await page.getByRole("button", { name: "Print labels for 2 selected" }).click();
      const href = await page.locator('[data-testid="print-labels-open"]').getAttribute("href");
      expect(href).toMatch(/^\/api\/labels\.pdf\?containerIds=\d+%2C\d+$/);
      const pdf = await page.evaluate(async (u) => {
        const r = await fetch(u);
        return { status: r.status, type: r.headers.get("content-type"), head: new TextDecoder().decode((await r.arrayBuffer()).slice(0, 5)) };
      }, href!);
      expect(pdf).toEqual({ status: 200, type: "application/pdf", head: "%PDF-" });
    } finally {
      await context.close();
    }
  }, 60_000);

  it("refuses a containers CSV with a bad row, naming its line, and imports nothing", async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    try {
      await signIn(page, server.url, "safety@kestrelbay.example");
      await page.click('[data-testid="nav-stockroom"]');
      await page.click('[data-testid="import-link"]');
      const total = () => page.evaluate(async () => (await (await fetch("/api/containers?status=sealed,in_use,on_hold,empty,disposed&limit=1")).json()).total as number);
      const before = await total();
      // Line 3 has a CAS number whose check digit is wrong (107-06-2 is right; CAS check-digit rule).
      const csv = "casNumber,quantity,unit\n107-06-2,500,mL\n107-06-3,500,mL\n";
      await page.setInputFiles('[data-testid="import-containers-file"]', { name: "delivery.csv", mimeType: "text/csv", buffer: Buffer.from(csv) });
      await page.click('[data-testid="import-containers-send"]');
      const bad = page.locator('[data-testid="import-containers-bad"]');
      await expect.poll(() => bad.textContent(), { timeout: 15_000 }).toContain("nothing was imported");
      expect(await bad.locator("tbody tr").count()).toBe(1);
      expect(await bad.locator("tbody tr td").first().textContent()).toBe("3");
      expect(await total()).toBe(before);
    } finally {
      await context.close();
    }
  }, 60_000);

  it("lets the safety officer upload a safety data sheet on the chemical page", async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    try {
      await signIn(page, server.url, "safety@kestrelbay.example");
      const id = await page.evaluate(async () => (await (await fetch("/api/chemicals?q=107-06-2")).json()).items[0].id as number);
      await page.goto(`${server.url}/stockroom/chemicals/${id}`);
      const pdf = Buffer.from("%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n");
      await page.setInputFiles('[data-testid="sds-file"]', { name: "dce-sheet-2026.pdf", mimeType: "application/pdf", buffer: pdf });
      await page.fill('[data-testid="sds-reviewed-on"]', "2026-06-01");
      await page.click('[data-testid="sds-upload"]');
      await expect.poll(() => page.locator('[data-testid="sds-list"]').textContent(), { timeout: 15_000 }).toContain("dce-sheet-2026.pdf");
    } finally {
      await context.close();
    }
  }, 60_000);

  it("opens the Stockroom on the containers on hold from the safety officer's start page", async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    try {
      await signIn(page, server.url, "safety@kestrelbay.example");
      const tile = page.locator('[data-testid="stat-on-hold"]');
      await tile.waitFor();
      const onHold = Number(await tile.locator("p.text-2xl").textContent());
      expect(onHold, "the demo holds containers on hold").toBeGreaterThan(0);
      await tile.getByRole("link").click();
      await page.waitForURL((u) => u.pathname === "/stockroom" && u.searchParams.get("status") === "on_hold");
      await expect.poll(() => page.locator('[data-testid^="container-row-"]').count(), { timeout: 15_000 }).toBe(onHold);
      const states = await page.locator('[data-testid^="container-row-"]').allTextContents();
      expect(states.every((row) => /On hold/.test(row))).toBe(true);
    } finally {
      await context.close();
    }
  }, 60_000);

  it("shows the safety officer the demo's over-limit under-bench cabinet", async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    try {
      await signIn(page, server.url, "safety@kestrelbay.example");
      await page.click('[data-testid="nav-safety"]');
      const finding = page.getByText(/location(s are| is) over (a|the) limit: .*Under-bench solvent cabinet UB-1/);
      await expect.poll(() => finding.count(), { timeout: 15_000 }).toBe(1);
      await expect.poll(() => page.getByText(/Over limit by \d+\.\d\d L/).count()).toBeGreaterThan(0);
    } finally {
      await context.close();
    }
  }, 60_000);
});

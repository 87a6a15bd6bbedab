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

  it("shows the safety officer the demo's over-limit under-bench cabinet", async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    try {
      await signIn(page, server.url, "safety@kestrelbay.example");
      await page.click('[data-testid="nav-safety"]');
      const finding = page.getByText(/location(s are| is) over the limit: .*Under-bench solvent cabinet UB-1/);
      await expect.poll(() => finding.count(), { timeout: 15_000 }).toBe(1);
      await expect.poll(() => page.getByText(/Over limit by \d+\.\d\d L/).count()).toBeGreaterThan(0);
    } finally {
      await context.close();
    }
  }, 60_000);
});

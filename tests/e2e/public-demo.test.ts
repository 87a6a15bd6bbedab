/**
 * A production server started with DEMO_SEED=1 is a public demo: every page, signed in or not,
 * carries the banner; the administrator's System page says mail and card payments wait, and
 * that no nightly backup is scheduled.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { launchBrowser, signIn, startServer, type RunningServer } from "../support/e2e";

let server: RunningServer;
let browser: Browser;

beforeAll(async () => {
  server = await startServer({ env: { NODE_ENV: "production", DEMO_SEED: "1" } });
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

describe("the public demo", () => {
  it("shows the banner on the sign-in page and on every signed-in page, and the System page shows what waits", async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await context.newPage();
    try {
      await page.goto(`${server.url}/sign-in`);
      await expect.poll(() => page.locator('[data-testid="public-demo-banner"]').textContent()).toMatch(/Public demo\..*invented/);
      await signIn(page, server.url, "admin@kestrelbay.example");
      for (const path of ["/", "/admin/people"]) {
        await page.goto(`${server.url}${path}`);
        await expect.poll(() => page.locator('[data-testid="public-demo-banner"]').isVisible(), { message: path }).toBe(true);
      }
      await page.click('[data-testid="nav-system"]');
      await page.waitForURL((u) => u.pathname === "/admin/mailbox");
      await expect.poll(() => page.locator('[data-testid="status-mail"]').textContent()).toContain("nothing: SMTP_URL is not set");
      await expect.poll(() => page.locator('[data-testid="status-payments"]').textContent()).toContain("nothing: STRIPE_SECRET_KEY is not set");
      await expect.poll(() => page.locator('[data-testid="status-backup"]').textContent()).toContain("not set (BACKUP_DIR)");
      // The mailbox's own section loads after the status.
      await expect.poll(() => page.locator("main").textContent(), { timeout: 15_000 }).toContain("The local mailbox is switched off here");
    } finally {
      await context.close();
    }
  });
});

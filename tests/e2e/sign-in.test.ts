/** Each demo role signs in through the browser, sees its own navigation, and signs out. */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
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

const EVERYONE = ["home", "schedule", "bookings", "instruments", "stockroom", "scan"];
const CASES: { email: string; sees: string[]; hidden: string[] }[] = [
  { email: "member@kestrelbay.example", sees: EVERYONE, hidden: ["training", "recharge", "safety", "people", "system"] },
  { email: "member2@kestrelbay.example", sees: EVERYONE, hidden: ["training", "recharge", "safety", "people"] },
  { email: "lead@kestrelbay.example", sees: [...EVERYONE, "recharge"], hidden: ["training", "safety", "people"] },
  { email: "manager@kestrelbay.example", sees: [...EVERYONE, "training", "recharge", "safety"], hidden: ["people", "system"] },
  { email: "safety@kestrelbay.example", sees: [...EVERYONE, "safety"], hidden: ["training", "recharge", "people"] },
  { email: "admin@kestrelbay.example", sees: ["home", "people", "system"], hidden: ["training", "recharge"] },
  { email: "buyer@tidewater.example", sees: EVERYONE, hidden: ["training", "recharge", "safety", "people"] },
];

describe("signing in as each demo role", () => {
  for (const c of CASES) {
    it(`${c.email} sees its own navigation and signs out`, async () => {
      const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
      const page = await context.newPage();
      try {
        await signIn(page, server.url, c.email);
        for (const slug of c.sees) {
          await expect.poll(() => page.locator(`[data-testid="nav-${slug}"]`).first().isVisible(), { message: `nav-${slug} for ${c.email}` }).toBe(true);
        }
        for (const slug of c.hidden) {
          expect(await page.locator(`[data-testid="nav-${slug}"]`).count(), `nav-${slug} hidden for ${c.email}`).toBe(0);
        }
        await page.click('[data-testid="sign-out"]');
        await page.waitForURL((u) => u.pathname.startsWith("/sign-in"));
        // Signed out for real: the API no longer knows this browser.
        const me = await page.evaluate(async () => (await fetch("/api/auth/me")).status);
        expect(me).toBe(401);
      } finally {
        await context.close();
      }
    });
  }

  it("sends someone who is not signed in to the sign-in page and back to where they were going", async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    try {
      await page.goto(`${server.url}/instruments`);
      await page.waitForURL((u) => u.pathname.startsWith("/sign-in"));
      await page.fill('input[name="email"]', "member@kestrelbay.example");
      await page.fill('input[name="password"]', "phasebook-demo");
      await page.click('[data-testid="sign-in-submit"]');
      await page.waitForURL((u) => u.pathname === "/instruments");
    } finally {
      await context.close();
    }
  });

  it("shows a wrong password as words on the page", async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    try {
      await page.goto(`${server.url}/sign-in`);
      await page.fill('input[name="email"]', "member@kestrelbay.example");
      await page.fill('input[name="password"]', "not-the-password");
      await page.click('[data-testid="sign-in-submit"]');
      await expect.poll(() => page.getByText(/not right/i).count()).toBeGreaterThan(0);
    } finally {
      await context.close();
    }
  });
});

describe("the API description", () => {
  it("renders at /api/docs from files the app ships (no CDN), listing the contract's routes", async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await context.newPage();
    const foreign: string[] = [];
    page.on("request", (r) => {
      if (!r.url().startsWith(server.url)) foreign.push(r.url());
    });
    try {
      await page.goto(`${server.url}/api/docs`);
      await expect.poll(() => page.getByText("Phasebook API").first().isVisible(), { timeout: 20_000 }).toBe(true);
      await expect.poll(() => page.getByText("/api/containers/{id}/usage").first().isVisible()).toBe(true);
      expect(foreign).toEqual([]);
    } finally {
      await context.close();
    }
  });
});

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
      // The server compares at the configured bcrypt cost (about half a second, longer on a busy machine).
      await expect.poll(() => page.getByText(/not right/i).count(), { timeout: 10_000 }).toBeGreaterThan(0);
    } finally {
      await context.close();
    }
  });
});

describe("choosing a new password", () => {
  it("says next to the field why a short or a common password is refused, and changes nothing", async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await context.newPage();
    /** The words of the "New password" field: its label, and its hint or the error in the hint's place. */
    const underNewPassword = () => page.locator('input[name="newPassword"]').evaluate((el) => el.closest("div")?.textContent ?? "");
    try {
      await signIn(page, server.url, "member2@kestrelbay.example");
      await page.goto(`${server.url}/profile`);
      await page.locator('input[name="currentPassword"]').fill("phasebook-demo");
      for (const [typed, words] of [
        ["aaaaaaaaaa", /at least 12 characters/i],
        ["qwerty123456", /commonly used passwords/i],
      ] as const) {
        await page.locator('input[name="newPassword"]').fill(typed);
        await page.locator('input[name="repeatPassword"]').fill(typed);
        await page.getByRole("button", { name: "Change password" }).click();
        await expect.poll(underNewPassword, { timeout: 10_000, message: typed }).toMatch(words);
      }
    } finally {
      await context.close();
    }
    // The refusals changed nothing: the demo password still signs in.
    const again = await browser.newContext();
    try {
      await signIn(await again.newPage(), server.url, "member2@kestrelbay.example");
    } finally {
      await again.close();
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
      // Areas open folded; the Stockroom's unfolds to its routes.
      await page.locator("#operations-tag-stockroom").click();
      await expect.poll(() => page.getByText("/api/containers/{id}/usage").first().isVisible(), { timeout: 20_000 }).toBe(true);
      expect(foreign).toEqual([]);
    } finally {
      await context.close();
    }
  });
});

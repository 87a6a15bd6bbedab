/**
 * The axe walk: every page each demo role can reach — the links of its navigation, the pages
 * those screens lead to (src/config/paths.ts: an instrument, a chemical, a container, a scanned
 * label, the profile, the area sub-pages of AREA_ROLES) and the signed-out pages — checked with
 * axe-core against the WCAG 2.2 AA rules (tags wcag2a, wcag2aa, wcag21a, wcag21aa, wcag22aa), at a
 * desk (1280×800) and on a phone (390×844), and for the manager, who reaches the most pages, in
 * the dark colour scheme too. Any violation fails with the rule, the page and the elements.
 */
import fs from "node:fs";
import { createRequire } from "node:module";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { paths } from "../../src/config/paths";
import { AREA_ROLES } from "../../src/layouts/nav-items";
import { DEMO_PASSWORD, launchBrowser, startServer, type RunningServer } from "../support/e2e";
import { ApiClient } from "../support/http-client";

const AXE_SOURCE = fs.readFileSync(createRequire(import.meta.url).resolve("axe-core/axe.min.js"), "utf8");
const TAGS = ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa", "wcag22aa"];

const SIZES = {
  desk: { width: 1280, height: 800 },
  phone: { width: 390, height: 844 },
} as const;

type RoleName = "member" | "group_lead" | "manager" | "safety_officer" | "admin";
const ACCOUNTS: Record<RoleName, string> = {
  member: "member@kestrelbay.example",
  group_lead: "lead@kestrelbay.example",
  manager: "manager@kestrelbay.example",
  safety_officer: "safety@kestrelbay.example",
  admin: "admin@kestrelbay.example",
};

let server: RunningServer;
let browser: Browser;
/** Concrete addresses of the detail pages, read from the demo data. */
let details: { instrument: string; chemical: string; container: string; scanned: string };
/** The demo roles each account holds (a manager is also a member, and so on). */
const rolesOf = new Map<RoleName, string[]>();

beforeAll(async () => {
  server = await startServer();
  browser = await launchBrowser();
  const manager = new ApiClient(server.url);
  expect((await manager.login(ACCOUNTS.manager, DEMO_PASSWORD)).status).toBe(200);
  const instrument = (await manager.get("/api/instruments?limit=1")).body.items[0] as { id: number };
  const container = (await manager.get("/api/containers?limit=1&status=sealed,in_use")).body.items[0] as { id: number; chemicalId: number; labelToken: string };
  details = {
    instrument: paths.instrument.getHref(instrument.id),
    chemical: paths.chemical.getHref(container.chemicalId),
    container: paths.container.getHref(container.id),
    scanned: paths.scanToken.getHref(container.labelToken),
  };
  for (const [role, email] of Object.entries(ACCOUNTS) as [RoleName, string][]) {
    const api = new ApiClient(server.url);
    const me = await api.login(email, DEMO_PASSWORD);
    rolesOf.set(role, (me.body.user as { roles: string[] }).roles);
  }
});
afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

/** The pages behind a role's navigation that the navigation itself does not list. */
function subPages(roles: string[]): string[] {
  const holds = (area: readonly string[]) => area.some((r) => roles.includes(r));
  const pages = [details.instrument, details.chemical, details.container, details.scanned, paths.profile.getHref(), paths.stockroomChemicals.getHref()];
  if (roles.some((r) => ["member", "manager", "safety_officer"].includes(r))) pages.push(paths.prepareSolution.getHref());
  if (holds(AREA_ROLES.training)) pages.push(paths.approvals.getHref(), paths.utilisation.getHref(), paths.scheduleSettings.getHref());
  if (holds(AREA_ROLES.safety)) pages.push(paths.safetyLocations.getHref(), paths.receive.getHref(), paths.stockImport.getHref());
  return pages;
}

interface Violation {
  id: string;
  impact: string | null;
  help: string;
  nodes: { target: string[]; failureSummary?: string }[];
}

/** Waits for a screen to settle: no request in flight, no loading line, a page heading. */
async function settle(page: Page): Promise<void> {
  await page.waitForLoadState("networkidle", { timeout: 30_000 }).catch(() => undefined);
  await page.waitForFunction(() => !document.querySelector('[aria-busy="true"]') && !/Loading|Checking your session/.test(document.body.innerText.slice(0, 4000)), undefined, { timeout: 20_000 }).catch(() => undefined);
  // Every screen has its h1 (PageHeader); a missing one is reported with the page rather than waited for.
  await page.locator("h1").first().waitFor({ timeout: 10_000 }).catch(() => undefined);
}

const headingProblem = async (page: Page, where: string): Promise<string[]> => ((await page.locator("h1").count()) === 0 ? [`${where}: no h1 on the page`] : []);

async function axe(page: Page): Promise<Violation[]> {
  if (!(await page.evaluate(() => "axe" in window))) await page.evaluate(AXE_SOURCE);
  return page.evaluate(async (tags) => {
    const run = (window as unknown as { axe: { run: (ctx: Document, opts: unknown) => Promise<{ violations: Violation[] }> } }).axe.run;
    const result = await run(document, { runOnly: { type: "tag", values: tags }, resultTypes: ["violations"] });
    return result.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.map((n) => ({ target: n.target, failureSummary: n.failureSummary })) }));
  }, TAGS);
}

function describeViolations(where: string, violations: Violation[]): string[] {
  return violations.map((v) => `${where}: ${v.id} (${v.impact}) ${v.help} — ${v.nodes.slice(0, 4).map((n) => n.target.join(" ")).join(", ")}${v.nodes.length > 4 ? ` and ${v.nodes.length - 4} more` : ""}`);
}

async function newContext(size: keyof typeof SIZES, colorScheme: "light" | "dark" = "light"): Promise<BrowserContext> {
  return browser.newContext({ viewport: SIZES[size], colorScheme, reducedMotion: "reduce", bypassCSP: true, locale: "en-GB" });
}

async function signIn(page: Page, email: string): Promise<void> {
  await page.goto(`${server.url}${paths.signIn.getHref()}`);
  await page.fill('input[name="email"]', email);
  await page.fill('input[name="password"]', DEMO_PASSWORD);
  await page.click('[data-testid="sign-in-submit"]');
  await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"), { timeout: 20_000 });
}

/** Signs in, reads the navigation's links, then checks each page the role can reach. */
async function walk(role: RoleName, size: keyof typeof SIZES, colorScheme: "light" | "dark" = "light"): Promise<{ visited: string[]; problems: string[] }> {
  const context = await newContext(size, colorScheme);
  const page = await context.newPage();
  const problems: string[] = [];
  try {
    await signIn(page, ACCOUNTS[role]);
    await settle(page);
    const navLinks = await page.$$eval('#app-nav a[data-testid^="nav-"]', (links) => links.map((a) => a.getAttribute("href") ?? ""));
    expect(navLinks.length, `${role}'s navigation`).toBeGreaterThan(3);
    const pages = [...new Set([...navLinks, ...subPages(rolesOf.get(role) ?? [])])];
    for (const p of pages) {
      await page.goto(server.url + p);
      await settle(page);
      problems.push(...describeViolations(`${role} ${size} ${colorScheme} ${p}`, await axe(page)), ...(await headingProblem(page, `${role} ${size} ${p}`)));
    }
    if (size === "phone") {
      // The folded navigation, opened.
      await page.getByRole("button", { name: "Open menu" }).click();
      problems.push(...describeViolations(`${role} ${size} ${colorScheme} open menu`, await axe(page)));
    }
    return { visited: pages, problems };
  } finally {
    await context.close();
  }
}

describe("the axe walk (WCAG 2.2 AA)", () => {
  it("finds nothing on the signed-out pages, at a desk and on a phone, light and dark", { timeout: 300_000 }, async () => {
    const problems: string[] = [];
    for (const size of ["desk", "phone"] as const) {
      for (const scheme of ["light", "dark"] as const) {
        const context = await newContext(size, scheme);
        const page = await context.newPage();
        for (const p of [paths.signIn.getHref(), paths.forgot.getHref(), paths.reset.getHref("not-a-real-token-but-long-enough")]) {
          await page.goto(server.url + p);
          await settle(page);
          problems.push(...describeViolations(`signed out ${size} ${scheme} ${p}`, await axe(page)));
        }
        // The sign-in form with its errors showing.
        await page.goto(server.url + paths.signIn.getHref());
        await page.click('[data-testid="sign-in-submit"]');
        await page.locator('[aria-invalid="true"]').first().waitFor();
        problems.push(...describeViolations(`signed out ${size} ${scheme} sign-in with errors`, await axe(page)));
        await context.close();
      }
    }
    expect(problems).toEqual([]);
  });

  for (const role of Object.keys(ACCOUNTS) as RoleName[]) {
    it(`finds nothing on any page the ${role.replace("_", " ")} reaches, at a desk and on a phone`, { timeout: 600_000 }, async () => {
      const desk = await walk(role, "desk");
      const phone = await walk(role, "phone");
      expect(desk.visited.length).toBeGreaterThan(6);
      expect([...desk.problems, ...phone.problems]).toEqual([]);
    });
  }

  it("finds nothing on the manager's pages in the dark colour scheme", { timeout: 600_000 }, async () => {
    const dark = await walk("manager", "desk", "dark");
    expect(dark.problems).toEqual([]);
  });
});

/**
 * How the client arrives in a real browser: its scripts come compressed and cached for a year;
 * a screen's queries start while its code is still on the way (the route loaders), which the
 * test proves by holding the screen's code back until its data has been asked for; and a link
 * warms the next screen's code when the pointer rests on it or it gets the keyboard's focus.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page, Route } from "playwright-core";
import fs from "node:fs";
import { DEMO_PASSWORD, launchBrowser, signIn, startServer, type RunningServer } from "../support/e2e";
import { WARM_UP, PAGE_MODULES } from "../../server/http/page-boot";
import { SCREEN_HEADS } from "../../shared/screens";

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

const MANAGER = "manager@kestrelbay.example";

async function newPage(): Promise<Page> {
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
  return context.newPage();
}

/** A screen's own code: /assets/<name>-<8-character hash>.js (its loader lives in <name>-data-….js). */
const chunkOf = (name: string) => new RegExp(`/assets/${name}-[A-Za-z0-9_-]{8}\\.js$`);

describe("the client's delivery", () => {
  it("loads the sign-in page's scripts brotli-compressed, cached for a year, and no zod", async () => {
    const page = await newPage();
    const scripts: { url: string; encoding?: string; cache?: string; length: number }[] = [];
    page.on("response", (r) => {
      if (r.request().resourceType() === "script") {
        const h = r.headers();
        scripts.push({ url: r.url(), encoding: h["content-encoding"], cache: h["cache-control"], length: Number(h["content-length"] ?? Infinity) });
      }
    });
    await page.goto(`${server.url}/sign-in`, { waitUntil: "networkidle" });
    expect(scripts.length).toBeGreaterThan(2);
    expect(scripts.filter((s) => s.encoding === "br").length).toBeGreaterThan(2);
    for (const s of scripts) {
      expect(s.cache, s.url).toBe("public, max-age=31536000, immutable");
      // Chunks under 1 kB are not worth compressing (the build's threshold); everything else comes as brotli.
      if (s.encoding === undefined) expect(s.length, s.url).toBeLessThan(1024);
      else expect(s.encoding, s.url).toBe("br");
    }
    // The form's rules (and zod with them) come with the first check, not with the page.
    expect(scripts.filter((s) => /\/zod-/.test(s.url))).toEqual([]);
    // Leaving the e-mail field empty is the first check: the rule's words appear beside it.
    await page.locator('input[name="email"]').focus();
    await page.locator('input[name="password"]').focus();
    await expect.poll(() => page.getByText("Enter your e-mail address").count(), { timeout: 10_000 }).toBeGreaterThan(0);
    expect(scripts.some((s) => /\/zod-/.test(s.url))).toBe(true);
    await page.context().close();
  });

  it("finds every screen the page boot names in the build's manifest, so each address gets its preloads", () => {
    const manifest = JSON.parse(fs.readFileSync("dist/.vite/manifest.json", "utf8")) as Record<string, { file: string }>;
    const missing = [...new Set(PAGE_MODULES.map((p) => p.screen)), "src/app/routes/signed-in-frame.tsx"].filter((m) => !manifest[m]);
    expect(missing).toEqual([]);
  });

  it("builds the router from react-router's production files, not its development ones", () => {
    const framework = fs.readdirSync("dist/assets").find((f) => /^framework-[\w-]+\.js$/.test(f))!;
    const sources = (JSON.parse(fs.readFileSync(`dist/assets/${framework}.map`, "utf8")) as { sources: string[] }).sources.filter((s) => s.includes("react-router/dist/"));
    expect(sources.length).toBeGreaterThan(0);
    expect(sources.filter((s) => !s.includes("react-router/dist/production/"))).toEqual([]);
  });

  it("moves the source map of each chunk carrying the compile hint down by the hint's line", () => {
    const hinted = fs.readdirSync("dist/assets").filter((f) => f.endsWith(".js") && fs.readFileSync(`dist/assets/${f}`, "utf8").startsWith("//# allFunctionsCalledOnLoad\n"));
    expect(hinted.some((f) => f.startsWith("framework-"))).toBe(true);
    for (const file of hinted) {
      const map = JSON.parse(fs.readFileSync(`dist/assets/${file}.map`, "utf8")) as { mappings: string };
      // The first line (the hint) maps to nothing; the code's first line is the map's second.
      expect(map.mappings.startsWith(";"), file).toBe(true);
    }
  });

  it("opens a signed-in first load with its screen's code preloaded and the session known from the page", async () => {
    const page = await newPage();
    await signIn(page, server.url, MANAGER, DEMO_PASSWORD);
    await page.locator('[data-testid="nav-home"]').waitFor();
    const asked: string[] = [];
    page.on("request", (r) => asked.push(new URL(r.url()).pathname));
    const refused: string[] = [];
    page.on("console", (m) => {
      if (/Content Security Policy/i.test(m.text())) refused.push(m.text());
    });
    const response = await page.goto(`${server.url}/stockroom`);
    const html = await response!.text();
    expect(response!.headers()["cache-control"]).toBe("private, no-cache");
    // The screen's own chunk and the signed-in frame come with the first scripts (server/http/page-boot.ts).
    expect(html).toMatch(/<link rel="modulepreload" crossorigin href="\/assets\/stockroom-[A-Za-z0-9_-]{8}\.js">/);
    expect(html).toMatch(/<link rel="modulepreload" crossorigin href="\/assets\/signed-in-frame-[A-Za-z0-9_-]{8}\.js">/);
    expect(html).not.toMatch(/sign-in-[A-Za-z0-9_-]{8}\.js/);
    expect(html).toContain('"email":"manager@kestrelbay.example"');
    // The page says what it is before its code arrives: the Stockroom's head, as the screen draws it.
    const { title, description } = SCREEN_HEADS.stockroom;
    expect(html).toContain(`>${title}</h1><p class="mt-0.5 max-w-3xl text-grey-600">${description}</p>`);
    expect(html).toContain(`<script>${WARM_UP}</script>`);
    // zod and the Stockroom's schemas run as soon as they arrive, apart from the libraries: the
    // page runs them as async module scripts, and the build left them free of React and the router.
    const early = [...html.matchAll(/<script type="module" async crossorigin src="\/(assets\/[^"]+)"><\/script>/g)].map((m) => m[1]!);
    expect(early.map((f) => f.replace(/-[A-Za-z0-9_-]{8}\.js$/, "")).sort()).toEqual(["assets/data", "assets/schemas-stock"]);
    const manifest = JSON.parse(fs.readFileSync("dist/.vite/manifest.json", "utf8")) as Record<string, { file: string; name?: string; isEntry?: boolean; imports?: string[] }>;
    const needs = (key: string, seen = new Set<string>()): string[] =>
      seen.has(key) ? [] : (seen.add(key), (manifest[key]!.imports ?? []).flatMap((k) => [k, ...needs(k, seen)]));
    for (const file of early) {
      const key = Object.keys(manifest).find((k) => `${manifest[k]!.file}` === file)!;
      const libraries = needs(key).filter((k) => manifest[k]!.isEntry || ["framework", "shell"].includes(manifest[k]!.name ?? ""));
      expect(libraries, file).toEqual([]);
    }
    await page.locator('[data-testid="nav-stockroom"]').waitFor();
    await expect.poll(() => page.locator("h1").allTextContents()).toEqual([title]);
    expect(await page.locator("h1 + p").first().textContent()).toBe(description);
    await page.waitForLoadState("networkidle");
    // The warm-up line runs under the page's Content-Security-Policy (its hash is allowed).
    expect(refused).toEqual([]);
    // Nobody asked who is signed in or where the facility is: the page said so.
    expect(asked.filter((p) => p === "/api/auth/me" || p === "/api/facility")).toEqual([]);
    expect(await page.locator("#phasebook-boot").count()).toBe(0);
    await page.context().close();
  });

  it("sends a signed-out first load of a signed-in page the sign-in screen's code, and the sign-in page", async () => {
    const page = await newPage();
    const response = await page.goto(`${server.url}/schedule`);
    const html = await response!.text();
    expect(html).toMatch(/<link rel="modulepreload" crossorigin href="\/assets\/sign-in-[A-Za-z0-9_-]{8}\.js">/);
    expect(html).not.toMatch(/"email"/);
    await page.waitForURL((u) => u.pathname === "/sign-in" && u.searchParams.get("next") === "/schedule", { timeout: 20_000 });
    await page.locator('input[name="email"]').waitFor();
    await page.context().close();
  });

  for (const screen of [
    { nav: "stockroom", chunk: "stockroom", api: /\/api\/containers\?/ },
    { nav: "schedule", chunk: "schedule", api: /\/api\/bookings\?/ },
    { nav: "safety", chunk: "safety", api: /\/api\/safety\/review/ },
  ]) {
    it(`asks for the ${screen.nav} screen's data while its code is still loading`, async () => {
      const page = await newPage();
      await signIn(page, server.url, MANAGER, DEMO_PASSWORD);
      await page.locator('[data-testid="nav-home"]').waitFor();
      await page.waitForLoadState("networkidle");

      let release!: () => void;
      const released = new Promise<void>((r) => (release = r));
      let held = 0;
      await page.route(chunkOf(screen.chunk), async (route: Route) => {
        held += 1;
        await released;
        await route.continue();
      });
      const asked = page.waitForRequest((r) => screen.api.test(r.url()), { timeout: 20_000 });
      // A click with no hover first, so prefetch-on-intent has not loaded the code already.
      await page.locator(`[data-testid="nav-${screen.nav}"]`).dispatchEvent("click");
      await expect.poll(() => held, { timeout: 20_000 }).toBeGreaterThan(0);
      const request = await asked; // while the screen's code is held back
      expect(request.url()).toMatch(screen.api);
      release();
      await page.waitForURL((u) => u.pathname === `/${screen.nav}`);
      await page.locator("h1").first().waitFor();
      await page.context().close();
    });
  }

  it("warms a screen's code when the pointer rests on its link, and when the link gets the focus", async () => {
    const page = await newPage();
    await signIn(page, server.url, MANAGER, DEMO_PASSWORD);
    await page.locator('[data-testid="nav-home"]').waitFor();
    await page.waitForLoadState("networkidle");
    const requested: string[] = [];
    page.on("request", (r) => requested.push(r.url()));

    await page.locator('[data-testid="nav-instruments"]').hover();
    await expect.poll(() => requested.some((u) => chunkOf("instruments").test(u)), { timeout: 10_000 }).toBe(true);
    expect(page.url()).toMatch(/\/$/);

    await page.locator('[data-testid="nav-training"]').focus();
    await expect.poll(() => requested.some((u) => chunkOf("training").test(u)), { timeout: 10_000 }).toBe(true);
    // Code only: no data is fetched before the person goes there.
    expect(requested.filter((u) => /\/api\/training/.test(u))).toEqual([]);
    await page.context().close();
  });
});

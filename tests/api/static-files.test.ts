/**
 * Serving the built client: hashed assets as files (a missing one is 404, never the page), and
 * index.html only for page loads, so a stale script tag after a deploy fails loudly instead of
 * running HTML as JavaScript.
 */
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, type TestApp } from "../support/test-app";

let t: TestApp;
let dist: string;
const PAGE = '<!doctype html><html><body><div id="root"></div><script type="module" src="/assets/index-Ab12Cd34.js"></script></body></html>';

beforeAll(async () => {
  dist = fs.mkdtempSync(path.join(os.tmpdir(), "phasebook-dist-"));
  fs.mkdirSync(path.join(dist, "assets"));
  fs.writeFileSync(path.join(dist, "index.html"), PAGE);
  fs.writeFileSync(path.join(dist, "assets", "index-Ab12Cd34.js"), "console.log('phasebook');\n");
  fs.writeFileSync(path.join(dist, "favicon.svg"), "<svg xmlns='http://www.w3.org/2000/svg'/>");
  t = await startTestApp({ deps: { staticDir: dist } });
});
afterAll(async () => {
  await t.close();
  fs.rmSync(dist, { recursive: true, force: true });
});

const get = (p: string, accept?: string) => fetch(t.url + p, { headers: accept ? { accept } : {} });
const BROWSER_PAGE = "text/html,application/xhtml+xml,application/xml;q=0.9,*/*;q=0.8";
const BROWSER_SCRIPT = "*/*";
const BROWSER_IMAGE = "image/avif,image/webp,image/apng,image/svg+xml,image/*,*/*;q=0.8";

describe("the built client", () => {
  it("serves a hashed asset as JavaScript, cached as immutable", async () => {
    const r = await get("/assets/index-Ab12Cd34.js", BROWSER_SCRIPT);
    expect(r.status).toBe(200);
    expect(r.headers.get("content-type")).toMatch(/javascript/);
    expect(r.headers.get("cache-control")).toMatch(/immutable/);
    expect(await r.text()).toContain("phasebook");
  });

  it("answers 404 for a missing asset, whatever the request accepts", async () => {
    for (const accept of [BROWSER_SCRIPT, BROWSER_PAGE, "text/css,*/*;q=0.1"]) {
      const r = await get("/assets/nonexistent.js", accept);
      expect(r.status, accept).toBe(404);
      expect(r.headers.get("content-type")).toMatch(/application\/problem\+json/);
      expect(await r.text()).not.toContain('id="root"');
    }
  });

  it("gives index.html to a page load of any client path", async () => {
    for (const p of ["/", "/schedule", "/stockroom/containers/12", "/reset-password/abc"]) {
      const r = await get(p, BROWSER_PAGE);
      expect(r.status, p).toBe(200);
      expect(r.headers.get("content-type")).toMatch(/text\/html/);
      expect(r.headers.get("cache-control")).toBe("no-cache");
      expect(await r.text()).toBe(PAGE);
    }
  });

  it("gives the page to a request with no preference for a path without an extension, as curl sends", async () => {
    const r = await get("/schedule", "*/*");
    expect(r.status).toBe(200);
    expect(await r.text()).toBe(PAGE);
  });

  it("answers 404 to a missing image, script or JSON file outside /assets", async () => {
    expect((await get("/logo.png", BROWSER_IMAGE)).status).toBe(404);
    expect((await get("/config.json", "application/json")).status).toBe(404);
    expect((await get("/schedule", "application/json")).status).toBe(404);
    expect((await get("/old-bundle.js", BROWSER_SCRIPT)).status).toBe(404);
  });

  it("serves other files of the build as they are", async () => {
    const r = await get("/favicon.svg", BROWSER_IMAGE);
    expect(r.status).toBe(200);
    expect(r.headers.get("content-type")).toMatch(/svg/);
  });

  it("never gives the page to a request that is not a GET", async () => {
    const r = await fetch(`${t.url}/schedule`, { method: "POST", headers: { accept: BROWSER_PAGE } });
    expect(r.status).toBe(404);
  });

  it("keeps the API's own 404 under /api", async () => {
    const r = await get("/api/nothing-here", BROWSER_PAGE);
    expect(r.status).toBe(404);
    expect((await r.json()).code).toBe("no_such_route");
  });
});

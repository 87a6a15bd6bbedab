/**
 * Serving the built client: hashed assets as files (a missing one is 404, never the page), and
 * index.html only for page loads, so a stale script tag after a deploy fails loudly instead of
 * running HTML as JavaScript. Answers come compressed when the client asks: the build's brotli
 * and gzip copies of an asset, the API's JSON on the fly.
 */
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import http from "node:http";
import zlib from "node:zlib";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTestApp, type TestApp } from "../support/test-app";

let t: TestApp;
let dist: string;
const BIG = `export const rows = ${JSON.stringify(Array.from({ length: 400 }, (_, i) => ({ container: i, solvent: "1,2-dichloroethane" })))};\n`;
const PAGE = '<!doctype html><html><head><title>Phasebook</title></head><body><div id="root"></div><script type="module" src="/assets/index-Ab12Cd34.js"></script></body></html>';
/** The page as a load by someone not signed in gets it: the session block written into its head (server/http/page-boot.ts). */
const SIGNED_OUT_PAGE = PAGE.replace(
  "</head>",
  '<script type="application/json" id="phasebook-boot">{"facility":{"name":"Liquid Interfaces Core","timeZone":"America/Halifax","currency":"CAD","publicDemo":false},"user":null}</script></head>',
);

beforeAll(async () => {
  dist = fs.mkdtempSync(path.join(os.tmpdir(), "phasebook-dist-"));
  fs.mkdirSync(path.join(dist, "assets"));
  fs.writeFileSync(path.join(dist, "index.html"), PAGE);
  fs.writeFileSync(path.join(dist, "assets", "index-Ab12Cd34.js"), "console.log('phasebook');\n");
  // What the build writes beside a large asset (vite-plugin-compression2): made here with zlib.
  fs.writeFileSync(path.join(dist, "assets", "big-Zx98Yw76.js"), BIG);
  fs.writeFileSync(path.join(dist, "assets", "big-Zx98Yw76.js.br"), zlib.brotliCompressSync(BIG));
  fs.writeFileSync(path.join(dist, "assets", "big-Zx98Yw76.js.gz"), zlib.gzipSync(BIG));
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
      expect(r.headers.get("cache-control")).toBe("private, no-cache");
      expect(r.headers.get("vary")).toMatch(/Cookie/);
      expect(await r.text()).toBe(SIGNED_OUT_PAGE);
    }
  });

  it("gives the page to a request with no preference for a path without an extension, as curl sends", async () => {
    const r = await get("/schedule", "*/*");
    expect(r.status).toBe(200);
    expect(await r.text()).toBe(SIGNED_OUT_PAGE);
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

/** A raw GET that keeps the bytes as sent (fetch would undo the Content-Encoding). */
function rawGet(p: string, headers: Record<string, string>): Promise<{ status: number; headers: http.IncomingHttpHeaders; body: Buffer }> {
  return new Promise((resolve, reject) => {
    http
      .get(t.url + p, { headers }, (res) => {
        const chunks: Buffer[] = [];
        res.on("data", (c: Buffer) => chunks.push(c));
        res.on("end", () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }));
      })
      .on("error", reject);
  });
}

describe("compressed answers", () => {
  const CHROME = "gzip, deflate, br, zstd";

  it("sends the build's brotli copy of an asset to a browser that accepts it, cached for a year as immutable", async () => {
    const r = await rawGet("/assets/big-Zx98Yw76.js", { accept: BROWSER_SCRIPT, "accept-encoding": CHROME });
    expect(r.status).toBe(200);
    expect(r.headers["content-encoding"]).toBe("br");
    expect(r.headers.vary).toMatch(/Accept-Encoding/i);
    expect(r.headers["content-type"]).toMatch(/javascript/);
    expect(r.headers["cache-control"]).toBe("public, max-age=31536000, immutable");
    expect(r.headers["x-content-type-options"]).toBe("nosniff");
    expect(r.body.length).toBeLessThan(BIG.length / 4);
    expect(zlib.brotliDecompressSync(r.body).toString()).toBe(BIG);
  });

  it("sends the gzip copy to a client that takes only gzip, and the plain file to one that takes neither", async () => {
    const gz = await rawGet("/assets/big-Zx98Yw76.js", { accept: BROWSER_SCRIPT, "accept-encoding": "gzip" });
    expect(gz.headers["content-encoding"]).toBe("gzip");
    expect(zlib.gunzipSync(gz.body).toString()).toBe(BIG);
    const plain = await rawGet("/assets/big-Zx98Yw76.js", { accept: BROWSER_SCRIPT, "accept-encoding": "identity" });
    expect(plain.headers["content-encoding"]).toBeUndefined();
    expect(plain.body.toString()).toBe(BIG);
    expect(plain.headers["cache-control"]).toBe("public, max-age=31536000, immutable");
  });

  it("still answers 404 for a missing asset when the client accepts brotli", async () => {
    const r = await rawGet("/assets/gone-Qq11Rr22.js", { accept: BROWSER_SCRIPT, "accept-encoding": CHROME });
    expect(r.status).toBe(404);
  });

  it("compresses the API's JSON on the fly with brotli or gzip, as the client asks", async () => {
    const br = await rawGet("/api/openapi.json", { accept: "application/json", "accept-encoding": CHROME });
    expect(br.status).toBe(200);
    expect(br.headers["content-encoding"]).toBe("br");
    expect(br.headers.vary).toMatch(/Accept-Encoding/i);
    const spec = JSON.parse(zlib.brotliDecompressSync(br.body).toString()) as { openapi: string };
    expect(spec.openapi).toMatch(/^3\./);
    const gz = await rawGet("/api/openapi.json", { accept: "application/json", "accept-encoding": "gzip" });
    expect(gz.headers["content-encoding"]).toBe("gzip");
    expect(JSON.parse(zlib.gunzipSync(gz.body).toString()).openapi).toBe(spec.openapi);
    const plain = await rawGet("/api/openapi.json", { accept: "application/json" });
    expect(plain.headers["content-encoding"]).toBeUndefined();
  });

  it("compresses index.html for a page load and keeps it revalidated", async () => {
    const r = await rawGet("/schedule", { accept: BROWSER_PAGE, "accept-encoding": "gzip" });
    expect(r.status).toBe(200);
    expect(r.headers["cache-control"]).toBe("private, no-cache");
    // Near the 1 kB threshold here, so it may go plain; either way the page is intact.
    const body = r.headers["content-encoding"] === "gzip" ? zlib.gunzipSync(r.body).toString() : r.body.toString();
    expect(body).toBe(SIGNED_OUT_PAGE);
  });
});

/**
 * Rasterises a PDF page in Chromium with pdf.js (pdfjs-dist) — a renderer independent of both
 * our PDF writer and Chromium's own PDF viewer, which headless builds do not always carry.
 * The page is served from a made-up origin through Playwright's request routing, so nothing
 * leaves the machine.
 */
import fs from "node:fs";
import path from "node:path";
import { createRequire } from "node:module";
import type { Browser } from "playwright-core";

const ORIGIN = "http://pdf-render.phasebook.test";
const require = createRequire(import.meta.url);
const PDFJS_BUILD = path.dirname(require.resolve("pdfjs-dist/build/pdf.min.mjs"));

const PAGE = `<!doctype html><html><body style="margin:0;background:#fff">
<canvas id="page"></canvas>
<script type="module">
  import * as pdfjs from "/pdfjs/pdf.min.mjs";
  pdfjs.GlobalWorkerOptions.workerSrc = "/pdfjs/pdf.worker.min.mjs";
  try {
    const bytes = new Uint8Array(await (await fetch("/document.pdf")).arrayBuffer());
    const doc = await pdfjs.getDocument({ data: bytes }).promise;
    const page = await doc.getPage(Number(new URL(location.href).searchParams.get("page") ?? "1"));
    const viewport = page.getViewport({ scale: Number(new URL(location.href).searchParams.get("scale") ?? "3") });
    const canvas = document.getElementById("page");
    canvas.width = Math.ceil(viewport.width);
    canvas.height = Math.ceil(viewport.height);
    await page.render({ canvas, canvasContext: canvas.getContext("2d"), viewport }).promise;
    document.body.dataset.rendered = String(doc.numPages);
  } catch (err) {
    document.body.dataset.failed = String(err && err.message ? err.message : err);
  }
</script></body></html>`;

/** Renders one page of `pdf` and returns a PNG of it. */
export async function renderPdfPage(browser: Browser, pdf: Buffer, opts: { page?: number; scale?: number } = {}): Promise<Buffer> {
  const context = await browser.newContext({ viewport: { width: 800, height: 800 } });
  try {
    await context.route(`${ORIGIN}/**`, async (route) => {
      const { pathname } = new URL(route.request().url());
      if (pathname === "/") return route.fulfill({ contentType: "text/html", body: PAGE });
      if (pathname === "/document.pdf") return route.fulfill({ contentType: "application/pdf", body: pdf });
      if (pathname.startsWith("/pdfjs/")) {
        const file = path.join(PDFJS_BUILD, path.basename(pathname));
        return route.fulfill({ contentType: "text/javascript", body: fs.readFileSync(file) });
      }
      return route.fulfill({ status: 404, body: "" });
    });
    const page = await context.newPage();
    await page.goto(`${ORIGIN}/?page=${opts.page ?? 1}&scale=${opts.scale ?? 3}`);
    await page.waitForFunction(() => document.body.dataset.rendered || document.body.dataset.failed, undefined, { timeout: 20_000 });
    const failed = await page.evaluate(() => document.body.dataset.failed);
    if (failed) throw new Error(`pdf.js could not render the PDF: ${failed}`);
    return await page.locator("#page").screenshot();
  } finally {
    await context.close();
  }
}

/**
 * A label scanned in Chromium opens the right record: through the camera (Chromium's fake
 * media stream playing a video of the label), through an uploaded photo, and through the
 * printed address when signed out (sign in first, then land on the record). Then a usage is
 * logged from the scanned page and the quantity changes.
 */
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import Database from "better-sqlite3";
import { chromium, type Browser, type Page } from "playwright-core";
import fs from "node:fs";
import jsQR from "jsqr";
import { PNG } from "pngjs";
import { labelUrl } from "@shared/domain/labels";
import { CHROMIUM, DEMO_PASSWORD, launchBrowser, signIn, startServer, type RunningServer } from "../support/e2e";
import { ApiClient } from "../support/http-client";
import { writeLabelPng, writeLabelVideo } from "../support/fake-camera";
import { renderPdfPage } from "../support/pdf-raster";

let server: RunningServer;
let browser: Browser;
let bottle: { id: number; labelToken: string; quantity: number; unit: string; name: string };
const MEMBER = "member@kestrelbay.example";

beforeAll(async () => {
  server = await startServer();
  browser = await launchBrowser();
  const db = new Database(path.join(server.dir, "phasebook.sqlite"), { readonly: true });
  // A bottle of 1,2-dichloroethane from the demo stock the member may use (facility stock or the member's group).
  bottle = db
    .prepare(
      `SELECT c.id, c.labelToken, c.quantity, c.unit, ch.name FROM containers c JOIN chemicals ch ON ch.id = c.chemicalId
        WHERE ch.casNumber = '107-06-2' AND c.status = 'in_use' AND c.quantity > 10
          AND (c.groupId IS NULL OR c.groupId = (SELECT groupId FROM users WHERE email = ?))
        ORDER BY c.id LIMIT 1`,
    )
    .get(MEMBER) as typeof bottle;
  db.close();
  expect(bottle, "the demo stock holds an open bottle of 1,2-dichloroethane for the member").toBeTruthy();
});
afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

const recordName = (page: Page) => page.locator('[data-testid="scan-record-name"]');

describe("the Scan page", () => {
  it("reads an uploaded photo of a label and opens the container's record", async () => {
    const file = path.join(server.dir, "label.png");
    await writeLabelPng(file, labelUrl(server.url, bottle.labelToken));
    const context = await browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
    const page = await context.newPage();
    try {
      await signIn(page, server.url, MEMBER);
      await page.goto(`${server.url}/scan`);
      await page.setInputFiles('[data-testid="scan-photo"]', file);
      await page.waitForURL((u) => u.pathname === `/s/${bottle.labelToken}`, { timeout: 15_000 });
      await expect.poll(() => recordName(page).textContent()).toBe(bottle.name);
      expect(await page.locator('[data-testid="scan-quantity"]').textContent()).toBe(`${bottle.quantity} ${bottle.unit}`);
    } finally {
      await context.close();
    }
  });

  it("reads the label through the camera (Chromium playing a video of the label as its camera)", async () => {
    const video = path.join(server.dir, "label.y4m");
    writeLabelVideo(video, labelUrl(server.url, bottle.labelToken));
    const camBrowser = await chromium.launch({
      executablePath: CHROMIUM,
      headless: true,
      args: [
        "--no-sandbox",
        "--disable-gpu",
        "--use-fake-device-for-media-stream",
        "--use-fake-ui-for-media-stream",
        `--use-file-for-fake-video-capture=${video}`,
      ],
    });
    try {
      const context = await camBrowser.newContext({ viewport: { width: 390, height: 844 }, permissions: ["camera"] });
      const page = await context.newPage();
      await signIn(page, server.url, MEMBER);
      await page.goto(`${server.url}/scan`);
      await page.click('[data-testid="scan-start-camera"]');
      await page.waitForURL((u) => u.pathname === `/s/${bottle.labelToken}`, { timeout: 20_000 });
      await expect.poll(() => recordName(page).textContent()).toBe(bottle.name);
    } finally {
      await camBrowser.close();
    }
  });

  it("says so when a typed code belongs to no record, and when a text is no label at all", async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    try {
      await signIn(page, server.url, MEMBER);
      await page.goto(`${server.url}/scan`);
      await page.fill('[data-testid="scan-code-input"]', "see you at the bench");
      await page.click('[data-testid="scan-code-submit"]');
      await expect.poll(() => page.locator('[data-testid="scan-message"]').textContent()).toMatch(/not a Phasebook label/);
      await page.fill('[data-testid="scan-code-input"]', `${server.url}/s/${"Z".repeat(32)}`);
      await page.click('[data-testid="scan-code-submit"]');
      await expect.poll(() => page.locator('[data-testid="scan-problem-notice"]').textContent()).toMatch(/No record carries this label/);
    } finally {
      await context.close();
    }
  });
});

describe("a printed label", () => {
  it("renders (pdf.js in Chromium) to a QR code that jsqr reads as the label URL, and that photo opens the record", async () => {
    const manager = new ApiClient(server.url);
    await manager.login("manager@kestrelbay.example", DEMO_PASSWORD);
    const res = await fetch(`${server.url}/api/labels.pdf?containerIds=${bottle.id}`, { headers: { cookie: manager.cookieHeader } });
    expect(res.status).toBe(200);
    const pdfFile = path.join(server.dir, "label.pdf");
    fs.writeFileSync(pdfFile, Buffer.from(await res.arrayBuffer()));

    // Rasterise the printed page with pdf.js in Chromium, as a printer would, and read it with jsqr.
    const shot = path.join(server.dir, "label-printed.png");
    fs.writeFileSync(shot, await renderPdfPage(browser, fs.readFileSync(pdfFile)));
    const png = PNG.sync.read(fs.readFileSync(shot));
    const read = jsQR(new Uint8ClampedArray(png.data), png.width, png.height)?.data ?? null;
    expect(read).toBe(labelUrl(server.url, bottle.labelToken));

    const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    try {
      await signIn(page, server.url, MEMBER);
      await page.goto(`${server.url}/scan`);
      await page.setInputFiles('[data-testid="scan-photo"]', shot);
      await page.waitForURL((u) => u.pathname === `/s/${bottle.labelToken}`, { timeout: 15_000 });
      await expect.poll(() => recordName(page).textContent()).toBe(bottle.name);
    } finally {
      await context.close();
    }
  });
});

describe("the printed address /s/:token", () => {
  it("asks a signed-out visitor to sign in first, then lands on the record", async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    try {
      await page.goto(labelUrl(server.url, bottle.labelToken));
      await page.waitForURL((u) => u.pathname === "/sign-in");
      expect(new URL(page.url()).searchParams.get("next")).toBe(`/s/${bottle.labelToken}`);
      await page.fill('input[name="email"]', MEMBER);
      await page.fill('input[name="password"]', DEMO_PASSWORD);
      await page.click('[data-testid="sign-in-submit"]');
      await page.waitForURL((u) => u.pathname === `/s/${bottle.labelToken}`, { timeout: 15_000 });
      await expect.poll(() => recordName(page).textContent()).toBe(bottle.name);
    } finally {
      await context.close();
    }
  });
});

describe("logging a usage from a scanned container", () => {
  it("changes the quantity shown", async () => {
    const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    try {
      await signIn(page, server.url, MEMBER);
      await page.goto(`${server.url}/s/${bottle.labelToken}`);
      await expect.poll(() => recordName(page).textContent()).toBe(bottle.name);
      const before = Number((await page.locator('[data-testid="scan-quantity"]').textContent())!.split(" ")[0]);
      expect(await page.locator('[data-testid="scan-usage-unit"]').inputValue()).toBe(bottle.unit);
      await page.fill('[data-testid="scan-usage-amount"]', "5");
      await page.click('[data-testid="scan-usage-submit"]');
      await expect
        .poll(async () => Number((await page.locator('[data-testid="scan-quantity"]').textContent())!.split(" ")[0]))
        .toBeCloseTo(before - 5, 6);
    } finally {
      await context.close();
    }
  });
});


describe("a replaced label", () => {
  it("tells the scanner that the label was replaced, and the new label opens the record", async () => {
    const db = new Database(path.join(server.dir, "phasebook.sqlite"), { readonly: true });
    const other = db
      .prepare(`SELECT c.id, c.labelToken, ch.name FROM containers c JOIN chemicals ch ON ch.id = c.chemicalId WHERE c.id <> ? AND c.status IN ('sealed', 'in_use') AND c.groupId IS NULL ORDER BY c.id LIMIT 1`)
      .get(bottle.id) as { id: number; labelToken: string; name: string };
    db.close();
    const safety = new ApiClient(server.url);
    await safety.login("safety@kestrelbay.example", DEMO_PASSWORD);
    const fresh = await safety.post(`/api/labels/container/${other.id}/reissue`, { reason: "Label smudged with DCE" });
    expect(fresh.status).toBe(200);

    const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    try {
      await signIn(page, server.url, MEMBER);
      await page.goto(labelUrl(server.url, other.labelToken));
      await expect.poll(() => page.locator('[data-testid="scan-problem-notice"]').textContent()).toMatch(/This label was replaced/);
      await page.goto(fresh.body.url);
      await expect.poll(() => recordName(page).textContent()).toBe(other.name);
    } finally {
      await context.close();
    }
  });
});

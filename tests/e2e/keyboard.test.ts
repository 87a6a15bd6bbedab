/**
 * The keyboard-only paths: a member books a slot on the Schedule, the manager approves a request
 * in the queue, and a member logs what they used from a container, each with Tab, Shift+Tab,
 * Enter, Space and typing only — no mouse. Dialogs keep the focus inside them and give it back;
 * the focus ring shows; someone who asks for less motion gets none; the open dialogs pass axe.
 */
import fs from "node:fs";
import { createRequire } from "node:module";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { DateTime } from "luxon";
import { DEMO_PASSWORD, launchBrowser, startServer, type RunningServer } from "../support/e2e";
import { ApiClient } from "../support/http-client";

const AXE_SOURCE = fs.readFileSync(createRequire(import.meta.url).resolve("axe-core/axe.min.js"), "utf8");
const FACILITY_TZ = "America/Halifax";
const MEMBER = "member@kestrelbay.example";
const MANAGER = "manager@kestrelbay.example";

let server: RunningServer;
let browser: Browser;
const api = { member: null as unknown as ApiClient, manager: null as unknown as ApiClient };
let memberId: number;

beforeAll(async () => {
  server = await startServer();
  browser = await launchBrowser();
  api.member = new ApiClient(server.url);
  api.manager = new ApiClient(server.url);
  const me = await api.member.login(MEMBER, DEMO_PASSWORD);
  memberId = (me.body.user as { id: number }).id;
  expect((await api.manager.login(MANAGER, DEMO_PASSWORD)).status).toBe(200);
});
afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

/** A page whose own clock, when given, stands still at `now` (the Schedule proposes the next half hour from it). */
async function newPage(opts: { now?: DateTime; reducedMotion?: "reduce" | "no-preference" } = {}): Promise<Page> {
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 }, timezoneId: FACILITY_TZ, locale: "en-GB", reducedMotion: opts.reducedMotion ?? "reduce", bypassCSP: true });
  if (opts.now) await context.clock.setFixedTime(opts.now.toJSDate());
  return context.newPage();
}

/** Presses Tab (or Shift+Tab) until the focused element matches `selector`; fails after `limit` presses. */
async function tabTo(page: Page, selector: string, opts: { back?: boolean; limit?: number } = {}): Promise<void> {
  for (let n = 0; n < (opts.limit ?? 80); n += 1) {
    if (await page.evaluate((s) => document.activeElement?.matches(s) ?? false, selector)) return;
    await page.keyboard.press(opts.back ? "Shift+Tab" : "Tab");
  }
  throw new Error(`The keyboard never reached ${selector}`);
}

const focused = (page: Page) => page.evaluate(() => ({ testId: document.activeElement?.getAttribute("data-testid"), text: document.activeElement?.textContent?.trim() ?? "" }));

async function signInByKeyboard(page: Page, email: string): Promise<void> {
  await page.goto(`${server.url}/sign-in`);
  await page.locator('input[name="email"]').waitFor();
  // The e-mail field has the focus when the page opens.
  expect(await page.evaluate(() => document.activeElement?.getAttribute("name"))).toBe("email");
  await page.keyboard.type(email);
  await page.keyboard.press("Tab");
  await page.keyboard.type(DEMO_PASSWORD);
  await page.keyboard.press("Enter");
  await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"), { timeout: 20_000 });
}

async function axeViolations(page: Page): Promise<string[]> {
  if (!(await page.evaluate(() => "axe" in window))) await page.evaluate(AXE_SOURCE);
  return page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (c: Document, o: unknown) => Promise<{ violations: { id: string; nodes: { target: string[] }[] }[] }> } }).axe;
    const r = await axe.run(document, { runOnly: { type: "tag", values: ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa", "wcag22aa"] } });
    return r.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`);
  });
}

/** An instrument that confirms at once, that the member is trained on, free on that day. */
async function freeInstrument(day: DateTime): Promise<{ id: number; name: string }> {
  const instruments = (await api.member.get("/api/instruments?limit=200")).body.items as { id: number; name: string; kind: string; status: string; requiresApproval: boolean }[];
  const training = (await api.member.get(`/api/training?userId=${memberId}`)).body.items as { instrumentId: number; state: string }[];
  const trained = new Set(training.filter((t) => t.state === "current" || t.state === "expiring").map((t) => t.instrumentId));
  const window = `from=${encodeURIComponent(day.startOf("day").toISO()!)}&to=${encodeURIComponent(day.endOf("day").toISO()!)}`;
  for (const i of instruments.filter((x) => x.kind === "potentiostat" && x.status === "in_service" && !x.requiresApproval && trained.has(x.id))) {
    if ((await api.manager.get(`/api/bookings?instrumentId=${i.id}&${window}`)).body.total === 0) return i;
  }
  throw new Error("No free potentiostat for the member on that day");
}

describe("keyboard only", () => {
  it("books a slot: Book a slot, the instrument, the purpose, Book — Tab, Space, Enter and typing", async () => {
    // A Wednesday five weeks ahead at 09:40 on the facility's clock: the form proposes 10:00–11:00.
    const now = DateTime.now().setZone(FACILITY_TZ).plus({ weeks: 5 }).set({ weekday: 3, hour: 9, minute: 40, second: 0, millisecond: 0 });
    const instrument = await freeInstrument(now);
    const page = await newPage({ now });
    await signInByKeyboard(page, MEMBER);
    await page.goto(`${server.url}/schedule`);
    await page.locator('[data-testid="schedule-toolbar"]').waitFor();

    await tabTo(page, '[data-testid="book-slot"]');
    // The focus ring shows on the focused control.
    const ring = await page.evaluate(() => {
      const s = getComputedStyle(document.activeElement!);
      return { style: s.outlineStyle, width: parseFloat(s.outlineWidth) };
    });
    expect(ring.style).not.toBe("none");
    expect(ring.width).toBeGreaterThanOrEqual(2);
    await page.keyboard.press("Enter");

    const form = page.locator('[data-testid="booking-form"]');
    await form.waitFor();
    const day = now.toISODate();
    expect(await page.inputValue('[data-testid="booking-start"]')).toBe(`${day}T10:00`);
    expect(await page.inputValue('[data-testid="booking-end"]')).toBe(`${day}T11:00`);
    expect(await axeViolations(page)).toEqual([]);

    await tabTo(page, `[data-testid="booking-form"] input[type="checkbox"][value="${instrument.id}"]`);
    await page.keyboard.press("Space");
    expect(await form.locator(`input[type="checkbox"][value="${instrument.id}"]`).isChecked()).toBe(true);
    await tabTo(page, '[data-testid="booking-purpose"]');
    await page.keyboard.type("Ferrocene CV in DCE, booked without a mouse");
    await tabTo(page, '[data-testid="booking-submit"]');
    await page.keyboard.press("Enter");
    await expect.poll(() => page.getByText(/Booked: confirmed/).count(), { timeout: 20_000 }).toBeGreaterThan(0);

    const mine = (await api.member.get(`/api/bookings?mine=true&instrumentId=${instrument.id}&from=${encodeURIComponent(now.startOf("day").toISO()!)}&to=${encodeURIComponent(now.endOf("day").toISO()!)}`)).body
      .items as { start: string; end: string }[];
    expect(mine).toHaveLength(1);
    expect(new Date(mine[0]!.start).getTime()).toBe(now.set({ hour: 10, minute: 0 }).toMillis());

    // The new block is a button named by its state, instrument and time; Enter opens its details.
    const block = page.locator('.fc-event[role="button"]', { hasText: "Confirmed" }).filter({ hasText: instrument.name });
    await block.first().waitFor();
    expect(await block.first().getAttribute("tabindex")).toBe("0");
    await block.first().evaluate((el) => el.setAttribute("data-keyboard-target", "block"));
    await tabTo(page, '[data-keyboard-target="block"]', { limit: 200 });
    await page.keyboard.press("Enter");
    const details = page.locator('[data-testid="booking-details"]');
    await details.waitFor();
    expect(await details.textContent()).toContain(instrument.name);
    expect(await axeViolations(page)).toEqual([]);
    await page.keyboard.press("Escape");
    await details.waitFor({ state: "detached" });
    await page.context().close();
  });

  it("keeps the focus inside an open dialog, closes it with Escape and gives the focus back", async () => {
    const page = await newPage();
    await signInByKeyboard(page, MEMBER);
    await page.goto(`${server.url}/schedule`);
    await page.locator('[data-testid="schedule-toolbar"]').waitFor();
    await tabTo(page, '[data-testid="book-slot"]');
    await page.keyboard.press("Enter");
    await page.locator('[data-testid="booking-form"]').waitFor();
    for (let n = 0; n < 30; n += 1) {
      await page.keyboard.press(n % 3 === 2 ? "Shift+Tab" : "Tab");
      const inside = await page.evaluate(() => Boolean(document.activeElement?.closest("dialog[open]")));
      expect(inside, `focus after ${n + 1} presses: ${JSON.stringify(await focused(page))}`).toBe(true);
    }
    await page.keyboard.press("Escape");
    await page.locator("dialog[open]").waitFor({ state: "detached" }).catch(() => undefined);
    expect(await page.locator("dialog[open]").count()).toBe(0);
    expect((await focused(page)).testId).toBe("book-slot");
    await page.context().close();
  });

  it("approves a booking request in the queue: Tab to Approve, Enter", async () => {
    // The micro-interface cell needs approval; the manager trains the member on it, the member asks for a slot.
    const instruments = (await api.manager.get("/api/instruments?limit=200")).body.items as { id: number; name: string; requiresApproval: boolean }[];
    const micro = instruments.find((i) => /Micro-interface/.test(i.name) && i.requiresApproval)!;
    await api.manager.post("/api/training", { userId: memberId, instrumentId: micro.id, expiresAt: new Date(Date.now() + 200 * 86_400_000).toISOString() });
    const accounts = (await api.member.get("/api/accounts")).body.items as { id: number; chargeable?: boolean }[];
    const day = DateTime.now().setZone(FACILITY_TZ).plus({ weeks: 7 }).set({ weekday: 4, hour: 13, minute: 0, second: 0, millisecond: 0 });
    const asked = await api.member.post("/api/bookings", { instrumentIds: [micro.id], start: day.toISO(), end: day.plus({ hours: 1 }).toISO(), accountId: (accounts.find((a) => a.chargeable !== false) ?? accounts[0])!.id, purpose: "Keyboard approval" });
    expect(asked.status, asked.text).toBe(201);
    expect(asked.body.booking.status).toBe("requested");
    const bookingId = asked.body.booking.id as number;

    const page = await newPage();
    await signInByKeyboard(page, MANAGER);
    await page.goto(`${server.url}/schedule/approvals`);
    const row = page.locator("tr", { hasText: "Keyboard approval" });
    await row.first().waitFor();
    await row.first().getByRole("button", { name: "Approve" }).evaluate((b) => b.setAttribute("data-keyboard-target", "approve"));
    await tabTo(page, '[data-keyboard-target="approve"]', { limit: 150 });
    await page.keyboard.press("Enter");
    await expect.poll(() => page.getByText(/Approved: /).count(), { timeout: 20_000 }).toBeGreaterThan(0);
    const after = await api.manager.get(`/api/bookings/${bookingId}`);
    expect(after.body.booking.status).toBe("confirmed");
    await page.context().close();
  });

  it("logs a usage on a container's page: amount, note, Log usage — typing, Tab and Enter", async () => {
    const list = (await api.member.get("/api/containers?limit=100&status=sealed,in_use")).body.items as { id: number; quantity: number; unit: string; abilities: { draw: boolean } }[];
    const bottle = list.find((c) => c.abilities.draw && c.quantity > 5)!;
    expect(bottle, "a container the member may draw from").toBeDefined();
    const page = await newPage();
    await signInByKeyboard(page, MEMBER);
    await page.goto(`${server.url}/stockroom/containers/${bottle.id}`);
    const usage = page.locator('[data-testid="usage-form"]');
    await usage.waitFor();
    await usage.locator('input[name="amount"]').evaluate((i) => i.setAttribute("data-keyboard-target", "amount"));
    await tabTo(page, '[data-keyboard-target="amount"]', { limit: 150 });
    await page.keyboard.type("2");
    await tabTo(page, '[data-testid="usage-form"] input[name="note"]');
    await page.keyboard.type("Keyboard-only usage");
    await tabTo(page, '[data-testid="usage-form"] button[type="submit"]');
    await page.keyboard.press("Enter");
    await expect.poll(() => usage.getByText(/Logged 2 /).count(), { timeout: 20_000 }).toBeGreaterThan(0);
    const after = (await api.member.get(`/api/containers/${bottle.id}`)).body.container as { quantity: number };
    expect(after.quantity).toBeCloseTo(bottle.quantity - 2, 6);
    await page.context().close();
  });
});

describe("motion", () => {
  it("stops animations for someone who asks their system for less motion, and keeps them otherwise", async () => {
    const spin = async (reducedMotion: "reduce" | "no-preference") => {
      const page = await newPage({ reducedMotion });
      await page.goto(`${server.url}/sign-in`);
      await page.locator('input[name="email"]').waitFor();
      const duration = await page.evaluate(() => {
        const el = document.createElement("span");
        el.className = "animate-spin";
        document.body.append(el);
        return getComputedStyle(el).animationDuration;
      });
      await page.context().close();
      return parseFloat(duration);
    };
    expect(await spin("reduce")).toBeLessThan(0.01);
    expect(await spin("no-preference")).toBeGreaterThanOrEqual(0.5);
  });
});

/**
 * Administration › People in the browser, on the demo data: each row offers what the user policy
 * allows (not deactivating oneself, keeping one's own Administrator role), and a person's
 * organisation is typed with the known organisations offered.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { launchBrowser, signIn, startServer, type RunningServer } from "../support/e2e";
import { ApiClient } from "../support/http-client";

const ADMIN = "admin@kestrelbay.example";
const ADMIN_NAME = "Dev Ramaswamy";
const TIDEWATER = "Tidewater Metals Recovery Ltd";

let server: RunningServer;
let browser: Browser;
let page: Page;

beforeAll(async () => {
  server = await startServer();
  browser = await launchBrowser();
  const context = await browser.newContext({ viewport: { width: 1400, height: 1000 } });
  page = await context.newPage();
  await signIn(page, server.url, ADMIN);
  await page.goto(`${server.url}/admin/people`);
  await page.locator("tr", { hasText: ADMIN_NAME }).first().waitFor();
});
afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

describe("Administration › People", () => {
  it("does not offer deactivating one's own account, and does for others", async () => {
    expect(await page.getByRole("button", { name: `Deactivate ${ADMIN_NAME}` }).isDisabled()).toBe(true);
    expect(await page.getByRole("button", { name: "Deactivate Priya Nandakumar" }).isDisabled()).toBe(false);
  });

  it("shows the external buyer's organisation", async () => {
    const row = page.locator("tr", { hasText: "buyer@tidewater.example" });
    expect(await row.textContent()).toContain(TIDEWATER);
  });

  it("adds a person of an external customer, offering the organisations already known", async () => {
    await page.click('[data-testid="add-person"]');
    const form = page.locator('form[aria-label="Add a person"]');
    await form.waitFor();
    const field = form.locator('[data-testid="person-organisation"]');
    const listId = await field.getAttribute("list");
    await expect.poll(() => page.locator(`datalist[id="${listId}"] option`).evaluateAll((os) => os.map((o) => (o as HTMLOptionElement).value))).toContain(TIDEWATER);
    await form.getByLabel("Name").fill("Rita Okafor");
    await form.getByLabel("E-mail").fill("r.okafor@tidewater.example");
    await field.fill(TIDEWATER);
    await form.getByRole("button", { name: "Add person" }).click();
    await page.getByText("Rita Okafor was added.").waitFor();
    const row = page.locator("tr", { hasText: "r.okafor@tidewater.example" });
    expect(await row.textContent()).toContain(TIDEWATER);

    const api = new ApiClient(server.url);
    await api.login(ADMIN, "phasebook-demo");
    const found = (await api.get("/api/users?q=r.okafor")).body.items;
    expect(found).toMatchObject([{ email: "r.okafor@tidewater.example", organisation: TIDEWATER, roles: ["member"] }]);
  });

  it("keeps one's own Administrator role checked in the edit form", async () => {
    await page.getByRole("button", { name: `Edit ${ADMIN_NAME}` }).click();
    const form = page.locator(`form[aria-label="Edit ${ADMIN_NAME}"]`);
    await form.waitFor();
    const adminBox = form.locator('[data-testid="role-admin"]');
    expect(await adminBox.isChecked()).toBe(true);
    // aria-disabled says it is locked; a click must still not uncheck it.
    await adminBox.click({ force: true });
    expect(await adminBox.isChecked()).toBe(true);
    expect(await form.textContent()).toContain("You cannot remove your own Administrator role");
    await form.getByRole("button", { name: "Cancel" }).click();
  });
});

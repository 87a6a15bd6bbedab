/**
 * Statement PDFs rendered in the worker pool's threads are the very bytes rendered in-process,
 * whatever the clock says: the PDF's creation date (and the file identifier pdfkit derives from
 * it) is the statement's own. When no worker can start, the statement is still rendered, in-process,
 * and the failure is said.
 */
import { afterAll, afterEach, describe, expect, it, vi } from "vitest";
import { fileURLToPath } from "node:url";
import { renderStatementPdf, type StatementPdfInput } from "../../server/modules/recharge/statement-pdf";
import { createStatementPdfPool, type StatementPdfRenderer } from "../../server/modules/recharge/statement-pdf-pool";

/** An external statement with two instrument groups, consumables and a credit: several pages. */
function statement(code: string): StatementPdfInput {
  const lines: StatementPdfInput["lines"] = [];
  for (let i = 0; i < 120; i++) {
    const day = String(1 + (i % 28)).padStart(2, "0");
    lines.push({
      at: `2026-11-${day}T14:${String(i % 60).padStart(2, "0")}:00.000Z`,
      description: i % 3 === 0 ? "1,2-Dichloroethane, 12.5 mL used; cost 37 ¢/mL + 15% mark-up" : `Potentiostat PS-${i % 2}, booking #${1000 + i}: 90 min checked-in time`,
      quantity: i % 3 === 0 ? "12.5" : "1.5",
      unit: i % 3 === 0 ? "mL" : "h",
      unitPriceCents: i % 3 === 0 ? "42.55" : "3500",
      amountCents: i % 3 === 0 ? 532 : 5250,
      person: `Person ${i % 7}`,
      group: i % 3 === 0 ? "Consumables" : `Potentiostat PS-${i % 2}`,
    });
  }
  lines.sort((a, b) => (a.group === b.group ? 0 : a.group < b.group ? -1 : 1));
  lines.push({ at: "2026-11-30T12:00:00.000Z", description: "Credit: instrument down for two days", quantity: "1", unit: "each", unitPriceCents: "-2500", amountCents: -2500, group: "Adjustments and credits" });
  return {
    facility: "Liquid Interfaces Core",
    createdAt: "2026-12-02T13:05:09.000Z",
    period: "2026-11",
    currency: "CAD",
    account: { code, name: `Customer ${code}`, kind: "external", organisation: "Kestrel Bay Materials" },
    lines,
    totalCents: lines.reduce((s, l) => s + l.amountCents, 0),
    status: "invoice open",
    invoiceNumber: "INV-0042",
    paymentUrl: "https://pay.example/invoice/42",
    tz: "America/Halifax",
  };
}

const pools: StatementPdfRenderer[] = [];
afterAll(async () => {
  await Promise.all(pools.map((p) => p.close()));
});
afterEach(() => {
  vi.useRealTimers();
});

describe("the statement PDF pool", () => {
  it("renders a statement in its worker threads to the same bytes as in-process", async () => {
    const pool = createStatementPdfPool({ threads: 2 });
    pools.push(pool);
    const inputs = ["EXT-1", "EXT-2", "EXT-3"].map(statement);
    const viaPool = await Promise.all(inputs.map((i) => pool.render(i)));
    expect(pool.rendered).toEqual({ inWorker: 3, inProcess: 0 });
    for (const [k, input] of inputs.entries()) {
      const here = await renderStatementPdf(input);
      expect(viaPool[k].subarray(0, 5).toString()).toBe("%PDF-");
      expect(viaPool[k].length).toBeGreaterThan(10_000);
      expect(Buffer.compare(viaPool[k], here)).toBe(0);
    }
    // Different statements, different files: the comparison above is not between empty shells.
    expect(Buffer.compare(viaPool[0], viaPool[1])).not.toBe(0);
  });

  it("dates the PDF by the statement, not by the clock, so a later rendering gives the same bytes", async () => {
    const input = statement("EXT-9");
    vi.useFakeTimers({ toFake: ["Date"] });
    vi.setSystemTime(new Date("2027-01-15T08:00:00Z"));
    const first = await renderStatementPdf(input);
    vi.setSystemTime(new Date("2031-06-30T23:59:59Z"));
    const later = await renderStatementPdf(input);
    expect(Buffer.compare(first, later)).toBe(0);
    const text = first.toString("latin1");
    expect(text).toContain("(D:20261202130509Z)");
    expect(text).not.toMatch(/\(D:20(27|31)/);
  });

  it("renders in-process, with the same bytes, when its worker file is missing, and says so", async () => {
    const said: string[] = [];
    const missing = fileURLToPath(new URL("./no-such-statement-worker.mjs", import.meta.url));
    const pool = createStatementPdfPool({ threads: 2, worker: { file: missing, execArgv: [] }, log: (m) => said.push(m) });
    pools.push(pool);
    const a = await pool.render(statement("EXT-4"));
    expect(Buffer.compare(a, await renderStatementPdf(statement("EXT-4")))).toBe(0);
    expect(pool.rendered).toEqual({ inWorker: 0, inProcess: 1 });
    expect(said).toHaveLength(1);
    expect(said[0]).toMatch(/no-such-statement-worker\.mjs is missing; rendering them in-process/);
  });

  it("renders in-process, with the same bytes, when its thread fails to start, and says so once", async () => {
    const said: string[] = [];
    // The TypeScript worker without tsx in its thread: Node cannot load it, as a broken install could not.
    const worker = { file: fileURLToPath(new URL("../../server/modules/recharge/statement-pdf.worker.ts", import.meta.url)), execArgv: [] };
    const pool = createStatementPdfPool({ threads: 2, worker, log: (m) => said.push(m) });
    pools.push(pool);
    const [a, b] = await Promise.all([pool.render(statement("EXT-4")), pool.render(statement("EXT-5"))]);
    const c = await pool.render(statement("EXT-8"));
    expect(Buffer.compare(a, await renderStatementPdf(statement("EXT-4")))).toBe(0);
    expect(Buffer.compare(b, await renderStatementPdf(statement("EXT-5")))).toBe(0);
    expect(Buffer.compare(c, await renderStatementPdf(statement("EXT-8")))).toBe(0);
    expect(pool.rendered).toEqual({ inWorker: 0, inProcess: 3 });
    expect(said).toHaveLength(1);
    expect(said[0]).toMatch(/a worker thread failed .*; rendering them in-process from now on/);
  });

  it("refuses a statement that cannot be rendered either way, and keeps its threads for the next one", async () => {
    const said: string[] = [];
    const pool = createStatementPdfPool({ threads: 1, log: (m) => said.push(m) });
    pools.push(pool);
    const broken = { ...statement("EXT-6"), lines: [{ ...statement("EXT-6").lines[0], unitPriceCents: "not a price" }] };
    await expect(renderStatementPdf(broken)).rejects.toThrow(/not a number/);
    await expect(pool.render(broken)).rejects.toThrow(/not a number/);
    const next = await pool.render(statement("EXT-7"));
    expect(Buffer.compare(next, await renderStatementPdf(statement("EXT-7")))).toBe(0);
    expect(pool.rendered).toEqual({ inWorker: 1, inProcess: 0 });
    expect(said).toEqual([]);
  });
});

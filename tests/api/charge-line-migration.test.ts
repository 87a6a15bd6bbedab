/**
 * The migration that makes charge-line figures exact keeps the lines already billed right:
 * instrument lines held minutes at an hourly rate and become hours at that rate; every other
 * line (a consumable whose unit price held its cost before the mark-up, an adjustment, a cap
 * credit, a correction) becomes 1 each at its amount. Amounts never change, and afterwards every
 * line reconciles. Its `down` gives the old columns back.
 */
import { afterEach, describe, expect, it } from "vitest";
import type { DataSource } from "typeorm";
import { lineReconciles } from "@shared/domain/charges";
import { openDatabase } from "../../server/db/data-source";
import { minutesAsHours } from "../../server/db/migrations/1796238557056-charge-line-exact-figures";

let ds: DataSource | undefined;

/** Undoes migrations, newest first, until the named one is undone too (later ones come off first). */
async function undoThrough(source: DataSource, name: string): Promise<void> {
  for (;;) {
    const [last] = (await source.query(`SELECT name FROM migrations ORDER BY id DESC LIMIT 1`)) as { name: string }[];
    if (!last) throw new Error(`${name} was never applied`);
    await source.undoLastMigration({ transaction: "each" });
    if (last.name === name) return;
  }
}
const CHARGE_LINE_MIGRATION = "ChargeLineExactFigures1796238557056";
afterEach(async () => {
  await ds?.destroy();
  ds = undefined;
});

const LINE = `INSERT INTO charge_lines (statementId, runId, accountId, kind, description, quantity, unit, unitPriceCents, amountCents, at) VALUES (1, 1, 1, ?, ?, ?, ?, ?, ?, '2026-05-04T13:00:00.000Z')`;

describe("the charge-line exact figures migration", () => {
  it("writes minutes ÷ 60 exactly: a decimal where one exists, else the reduced fraction", () => {
    expect(minutesAsHours(90n)).toBe("1.5");
    expect(minutesAsHours(75n)).toBe("1.25");
    expect(minutesAsHours(3n)).toBe("0.05");
    expect(minutesAsHours(120n)).toBe("2");
    expect(minutesAsHours(10n)).toBe("1/6");
    expect(minutesAsHours(50n)).toBe("5/6");
    expect(minutesAsHours(0n)).toBe("0");
  });

  it("turns lines billed before it into lines that reconcile, with the same amounts, and undoes cleanly", async () => {
    ds = await openDatabase(":memory:");
    await undoThrough(ds, CHARGE_LINE_MIGRATION);
    await ds.query(`INSERT INTO billing_runs (id, period, status, currency, totalCents, createdAt) VALUES (1, '2026-05', 'final', 'CAD', 0, '2026-06-02T12:00:00.000Z')`);
    await ds.query(`INSERT INTO statements (id, runId, accountId, period, totalCents, currency, createdAt) VALUES (1, 1, 1, '2026-05', 0, 'CAD', '2026-06-02T12:00:00.000Z')`);
    // As the old run wrote them (the old columns: quantity real, unitPriceCents integer):
    await ds.query(LINE, ["instrument", "75 min at 45.50 $/h", 75, "min", 4550, 5688]); // 75 × 4550 / 60 = 5687.5 → 5688
    await ds.query(LINE, ["instrument", "10 min at 45.50 $/h", 10, "min", 4550, 758]); // 10 × 4550 / 60 = 758.33… → 758
    await ds.query(LINE, ["instrument", "90 min, second half", 90, "min", 4550, 6825]); // 90 × 4550 / 60 = 6825
    await ds.query(LINE, ["consumable", "25 mL of DCE, cost 175 cents + 8 %", 25, "mL", 175, 189]); // 175 × 1.08 = 189
    await ds.query(LINE, ["adjustment", "Credit: instrument fault", 1, "each", -1500, -1500]);
    await ds.query(LINE, ["cap_credit", "Monthly cap reached", 1, "each", -7000, -7000]);
    await ds.query(LINE, ["instrument", "a line that never reconciled", 30, "min", 4000, 2100]); // 30 × 4000 / 60 = 2000, not 2100

    await ds.runMigrations({ transaction: "each" });
    const rows: { kind: string; quantity: string; unit: string; unitPriceCents: string; amountCents: number }[] = await ds.query(
      `SELECT kind, quantity, unit, unitPriceCents, amountCents FROM charge_lines ORDER BY id`,
    );
    expect(rows.map((r) => [r.kind, r.quantity, r.unit, r.unitPriceCents, r.amountCents])).toEqual([
      ["instrument", "1.25", "h", "4550", 5688],
      ["instrument", "1/6", "h", "4550", 758],
      ["instrument", "1.5", "h", "4550", 6825],
      ["consumable", "1", "each", "189", 189],
      ["adjustment", "1", "each", "-1500", -1500],
      ["cap_credit", "1", "each", "-7000", -7000],
      ["instrument", "1", "each", "2100", 2100],
    ]);
    for (const r of rows) expect(lineReconciles({ quantity: r.quantity, unit: r.unit, unitPriceCents: r.unitPriceCents, amountCents: r.amountCents })).toBe(true);
    expect((await ds.query(`SELECT typeof(quantity) AS q, typeof(unitPriceCents) AS p FROM charge_lines LIMIT 1`))[0]).toEqual({ q: "text", p: "text" });

    await undoThrough(ds, CHARGE_LINE_MIGRATION);
    const back: { quantity: number; unit: string; unitPriceCents: number; amountCents: number }[] = await ds.query(
      `SELECT quantity, unit, unitPriceCents, amountCents FROM charge_lines ORDER BY id LIMIT 3`,
    );
    expect(back).toEqual([
      { quantity: 75, unit: "min", unitPriceCents: 4550, amountCents: 5688 },
      { quantity: 10, unit: "min", unitPriceCents: 4550, amountCents: 758 },
      { quantity: 90, unit: "min", unitPriceCents: 4550, amountCents: 6825 },
    ]);
  });
});

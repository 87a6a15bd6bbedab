import type { MigrationInterface, QueryRunner } from "typeorm";

/**
 * Charge lines a finance office can check with a calculator, and a stored double-entry journal.
 *
 * - `charge_lines.quantity` and `unitPriceCents` become exact text (a decimal, or a reduced
 *   fraction such as "1/6" h): quantity × unit price rounds to the amount. SQLite cannot change
 *   a column's type in place, so the table is rebuilt (no other table points at it) and the
 *   rows already there are rewritten so that they keep reconciling:
 *   instrument lines held minutes at an hourly rate → hours ("1.5" h) at the same rate (the
 *   amount was rate × minutes ÷ 60 rounded half away from zero, which is hours × rate rounded
 *   the same way); every other line held the whole amount (or, for consumables, the cost
 *   before the mark-up) → quantity "1", unit "each", unit price = the amount.
 * - `billing_runs.recoveryAccount` and `journal_lines`: the journal a run writes when it is
 *   finalised (debit each internal account, credit the recovery account). Runs finalised
 *   before this migration have no stored journal; theirs is built when it is downloaded.
 *
 * The `down` puts the old types back: hours become minutes again, fractions become the nearest
 * number, and unit prices are rounded to whole cents (the amounts are untouched).
 */

const FK_STATEMENT = `CONSTRAINT "FK_6f69563b50f0de444450759a309" FOREIGN KEY ("statementId") REFERENCES "statements" ("id") ON DELETE CASCADE ON UPDATE NO ACTION`;
const COLUMNS = `"id", "statementId", "runId", "accountId", "kind", "bookingId", "instrumentId", "usageId", "adjustmentId", "userId", "rateId", "description", "quantity", "unit", "unitPriceCents", "amountCents", "at"`;
const INDEXES: [string, string][] = [
  ["IDX_6f69563b50f0de444450759a30", "statementId"],
  ["IDX_2dae77fae8f329fb13b60b1ac9", "runId"],
  ["IDX_00ba2ed403f6d866c3b1f3ba2a", "bookingId"],
  ["IDX_837afbfc3c750aa65fe7b9ee38", "usageId"],
  ["IDX_8c969db11bab950ceb6945e370", "userId"],
];

function table(name: string, quantityType: string, priceType: string): string {
  return (
    `CREATE TABLE "${name}" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "statementId" integer NOT NULL, "runId" integer NOT NULL, "accountId" integer NOT NULL, ` +
    `"kind" text NOT NULL, "bookingId" integer, "instrumentId" integer, "usageId" integer, "adjustmentId" integer, "userId" integer, "rateId" integer, ` +
    `"description" text NOT NULL, "quantity" ${quantityType} NOT NULL, "unit" text NOT NULL, "unitPriceCents" ${priceType} NOT NULL, "amountCents" integer NOT NULL, "at" text NOT NULL, ${FK_STATEMENT})`
  );
}

async function rebuild(q: QueryRunner, quantityType: string, priceType: string, select: string): Promise<void> {
  for (const [name] of INDEXES) await q.query(`DROP INDEX "${name}"`);
  await q.query(table("temporary_charge_lines", quantityType, priceType));
  await q.query(`INSERT INTO "temporary_charge_lines"(${COLUMNS}) SELECT ${select} FROM "charge_lines"`);
  await q.query(`DROP TABLE "charge_lines"`);
  await q.query(`ALTER TABLE "temporary_charge_lines" RENAME TO "charge_lines"`);
  for (const [name, column] of INDEXES) await q.query(`CREATE INDEX "${name}" ON "charge_lines" ("${column}") `);
}

// Exact arithmetic of our own: a migration never changes after it lands, so it imports nothing that might.
function gcd(a: bigint, b: bigint): bigint {
  let [x, y] = [a < 0n ? -a : a, b];
  while (y !== 0n) [x, y] = [y, x % y];
  return x;
}

/** minutes ÷ 60 as exact text: a decimal where one exists ("1.5", "0.05"), else "n/d". */
export function minutesAsHours(minutes: bigint): string {
  const g = gcd(minutes, 60n);
  const [n, d] = [minutes / g, 60n / g];
  if (d === 1n) return n.toString();
  // 60 = 2² · 3 · 5: a decimal exists unless a 3 is left in the denominator; then at most two places.
  if (d % 3n === 0n) return `${n}/${d}`;
  const hundredths = (n * 100n) / d;
  const sign = hundredths < 0n ? "-" : "";
  const abs = (hundredths < 0n ? -hundredths : hundredths).toString().padStart(3, "0");
  return `${sign}${abs.slice(0, -2)}.${abs.slice(-2)}`.replace(/\.?0+$/, "");
}

/** rate × minutes ÷ 60 rounded half away from zero (the old amount of an instrument line). */
function timeAmount(rateCents: bigint, minutes: bigint): bigint {
  const n = rateCents * minutes;
  const abs = n < 0n ? -n : n;
  const rounded = (abs * 2n + 60n) / 120n;
  return n < 0n ? -rounded : rounded;
}

/** Exact text (decimal or "n/d") as the nearest number, for the down migration. */
function toNumber(text: string): number {
  const m = /^(-?\d+)\/(\d+)$/.exec(text);
  return m ? Number(m[1]) / Number(m[2]) : Number(text);
}

export class ChargeLineExactFigures1796238557056 implements MigrationInterface {
  name = "ChargeLineExactFigures1796238557056";

  async up(queryRunner: QueryRunner): Promise<void> {
    // Instrument minutes are kept as they are for a moment (unit "min"), converted to hours below.
    await rebuild(
      queryRunner,
      "text",
      "text",
      `"id", "statementId", "runId", "accountId", "kind", "bookingId", "instrumentId", "usageId", "adjustmentId", "userId", "rateId", "description", ` +
        `CASE WHEN "kind" = 'instrument' AND "unit" = 'min' THEN CAST(CAST("quantity" AS INTEGER) AS TEXT) ELSE '1' END, ` +
        `CASE WHEN "kind" = 'instrument' AND "unit" = 'min' THEN 'min' ELSE 'each' END, ` +
        `CASE WHEN "kind" = 'instrument' AND "unit" = 'min' THEN CAST("unitPriceCents" AS TEXT) ELSE CAST("amountCents" AS TEXT) END, ` +
        `"amountCents", "at"`,
    );
    const groups: { quantity: string; unitPriceCents: string; amountCents: number }[] = await queryRunner.query(
      `SELECT DISTINCT "quantity", "unitPriceCents", "amountCents" FROM "charge_lines" WHERE "unit" = 'min'`,
    );
    for (const g of groups) {
      const minutes = BigInt(g.quantity);
      const same = `WHERE "unit" = 'min' AND "quantity" = ? AND "unitPriceCents" = ? AND "amountCents" = ?`;
      const key = [g.quantity, g.unitPriceCents, g.amountCents];
      if (/^-?\d+$/.test(g.unitPriceCents) && timeAmount(BigInt(g.unitPriceCents), minutes) === BigInt(g.amountCents)) {
        await queryRunner.query(`UPDATE "charge_lines" SET "quantity" = ?, "unit" = 'h' ${same}`, [minutesAsHours(minutes), ...key]);
      } else {
        // A line whose figures never reconciled: its amount as one item, so it reconciles now.
        await queryRunner.query(`UPDATE "charge_lines" SET "quantity" = '1', "unit" = 'each', "unitPriceCents" = CAST("amountCents" AS TEXT) ${same}`, key);
      }
    }
    await queryRunner.query(`ALTER TABLE "billing_runs" ADD COLUMN "recoveryAccount" text`);
    await queryRunner.query(
      `CREATE TABLE "journal_lines" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "runId" integer NOT NULL, "position" integer NOT NULL, "period" text NOT NULL, "account" text NOT NULL, ` +
        `"department" text NOT NULL DEFAULT (''), "debitCents" integer, "creditCents" integer, "currency" text NOT NULL, "description" text NOT NULL, ` +
        `CONSTRAINT "FK_442184592f92ff39e6172683bb4" FOREIGN KEY ("runId") REFERENCES "billing_runs" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_442184592f92ff39e6172683bb" ON "journal_lines" ("runId") `);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX "IDX_442184592f92ff39e6172683bb"`);
    await queryRunner.query(`DROP TABLE "journal_lines"`);
    await queryRunner.query(`ALTER TABLE "billing_runs" DROP COLUMN "recoveryAccount"`);
    const hours: { quantity: string }[] = await queryRunner.query(`SELECT DISTINCT "quantity" FROM "charge_lines" WHERE "unit" = 'h'`);
    for (const h of hours) {
      await queryRunner.query(`UPDATE "charge_lines" SET "quantity" = ?, "unit" = 'min' WHERE "unit" = 'h' AND "quantity" = ?`, [String(Math.round(toNumber(h.quantity) * 60)), h.quantity]);
    }
    for (const column of ["quantity", "unitPriceCents"]) {
      const fractions: { v: string }[] = await queryRunner.query(`SELECT DISTINCT "${column}" AS v FROM "charge_lines" WHERE "${column}" LIKE '%/%'`);
      for (const f of fractions) await queryRunner.query(`UPDATE "charge_lines" SET "${column}" = ? WHERE "${column}" = ?`, [String(toNumber(f.v)), f.v]);
    }
    await rebuild(
      queryRunner,
      "real",
      "integer",
      `"id", "statementId", "runId", "accountId", "kind", "bookingId", "instrumentId", "usageId", "adjustmentId", "userId", "rateId", "description", ` +
        `CAST("quantity" AS REAL), "unit", CAST(ROUND(CAST("unitPriceCents" AS REAL)) AS INTEGER), "amountCents", "at"`,
    );
  }
}

/**
 * Writes a finalising billing run's statements and charge lines while the month is being priced
 * (month-stream's streamMonth hands over one page of lines at a time), so a month of tens of
 * thousands of lines never sits in memory whole. Runs on the run's own transaction connection:
 * better-sqlite3 has one connection, and the TypeORM transaction that owns the run has begun on it.
 */
import type { EntityManager } from "typeorm";
import type { ComputedLine } from "./month-pricer";

interface RawStatement {
  run(...params: unknown[]): { lastInsertRowid: number | bigint };
}
interface RawDb {
  prepare(sql: string): RawStatement;
  inTransaction: boolean;
}

const LINE_COLUMNS = [
  "statementId", "runId", "accountId", "kind", "bookingId", "instrumentId", "usageId", "adjustmentId", "userId", "rateId",
  "description", "quantity", "unit", "unitPriceCents", "amountCents", "at",
] as const;

function rawDb(em: EntityManager): RawDb {
  return (em.connection.driver as unknown as { databaseConnection: RawDb }).databaseConnection;
}

export interface RunWriter {
  /** A LineSink: stores a page of lines, opening an account's statement on its first line. */
  write(lines: ComputedLine[]): void;
  /** The statement opened for an account, if any line of it was written. */
  statementId(accountId: number): number | undefined;
}

export function createRunWriter(em: EntityManager, run: { id: number; period: string; currency: string; createdAt: string }): RunWriter {
  const db = rawDb(em);
  // Raw writes outside the run's transaction would survive its rollback; refuse rather than risk it.
  if (!db.inTransaction) throw new Error("createRunWriter must be used inside the run's transaction");
  const row = `(${LINE_COLUMNS.map(() => "?").join(", ")})`;
  const insert = `INSERT INTO charge_lines (${LINE_COLUMNS.map((c) => `"${c}"`).join(", ")}) VALUES `;
  // One row per INSERT: SQLite keeps an undo journal of every page a multi-row INSERT changes (it
  // may have to undo the rows before a failing one), written to a temporary file past 64 KiB; with
  // the lines' five indexes that was a few pages per line, and more per line the larger the month.
  const one = db.prepare(insert + row);
  // Totals and invoice state are set once the month is complete (closeStatements in billing-run.commands).
  const openStatement = db.prepare(
    `INSERT INTO statements (runId, accountId, period, totalCents, currency, invoiceStatus, invoiceAttempts, createdAt) VALUES (?, ?, ?, 0, ?, 'none', 0, ?)`,
  );
  const statements = new Map<number, number>();

  const statementFor = (accountId: number): number => {
    let id = statements.get(accountId);
    if (id === undefined) {
      id = Number(openStatement.run(run.id, accountId, run.period, run.currency, run.createdAt).lastInsertRowid);
      statements.set(accountId, id);
    }
    return id;
  };
  const params = (l: ComputedLine, out: unknown[]) => {
    out.push(
      statementFor(l.accountId), run.id, l.accountId, l.kind, l.bookingId, l.instrumentId, l.usageId, l.adjustmentId, l.userId, l.rateId,
      l.description, l.quantity, l.unit, l.unitPriceCents, l.amountCents, l.at,
    );
  };

  return {
    write(lines) {
      const values: unknown[] = [];
      for (const l of lines) {
        values.length = 0;
        params(l, values);
        one.run(...values);
      }
    },
    statementId: (accountId) => statements.get(accountId),
  };
}

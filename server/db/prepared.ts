/**
 * Prepared statements straight on the better-sqlite3 connection under TypeORM, for the few
 * queries every request makes (session row, signed-in person). TypeORM's query builder and
 * entity hydration cost far more than the lookups themselves there. Statements are cached per
 * connection, so a data source that is destroyed and opened again prepares them afresh.
 */
import type { DataSource, EntityTarget, ObjectLiteral } from "typeorm";
import type { Database, Statement } from "better-sqlite3";

const cache = new WeakMap<Database, Map<string, Statement>>();

/** The better-sqlite3 connection TypeORM opened for this data source. */
export function connectionOf(ds: DataSource): Database {
  return (ds.driver as unknown as { databaseConnection: Database }).databaseConnection;
}

export function prepared(ds: DataSource, sql: string): Statement {
  const db = connectionOf(ds);
  let stmts = cache.get(db);
  if (!stmts) {
    stmts = new Map();
    cache.set(db, stmts);
  }
  let stmt = stmts.get(sql);
  if (!stmt) {
    stmt = db.prepare(sql);
    stmts.set(sql, stmt);
  }
  return stmt;
}

const booleanColumnsOf = new WeakMap<object, string[]>();

/**
 * Rows read with a prepared statement, shaped as TypeORM would hydrate them: SQLite keeps
 * booleans as 0/1, so the entity's boolean columns are turned back into true/false (every
 * other column type we use — text, integer, real — reads back as it is).
 */
export function readEntities<T extends ObjectLiteral>(ds: DataSource, target: EntityTarget<T>, sql: string, ...args: unknown[]): T[] {
  const meta = ds.getMetadata(target);
  let booleans = booleanColumnsOf.get(meta);
  if (!booleans) {
    booleans = meta.columns.filter((c) => c.type === "boolean").map((c) => c.databaseName);
    booleanColumnsOf.set(meta, booleans);
  }
  const rows = prepared(ds, sql).all(...args) as Record<string, unknown>[];
  for (const row of rows) for (const col of booleans) if (row[col] !== null && row[col] !== undefined) row[col] = Boolean(row[col]);
  return rows as T[];
}

/** The first row of readEntities, or undefined. */
export function readEntity<T extends ObjectLiteral>(ds: DataSource, target: EntityTarget<T>, sql: string, ...args: unknown[]): T | undefined {
  return readEntities(ds, target, sql, ...args)[0];
}

/**
 * `PRAGMA optimize`: SQLite runs ANALYZE (with a bounded sample) on the tables whose statistics
 * are missing or stale since they grew or shrank tenfold, so the query planner keeps choosing the
 * indexes the lists rely on. Cheap when nothing changed; called after bulk imports, and with
 * 0x10002 (check every table) when the database opens, as SQLite advises for long-lived connections.
 */
export function refreshPlannerStatistics(ds: DataSource, atOpen = false): void {
  connectionOf(ds).pragma(atOpen ? "optimize=0x10002" : "optimize");
}

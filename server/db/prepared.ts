/**
 * Prepared statements straight on the better-sqlite3 connection under TypeORM, for the few
 * queries every request makes (session row, signed-in person). TypeORM's query builder and
 * entity hydration cost far more than the lookups themselves there. Statements are cached per
 * connection, so a data source that is destroyed and opened again prepares them afresh.
 */
import type { DataSource } from "typeorm";
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

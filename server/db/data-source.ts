/**
 * The one TypeORM data source: better-sqlite3 with WAL and foreign keys, schema from
 * migrations only (synchronize is off everywhere, tests included).
 */
import fs from "node:fs";
import path from "node:path";
import "reflect-metadata";
import { DataSource } from "typeorm";
import { entities } from "../entities";
import { migrations } from "./migrations";
import { refreshPlannerStatistics } from "./prepared";

export function createDataSource(databasePath: string): DataSource {
  if (databasePath !== ":memory:") fs.mkdirSync(path.dirname(path.resolve(databasePath)), { recursive: true });
  return new DataSource({
    type: "better-sqlite3",
    database: databasePath,
    entities,
    migrations,
    migrationsRun: false,
    synchronize: false,
    logging: false,
    prepareDatabase: (db: { pragma(s: string): unknown }) => {
      db.pragma("journal_mode = WAL");
      db.pragma("foreign_keys = ON");
      db.pragma("busy_timeout = 5000");
      // WAL with NORMAL sync is durable across application crashes; common practice for SQLite servers.
      db.pragma("synchronous = NORMAL");
    },
  });
}

/** Opens the database and applies any migrations that have not run yet. */
export async function openDatabase(databasePath: string): Promise<DataSource> {
  const ds = createDataSource(databasePath);
  await ds.initialize();
  await ds.runMigrations({ transaction: "each" });
  refreshPlannerStatistics(ds, true);
  return ds;
}

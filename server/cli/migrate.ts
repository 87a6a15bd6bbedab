/** Applies pending migrations to DATABASE_PATH. */
import { loadConfig } from "../config";
import { openDatabase } from "../db/data-source";

const config = loadConfig();
const ds = await openDatabase(config.DATABASE_PATH);
const pending = await ds.showMigrations();
console.log(`Database ${config.DATABASE_PATH} is migrated${pending ? " (some migrations still pending?)" : ""}.`);
await ds.destroy();

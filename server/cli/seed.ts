/** Seeds the invented demo facility into DATABASE_PATH once; a second run adds nothing. */
import { loadConfig } from "../config";
import { openDatabase } from "../db/data-source";
import { seedDemo } from "../db/seed/demo";

const config = loadConfig();
const ds = await openDatabase(config.DATABASE_PATH);
const { seeded } = await seedDemo(ds, {
  now: new Date(),
  tz: config.FACILITY_TZ,
  currency: config.CURRENCY,
  facilityName: config.FACILITY_NAME,
  recoveryAccount: config.RECOVERY_ACCOUNT,
});
console.log(seeded ? "Demo scenario seeded." : "The demo scenario was already there; nothing added.");
await ds.destroy();

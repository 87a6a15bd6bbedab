/** What the Schedule's commands need of the app: the database, the clock and a few settings (the app's Ctx is one). */
import type { Config } from "../../config";
import type { Deps } from "../../core/deps";

export interface ScheduleDeps extends Deps {
  config: Pick<Config, "FACILITY_TZ" | "PUBLIC_URL">;
}

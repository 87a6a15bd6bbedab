/** What the people's commands need of the app. The app's Ctx is one; tests and seeds may pass less. */
import type { Deps } from "../../core/deps";
import type { Config } from "../../config";

export interface PeopleDeps extends Deps {
  /** Links in mail point at PUBLIC_URL; the welcome mail names the facility. */
  config: Pick<Config, "PUBLIC_URL" | "FACILITY_NAME">;
  /** bcrypt cost; tests may lower it for speed, never below 10. */
  bcryptCost?: number;
}

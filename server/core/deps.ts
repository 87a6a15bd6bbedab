/** What a command or query needs of the app: the database and the clock (tests fix it). The app's Ctx is one. */
import type { DataSource } from "typeorm";

export interface Deps {
  ds: DataSource;
  now: () => Date;
}

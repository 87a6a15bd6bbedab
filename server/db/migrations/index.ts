// Every migration in order. Migrations are never edited after they land: add a new one
// (npm run db:migration -- <name>) and list it here.
import { InitialSchema1796173192009 } from "./1796173192009-initial-schema";
import { BookingsAndUsages1796173432958 } from "./1796173432958-bookings-and-usages";
import { Recharge1796174960945 } from "./1796174960945-recharge";

export const migrations = [InitialSchema1796173192009, BookingsAndUsages1796173432958, Recharge1796174960945];

/**
 * Every area's route table, in the order the API matches them. An area's public entry
 * (server/modules/<area>/index.ts) is the only file other areas and app.ts import.
 */
import type { RouteTable } from "../http/route-table";
import { stockroomTable } from "./stockroom";
import { safetyTable } from "./safety";
import { labelsTable } from "./labels";
import { systemTable } from "./system";
import { peopleTable } from "./people";
import { rechargeTable } from "./recharge";
import { scheduleTable } from "./schedule";
import { runPlansTable } from "./runplans";

// People first: its session routes (GET /api/auth/me, the signed-in baseline) are matched before any other.
export const ROUTE_TABLES: RouteTable[] = [peopleTable, systemTable, scheduleTable, stockroomTable, safetyTable, labelsTable, rechargeTable, runPlansTable];

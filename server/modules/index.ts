/**
 * Every area's route table, in the order the API matches them. An area's public entry
 * (server/modules/<area>/index.ts) is the only file other areas and app.ts import.
 */
import type { RouteTable } from "../http/route-table";
import { stockroomTable } from "./stockroom";
import { safetyTable } from "./safety";
import { labelsTable } from "./labels";
import { systemTable } from "./system";
import { scheduleTable } from "./schedule";

export const ROUTE_TABLES: RouteTable[] = [systemTable, stockroomTable, safetyTable, labelsTable, scheduleTable];

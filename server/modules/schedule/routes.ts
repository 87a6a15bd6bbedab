/** The Schedule's route table: instruments, bookings, setups, calendar feeds and the utilisation report. */
import type { RouteTable } from "../../http/route-table";
import { bookingRoutes } from "./booking.routes";
import { calendarRoutes } from "./calendar.routes";
import { instrumentRoutes } from "./instrument.routes";
import { setupRoutes } from "./setup.routes";
import { utilisationRoutes } from "./utilisation.routes";

export const scheduleTable: RouteTable = {
  module: "schedule",
  description: "Instruments and their booking rules and faults, bookings (create, move, approve, decline, cancel, check-in/out, no-show), setups, personal calendar feeds and utilisation.",
  routes: [...instrumentRoutes, ...bookingRoutes, ...setupRoutes, ...calendarRoutes, ...utilisationRoutes],
};

/** The Stockroom's route table: chemicals, containers, solutions and locations. */
import type { RouteTable } from "../../http/route-table";
import { chemicalRoutes } from "./chemical.routes";
import { containerRoutes } from "./container.routes";
import { locationRoutes } from "./location.routes";
import { solutionRoutes } from "./solution.routes";

export const stockroomTable: RouteTable = {
  module: "stockroom",
  description: "Chemicals with their hazard data, containers (bottles, vials, prepared solutions, waste), usage, solution preparation and locations.",
  routes: [...chemicalRoutes, ...containerRoutes, ...solutionRoutes, ...locationRoutes],
};

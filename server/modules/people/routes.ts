/** The People area's route table: the session, people administration, departments and groups, training. */
import type { RouteTable } from "../../http/route-table";
import { sessionRoutes } from "./auth.routes";
import { orgRoutes } from "./org.routes";
import { trainingRoutes } from "./training.routes";
import { userRoutes } from "./user.routes";

export const peopleTable: RouteTable = {
  module: "people",
  description: "Signing in and out, passwords, people and their roles (administrators), departments and research groups, and training on instruments.",
  routes: [...sessionRoutes, ...userRoutes, ...orgRoutes, ...trainingRoutes],
};

/** Departments and research groups, readable by everyone signed in (forms pick from them). */
import { pageOf } from "@shared/schemas/common";
import { departmentDto, groupDto } from "@shared/schemas/users";
import { route } from "../../http/route-table";
import { listDepartments, listGroups } from "./org.queries";
import { presentDepartment, presentGroup } from "./user.presenter";

export const orgRoutes = [
  route({
    method: "get",
    path: "/departments",
    summary: "Departments, by name",
    access: "signed_in",
    output: pageOf(departmentDto),
    handler: async ({ ctx }) => {
      const items = await listDepartments(ctx.ds);
      return { items: items.map(presentDepartment), total: items.length };
    },
  }),
  route({
    method: "get",
    path: "/groups",
    summary: "Research groups, by name, each in a department and with its lead",
    access: "signed_in",
    output: pageOf(groupDto),
    handler: async ({ ctx }) => {
      const items = await listGroups(ctx.ds);
      return { items: items.map(presentGroup), total: items.length };
    },
  }),
];

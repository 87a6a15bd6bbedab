/**
 * People administration (administrators): list, add, change roles, department, group and
 * organisation, deactivate and reactivate. The user policy decides on each person; every row
 * carries the administrator's abilities on it.
 */
import { z } from "zod";
import { boundedPageOf, idParam } from "@shared/schemas/common";
import { createUserInput, organisationList, updateUserInput, userAdminDto, userListQuery } from "@shared/schemas/users";
import { route, WRITTEN } from "../../http/route-table";
import { toCsv, type CsvColumn } from "../../core/csv";
import { createUser, updateUser } from "./user.commands";
import { knownOrganisations, listUsers, peopleForExport, type PersonExportRow } from "./user.queries";
import { presentUserAdmin } from "./user.presenter";

const ADMINS = ["admin"] as const;
const one = z.object({ user: userAdminDto });

/** The people export's columns, through the one CSV writer: no name or organisation can start a formula. */
const PEOPLE_COLUMNS: CsvColumn<PersonExportRow>[] = [
  { header: "name", value: (p) => p.name },
  { header: "email", value: (p) => p.email },
  { header: "roles", value: (p) => p.roles },
  { header: "department", value: (p) => p.department },
  { header: "research_group", value: (p) => p.researchGroup },
  { header: "organisation", value: (p) => p.organisation },
  { header: "may_sign_in", value: (p) => p.active === 1 },
  { header: "created_at", value: (p) => p.createdAt },
];

export const userRoutes = [
  route({
    method: "get",
    path: "/users",
    summary: "People with an account, by name, filtered by name, e-mail or organisation",
    access: ADMINS,
    query: userListQuery,
    description: "The text is plain text: part of a name, e-mail or organisation. `total` is exact while `totalIsExact` is true; past 1,000 matches counting stops (more than `total` match).",
    output: boundedPageOf(userAdminDto),
    handler: async ({ ctx, actor, query }) => {
      const page = await listUsers(ctx.ds, query);
      return { items: page.items.map((u) => presentUserAdmin(u, actor)), total: page.total, totalIsExact: page.totalIsExact };
    },
  }),
  route({
    method: "get",
    path: "/users/export.csv",
    summary: "Everyone with an account as CSV (RFC 4180): roles, department, group, organisation and whether they may sign in, for an access review",
    access: ADMINS,
    produces: "text/csv",
    handler: async ({ ctx, res }) => {
      const csv = toCsv(await peopleForExport(ctx.ds), PEOPLE_COLUMNS);
      res.type("text/csv; charset=utf-8").set("Content-Disposition", `attachment; filename="people-${ctx.now().toISOString().slice(0, 10)}.csv"`).send(csv);
      return WRITTEN;
    },
  }),
  route({
    method: "get",
    path: "/users/organisations",
    summary: "External customers' organisations already known (from their accounts and people), offered when typing a person's",
    access: ADMINS,
    output: organisationList,
    handler: async ({ ctx }) => ({ items: await knownOrganisations(ctx.ds) }),
  }),
  route({
    method: "post",
    path: "/users",
    summary: "Add a person; without a first password they are mailed a link to choose one",
    access: ADMINS,
    body: createUserInput,
    status: 201,
    output: one,
    handler: async ({ ctx, actor, body }) => ({ user: presentUserAdmin(await createUser(ctx, actor, body), actor) }),
  }),
  route({
    method: "patch",
    path: "/users/:id",
    summary: "Change a person's name, roles, department, group or organisation, or whether they may sign in",
    description: "Nobody deactivates their own account or removes their own Administrator role (422). A deactivation ends the person's sessions.",
    access: ADMINS,
    policy: "user.edit",
    params: idParam,
    body: updateUserInput,
    output: one,
    handler: async ({ ctx, actor, params, body }) => ({ user: presentUserAdmin(await updateUser(ctx, actor, params.id, body), actor) }),
  }),
];

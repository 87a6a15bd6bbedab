/** Health, the facility's settings, each role's start page, the audit log and the development mailbox. */
import { facilityDto } from "@shared/schemas/facility";
import { dashboardDto } from "@shared/schemas/dashboard";
import { pageOf } from "@shared/schemas/common";
import { auditEntryDto, auditQuery, healthDto, mailboxPageDto, systemStatusDto } from "@shared/schemas/system";
import { route, type RouteTable } from "../../http/route-table";
import { hasRole } from "../../middleware/auth";
import { NotFound } from "../../errors";
import { dashboardFor } from "./dashboard.queries";
import { auditPage, databaseAnswers, facilitySettings, systemStatus } from "./system.queries";

export const systemTable: RouteTable = {
  module: "system",
  description: "Health, the facility's settings, each role's start page, the audit log, the administrator's status of mail, payments and backups and, in development, the local mailbox.",
  routes: [
    route({
      method: "get",
      path: "/health",
      summary: "Whether the server and its database answer",
      access: "public",
      output: healthDto,
      handler: ({ ctx, res }) => {
        const ok = databaseAnswers(ctx.ds);
        res.status(ok ? 200 : 503);
        return { status: ok ? "ok" : "degraded", db: ok ? "ok" : "unavailable" } as const;
      },
    }),
    route({
      method: "get",
      path: "/facility",
      summary: "The facility's name, time zone and currency (the client shows local times in the facility's zone)",
      access: "public",
      output: facilityDto,
      handler: ({ ctx }) => facilitySettings(ctx.config),
    }),
    route({
      method: "get",
      path: "/dashboard",
      summary: "The signed-in person's start page: next bookings, and the manager's and safety officer's figures",
      access: "signed_in",
      output: dashboardDto,
      handler: ({ ctx, actor }) => dashboardFor(ctx, actor, { manager: hasRole(actor, "manager"), safety: hasRole(actor, "safety_officer", "manager") }),
    }),
    route({
      method: "get",
      path: "/audit",
      summary: "The audit log: who did what to which record, newest first",
      access: ["admin", "manager"],
      query: auditQuery,
      output: pageOf(auditEntryDto),
      handler: ({ ctx, query }) => auditPage(ctx.ds, query),
    }),
    route({
      method: "get",
      path: "/system/status",
      summary: "Whether mail, payments and the nightly backup work: outbox counts, invoices waiting, the last backup",
      access: ["admin"],
      output: systemStatusDto,
      handler: ({ ctx }) => systemStatus(ctx),
    }),
    route({
      method: "get",
      path: "/dev/mailbox",
      summary: "What the local fake mailbox received (development only; 404 in production)",
      access: ["admin"],
      output: mailboxPageDto,
      handler: async ({ ctx }) => {
        if (ctx.config.NODE_ENV === "production" || !ctx.mailboxUrl) throw new NotFound("The development mailbox");
        const answer = await fetch(`${ctx.mailboxUrl}/messages`);
        return mailboxPageDto.parse(await answer.json());
      },
    }),
  ],
};

/**
 * Instruments: the list (contract GET /api/instruments) and one instrument with its open fault
 * reports for everyone signed in; adding, editing and changing the status for the manager;
 * fault reports from anyone signed in (202: stored and mailed, the status stays the manager's
 * to change), closed by the manager. The instrument policy decides on each instrument.
 */
import { z } from "zod";
import { idParam, pageOf } from "@shared/schemas/common";
import {
  closeFaultInput,
  faultParams,
  faultReportDto,
  instrumentDetailDto,
  instrumentDto,
  instrumentInput,
  instrumentListQuery,
  instrumentPatch,
  reportFaultInput,
} from "@shared/schemas/instruments";
import { route } from "../../http/route-table";
import { createInstrument, updateInstrument } from "./instrument.commands";
import { closeInstrumentFault, reportInstrumentFault } from "./instrument-fault.commands";
import { faultReport, getInstrument, listInstruments, openFaults } from "./instrument.queries";
import { presentInstrument, presentInstrumentDetail } from "./instrument.presenter";

const one = z.object({ instrument: instrumentDto });
const oneFault = z.object({ fault: faultReportDto });

export const instrumentRoutes = [
  route({
    method: "get",
    path: "/instruments",
    summary: "Potentiostats, interface cells and support equipment, by kind and name",
    access: "signed_in",
    query: instrumentListQuery,
    output: pageOf(instrumentDto),
    handler: async ({ ctx, actor, query }) => {
      const { items, total } = await listInstruments(ctx.ds, query);
      return { items: items.map((i) => presentInstrument(i, actor)), total };
    },
  }),
  route({
    method: "get",
    path: "/instruments/:id",
    summary: "One instrument with its booking rules, open fault reports and what the caller may do to it",
    access: "signed_in",
    params: idParam,
    output: z.object({ instrument: instrumentDetailDto }),
    handler: async ({ ctx, actor, params }) => {
      const i = await getInstrument(ctx.ds, params.id);
      return { instrument: presentInstrumentDetail(i, actor, await openFaults(ctx.ds.manager, i.id)) };
    },
  }),
  route({
    method: "post",
    path: "/instruments",
    summary: "Add an instrument with its booking rules",
    access: ["manager"],
    body: instrumentInput,
    status: 201,
    output: one,
    handler: async ({ ctx, actor, body }) => ({ instrument: presentInstrument(await createInstrument(ctx, actor, body), actor) }),
  }),
  route({
    method: "patch",
    path: "/instruments/:id",
    summary: "Change an instrument's rules or status; leaving service tells the owners of its upcoming bookings",
    description: "A status change asks the instrument policy: leaving service is takeOutOfService, coming back returnToService.",
    access: ["manager"],
    policy: "instrument.edit",
    params: idParam,
    body: instrumentPatch,
    output: one,
    handler: async ({ ctx, actor, params, body }) => ({ instrument: presentInstrument(await updateInstrument(ctx, actor, params.id, body), actor) }),
  }),
  route({
    method: "post",
    path: "/instruments/:id/faults",
    summary: "Report a fault: stored, shown on the instrument and mailed to the manager",
    description: "Answers 202 with the stored report: whether the instrument leaves service is the manager's decision. 409 for a retired instrument.",
    access: "signed_in",
    policy: "instrument.reportFault",
    params: idParam,
    body: reportFaultInput,
    status: 202,
    output: oneFault,
    handler: async ({ ctx, actor, params, body }) => {
      const faultId = await reportInstrumentFault(ctx, actor, params.id, body.note);
      return { fault: await faultReport(ctx.ds, params.id, faultId) };
    },
  }),
  route({
    method: "post",
    path: "/instruments/:id/faults/:faultId/close",
    summary: "Close a fault report, saying what was done",
    access: ["manager"],
    policy: "instrument.closeFault",
    params: faultParams,
    body: closeFaultInput,
    output: oneFault,
    handler: async ({ ctx, actor, params, body }) => {
      await closeInstrumentFault(ctx, actor, params.id, params.faultId, body.resolution);
      return { fault: await faultReport(ctx.ds, params.id, params.faultId) };
    },
  }),
];

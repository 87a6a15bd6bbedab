/**
 * Run plans' route table: the ion table (and the manager's additions), the contract computations
 * POST /api/run-plans/preview and /distribution, and plans as records attached to bookings.
 */
import { distribution, previewRunPlan, RUN_PLAN_CONVENTIONS } from "@shared/domain/ion-transfer";
import { idParam, pageOf } from "@shared/schemas/common";
import { distributionDto, distributionInput, runPlanPreviewDto, runPlanPreviewInput } from "@shared/schemas/run-plans";
import { addIonInput, addSolventInput, ionsAnswer, ionsQuery, solventsAnswer } from "@shared/schemas/ion-table";
import { oneRunPlan, reserveInput, runPlanInput, runPlanListQuery, runPlanSummaryDto } from "@shared/schemas/run-plan-records";
import type { RouteTable } from "../../http/route-table";
import { route } from "../../http/route-table";
import { hasRole } from "../../middleware/auth";
import { loadIonTable, ionsOf } from "./ion-table.queries";
import { addIon, addSolvent } from "./ion-table.commands";
import { withIonProblems } from "./ion-problem";
import { createRunPlan, releaseRunPlan, reserveForBooking, updateRunPlan } from "./run-plan.commands";
import { factsOf, instrumentById, listPlans, planRow } from "./run-plan.queries";
import { presentRunPlan, presentRunPlanSummary } from "./run-plan.presenter";
import { runPlanPolicy } from "./run-plan.policy";

const CONVENTIONS =
  "Conventions: Galvani potential difference Δ_o^w φ = φ(water) − φ(organic); standard ion-transfer potential Δ_o^w φ° = ΔG°tr(w→o)/(zF) " +
  "(IUPAC, Pure Appl. Chem. 76 (2004) 2147); Nernst equation for ion partition with activities taken as concentrations; constants CODATA 2018. " +
  "Unknown solvents and ions answer 422 with `unknown` (the names) and `known` (the table's names); a custom ion may be given inline " +
  '({ ion: "X+", charge: 1, standardPotentialV: -0.30 }).';

const one = (ctx: { ds: import("typeorm").DataSource }, actor: Parameters<typeof presentRunPlan>[1], id: number) => {
  const row = planRow(ctx.ds, id);
  runPlanPolicy.authorize(actor, "see", factsOf(row));
  return { runPlan: presentRunPlan(ctx.ds, actor, row) };
};

const ionTableRoutes = [
  route({
    method: "get",
    path: "/ion-transfer/solvents",
    summary: "The water | organic pairs of the ion table (built-in and added by the manager)",
    description: CONVENTIONS,
    access: "signed_in",
    output: solventsAnswer,
    handler: ({ ctx }) => ({ items: loadIonTable(ctx.ds).solvents, conventions: [...RUN_PLAN_CONVENTIONS] }),
  }),
  route({
    method: "get",
    path: "/ion-transfer/ions",
    summary: "One solvent's ions with their charges, standard transfer potentials and the source of each value",
    description: "Without `solvent`, 1,2-dichloroethane. 422 `unknown_solvent` naming it and the known ones.",
    access: "signed_in",
    query: ionsQuery,
    output: ionsAnswer,
    handler: ({ ctx, query }) => withIonProblems(() => ionsOf(loadIonTable(ctx.ds), query.solvent)),
  }),
  route({
    method: "post",
    path: "/ion-transfer/solvents",
    summary: "Add a water | solvent pair to the ion table, with the source of its data (manager)",
    access: ["manager"],
    body: addSolventInput,
    status: 201,
    output: solventsAnswer,
    handler: async ({ ctx, actor, body }) => {
      await addSolvent(ctx, actor, body);
      return { items: loadIonTable(ctx.ds).solvents, conventions: [...RUN_PLAN_CONVENTIONS] };
    },
  }),
  route({
    method: "post",
    path: "/ion-transfer/ions",
    summary: "Add an ion's standard transfer potential for a solvent, with its source (manager)",
    description: "An added ion named like a built-in one takes its place for that solvent. 422 for an unknown solvent; 409 when it was already added.",
    access: ["manager"],
    body: addIonInput,
    status: 201,
    output: ionsAnswer,
    handler: async ({ ctx, actor, body }) => {
      const { solvent } = await addIon(ctx, actor, body);
      return ionsOf(loadIonTable(ctx.ds), solvent);
    },
  }),
];

const computeRoutes = [
  route({
    method: "post",
    path: "/run-plans/preview",
    summary: "The potential window, analytes' transfers and currents of a water | organic electrolyte pair (changes nothing)",
    description: CONVENTIONS + " A side of the window that no listed ion can set is null, with a sentence in window.notes.",
    access: "signed_in",
    body: runPlanPreviewInput,
    output: runPlanPreviewDto,
    handler: ({ ctx, body }) => withIonProblems(() => previewRunPlan(body, loadIonTable(ctx.ds).table)),
  }),
  route({
    method: "post",
    path: "/run-plans/distribution",
    summary: "The distribution potential and final concentrations of partitioning ions (mass balance, Nernst partition, electroneutrality)",
    description: CONVENTIONS,
    access: "signed_in",
    body: distributionInput,
    output: distributionDto,
    handler: ({ ctx, body }) => withIonProblems(() => distribution(body, loadIonTable(ctx.ds).table)),
  }),
];

const recordRoutes = [
  route({
    method: "get",
    path: "/run-plans",
    summary: "Run plans the caller may see (their own, those on their bookings; the manager all), newest first",
    access: "signed_in",
    query: runPlanListQuery,
    output: pageOf(runPlanSummaryDto),
    handler: ({ ctx, actor, query }) => {
      const page = listPlans(ctx.ds, { id: actor.id, manager: hasRole(actor, "manager") }, { ...query, mine: query.mine === "true" });
      return { items: page.items.map((p) => presentRunPlanSummary(actor, p, instrumentById(ctx.ds, p.cellId)?.name ?? null)), total: page.total };
    },
  }),
  route({
    method: "post",
    path: "/run-plans",
    summary: "Save a run plan: electrolytes from the Stockroom or the ion table, the cell, analytes",
    description: "422 naming the field for unknown ions or salts, a chemical without ions, or a cell that is not an interface cell.",
    access: "signed_in",
    body: runPlanInput,
    status: 201,
    output: oneRunPlan,
    handler: async ({ ctx, actor, body }) => one(ctx, actor, await createRunPlan(ctx, actor, body)),
  }),
  route({
    method: "get",
    path: "/run-plans/:id",
    summary: "One run plan with its window, analytes, what to weigh, the stock, the waste and its reservations",
    access: "signed_in",
    policy: "runPlan.see",
    params: idParam,
    output: oneRunPlan,
    handler: ({ ctx, actor, params }) => one(ctx, actor, params.id),
  }),
  route({
    method: "put",
    path: "/run-plans/:id",
    summary: "Change a run plan (its author or the manager, while it holds no stock)",
    access: "signed_in",
    policy: "runPlan.edit",
    params: idParam,
    body: runPlanInput,
    output: oneRunPlan,
    handler: async ({ ctx, actor, params, body }) => {
      await updateRunPlan(ctx, actor, params.id, body);
      return one(ctx, actor, params.id);
    },
  }),
  route({
    method: "post",
    path: "/run-plans/:id/reserve",
    summary: "Attach the plan to a booking of a potentiostat and an interface cell and reserve what it weighs",
    description: "All or nothing. 409 `not_enough_free` naming the container and what is left; 422 for a booking that is not the caller's or lacks a cell.",
    access: "signed_in",
    policy: "runPlan.attach",
    params: idParam,
    body: reserveInput,
    output: oneRunPlan,
    handler: async ({ ctx, actor, params, body }) => {
      await reserveForBooking(ctx, actor, params.id, body);
      return one(ctx, actor, params.id);
    },
  }),
  route({
    method: "post",
    path: "/run-plans/:id/release",
    summary: "Release the stock a plan holds for its booking",
    access: "signed_in",
    policy: "runPlan.release",
    params: idParam,
    output: oneRunPlan,
    handler: async ({ ctx, actor, params }) => {
      await releaseRunPlan(ctx, actor, params.id);
      return one(ctx, actor, params.id);
    },
  }),
];

export const runPlansTable: RouteTable = {
  module: "runplans",
  description: "Run plans: the ion table, the window and transfers of a water | organic pair, distribution potentials, and plans that reserve stock for a booking.",
  routes: [...ionTableRoutes, ...computeRoutes, ...recordRoutes],
};


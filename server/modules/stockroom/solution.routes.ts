/** Solution planning (contract POST /api/solutions/plan, pure) and preparation (one transaction). */
import { z } from "zod";
import { BENCH_ROLES } from "@shared/schemas/auth";
import { containerDto, prepareSolutionInput, solutionPlanDto, solutionPlanInput } from "@shared/schemas/stock";
import { route } from "../../http/route-table";
import { planSolutionFor, prepareSolution } from "./solution.commands";
import { presentContainer } from "./stock.presenter";

export const solutionRoutes = [
  route({
    method: "post",
    path: "/solutions/plan",
    summary: "The mass of solute to weigh for a concentration and volume (changes nothing)",
    description: "API.md names this a member route; Phasebook allows every bench role (member, manager, safety officer).",
    access: BENCH_ROLES,
    body: solutionPlanInput,
    output: solutionPlanDto,
    handler: ({ ctx, body }) => planSolutionFor(ctx.ds, body),
  }),
  route({
    method: "post",
    path: "/solutions",
    summary: "Prepare a solution: draw solute and solvent, create the new container with its lineage",
    access: BENCH_ROLES,
    policy: "container.draw",
    body: prepareSolutionInput,
    status: 201,
    output: z.object({
      container: containerDto,
      plan: solutionPlanDto,
      massWeighedG: z.number(),
      actualConcentrationMolPerL: z.number(),
      parents: z.array(containerDto),
    }),
    handler: async ({ ctx, actor, body }) => {
      const out = await prepareSolution(ctx, actor, body);
      return {
        container: presentContainer(out.container, actor),
        plan: out.plan,
        massWeighedG: out.massWeighedG,
        actualConcentrationMolPerL: out.actualConcentrationMolPerL,
        parents: out.parents.map((p) => presentContainer(p, actor)),
      };
    },
  }),
];

/** The rate schedule (published to everyone signed in; changed by the manager) and the yearly rate review. */
import { idParam } from "@shared/schemas/common";
import { ratePage, rateApplyInput, rateInput, rateResponse, rateReviewInput, rateReviewResponse, rateUpdateInput } from "@shared/schemas/recharge";
import { route } from "../../http/route-table";
import { listRates, reviewRates } from "./rate.queries";
import { applyRates, createRate, removeRate, updateRate } from "./rate.commands";

export const rateRoutes = [
  route({
    method: "get",
    path: "/rates",
    summary: "Every rate, past, present and future, with whether it is in effect today",
    access: "signed_in",
    output: ratePage,
    handler: async ({ ctx }) => {
      const items = await listRates(ctx);
      return { items, total: items.length };
    },
  }),
  route({
    method: "post",
    path: "/rates",
    summary: "Add a rate for an instrument (or a kind of instrument) and customer class from a date",
    description: "422 `rate_overlap` when the instrument (or kind) and class would have two rates at once.",
    access: ["manager"],
    body: rateInput,
    status: 201,
    output: rateResponse,
    handler: async ({ ctx, actor, body }) => ({ rate: await createRate(ctx, actor, body) }),
  }),
  route({
    method: "post",
    path: "/rates/review",
    summary: "The rate review: break-even and class rates per instrument beside the rates in effect (changes nothing)",
    access: ["manager"],
    body: rateReviewInput,
    output: rateReviewResponse,
    handler: async ({ ctx, body }) => ({ items: await reviewRates(ctx, body) }),
  }),
  route({
    method: "post",
    path: "/rates/apply",
    summary: "Apply reviewed rates from a date (each instrument's running rate ends there)",
    access: ["manager"],
    body: rateApplyInput,
    status: 201,
    output: ratePage,
    handler: async ({ ctx, actor, body }) => {
      const items = await applyRates(ctx, actor, body);
      return { items, total: items.length };
    },
  }),
  route({
    method: "patch",
    path: "/rates/:id",
    summary: "Change a rate (its amount, dates, minimum, increment, after-hours factor or note)",
    access: ["manager"],
    params: idParam,
    body: rateUpdateInput,
    output: rateResponse,
    handler: async ({ ctx, actor, params, body }) => ({ rate: await updateRate(ctx, actor, params.id, body) }),
  }),
  route({
    method: "delete",
    path: "/rates/:id",
    summary: "Delete a rate no final statement was priced with (409 `rate_in_use` otherwise)",
    access: ["manager"],
    params: idParam,
    handler: ({ ctx, actor, params }) => removeRate(ctx, actor, params.id),
  }),
];

/**
 * Training records (the manager grants and revokes; others see their own) and training requests
 * (anyone signed in asks; the manager closes). The training policy decides on each record and
 * sends its abilities with it.
 */
import { z } from "zod";
import { idParam, pageOf } from "@shared/schemas/common";
import { reasonInput } from "@shared/schemas/bookings";
import {
  closeTrainingRequestInput,
  grantTrainingInput,
  trainablePersonDto,
  trainingDto,
  trainingListQuery,
  trainingRequestClosed,
  trainingRequestCreated,
  trainingRequestDto,
  trainingRequestInput,
  trainingRequestListQuery,
} from "@shared/schemas/training";
import { route } from "../../http/route-table";
import { askForTraining, closeTrainingRequest, grantTraining, revokeTraining } from "./training.commands";
import { listTraining, listTrainingRequests, trainablePeople, trainingRecord } from "./training.queries";
import { presentTraining, presentTrainingRequest } from "./training.presenter";
import { visibleTrainee } from "./training.policy";

const MANAGER = ["manager"] as const;
const one = z.object({ record: trainingDto });

export const trainingRoutes = [
  route({
    method: "get",
    path: "/training",
    summary: "Training records, soonest to expire first: one's own, or (the manager) anyone's",
    access: "signed_in",
    policy: "training.view",
    query: trainingListQuery,
    output: pageOf(trainingDto),
    handler: async ({ ctx, actor, query }) => {
      const now = ctx.now();
      const page = await listTraining(ctx.ds, now, visibleTrainee(actor, query.userId), query);
      return { items: page.items.map((r) => presentTraining(r, now, actor)), total: page.total };
    },
  }),
  route({
    method: "post",
    path: "/training",
    summary: "Grant training on an instrument, or renew the person's live record on it",
    access: MANAGER,
    body: grantTrainingInput,
    status: 201,
    output: one,
    handler: async ({ ctx, actor, body }) => {
      const id = await grantTraining(ctx, actor, body);
      return { record: presentTraining(await trainingRecord(ctx.ds, id), ctx.now(), actor) };
    },
  }),
  route({
    method: "post",
    path: "/training/:id/revoke",
    summary: "Revoke a training record, saying why",
    access: MANAGER,
    policy: "training.revoke",
    params: idParam,
    body: reasonInput,
    output: one,
    handler: async ({ ctx, actor, params, body }) => {
      await revokeTraining(ctx, actor, params.id, body.reason);
      return { record: presentTraining(await trainingRecord(ctx.ds, params.id), ctx.now(), actor) };
    },
  }),
  route({
    method: "get",
    path: "/training/people",
    summary: "The people a manager may train: everyone active with the member role",
    access: MANAGER,
    output: pageOf(trainablePersonDto),
    handler: async ({ ctx }) => {
      const items = await trainablePeople(ctx.ds);
      return { items, total: items.length };
    },
  }),
  route({
    method: "get",
    path: "/training/requests",
    summary: "Training requests, newest first: one's own, or (the manager) everyone's",
    access: "signed_in",
    policy: "trainingRequest.view",
    query: trainingRequestListQuery,
    output: pageOf(trainingRequestDto),
    handler: async ({ ctx, actor, query }) => {
      const items = (await listTrainingRequests(ctx.ds, visibleTrainee(actor), query.status)).map((r) => presentTrainingRequest(r, actor));
      return { items, total: items.length };
    },
  }),
  route({
    method: "post",
    path: "/training/requests",
    summary: "Ask the facility manager for training on an instrument",
    description: "409 request_open while one's earlier request for the instrument is still open.",
    access: "signed_in",
    policy: "trainingAsk.ask",
    body: trainingRequestInput,
    status: 201,
    output: trainingRequestCreated,
    handler: async ({ ctx, actor, body }) => {
      const id = await askForTraining(ctx, actor, body.instrumentId, body.note);
      return { request: { id, status: "open" as const, instrumentId: body.instrumentId } };
    },
  }),
  route({
    method: "post",
    path: "/training/requests/:id/close",
    summary: "Close a training request: granted or dismissed",
    access: MANAGER,
    policy: "trainingRequest.close",
    params: idParam,
    body: closeTrainingRequestInput,
    output: trainingRequestClosed,
    handler: async ({ ctx, actor, params, body }) => {
      await closeTrainingRequest(ctx, actor, params.id, body.outcome);
      return { request: { id: params.id, status: body.outcome } };
    },
  }),
];

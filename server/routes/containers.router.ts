/**
 * Containers: the Stockroom search (contract GET /api/containers), receiving a delivery, one
 * container with its history, usage (contract POST /api/containers/:id/usage), moves, holds,
 * emptying, pouring into a waste container, disposal, CSV import and export.
 */
import { Router } from "express";
import { idParam } from "@shared/schemas/common";
import {
  containerListQuery,
  disposeInput,
  holdInput,
  moveInput,
  receiveInput,
  usageInput,
  wasteAddInput,
  type ContainerListQuery,
  type DisposeInput,
  type HoldInput,
  type MoveInput,
  type ReceiveInput,
  type UsageInput,
  type WasteAddInput,
} from "@shared/schemas/stock";
import type { Ctx } from "../context";
import { BENCH_ROLES } from "@shared/schemas/auth";
import { currentUser, requireAuth, requireRole } from "../middleware/auth";
import { body, params, query, validate } from "../middleware/validate";
import { presentChemical, presentContainer } from "../presenters/stock.presenter";
import { containersCsv } from "../services/stock-csv.service";
import { csvBody, csvText } from "./chemicals.router";

const STOCK_KEEPERS = ["manager", "safety_officer"] as const;

export function createContainersRouter(ctx: Ctx): Router {
  const r = Router();
  const containers = ctx.services.containers;
  const id = (req: Express.Request) => params<{ id: number }>(req).id;

  r.get("/", requireAuth, validate({ query: containerListQuery }), async (req, res) => {
    const page = await containers.list(query<ContainerListQuery>(req));
    res.json({ items: page.items.map(presentContainer), total: page.total });
  });

  r.get("/export.csv", requireAuth, validate({ query: containerListQuery.omit({ limit: true, offset: true }) }), async (req, res) => {
    const page = await containers.list({ ...query<ContainerListQuery>(req), limit: 100_000, offset: 0 });
    res.type("text/csv").attachment("phasebook-containers.csv").send(containersCsv(page.items.map(presentContainer)));
  });

  r.post("/receive", requireRole(...STOCK_KEEPERS), validate({ body: receiveInput }), async (req, res) => {
    const rows = await containers.receive(currentUser(req), body<ReceiveInput>(req));
    res.status(201).json({ containers: rows.map(presentContainer) });
  });

  r.post("/import", requireRole(...STOCK_KEEPERS), csvBody, async (req, res) => {
    res.status(201).json(await ctx.services.stockCsv.importContainers(currentUser(req).id, csvText(req)));
  });

  r.get("/:id", requireAuth, validate({ params: idParam }), async (req, res) => {
    const d = await containers.detail(id(req));
    res.json({
      container: presentContainer(d.container),
      chemical: presentChemical(d.chemical),
      locationPath: d.locationPath,
      movements: d.movements.map((m) => ({
        id: m.id,
        kind: m.kind,
        fromLocationId: m.fromLocationId,
        fromLocationName: m.fromLocationName,
        toLocationId: m.toLocationId,
        toLocationName: m.toLocationName,
        userName: m.userName,
        note: m.note,
        at: m.at,
      })),
      usages: d.usages.map((u) => ({
        id: u.id,
        amount: u.amount,
        unit: u.unit,
        amountInContainerUnit: u.amountInContainerUnit,
        costCents: u.costCents,
        bookingId: u.bookingId,
        accountId: u.accountId,
        userName: u.userName,
        note: u.note,
        at: u.at,
      })),
      parents: d.parents,
      children: d.children,
    });
  });

  r.post("/:id/usage", requireRole(...BENCH_ROLES), validate({ params: idParam, body: usageInput }), async (req, res) => {
    const row = await containers.logUsage(currentUser(req), id(req), body<UsageInput>(req));
    res.json({ container: presentContainer(row) });
  });

  r.post("/:id/move", requireAuth, validate({ params: idParam, body: moveInput }), async (req, res) => {
    res.json({ container: presentContainer(await containers.move(currentUser(req), id(req), body<MoveInput>(req))) });
  });

  // Anyone at the bench pours into the halogenated waste, as anyone logs usage.
  r.post("/:id/waste", requireAuth, validate({ params: idParam, body: wasteAddInput }), async (req, res) => {
    res.json({ container: presentContainer(await containers.addWaste(currentUser(req), id(req), body<WasteAddInput>(req))) });
  });

  r.post("/:id/hold", requireRole(...STOCK_KEEPERS), validate({ params: idParam, body: holdInput }), async (req, res) => {
    res.json({ container: presentContainer(await containers.hold(currentUser(req), id(req), body<HoldInput>(req).reason)) });
  });

  r.post("/:id/release", requireRole(...STOCK_KEEPERS), validate({ params: idParam }), async (req, res) => {
    res.json({ container: presentContainer(await containers.release(currentUser(req), id(req))) });
  });

  r.post("/:id/empty", requireAuth, validate({ params: idParam }), async (req, res) => {
    res.json({ container: presentContainer(await containers.markEmpty(currentUser(req), id(req))) });
  });

  r.post("/:id/dispose", requireRole(...STOCK_KEEPERS), validate({ params: idParam, body: disposeInput }), async (req, res) => {
    res.json({ container: presentContainer(await containers.dispose(currentUser(req), id(req), body<DisposeInput>(req))) });
  });

  return r;
}

/** Instruments: the list and one record for everyone signed in; adding and editing for managers. */
import { Router } from "express";
import { idParam } from "@shared/schemas/common";
import { z } from "zod";
import { instrumentInput, instrumentListQuery, instrumentPatch, type InstrumentListQuery, type InstrumentPatchParsed as InstrumentPatch } from "@shared/schemas/instruments";
import type { Ctx } from "../context";
import { currentUser, requireAuth, requireRole } from "../middleware/auth";
import { body, params, query, validate } from "../middleware/validate";
import { Instrument } from "../entities";
import { NotFound } from "../errors";
import { presentInstrument } from "../presenters/instrument.presenter";

export function createInstrumentsRouter(ctx: Ctx): Router {
  const r = Router();
  const repo = () => ctx.ds.getRepository(Instrument);

  r.get("/", requireAuth, validate({ query: instrumentListQuery }), async (req, res) => {
    const q = query<InstrumentListQuery>(req);
    const where = { ...(q.kind ? { kind: q.kind } : {}), ...(q.status ? { status: q.status } : {}) };
    const [items, total] = await repo().findAndCount({ where, order: { kind: "ASC", name: "ASC" }, skip: q.offset, take: q.limit });
    res.json({ items: items.map(presentInstrument), total });
  });

  r.get("/:id", requireAuth, validate({ params: idParam }), async (req, res) => {
    const i = await repo().findOneBy({ id: params<{ id: number }>(req).id });
    if (!i) throw new NotFound("That instrument");
    res.json({ instrument: presentInstrument(i) });
  });

  r.post("/", requireRole("manager"), validate({ body: instrumentInput }), async (req, res) => {
    const i = await ctx.services.instruments.create(currentUser(req), body<z.output<typeof instrumentInput>>(req));
    res.status(201).json({ instrument: presentInstrument(i) });
  });

  r.patch("/:id", requireRole("manager"), validate({ params: idParam, body: instrumentPatch }), async (req, res) => {
    const i = await ctx.services.instruments.update(currentUser(req), params<{ id: number }>(req).id, body<InstrumentPatch>(req));
    res.json({ instrument: presentInstrument(i) });
  });

  return r;
}

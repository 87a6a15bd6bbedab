/** Instruments: the list and one record, for everyone signed in. */
import { Router } from "express";
import { idParam } from "@shared/schemas/common";
import { instrumentListQuery, type InstrumentListQuery } from "@shared/schemas/instruments";
import type { Ctx } from "../context";
import { requireAuth } from "../middleware/auth";
import { params, query, validate } from "../middleware/validate";
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

  return r;
}

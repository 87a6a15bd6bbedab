/**
 * What anyone at the bench may record on an instrument: a fault report (stored, shown on the
 * instrument and mailed to the managers; the instrument's status is the manager's to change),
 * and that an interface cell was cleaned. The manager closes a report with what was done.
 */
import type { EntityManager } from "typeorm";
import { Instrument, InstrumentFault, User, UserRole } from "../../entities";
import { NotFound } from "../../errors";
import { serialTransaction } from "../../db/serial";
import type { AuthUser } from "../../middleware/auth";
import { audit } from "../../core/audit";
import { enqueueMail } from "../../core/outbox";
import type { Deps } from "../../core/deps";
import { instrumentPolicy } from "./instrument.policy";

async function loadInstrument(em: EntityManager, id: number): Promise<Instrument> {
  const i = await em.findOne(Instrument, { where: { id } });
  if (!i) throw new NotFound("That instrument");
  return i;
}

async function managerEmails(em: EntityManager): Promise<string[]> {
  const rows = await em
    .getRepository(User)
    .createQueryBuilder("u")
    .innerJoin(UserRole, "r", "r.userId = u.id AND r.role = 'manager'")
    .where("u.active = 1")
    .getMany();
  return rows.map((u) => u.email);
}

/** Stores a fault report and tells the managers; answers the report's id. */
export async function reportInstrumentFault(deps: Deps & { config: { PUBLIC_URL: string } }, actor: AuthUser, id: number, note: string): Promise<number> {
  return serialTransaction(deps.ds, async (em) => {
    const i = await loadInstrument(em, id);
    instrumentPolicy.authorize(actor, "reportFault", i);
    const t = deps.now();
    const res = await em.insert(InstrumentFault, { instrumentId: id, reportedById: actor.id, note, reportedAt: t.toISOString(), closedAt: null, closedById: null, resolution: "" });
    const faultId = res.identifiers[0].id as number;
    await audit(em, t, actor.id, "instrument.fault_reported", "instrument", id, { note, faultId, status: i.status });
    for (const to of await managerEmails(em)) {
      await enqueueMail(em, t, {
        to,
        subject: `Fault reported: ${i.name}`,
        text:
          `${actor.name} (${actor.email}) reported a fault on ${i.name}:\n\n${note}\n\n` +
          `The instrument is still ${i.status.replace(/_/g, " ")}. Decide whether to take it out of service, and close the report when it is dealt with:\n` +
          `${deps.config.PUBLIC_URL}/instruments/${i.id}`,
      });
    }
    return faultId;
  });
}

/** The manager closes a fault report with what was done. */
export async function closeInstrumentFault(deps: Deps, actor: AuthUser, instrumentId: number, faultId: number, resolution: string): Promise<void> {
  await serialTransaction(deps.ds, async (em) => {
    const i = await loadInstrument(em, instrumentId);
    instrumentPolicy.authorize(actor, "closeFault", i);
    const f = await em.findOneBy(InstrumentFault, { id: faultId, instrumentId });
    if (!f) throw new NotFound("That fault report");
    if (f.closedAt) return;
    const t = deps.now();
    await em.update(InstrumentFault, faultId, { closedAt: t.toISOString(), closedById: actor.id, resolution });
    await audit(em, t, actor.id, "instrument.fault_closed", "instrument", instrumentId, { faultId, resolution });
  });
}

/** Interface cells must be cleaned and dried between users; this records who did it and when. */
export async function recordCleaned(deps: Deps, actor: AuthUser, id: number, note: string): Promise<void> {
  await serialTransaction(deps.ds, async (em) => {
    const i = await loadInstrument(em, id);
    instrumentPolicy.authorize(actor, "recordCleaned", i);
    await audit(em, deps.now(), actor.id, "instrument.cleaned", "instrument", id, { note });
  });
}

/**
 * Instruments (manager): add, edit rules, change status. Taking an instrument out of service
 * tells the owners of its upcoming bookings by e-mail; the bookings stay so the manager can
 * decide case by case. Rule changes are audited with before and after. Each change asks the
 * instrument policy (an edit, and the status change it makes).
 */
import type { EntityManager } from "typeorm";
import { validateBookableHours } from "@shared/domain/booking-rules";
import { INSTRUMENT_STATUS_LABELS, type InstrumentPatchParsed, type instrumentInput } from "@shared/schemas/instruments";
import type { z } from "zod";
import { Instrument } from "../../entities";
import { NotFound, RuleBroken } from "../../errors";
import { serialTransaction } from "../../db/serial";
import type { AuthUser } from "../../middleware/auth";
import { audit } from "../../core/audit";
import { enqueueMail } from "../../core/outbox";
import { newToken } from "../../core/tokens";
import { outOfServiceMail } from "./booking-mail";
import { instrumentPolicy, statusAction } from "./instrument.policy";
import type { ScheduleDeps } from "./deps";

type InstrumentInput = z.output<typeof instrumentInput>;

function checkHours(hours: InstrumentInput["bookableHours"] | undefined) {
  if (!hours) return;
  const problems = validateBookableHours(hours);
  if (problems.length) throw new RuleBroken("The bookable hours are not valid.", problems.map(({ path, message }) => ({ path, message })));
}

export async function createInstrument(deps: ScheduleDeps, actor: AuthUser, input: InstrumentInput): Promise<Instrument> {
  checkHours(input.bookableHours);
  return serialTransaction(deps.ds, async (em) => {
    const now = deps.now();
    const res = await em.insert(Instrument, {
      ...input,
      bookableHours: JSON.stringify(input.bookableHours),
      labelToken: newToken(24),
      createdAt: now.toISOString(),
    });
    const id = res.identifiers[0].id as number;
    await audit(em, now, actor.id, "instrument.created", "instrument", id, { name: input.name, kind: input.kind });
    return em.findOneByOrFail(Instrument, { id });
  });
}

/** Tells everyone with an upcoming booking on the instrument that it left service, with the manager's note. */
async function mailUpcomingBookings(deps: ScheduleDeps, em: EntityManager, now: Date, after: Instrument, note: string): Promise<void> {
  const upcoming: { id: number; startsAt: string; endsAt: string; purpose: string; email: string }[] = await em.query(
    `SELECT b.id, b.startsAt, b.endsAt, b.purpose, u.email FROM bookings b JOIN booking_instruments bi ON bi.bookingId = b.id
     JOIN users u ON u.id = b.userId
     WHERE bi.instrumentId = ? AND b.status IN ('requested','confirmed') AND b.endMs > ? ORDER BY b.startMs`,
    [after.id, now.getTime()],
  );
  const c = { publicUrl: deps.config.PUBLIC_URL, tz: deps.config.FACILITY_TZ };
  for (const b of upcoming) await enqueueMail(em, now, outOfServiceMail(b.email, after.name, INSTRUMENT_STATUS_LABELS[after.status], note, b, c));
}

export async function updateInstrument(deps: ScheduleDeps, actor: AuthUser, id: number, patch: InstrumentPatchParsed): Promise<Instrument> {
  checkHours(patch.bookableHours);
  return serialTransaction(deps.ds, async (em) => {
    const now = deps.now();
    const before = await em.findOneBy(Instrument, { id });
    if (!before) throw new NotFound("That instrument");
    instrumentPolicy.authorize(actor, "edit", before);
    if (patch.status && patch.status !== before.status) instrumentPolicy.authorize(actor, statusAction(before.status, patch.status), before);
    const { statusNote, bookableHours, ...rest } = patch;
    const changes: Partial<Instrument> = { ...rest, ...(bookableHours ? { bookableHours: JSON.stringify(bookableHours) } : {}) };
    const changed = Object.fromEntries(Object.entries(changes).filter(([k, v]) => (before as unknown as Record<string, unknown>)[k] !== v));
    if (Object.keys(changed).length === 0) return before;
    await em.update(Instrument, id, changed);
    const after = await em.findOneByOrFail(Instrument, { id });
    const was = Object.fromEntries(Object.keys(changed).map((k) => [k, (before as unknown as Record<string, unknown>)[k]]));
    await audit(em, now, actor.id, changed.status ? "instrument.status_changed" : "instrument.rules_changed", "instrument", id, { before: was, after: changed, note: statusNote ?? null });
    if (changed.status && changed.status !== "in_service" && before.status === "in_service") await mailUpcomingBookings(deps, em, now, after, statusNote ?? "");
    return after;
  });
}

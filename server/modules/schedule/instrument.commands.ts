/**
 * Instruments (manager): add, edit rules, change status. Taking an instrument out of service
 * tells the owners of its upcoming bookings by e-mail; the bookings stay so the manager can
 * decide case by case. Rule changes are audited with before and after.
 */
import type { DataSource } from "typeorm";
import { validateBookableHours } from "@shared/domain/booking-rules";
import { INSTRUMENT_STATUS_LABELS, type InstrumentPatchParsed as InstrumentPatch } from "@shared/schemas/instruments";
import type { z } from "zod";
import type { instrumentInput } from "@shared/schemas/instruments";
import { Instrument } from "../entities";
import { NotFound, RuleBroken } from "../errors";
import { serialTransaction } from "../db/serial";
import type { AuthUser } from "../middleware/auth";
import { audit } from "../core/audit";
import { enqueueMail } from "../core/outbox";
import { newToken } from "../core/tokens";
import { outOfServiceMail } from "./booking-mail";

type InstrumentInput = z.output<typeof instrumentInput>;

function checkHours(hours: InstrumentInput["bookableHours"] | undefined) {
  if (!hours) return;
  const problems = validateBookableHours(hours);
  if (problems.length) throw new RuleBroken("The bookable hours are not valid.", problems.map(({ path, message }) => ({ path, message })));
}

export function createInstrumentService(deps: { ds: DataSource; now: () => Date; tz: string; publicUrl: string }) {
  const { ds } = deps;
  return {
    async create(actor: AuthUser, input: InstrumentInput): Promise<Instrument> {
      checkHours(input.bookableHours);
      return serialTransaction(ds, async (em) => {
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
    },

    async update(actor: AuthUser, id: number, patch: InstrumentPatch): Promise<Instrument> {
      checkHours(patch.bookableHours);
      return serialTransaction(ds, async (em) => {
        const now = deps.now();
        const before = await em.findOneBy(Instrument, { id });
        if (!before) throw new NotFound("That instrument");
        const { statusNote, bookableHours, ...rest } = patch;
        const changes: Partial<Instrument> = { ...rest, ...(bookableHours ? { bookableHours: JSON.stringify(bookableHours) } : {}) };
        const changed = Object.fromEntries(
          Object.entries(changes).filter(([k, v]) => (before as unknown as Record<string, unknown>)[k] !== v),
        );
        if (Object.keys(changed).length === 0) return before;
        await em.update(Instrument, id, changed);
        const after = await em.findOneByOrFail(Instrument, { id });
        const was = Object.fromEntries(Object.keys(changed).map((k) => [k, (before as unknown as Record<string, unknown>)[k]]));
        await audit(em, now, actor.id, changed.status ? "instrument.status_changed" : "instrument.rules_changed", "instrument", id, {
          before: was,
          after: changed,
          note: statusNote ?? null,
        });
        if (changed.status && changed.status !== "in_service" && before.status === "in_service") {
          const upcoming: { id: number; startsAt: string; endsAt: string; purpose: string; email: string }[] = await em.query(
            `SELECT b.id, b.startsAt, b.endsAt, b.purpose, u.email FROM bookings b JOIN booking_instruments bi ON bi.bookingId = b.id
             JOIN users u ON u.id = b.userId
             WHERE bi.instrumentId = ? AND b.status IN ('requested','confirmed') AND b.endMs > ? ORDER BY b.startMs`,
            [id, now.getTime()],
          );
          for (const b of upcoming) {
            await enqueueMail(
              em,
              now,
              outOfServiceMail(b.email, after.name, INSTRUMENT_STATUS_LABELS[after.status], statusNote ?? "", b, { publicUrl: deps.publicUrl, tz: deps.tz }),
            );
          }
        }
        return after;
      });
    },
  };
}

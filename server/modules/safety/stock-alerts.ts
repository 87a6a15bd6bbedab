/**
 * Stock alerts by e-mail, run by the scheduler: a chemical below its reorder point (to the
 * managers), containers expiring within 30 days (to the safety officers and managers), a
 * location over its limit (to the safety officers). Each subject is mailed once and then again
 * only after a quiet week, so an hourly job does not flood anyone; mail goes through the outbox
 * in the same transaction that records the alert.
 */
import type { DataSource, EntityManager } from "typeorm";
import { DateTime } from "luxon";
import { convertAmount, UnitError } from "@shared/domain/units";
import { Chemical, StockAlert } from "../../entities";
import type { StockAlertKind } from "../../entities/stock-alert.entity";
import { serialTransaction } from "../../db/serial";
import { enqueueMail } from "../../core/outbox";
import { facilityToday, safetyLocationTotals } from "./safety.queries";

export const EXPIRY_WARNING_DAYS = 30;
/** A subject already mailed is not mailed again for this long. */
export const ALERT_QUIET_DAYS = 7;

async function recipients(em: EntityManager, roles: string[]): Promise<string[]> {
  const rows = (await em.query(
    `SELECT DISTINCT u.email FROM users u JOIN user_roles r ON r.userId = u.id WHERE u.active = 1 AND r.role IN (${roles.map(() => "?").join(",")}) ORDER BY u.email`,
    roles,
  )) as { email: string }[];
  return rows.map((r) => r.email);
}

/** Subjects of this kind mailed within the quiet period (expiry warnings: ever). */
async function recentlySent(em: EntityManager, kind: StockAlertKind, now: Date): Promise<Set<number>> {
  const since = kind === "expiring" ? "" : new Date(now.getTime() - ALERT_QUIET_DAYS * 86_400_000).toISOString();
  const rows = (await em.query(`SELECT subjectId FROM stock_alerts WHERE kind = ? AND sentAt >= ?`, [kind, since])) as { subjectId: number }[];
  return new Set(rows.map((r) => r.subjectId));
}

export interface StockAlertResult {
  reorder: number[];
  expiring: number[];
  overLimit: number[];
}

export async function runStockAlerts(ds: DataSource, now: Date, opts: { tz: string; publicUrl: string }): Promise<StockAlertResult> {
  const today = facilityToday(now, opts.tz);
  const horizon = DateTime.fromISO(today).plus({ days: EXPIRY_WARNING_DAYS }).toISODate()!;
  const totals = await safetyLocationTotals(ds);

  return serialTransaction(ds, async (em) => {
    const result: StockAlertResult = { reorder: [], expiring: [], overLimit: [] };
    const at = now.toISOString();
    const record = (kind: StockAlertKind, ids: number[]) => (ids.length ? em.insert(StockAlert, ids.map((subjectId) => ({ kind, subjectId, sentAt: at }))) : undefined);

    // Reorder points: usable stock of each chemical, in the unit of its reorder point.
    const chemicals = await em.getRepository(Chemical).find();
    const stock = (await em.query(
      `SELECT chemicalId, quantity, unit FROM containers WHERE status IN ('sealed', 'in_use') AND kind != 'waste' AND kind != 'solution'`,
    )) as { chemicalId: number; quantity: number; unit: string }[];
    const sentReorder = await recentlySent(em, "reorder", now);
    const low: { chem: Chemical; have: number }[] = [];
    for (const chem of chemicals) {
      if (chem.reorderPoint === null || !chem.reorderUnit || sentReorder.has(chem.id)) continue;
      let have = 0;
      for (const s of stock) {
        if (s.chemicalId !== chem.id) continue;
        try {
          have += convertAmount({ amount: s.quantity, from: s.unit, to: chem.reorderUnit, densityGPerMl: chem.densityGPerMl, molarMassGPerMol: chem.molarMass });
        } catch (e) {
          if (!(e instanceof UnitError)) throw e;
        }
      }
      if (have < chem.reorderPoint) low.push({ chem, have });
    }
    if (low.length) {
      const to = await recipients(em, ["manager"]);
      const lines = low.map(({ chem, have }) => `- ${chem.name} (${chem.casNumber}): ${Number(have.toPrecision(4))} ${chem.reorderUnit} in stock, reorder point ${chem.reorderPoint} ${chem.reorderUnit}`);
      for (const address of to) {
        await enqueueMail(em, now, {
          to: address,
          subject: `Phasebook: ${low.length} chemical(s) below the reorder point`,
          text: `These chemicals are below their reorder point:\n\n${lines.join("\n")}\n\nStockroom: ${opts.publicUrl}/stockroom\n`,
        });
      }
      await record("reorder", low.map((l) => l.chem.id));
      result.reorder = low.map((l) => l.chem.id);
    }

    // Expiring within 30 days (facility dates), each container once.
    const sentExpiring = await recentlySent(em, "expiring", now);
    const expiring = (
      (await em.query(
        `SELECT c.id, c.quantity, c.unit, c.expiresAt, ch.name AS chemicalName FROM containers c JOIN chemicals ch ON ch.id = c.chemicalId
         WHERE c.status NOT IN ('empty', 'disposed') AND c.expiresAt IS NOT NULL AND c.expiresAt >= ? AND c.expiresAt <= ? ORDER BY c.expiresAt`,
        [today, horizon],
      )) as { id: number; quantity: number; unit: string; expiresAt: string; chemicalName: string }[]
    ).filter((c) => !sentExpiring.has(c.id));
    if (expiring.length) {
      const to = await recipients(em, ["safety_officer", "manager"]);
      const lines = expiring.map((c) => `- #${c.id} ${c.chemicalName}, ${c.quantity} ${c.unit}: expires ${c.expiresAt} (${opts.publicUrl}/stockroom/containers/${c.id})`);
      for (const address of to) {
        await enqueueMail(em, now, {
          to: address,
          subject: `Phasebook: ${expiring.length} container(s) expire within ${EXPIRY_WARNING_DAYS} days`,
          text: `These containers expire by ${horizon}:\n\n${lines.join("\n")}\n`,
        });
      }
      await record("expiring", expiring.map((c) => c.id));
      result.expiring = expiring.map((c) => c.id);
    }

    // Locations over their limit.
    const sentOver = await recentlySent(em, "over_limit", now);
    const over = totals.filter((t) => t.overLimit && !sentOver.has(t.id));
    if (over.length) {
      const to = await recipients(em, ["safety_officer"]);
      const lines = over.flatMap((t) =>
        t.limits
          .filter((l) => l.finding === "over")
          .map((l) => `- ${t.path}: ${l.totalLitres.toFixed(2)} L of Class ${l.classes.join(" + ")} liquids against a limit of ${l.maxLitres.toFixed(2)} L`),
      );
      for (const address of to) {
        await enqueueMail(em, now, {
          to: address,
          subject: `Phasebook: ${over.length} location(s) over the storage limit`,
          text:
            `These locations hold more than the limit set for them:\n\n${lines.join("\n")}\n\nSafety review: ${opts.publicUrl}/safety\n\n` +
            "Storage limits and handling rules are those set by the local fire code, the institution's safety office and the safety data sheet, which take precedence over anything Phasebook computes.\n",
        });
      }
      await record("over_limit", over.map((t) => t.id));
      result.overLimit = over.map((t) => t.id);
    }
    return result;
  });
}

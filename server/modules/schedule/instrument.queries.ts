/** Reads of instruments: the list, one instrument, and its fault reports. */
import type { DataSource, EntityManager } from "typeorm";
import type { InstrumentListQuery } from "@shared/schemas/instruments";
import { Instrument } from "../../entities";
import { NotFound } from "../../errors";

/** The instruments of a kind and status, one page at a time, by kind and name. */
export async function listInstruments(ds: DataSource, q: InstrumentListQuery): Promise<{ items: Instrument[]; total: number }> {
  const where = { ...(q.kind ? { kind: q.kind } : {}), ...(q.status ? { status: q.status } : {}) };
  const [items, total] = await ds.getRepository(Instrument).findAndCount({ where, order: { kind: "ASC", name: "ASC" }, skip: q.offset, take: q.limit });
  return { items, total };
}

/** One instrument; 404 when unknown. */
export async function getInstrument(ds: DataSource, id: number): Promise<Instrument> {
  const i = await ds.getRepository(Instrument).findOneBy({ id });
  if (!i) throw new NotFound("That instrument");
  return i;
}

export interface FaultRow {
  id: number;
  note: string;
  reportedAt: string;
  reportedBy: string | null;
}

export interface FaultReportRow extends FaultRow {
  closedAt: string | null;
  closedBy: string | null;
  resolution: string;
}

/** Open fault reports of an instrument, newest first. */
export async function openFaults(em: EntityManager, instrumentId: number): Promise<FaultRow[]> {
  return (await em.query(
    `SELECT f.id, f.note, f.reportedAt, u.name AS reportedBy FROM instrument_faults f LEFT JOIN users u ON u.id = f.reportedById
      WHERE f.instrumentId = ? AND f.closedAt IS NULL ORDER BY f.reportedAt DESC, f.id DESC`,
    [instrumentId],
  )) as FaultRow[];
}

/** One fault report of an instrument as stored, open or closed; 404 when the instrument has no such report. */
export async function faultReport(ds: DataSource, instrumentId: number, faultId: number): Promise<FaultReportRow> {
  const [row] = (await ds.query(
    `SELECT f.id, f.note, f.reportedAt, r.name AS reportedBy, f.closedAt, c.name AS closedBy, f.resolution
       FROM instrument_faults f LEFT JOIN users r ON r.id = f.reportedById LEFT JOIN users c ON c.id = f.closedById
      WHERE f.id = ? AND f.instrumentId = ?`,
    [faultId, instrumentId],
  )) as FaultReportRow[];
  if (!row) throw new NotFound("That fault report");
  return row;
}

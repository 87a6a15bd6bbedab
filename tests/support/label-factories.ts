/** Records the label and scan tests need: places, a chemical, containers, instruments, a booking. */
import type { DataSource } from "typeorm";
import { Account, Booking, BookingInstrument, Chemical, Container, Department, Instrument, Location, ResearchGroup } from "../../server/entities";
import { newToken } from "../../server/core/tokens";

let seq = 0;
const stamp = "2026-11-01T12:00:00.000Z";

export async function makeCabinet(ds: DataSource, name = "Flammables cabinet F1"): Promise<Location> {
  seq += 1;
  const repo = ds.getRepository(Location);
  const building = await repo.save({ parentId: null, level: "building" as const, name: `Chemistry Building ${seq}` });
  const room = await repo.save({ parentId: building.id, level: "room" as const, name: "Room 214" });
  return repo.save({ parentId: room.id, level: "cabinet" as const, name, type: "flammable_cabinet" as const });
}

export async function makeGroup(ds: DataSource): Promise<ResearchGroup> {
  seq += 1;
  const dept = await ds.getRepository(Department).save({ code: `D${seq}-${Date.now()}`, name: `Department ${seq}` });
  return ds.getRepository(ResearchGroup).save({ name: `Group ${seq}`, departmentId: dept.id, leadId: null });
}

/** 1,2-dichloroethane with the H-codes of suppliers' safety data sheets (section 2). */
export async function makeDichloroethane(ds: DataSource): Promise<Chemical> {
  return ds.getRepository(Chemical).save({
    name: "1,2-Dichloroethane",
    casNumber: "107-06-2",
    formula: "C2H4Cl2",
    molarMass: 98.95,
    hazardStatements: JSON.stringify(["H225", "H302", "H315", "H319", "H335", "H350"]),
    pictograms: "[]",
    signalWord: "Danger" as const,
    flashPointC: 13,
    boilingPointC: 83.5,
    densityGPerMl: 1.2569,
    createdAt: stamp,
  });
}

export async function makeContainer(
  ds: DataSource,
  opts: { chemicalId: number; locationId?: number | null; groupId?: number | null; organisation?: string | null; kind?: Container["kind"]; status?: Container["status"]; quantity?: number; unit?: string; holdReason?: string | null },
): Promise<Container> {
  return ds.getRepository(Container).save({
    chemicalId: opts.chemicalId,
    kind: opts.kind ?? "bottle",
    quantity: opts.quantity ?? 500,
    initialQuantity: 1000,
    unit: opts.unit ?? "mL",
    locationId: opts.locationId ?? null,
    status: opts.status ?? "in_use",
    groupId: opts.groupId ?? null,
    organisation: opts.organisation ?? null,
    holdReason: opts.holdReason ?? null,
    labelToken: newToken(24),
    expiresAt: "2027-06-30",
    createdAt: stamp,
  });
}

export async function makeInstrument(ds: DataSource, kind: Instrument["kind"], locationId: number | null = null): Promise<Instrument> {
  seq += 1;
  return ds.getRepository(Instrument).save({
    name: `${kind === "interface_cell" ? "Interface cell" : "Potentiostat"} ${seq}-${Date.now()}`,
    kind,
    locationId,
    labelToken: newToken(24),
    createdAt: stamp,
  });
}

export async function makeBooking(ds: DataSource, opts: { userId: number; instrumentIds: number[]; start: string; end: string; status?: Booking["status"] }): Promise<Booking> {
  seq += 1;
  const account = await ds.getRepository(Account).save({
    code: `ACC-${seq}-${Date.now()}`,
    name: "Test account",
    kind: "internal" as const,
    customerClass: "internal" as const,
    createdAt: stamp,
  });
  const b = await ds.getRepository(Booking).save({
    userId: opts.userId,
    accountId: account.id,
    status: opts.status ?? "confirmed",
    startsAt: opts.start,
    endsAt: opts.end,
    startMs: Date.parse(opts.start),
    endMs: Date.parse(opts.end),
    createdAt: stamp,
    updatedAt: stamp,
  });
  await ds.getRepository(BookingInstrument).insert(opts.instrumentIds.map((instrumentId) => ({ bookingId: b.id, instrumentId })));
  return b;
}

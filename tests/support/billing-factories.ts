/**
 * Factories for recharge tests: accounts, instruments, bookings, container usages and rates
 * inserted directly, so billing is tested without the Schedule or Stockroom services.
 */
import type { DataSource } from "typeorm";
import { Account, AccountMember, Booking, BookingInstrument, Chemical, Container, ContainerUsage, Instrument, Rate } from "../../server/entities";
import type { BookingStatus } from "../../server/entities/booking.entity";
import type { CustomerClass } from "../../server/entities/account.entity";
import type { InstrumentKind } from "../../server/entities/instrument.entity";

let seq = 0;
const next = () => `${++seq}-${Math.random().toString(36).slice(2, 8)}`;
const STAMP = "2026-01-01T00:00:00.000Z";

export async function makeAccount(
  ds: DataSource,
  opts: Partial<Pick<Account, "kind" | "customerClass" | "ownerId" | "validFrom" | "validTo" | "billingEmail" | "organisation" | "name" | "code" | "departmentId">> & {
    members?: { userId: number; monthlyCapCents?: number | null }[];
  } = {},
): Promise<Account> {
  const kind = opts.kind ?? "internal";
  const a = await ds.getRepository(Account).save({
    code: opts.code ?? `ACC-${next()}`,
    name: opts.name ?? `Account ${seq}`,
    kind,
    customerClass: (opts.customerClass ?? (kind === "internal" ? "internal" : "commercial")) as CustomerClass,
    departmentId: opts.departmentId ?? null,
    ownerId: opts.ownerId ?? null,
    validFrom: opts.validFrom ?? null,
    validTo: opts.validTo ?? null,
    organisation: opts.organisation ?? null,
    billingEmail: opts.billingEmail ?? null,
    paymentCustomerId: null,
    active: true,
    createdAt: STAMP,
  });
  for (const m of opts.members ?? []) {
    await ds.getRepository(AccountMember).insert({ accountId: a.id, userId: m.userId, monthlyCapCents: m.monthlyCapCents ?? null });
  }
  return a;
}

export async function makeInstrument(ds: DataSource, opts: { kind?: InstrumentKind; name?: string; bookableHours?: object } = {}): Promise<Instrument> {
  return ds.getRepository(Instrument).save({
    name: opts.name ?? `Instrument ${next()}`,
    kind: opts.kind ?? "potentiostat",
    status: "in_service",
    bookableHours: JSON.stringify(opts.bookableHours ?? {}),
    labelToken: `label-${next()}`,
    createdAt: STAMP,
  });
}

export async function makeBooking(
  ds: DataSource,
  opts: {
    userId: number;
    accountId: number;
    instrumentIds: number[];
    start: string;
    end: string;
    status?: BookingStatus;
    checkedInAt?: string | null;
    checkedOutAt?: string | null;
    cancelledAt?: string | null;
    lateCancel?: boolean;
    updatedAt?: string;
  },
): Promise<Booking> {
  const start = new Date(opts.start);
  const end = new Date(opts.end);
  const b = await ds.getRepository(Booking).save({
    userId: opts.userId,
    accountId: opts.accountId,
    purpose: "test run",
    status: opts.status ?? "completed",
    startsAt: start.toISOString(),
    endsAt: end.toISOString(),
    startMs: start.getTime(),
    endMs: end.getTime(),
    checkedInAt: opts.checkedInAt ? new Date(opts.checkedInAt).toISOString() : null,
    checkedOutAt: opts.checkedOutAt ? new Date(opts.checkedOutAt).toISOString() : null,
    seriesId: null,
    declineReason: null,
    cancelReason: null,
    cancelledAt: opts.cancelledAt ? new Date(opts.cancelledAt).toISOString() : null,
    cancelledById: null,
    lateCancel: opts.lateCancel ?? false,
    decidedById: null,
    reminderSentAt: null,
    createdAt: STAMP,
    updatedAt: opts.updatedAt ?? STAMP,
  });
  await ds.getRepository(BookingInstrument).insert(opts.instrumentIds.map((instrumentId) => ({ bookingId: b.id, instrumentId })));
  return b;
}

/** A container of a chemical (made on first use per data source) to log usages from. */
export async function makeContainer(ds: DataSource, opts: { name?: string } = {}): Promise<Container> {
  const chem = await ds.getRepository(Chemical).save({
    name: opts.name ?? "Lithium chloride",
    casNumber: "7447-41-8",
    formula: "LiCl",
    createdAt: STAMP,
  });
  return ds.getRepository(Container).save({
    chemicalId: chem.id,
    quantity: 100,
    initialQuantity: 100,
    unit: "g",
    status: "in_use",
    labelToken: `c-${next()}`,
    createdAt: STAMP,
  });
}

export async function makeUsage(
  ds: DataSource,
  opts: { containerId: number; userId: number; accountId?: number | null; bookingId?: number | null; amount: number; unit?: string; costCents: number | null; at: string },
): Promise<ContainerUsage> {
  return ds.getRepository(ContainerUsage).save({
    containerId: opts.containerId,
    userId: opts.userId,
    bookingId: opts.bookingId ?? null,
    accountId: opts.accountId ?? null,
    amount: opts.amount,
    unit: opts.unit ?? "g",
    amountInContainerUnit: opts.amount,
    costCents: opts.costCents,
    note: "",
    at: new Date(opts.at).toISOString(),
  });
}

export async function makeRate(
  ds: DataSource,
  opts: Partial<Pick<Rate, "instrumentId" | "instrumentKind" | "effectiveTo" | "minimumMinutes" | "roundingIncrementMinutes" | "afterHoursFactor">> & {
    customerClass: CustomerClass;
    hourlyRateCents: number;
    effectiveFrom: string;
  },
): Promise<Rate> {
  return ds.getRepository(Rate).save({
    instrumentId: opts.instrumentId ?? null,
    instrumentKind: opts.instrumentId != null ? null : (opts.instrumentKind ?? "potentiostat"),
    customerClass: opts.customerClass,
    hourlyRateCents: opts.hourlyRateCents,
    effectiveFrom: opts.effectiveFrom,
    effectiveTo: opts.effectiveTo ?? null,
    minimumMinutes: opts.minimumMinutes ?? null,
    roundingIncrementMinutes: opts.roundingIncrementMinutes ?? null,
    afterHoursFactor: opts.afterHoursFactor ?? null,
    note: "",
    createdById: null,
    createdAt: STAMP,
  });
}

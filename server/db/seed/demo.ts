/**
 * Seeds Phasebook's invented demo scenario: Kestrel Bay University's Liquid Interfaces Core in
 * the Halvorsen Chemistry Building, with its people, accounts, rooms, instruments, training,
 * chemicals and containers. The data lives in the demo-*.ts files beside this one; this module
 * only writes it.
 *
 * Runs once per database: the `demo_seeded` setting marks a seeded database, and everything is
 * written in one transaction, so a failure leaves nothing half-seeded. All dates are relative
 * to `opts.now`, so the demo always has upcoming expiries and live grants.
 */
import type { DataSource, EntityManager } from "typeorm";
import { isValidCas } from "@shared/domain/cas";
import {
  Account,
  AccountMember,
  Chemical,
  Container,
  Department,
  Instrument,
  Location,
  LocationLimit,
  ResearchGroup,
  Setting,
  TrainingRecord,
  User,
  UserRole,
} from "../../entities";
import { audit } from "../../core/audit";
import { BCRYPT_COST, hashPassword } from "../../core/passwords";
import { newToken } from "../../core/tokens";
import { DEMO_ACCOUNTS } from "./demo-accounts";
import { seedDemoBookings } from "./demo-bookings";
import { type ChemicalKey, DEMO_CHEMICALS } from "./demo-chemicals";
import { DEMO_CONTAINERS } from "./demo-containers";
import { seedStockHistory } from "./demo-stock-history";
import { DEMO_INSTRUMENTS, DEMO_TRAINING, type InstrumentKey } from "./demo-instruments";
import { DEMO_LOCATIONS, type LocationKey } from "./demo-locations";
import { limitVolumeToLitres } from "@shared/domain/storage";
import { DEMO_DEPARTMENTS, DEMO_GROUPS, DEMO_PASSWORD, DEMO_PEOPLE, type DepartmentCode, type GroupKey, type PersonKey } from "./demo-people";
import { dateAfter, isoAfter } from "./demo-time";
import { seedDemoRates } from "./demo-rates";
import { seedBilledMonth } from "./demo-billing-history";

export const DEMO_SEEDED_KEY = "demo_seeded";

export interface SeedDemoOptions {
  now: Date;
  /**
   * bcrypt cost of the demo password's hash: the app's configured cost (BCRYPT_COST unless a
   * test lowers both), so a wrong password for a demo account costs what an unknown e-mail does.
   */
  bcryptCost?: number;
  /** The facility's time zone, for the demo timetable's local hours. */
  tz?: string;
  /** CURRENCY, FACILITY_NAME and RECOVERY_ACCOUNT, for the demo's billed month and its journal. */
  currency?: string;
  facilityName?: string;
  recoveryAccount?: string;
}

/** Refuses to seed data that would fail Phasebook's own input checks. */
function checkDemoData(): void {
  const bad = DEMO_CHEMICALS.filter((c) => !isValidCas(c.casNumber)).map((c) => `${c.name} (${c.casNumber})`);
  if (bad.length > 0) throw new Error(`Demo chemicals with an invalid CAS number: ${bad.join(", ")}`);
  // A customer's people are named with its organisation exactly as its accounts are, or the organisation rules would not match them.
  const organisations = new Set(DEMO_ACCOUNTS.filter((a) => a.kind === "external").map((a) => a.organisation));
  const stray = DEMO_PEOPLE.filter((p) => p.organisation !== undefined && !organisations.has(p.organisation)).map((p) => `${p.email} (${p.organisation})`);
  if (stray.length > 0) throw new Error(`Demo people of an organisation no external account has: ${stray.join(", ")}`);
}

async function insertId(em: EntityManager, entity: Parameters<EntityManager["insert"]>[0], row: object): Promise<number> {
  const result = await em.insert(entity, row as never);
  return result.identifiers[0].id as number;
}

function lookup<K extends string>(map: Map<K, number>, key: K): number {
  const id = map.get(key);
  if (id === undefined) throw new Error(`Demo data refers to unknown key "${key}"`);
  return id;
}

export async function seedDemo(ds: DataSource, opts: SeedDemoOptions): Promise<{ seeded: boolean }> {
  if (await ds.getRepository(Setting).findOne({ where: { key: DEMO_SEEDED_KEY } })) return { seeded: false };
  checkDemoData();
  // One hash for every demo person: bcrypt is slow on purpose, and they share the password.
  const passwordHash = await hashPassword(DEMO_PASSWORD, opts.bcryptCost ?? BCRYPT_COST);
  const { now } = opts;
  const nowIso = now.toISOString();

  return ds.transaction(async (em) => {
    // Checked again inside the transaction: two seeders started together must not both write.
    if (await em.findOne(Setting, { where: { key: DEMO_SEEDED_KEY } })) return { seeded: false };

    const departments = new Map<DepartmentCode, number>();
    for (const d of DEMO_DEPARTMENTS) departments.set(d.code, await insertId(em, Department, { code: d.code, name: d.name }));

    const people = new Map<PersonKey, number>();
    for (const p of DEMO_PEOPLE) {
      const id = await insertId(em, User, {
        email: p.email,
        name: p.name,
        passwordHash,
        active: true,
        departmentId: p.department ? lookup(departments, p.department) : null,
        groupId: null, // set below, once the groups exist (a group needs its lead first)
        organisation: p.organisation ?? null,
        calendarToken: newToken(24),
        createdAt: isoAfter(now, -420),
        updatedAt: isoAfter(now, -420),
      });
      await em.insert(UserRole, p.roles.map((role) => ({ userId: id, role })));
      people.set(p.key, id);
    }

    const groups = new Map<GroupKey, number>();
    for (const g of DEMO_GROUPS) {
      groups.set(
        g.key,
        await insertId(em, ResearchGroup, {
          name: g.name,
          departmentId: lookup(departments, g.department),
          leadId: lookup(people, g.lead),
        }),
      );
    }
    for (const p of DEMO_PEOPLE) {
      if (p.group) await em.update(User, lookup(people, p.key), { groupId: lookup(groups, p.group) });
    }

    const accounts = new Map<string, number>();
    for (const a of DEMO_ACCOUNTS) {
      const accountId = await insertId(em, Account, {
        code: a.code,
        name: a.name,
        kind: a.kind,
        customerClass: a.customerClass,
        departmentId: a.department ? lookup(departments, a.department) : null,
        ownerId: a.owner ? lookup(people, a.owner) : null,
        validFrom: a.validFromDays === null ? null : dateAfter(now, a.validFromDays),
        validTo: a.validToDays === null ? null : dateAfter(now, a.validToDays),
        organisation: a.organisation,
        billingEmail: a.billingEmail,
        paymentCustomerId: null,
        active: true,
        createdAt: a.validFromDays === null ? nowIso : isoAfter(now, Math.min(a.validFromDays, 0)),
      });
      accounts.set(a.code, accountId);
      if (a.members.length > 0) {
        await em.insert(
          AccountMember,
          a.members.map((m) => ({ accountId, userId: lookup(people, m.person), monthlyCapCents: m.monthlyCapCents })),
        );
      }
    }

    const locations = new Map<LocationKey, number>();
    for (const l of DEMO_LOCATIONS) {
      const locationId = await insertId(em, Location, { parentId: l.parent ? lookup(locations, l.parent) : null, level: l.level, name: l.name, type: l.type, limitNote: l.limitNote });
      locations.set(l.key, locationId);
      for (const limit of l.limits) {
        await em.insert(LocationLimit, {
          locationId,
          classes: JSON.stringify(limit.classes),
          maxLitres: limitVolumeToLitres(limit.volume, limit.unit),
          enteredVolume: limit.volume,
          enteredUnit: limit.unit,
          includesCabinets: limit.includesCabinets,
          note: limit.note,
          createdAt: nowIso,
        });
      }
    }

    const instruments = new Map<InstrumentKey, number>();
    for (const i of DEMO_INSTRUMENTS) {
      instruments.set(
        i.key,
        await insertId(em, Instrument, {
          name: i.name,
          kind: i.kind,
          status: i.status,
          model: i.model,
          serialNumber: i.serialNumber,
          description: i.description,
          locationId: lookup(locations, i.location),
          fourElectrode: i.fourElectrode,
          interfaceAreaCm2: i.interfaceAreaCm2,
          interfaceRadiusCm: i.interfaceRadiusCm ?? null,
          aqueousFillMl: i.aqueousFillMl ?? null,
          organicFillMl: i.organicFillMl ?? null,
          trainingRequired: i.trainingRequired,
          requiresApproval: i.requiresApproval,
          cleaningBufferMinutes: i.cleaningBufferMinutes,
          minLeadMinutes: i.minLeadMinutes,
          maxLengthMinutes: i.maxLengthMinutes,
          bookableHours: JSON.stringify(i.bookableHours),
          afterHoursAllowed: i.afterHoursAllowed,
          // Random, not derived from the id, so a label cannot be guessed from another one.
          labelToken: newToken(24),
          createdAt: isoAfter(now, -500),
        }),
      );
    }

    const managerId = lookup(people, "manager");
    for (const t of DEMO_TRAINING) {
      const grantedAt = isoAfter(now, t.grantedDays);
      const expiresAt = t.expiresDays === null ? null : isoAfter(now, t.expiresDays);
      const revokedAt = t.revokedDays === undefined ? null : isoAfter(now, t.revokedDays);
      const userId = lookup(people, t.person);
      const instrumentId = lookup(instruments, t.instrument);
      const id = await insertId(em, TrainingRecord, {
        userId,
        instrumentId,
        grantedAt,
        expiresAt,
        afterHours: t.afterHours,
        revokedAt,
        grantedById: managerId,
        notes: t.notes,
      });
      await audit(em, new Date(grantedAt), managerId, "training.granted", "training_record", id, {
        userId,
        instrumentId,
        expiresAt,
        afterHours: t.afterHours,
      });
      if (revokedAt) {
        await audit(em, new Date(revokedAt), managerId, "training.revoked", "training_record", id, { userId, instrumentId, reason: t.notes });
      }
    }

    const chemicals = new Map<ChemicalKey, number>();
    for (const c of DEMO_CHEMICALS) {
      chemicals.set(
        c.key,
        await insertId(em, Chemical, {
          name: c.name,
          synonyms: JSON.stringify(c.synonyms),
          casNumber: c.casNumber,
          formula: c.formula,
          molarMass: c.molarMass,
          molarMassOverridden: c.molarMassOverridden,
          hazardStatements: JSON.stringify(c.hazardStatements),
          pictograms: JSON.stringify(c.pictograms),
          signalWord: c.signalWord,
          precautions: c.precautions,
          flashPointC: c.flashPointC,
          boilingPointC: c.boilingPointC,
          densityGPerMl: c.densityGPerMl,
          carcinogen: c.carcinogen,
          acuteToxic: c.acuteToxic,
          storageGroup: c.storageGroup,
          reorderPoint: c.reorderPoint,
          reorderUnit: c.reorderUnit,
          unitCostCents: c.unitCostCents,
          costUnit: c.costUnit,
          onHoldReason: null,
          ions: c.ions ? JSON.stringify(c.ions) : null,
          createdAt: isoAfter(now, -500),
        }),
      );
    }

    const safetyId = lookup(people, "safety");
    const containerIds: number[] = [];
    for (const c of DEMO_CONTAINERS) {
      // Received a week before it was first opened (or a month ago if still sealed).
      const receivedDays = (c.openedDays ?? -23) - 7;
      const id = await insertId(em, Container, {
        chemicalId: lookup(chemicals, c.chemical),
        kind: c.kind,
        quantity: c.quantity,
        initialQuantity: c.initialQuantity,
        unit: c.unit,
        locationId: lookup(locations, c.location),
        status: c.status,
        openedAt: c.openedDays === null ? null : isoAfter(now, c.openedDays),
        expiresAt: c.expiresDays === null ? null : dateAfter(now, c.expiresDays),
        retestAt: null,
        groupId: c.group ? lookup(groups, c.group) : null,
        labelToken: newToken(24),
        supplier: c.supplier,
        lot: c.lot,
        priceCents: c.priceCents,
        concentrationMolPerL: c.concentrationMolPerL ?? null,
        holdReason: c.holdReason ?? null,
        createdAt: isoAfter(now, receivedDays),
      });
      containerIds.push(id);
      if (c.status === "on_hold") {
        await audit(em, new Date(isoAfter(now, -2)), safetyId, "container.held", "container", id, { reason: c.holdReason });
      }
    }

    await seedStockHistory(em, now, {
      containers: DEMO_CONTAINERS,
      ids: containerIds,
      locationIdOf: (c) => lookup(locations, c.location),
      memberId: lookup(people, "member"),
      receiverId: managerId,
    });
    await seedDemoBookings(em, { now, tz: opts.tz ?? "America/Halifax", people, instruments, accounts, managerId });
    await seedDemoRates(em, { now });
    const emailToId = new Map(DEMO_PEOPLE.map((p) => [p.email, lookup(people, p.key)]));
    await seedBilledMonth(em, {
      now,
      tz: opts.tz ?? "America/Halifax",
      currency: opts.currency ?? "CAD",
      facilityName: opts.facilityName ?? "Liquid Interfaces Core",
      recoveryAccount: opts.recoveryAccount ?? "4510-LIC-RECOVERY",
      managerId,
      containerOf: (chemical) => {
        const i = DEMO_CONTAINERS.findIndex((c) => c.chemical === chemical && c.kind === "bottle" && c.status === "in_use");
        return i < 0 ? undefined : containerIds[i];
      },
      personId: (email) => emailToId.get(email),
      accountId: (code) => accounts.get(code),
    });

    await em.insert(Setting, { key: DEMO_SEEDED_KEY, value: JSON.stringify({ at: nowIso }) });
    await audit(em, now, null, "demo.seeded", "setting", null, { key: DEMO_SEEDED_KEY });
    return { seeded: true };
  });
}

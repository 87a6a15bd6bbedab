/**
 * Containers: the Stockroom's search, receiving deliveries, usage, moves, holds, emptying and
 * disposal. Every check-then-write (a stock check and its decrement) runs in serialTransaction,
 * so parallel usages of one bottle are applied one after another and never over-draw.
 */
import type { DataSource, EntityManager } from "typeorm";
import { UnitError } from "@shared/domain/units";
import { amountInContainerUnit, usageCostCents } from "@shared/domain/stock";
import type { ContainerListQuery, DisposeInput, MoveInput, ReceiveInput, UsageInput, WasteAddInput } from "@shared/schemas/stock";
import { Booking, Chemical, Container, ContainerMovement, ContainerUsage, Location } from "../entities";
import type { MovementKind } from "../entities/container-movement.entity";
import { Conflict, NotFound, RuleBroken } from "../errors";
import { serialTransaction } from "../db/serial";
import { prepared, readEntity } from "../db/prepared";
import type { AuthUser } from "../middleware/auth";
import { hasRole } from "../middleware/auth";
import { locationPaths, type ContainerRow } from "../presenters/stock.presenter";
import { audit } from "../core/audit";
import { newToken } from "../core/tokens";

export interface ContainerServiceDeps {
  ds: DataSource;
  now: () => Date;
}

/** Amounts this close to what is left count as "all of it": float noise must not refuse the last drop. */
const EPSILON_REL = 1e-9;

/** A UnitError from the domain as a 422 naming the request's field. */
export function unitProblem(e: UnitError, fields: { amount: string; unit: string }): RuleBroken {
  const path = e.field === "amount" ? fields.amount : fields.unit;
  return new RuleBroken(e.message, [{ path, message: e.message }], e.code === "invalid_amount" ? "invalid_amount" : "unit_not_convertible");
}

const ROW_COLUMNS = `c.*, ch.name AS chemicalName, ch.casNumber AS casNumber, ch.onHoldReason AS chemicalHoldReason, l.name AS locationName`;
const ROW_FROM = `FROM containers c JOIN chemicals ch ON ch.id = c.chemicalId LEFT JOIN locations l ON l.id = c.locationId`;

const SORT_SQL: Record<ContainerListQuery["sort"], string> = {
  id: "c.id",
  chemical: "ch.name",
  quantity: "c.quantity",
  status: "c.status",
  // Containers without a date come last either way: "soonest expiry first" must not open on them.
  expiresAt: "c.expiresAt IS NULL, c.expiresAt",
  location: "l.name",
  lot: "c.lot",
};

/** Blocks what cannot be taken from: held chemical or container, empty, disposed, waste. */
function assertUsable(c: Container, chem: Chemical): void {
  if (chem.onHoldReason) throw new Conflict(`${chem.name} is on hold: ${chem.onHoldReason}`, "chemical_on_hold");
  if (c.status === "on_hold") throw new Conflict(`Container ${c.id} is on hold: ${c.holdReason ?? "no reason given"}`, "container_on_hold");
  if (c.status === "empty") throw new Conflict(`Container ${c.id} is marked empty.`, "container_empty");
  if (c.status === "disposed") throw new Conflict(`Container ${c.id} has been disposed of.`, "container_disposed");
  if (c.kind === "waste") throw new Conflict(`Container ${c.id} is a waste container; nothing is taken from it.`, "waste_container");
}

export interface Withdrawal {
  container: Container;
  amountInContainerUnit: number;
  usageId: number;
}

export function createContainerService(deps: ContainerServiceDeps) {
  const { ds, now } = deps;

  async function list(q: ContainerListQuery): Promise<{ items: ContainerRow[]; total: number }> {
    const where: string[] = [];
    const args: unknown[] = [];
    if (q.chemicalId) {
      where.push("c.chemicalId = ?");
      args.push(q.chemicalId);
    }
    if (q.locationId) {
      if (q.within === "true") {
        const ids = await descendantIds(ds.manager, q.locationId);
        where.push(`c.locationId IN (SELECT value FROM json_each(?))`);
        args.push(JSON.stringify(ids));
      } else {
        where.push("c.locationId = ?");
        args.push(q.locationId);
      }
    }
    if (q.status?.length) {
      where.push(`c.status IN (SELECT value FROM json_each(?))`);
      args.push(JSON.stringify(q.status));
    }
    if (q.kind) {
      where.push("c.kind = ?");
      args.push(q.kind);
    }
    if (q.q) {
      // Chemicals are few: find the matching ones first, then let the chemicalId index do the rest.
      const like = `%${q.q.replace(/[\\%_]/g, (m) => `\\${m}`)}%`;
      const chemIds = prepared(
        ds,
        `SELECT id FROM chemicals WHERE name LIKE ? ESCAPE '\\' OR casNumber LIKE ? ESCAPE '\\' OR synonyms LIKE ? ESCAPE '\\' OR formula LIKE ? ESCAPE '\\'`,
      )
        .all(like, like, like, like)
        .map((r) => (r as { id: number }).id);
      const ors = ["c.lot = ?", "c.labelToken = ?"];
      const orArgs: unknown[] = [q.q, q.q];
      if (chemIds.length) {
        ors.push(`c.chemicalId IN (SELECT value FROM json_each(?))`);
        orArgs.push(JSON.stringify(chemIds));
      }
      const asId = /^#?(\d{1,9})$/.exec(q.q);
      if (asId) {
        ors.push("c.id = ?");
        orArgs.push(Number(asId[1]));
      }
      where.push(`(${ors.join(" OR ")})`);
      args.push(...orArgs);
    }
    const whereSql = where.length ? `WHERE ${where.join(" AND ")}` : "";
    const dir = q.dir === "desc" ? "DESC" : "ASC";
    if (q.sort === "chemical" || q.sort === "location") return listByGroup(q.sort, whereSql, where, args, q, dir);
    // The count needs no joins; only the page joins names, for its few rows. Lists travel as JSON
    // arrays, so each shape of search is one cached prepared statement.
    const { n } = prepared(ds, `SELECT COUNT(*) AS n FROM containers c ${whereSql}`).get(...args) as { n: number };
    const items = prepared(ds, `SELECT ${ROW_COLUMNS} ${ROW_FROM} ${whereSql} ORDER BY ${SORT_SQL[q.sort]} ${dir}, c.id ${dir} LIMIT ? OFFSET ?`).all(
      ...args,
      q.limit,
      q.offset,
    ) as ContainerRow[];
    return { items, total: n };
  }

  /**
   * Sorting 20 000 containers by their chemical's (or location's) name would make SQLite sort
   * every matching row for each page. Chemicals and locations are few, so instead: count the
   * matches per chemical (an index-only GROUP BY), order those groups by name here, and read
   * only the one to three groups the page falls in, each by its own index. The total is the
   * sum of the counts.
   */
  async function listByGroup(
    by: "chemical" | "location",
    whereSql: string,
    where: string[],
    args: unknown[],
    q: ContainerListQuery,
    dir: "ASC" | "DESC",
  ): Promise<{ items: ContainerRow[]; total: number }> {
    const key = by === "chemical" ? "c.chemicalId" : "c.locationId";
    const groups = prepared(ds, `SELECT ${key} AS id, COUNT(*) AS n FROM containers c ${whereSql} GROUP BY ${key}`).all(...args) as { id: number | null; n: number }[];
    // Names of the matching groups only, in one prepared statement whatever their number.
    const ids = groups.flatMap((g) => (g.id === null ? [] : [g.id]));
    const names = new Map(
      (
        prepared(ds, `SELECT id, name FROM ${by === "chemical" ? "chemicals" : "locations"} WHERE id IN (SELECT value FROM json_each(?))`).all(JSON.stringify(ids)) as {
          id: number;
          name: string;
        }[]
      ).map((r) => [r.id, r.name]),
    );
    const sign = dir === "DESC" ? -1 : 1;
    // SQLite sorts NULL first ascending; containers without a location do the same here.
    const nameOf = (id: number | null) => (id === null ? "" : (names.get(id) ?? ""));
    groups.sort((a, b) => sign * (nameOf(a.id) < nameOf(b.id) ? -1 : nameOf(a.id) > nameOf(b.id) ? 1 : (a.id ?? 0) - (b.id ?? 0)));
    const total = groups.reduce((sum, g) => sum + Number(g.n), 0);
    let skip = q.offset;
    let need = q.limit;
    const items: ContainerRow[] = [];
    for (const g of groups) {
      if (need <= 0) break;
      const n = Number(g.n);
      if (skip >= n) {
        skip -= n;
        continue;
      }
      const take = Math.min(n - skip, need);
      const groupWhere = `WHERE ${[...where, g.id === null ? `${key} IS NULL` : `${key} = ?`].join(" AND ")}`;
      const rows = prepared(ds, `SELECT ${ROW_COLUMNS} ${ROW_FROM} ${groupWhere} ORDER BY c.id ${dir} LIMIT ? OFFSET ?`).all(
        ...args,
        ...(g.id === null ? [] : [g.id]),
        take,
        skip,
      ) as ContainerRow[];
      items.push(...rows);
      need -= take;
      skip = 0;
    }
    return { items, total };
  }

  async function row(em: EntityManager, id: number): Promise<ContainerRow> {
    const found = prepared(em.connection, `SELECT ${ROW_COLUMNS} ${ROW_FROM} WHERE c.id = ?`).get(id) as ContainerRow | undefined;
    if (!found) throw new NotFound("That container");
    return found;
  }

  async function detail(id: number) {
    const container = await row(ds.manager, id);
    const chemical = (await ds.getRepository(Chemical).findOneBy({ id: container.chemicalId }))!;
    const locations = await ds.getRepository(Location).find();
    const paths = locationPaths(locations);
    const movements = (await ds.query(
      `SELECT m.*, fl.name AS fromLocationName, tl.name AS toLocationName, u.name AS userName
       FROM container_movements m LEFT JOIN locations fl ON fl.id = m.fromLocationId LEFT JOIN locations tl ON tl.id = m.toLocationId
       LEFT JOIN users u ON u.id = m.userId WHERE m.containerId = ? ORDER BY m.at DESC, m.id DESC`,
      [id],
    )) as (ContainerMovement & { fromLocationName: string | null; toLocationName: string | null; userName: string | null })[];
    const usages = (await ds.query(
      `SELECT cu.*, u.name AS userName FROM container_usages cu LEFT JOIN users u ON u.id = cu.userId
       WHERE cu.containerId = ? ORDER BY cu.at DESC, cu.id DESC LIMIT 100`,
      [id],
    )) as (ContainerUsage & { userName: string | null })[];
    const parents = (await ds.query(
      `SELECT sc.parentContainerId AS containerId, ch.name AS chemicalName, sc.role, sc.amount, sc.unit
       FROM solution_components sc JOIN containers p ON p.id = sc.parentContainerId JOIN chemicals ch ON ch.id = p.chemicalId
       WHERE sc.solutionContainerId = ? ORDER BY sc.id`,
      [id],
    )) as { containerId: number; chemicalName: string; role: "solute" | "solvent"; amount: number; unit: string }[];
    const children = (await ds.query(
      `SELECT sc.solutionContainerId AS containerId, ch.name AS chemicalName, sc.role, sc.amount, sc.unit
       FROM solution_components sc JOIN containers s ON s.id = sc.solutionContainerId JOIN chemicals ch ON ch.id = s.chemicalId
       WHERE sc.parentContainerId = ? ORDER BY sc.id`,
      [id],
    )) as { containerId: number; chemicalName: string; role: "solute" | "solvent"; amount: number; unit: string }[];
    return {
      container,
      chemical,
      locationPath: container.locationId === null ? null : (paths.get(container.locationId) ?? null),
      movements,
      usages,
      parents,
      children,
    };
  }

  async function requireLocation(em: EntityManager, id: number | null | undefined, field: string): Promise<number | null> {
    if (id === null || id === undefined) return null;
    const l = await em.findOneBy(Location, { id });
    if (!l) throw new RuleBroken(`There is no location ${id}.`, [{ path: field, message: "Choose an existing location." }], "unknown_location");
    return id;
  }

  async function recordMovement(em: EntityManager, containerId: number, from: number | null, to: number | null, userId: number | null, kind: MovementKind, note = "") {
    await em.insert(ContainerMovement, { containerId, fromLocationId: from, toLocationId: to, userId, kind, note, at: now().toISOString() });
  }

  /** n containers of one delivery, each with its own random label token. */
  async function receive(actor: AuthUser, input: ReceiveInput): Promise<ContainerRow[]> {
    return serialTransaction(ds, async (em) => {
      const chem = await em.findOneBy(Chemical, { id: input.chemicalId });
      if (!chem) throw new RuleBroken(`There is no chemical ${input.chemicalId}.`, [{ path: "chemicalId", message: "Choose an existing chemical." }], "unknown_chemical");
      const locationId = await requireLocation(em, input.locationId, "locationId");
      if (input.expiresAt && input.retestAt && input.retestAt > input.expiresAt) {
        throw new RuleBroken("The retest date is after the expiry date.", [{ path: "retestAt", message: "A retest date after the expiry date is never reached; check both dates." }]);
      }
      const ids: number[] = [];
      const at = now().toISOString();
      // A waste container fills rather than empties: its size is the capacity, it starts empty and in use.
      const waste = input.kind === "waste";
      for (let i = 0; i < input.count; i++) {
        const res = await em.insert(Container, {
          chemicalId: chem.id,
          kind: input.kind,
          quantity: waste ? 0 : input.quantity,
          initialQuantity: input.quantity,
          unit: input.unit,
          locationId,
          status: waste ? "in_use" : "sealed",
          openedAt: waste ? at : null,
          expiresAt: input.expiresAt ?? null,
          retestAt: input.retestAt ?? null,
          groupId: input.groupId ?? null,
          // Random and unguessable: a label must not lead to another container's record.
          labelToken: newToken(18),
          supplier: input.supplier,
          lot: input.lot,
          priceCents: input.priceCents ?? null,
          concentrationMolPerL: null,
          holdReason: null,
          createdAt: at,
        });
        const id = res.identifiers[0].id as number;
        ids.push(id);
        await recordMovement(em, id, null, locationId, actor.id, "received", input.supplier ? `from ${input.supplier}` : "");
      }
      await audit(em, now(), actor.id, "containers.received", "chemical", chem.id, { containerIds: ids, lot: input.lot, quantity: input.quantity, unit: input.unit });
      const rows: ContainerRow[] = [];
      for (const id of ids) rows.push(await row(em, id));
      return rows;
    });
  }

  /**
   * Takes an amount from a container inside the caller's transaction: converts it, checks what
   * is left, decrements, and records the usage with its cost. Shared by usage and solution
   * preparation so both follow the same rules.
   */
  async function withdraw(
    em: EntityManager,
    actor: AuthUser,
    containerId: number,
    amount: number,
    unit: string,
    opts: { bookingId?: number | null; note?: string; fields?: { amount: string; unit: string; container?: string } },
  ): Promise<Withdrawal> {
    const fields = { amount: "amount", unit: "unit", ...opts.fields };
    // Prepared reads on the transaction's connection: the usage is the Stockroom's hottest write.
    const c = readEntity(em.connection, Container, `SELECT * FROM containers WHERE id = ?`, containerId);
    if (!c) {
      if (fields.container) throw new RuleBroken(`There is no container ${containerId}.`, [{ path: fields.container, message: "Choose an existing container." }], "unknown_container");
      throw new NotFound("That container");
    }
    const chem = readEntity(em.connection, Chemical, `SELECT * FROM chemicals WHERE id = ?`, c.chemicalId)!;
    assertUsable(c, chem);
    let take: number;
    try {
      take = amountInContainerUnit(amount, unit, c, chem);
    } catch (e) {
      if (e instanceof UnitError) throw unitProblem(e, fields);
      throw e;
    }
    if (take > c.quantity * (1 + EPSILON_REL) + 1e-12) {
      const msg = `Container ${c.id} has ${formatQty(c.quantity)} ${c.unit} left; ${formatQty(amount)} ${unit} is ${formatQty(take)} ${c.unit}.`;
      throw new RuleBroken(msg, [{ path: fields.amount, message: msg }], "not_enough_left", { left: c.quantity, unit: c.unit });
    }
    let accountId: number | null = null;
    const bookingId = opts.bookingId ?? null;
    if (bookingId !== null) {
      const b = await em.findOneBy(Booking, { id: bookingId });
      if (!b || (b.userId !== actor.id && !hasRole(actor, "manager"))) {
        throw new RuleBroken(`Booking ${bookingId} is not one of yours.`, [{ path: "bookingId", message: "Choose one of your own bookings." }], "unknown_booking");
      }
      accountId = b.accountId;
    }
    const left = take >= c.quantity ? 0 : c.quantity - take;
    const change = { quantity: left, status: left === 0 ? ("empty" as const) : ("in_use" as const), openedAt: c.openedAt ?? now().toISOString() };
    // Prepared statements on the transaction's connection: a usage is the Stockroom's most
    // frequent write, and TypeORM's builders cost more than the writes themselves.
    prepared(em.connection, `UPDATE containers SET quantity = ?, status = ?, openedAt = ? WHERE id = ?`).run(change.quantity, change.status, change.openedAt, c.id);
    // A prepared solution's cost was charged when its parents were used.
    const costCents = c.kind === "solution" ? null : usageCostCents(amount, unit, chem);
    const usageId = Number(
      prepared(
        em.connection,
        `INSERT INTO container_usages (containerId, userId, bookingId, accountId, amount, unit, amountInContainerUnit, costCents, note, at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
      ).run(c.id, actor.id, bookingId, accountId, amount, unit, take, costCents, opts.note ?? "", now().toISOString()).lastInsertRowid,
    );
    return { container: Object.assign(c, change), amountInContainerUnit: take, usageId };
  }

  async function logUsage(actor: AuthUser, id: number, input: UsageInput): Promise<ContainerRow> {
    return serialTransaction(ds, async (em) => {
      const w = await withdraw(em, actor, id, input.amount, input.unit, { bookingId: input.bookingId, note: input.note });
      await audit(em, now(), actor.id, "container.used", "container", id, {
        amount: input.amount,
        unit: input.unit,
        amountInContainerUnit: w.amountInContainerUnit,
        usageId: w.usageId,
      });
      return row(em, id);
    });
  }

  async function change<T>(id: number, work: (em: EntityManager, c: Container) => Promise<T>): Promise<ContainerRow> {
    return serialTransaction(ds, async (em) => {
      const c = await em.findOneBy(Container, { id });
      if (!c) throw new NotFound("That container");
      await work(em, c);
      return row(em, id);
    });
  }

  const move = (actor: AuthUser, id: number, input: MoveInput) =>
    change(id, async (em, c) => {
      if (c.status === "disposed") throw new Conflict(`Container ${c.id} has been disposed of.`, "container_disposed");
      await requireLocation(em, input.locationId, "locationId");
      if (c.locationId === input.locationId) throw new RuleBroken("The container is already there.", [{ path: "locationId", message: "Choose a different location." }], "same_location");
      await em.update(Container, c.id, { locationId: input.locationId });
      await recordMovement(em, c.id, c.locationId, input.locationId, actor.id, "moved", input.note ?? "");
      await audit(em, now(), actor.id, "container.moved", "container", c.id, { from: c.locationId, to: input.locationId });
    });

  const hold = (actor: AuthUser, id: number, reason: string) =>
    change(id, async (em, c) => {
      if (c.status === "empty" || c.status === "disposed") throw new Conflict(`Container ${c.id} is ${c.status}; there is nothing to hold.`, "container_" + c.status);
      await em.update(Container, c.id, { status: "on_hold", holdReason: reason });
      await audit(em, now(), actor.id, "container.held", "container", c.id, { reason, previous: c.status });
    });

  const release = (actor: AuthUser, id: number) =>
    change(id, async (em, c) => {
      if (c.status !== "on_hold") throw new Conflict(`Container ${c.id} is not on hold.`, "not_on_hold");
      // Back to what it was: opened bottles are in use, unopened ones sealed.
      const status = c.openedAt ? "in_use" : "sealed";
      await em.update(Container, c.id, { status, holdReason: null });
      await audit(em, now(), actor.id, "container.released", "container", c.id, { reason: c.holdReason });
    });

  const markEmpty = (actor: AuthUser, id: number) =>
    change(id, async (em, c) => {
      if (c.status === "disposed" || c.status === "empty") throw new Conflict(`Container ${c.id} is already ${c.status}.`, "container_" + c.status);
      if (c.status === "on_hold") throw new Conflict(`Container ${c.id} is on hold; the safety office releases it first.`, "container_on_hold");
      await em.update(Container, c.id, { status: "empty", quantity: 0 });
      await audit(em, now(), actor.id, "container.emptied", "container", c.id, { quantityBefore: c.quantity, unit: c.unit });
    });

  /**
   * Pour into a waste container: the amount, in any unit the container's chemical converts to,
   * adds to what it holds; more than its capacity (initialQuantity) is refused (422) so the
   * fill level the safety review shows never passes 100 %.
   */
  const addWaste = (actor: AuthUser, id: number, input: WasteAddInput) =>
    change(id, async (em, c) => {
      if (c.kind !== "waste") throw new Conflict(`Container ${c.id} is not a waste container.`, "not_waste_container");
      if (c.status === "on_hold") throw new Conflict(`Container ${c.id} is on hold: ${c.holdReason ?? "no reason given"}`, "container_on_hold");
      if (c.status === "empty" || c.status === "disposed") throw new Conflict(`Waste container ${c.id} has been ${c.status === "empty" ? "emptied" : "collected"}; use another.`, "container_" + c.status);
      const chem = (await em.findOneBy(Chemical, { id: c.chemicalId }))!;
      let add: number;
      try {
        add = amountInContainerUnit(input.amount, input.unit, c, chem);
      } catch (e) {
        if (e instanceof UnitError) throw unitProblem(e, { amount: "amount", unit: "unit" });
        throw e;
      }
      const room = c.initialQuantity - c.quantity;
      if (add > room * (1 + EPSILON_REL) + 1e-12) {
        const msg = `Waste container ${c.id} has room for ${formatQty(Math.max(0, room))} ${c.unit}; ${formatQty(input.amount)} ${input.unit} is ${formatQty(add)} ${c.unit}. Use another container and arrange collection.`;
        throw new RuleBroken(msg, [{ path: "amount", message: msg }], "waste_container_full", { room, unit: c.unit });
      }
      const filled = Math.min(c.initialQuantity, c.quantity + add);
      await em.update(Container, c.id, { quantity: filled, status: "in_use", openedAt: c.openedAt ?? now().toISOString() });
      await audit(em, now(), actor.id, "container.waste_added", "container", c.id, { amount: input.amount, unit: input.unit, amountInContainerUnit: add, note: input.note ?? "" });
    });

  const dispose = (actor: AuthUser, id: number, input: DisposeInput) =>
    change(id, async (em, c) => {
      if (c.status === "disposed") throw new Conflict(`Container ${c.id} is already disposed of.`, "container_disposed");
      await em.update(Container, c.id, { status: "disposed", quantity: 0 });
      await audit(em, now(), actor.id, "container.disposed", "container", c.id, { reason: input.reason ?? "", quantityBefore: c.quantity, unit: c.unit });
    });

  return { list, detail, row: (id: number) => row(ds.manager, id), receive, withdraw, logUsage, move, hold, release, markEmpty, addWaste, dispose, recordMovement, requireLocation, rowIn: row };
}

/** Ids of a location and everything inside it. */
export async function descendantIds(em: EntityManager, id: number): Promise<number[]> {
  const all = (await em.query(`SELECT id, parentId FROM locations`)) as { id: number; parentId: number | null }[];
  const out = [id];
  for (let i = 0; i < out.length; i++) for (const l of all) if (l.parentId === out[i] && !out.includes(l.id)) out.push(l.id);
  return out;
}

function formatQty(n: number): string {
  return Number(n.toPrecision(6)).toString();
}

export type ContainerService = ReturnType<typeof createContainerService>;

/**
 * Reads of containers: the Stockroom search, one row with its names, the container page's
 * history and lineage, and what the container policy needs to decide. Every SQL string that
 * reads containers for the Stockroom lives here.
 */
import type { DataSource, EntityManager } from "typeorm";
import type { ContainerListQuery } from "@shared/schemas/stock";
import type { ContainerMovement, ContainerUsage } from "../../entities";
import { Chemical, Location } from "../../entities";
import { NotFound } from "../../errors";
import { prepared } from "../../db/prepared";
import { locationPaths, type ContainerRow } from "./stock.presenter";
import { reservationsWhere } from "./reservation.queries";

const ROW_COLUMNS = `c.*, ch.name AS chemicalName, ch.casNumber AS casNumber, ch.onHoldReason AS chemicalHoldReason, l.name AS locationName,
  (SELECT COALESCE(SUM(r.amount - r.drawn), 0) FROM reservations r WHERE r.containerId = c.id AND r.state = 'held') AS reservedQuantity`;
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

/** The Stockroom search: filters, text, sort and one page, with the total. */
export async function listContainers(ds: DataSource, q: ContainerListQuery): Promise<{ items: ContainerRow[]; total: number }> {
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
  if (q.sort === "chemical" || q.sort === "location") return listByGroup(ds, q.sort, whereSql, where, args, q, dir);
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
function listByGroup(
  ds: DataSource,
  by: "chemical" | "location",
  whereSql: string,
  where: string[],
  args: unknown[],
  q: ContainerListQuery,
  dir: "ASC" | "DESC",
): { items: ContainerRow[]; total: number } {
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

/** One container with the names the Stockroom shows beside it; 404 when there is none. Inside a transaction pass `em.connection`. */
export function containerRow(ds: DataSource, id: number): ContainerRow {
  const found = prepared(ds, `SELECT ${ROW_COLUMNS} ${ROW_FROM} WHERE c.id = ?`).get(id) as ContainerRow | undefined;
  if (!found) throw new NotFound("That container");
  return found;
}

export type MovementRow = ContainerMovement & { fromLocationName: string | null; toLocationName: string | null; userName: string | null };
export type UsageRow = ContainerUsage & { userName: string | null };
export interface LineageRow {
  containerId: number;
  chemicalName: string;
  role: "solute" | "solvent";
  amount: number;
  unit: string;
}

/** The container page: the row, its chemical, where it is, its movements, usages and lineage. */
export async function containerDetail(ds: DataSource, id: number) {
  const container = containerRow(ds, id);
  const chemical = (await ds.getRepository(Chemical).findOneBy({ id: container.chemicalId }))!;
  const paths = locationPaths(await ds.getRepository(Location).find());
  const movements = (await ds.query(
    `SELECT m.*, fl.name AS fromLocationName, tl.name AS toLocationName, u.name AS userName
     FROM container_movements m LEFT JOIN locations fl ON fl.id = m.fromLocationId LEFT JOIN locations tl ON tl.id = m.toLocationId
     LEFT JOIN users u ON u.id = m.userId WHERE m.containerId = ? ORDER BY m.at DESC, m.id DESC`,
    [id],
  )) as MovementRow[];
  const usages = (await ds.query(
    `SELECT cu.*, u.name AS userName FROM container_usages cu LEFT JOIN users u ON u.id = cu.userId
     WHERE cu.containerId = ? ORDER BY cu.at DESC, cu.id DESC LIMIT 100`,
    [id],
  )) as UsageRow[];
  const parents = (await ds.query(
    `SELECT sc.parentContainerId AS containerId, ch.name AS chemicalName, sc.role, sc.amount, sc.unit
     FROM solution_components sc JOIN containers p ON p.id = sc.parentContainerId JOIN chemicals ch ON ch.id = p.chemicalId
     WHERE sc.solutionContainerId = ? ORDER BY sc.id`,
    [id],
  )) as LineageRow[];
  const children = (await ds.query(
    `SELECT sc.solutionContainerId AS containerId, ch.name AS chemicalName, sc.role, sc.amount, sc.unit
     FROM solution_components sc JOIN containers s ON s.id = sc.solutionContainerId JOIN chemicals ch ON ch.id = s.chemicalId
     WHERE sc.parentContainerId = ? ORDER BY sc.id`,
    [id],
  )) as LineageRow[];
  const reservations = reservationsWhere(ds, { containerId: id });
  return {
    container,
    chemical,
    reservations,
    locationPath: container.locationId === null ? null : (paths.get(container.locationId) ?? null),
    movements,
    usages,
    parents,
    children,
  };
}

/** Ids of a location and everything inside it. */
export async function descendantIds(em: EntityManager, id: number): Promise<number[]> {
  const all = (await em.query(`SELECT id, parentId FROM locations`)) as { id: number; parentId: number | null }[];
  const out = [id];
  for (let i = 0; i < out.length; i++) for (const l of all) if (l.parentId === out[i] && !out.includes(l.id)) out.push(l.id);
  return out;
}

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
import { ROW_COLUMNS, ROW_FROM, searchContainers, type ContainerPage } from "./container-search";

/** The Stockroom search: filters, text, sort and one page, with a total that stops counting at a bound (container-search.ts). */
export async function listContainers(ds: DataSource, q: ContainerListQuery): Promise<ContainerPage> {
  const locationIds = q.locationId ? (q.within === "true" ? await descendantIds(ds.manager, q.locationId) : [q.locationId]) : null;
  return searchContainers(ds, q, locationIds);
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

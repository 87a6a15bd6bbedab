/** Reads of the system area: a database probe and pages of the audit log. */
import type { DataSource } from "typeorm";
import { AuditEntry } from "../../entities";
import { prepared } from "../../db/prepared";

/** True when the database answers a trivial query. */
export function databaseAnswers(ds: DataSource): boolean {
  try {
    prepared(ds, "SELECT 1").get();
    return true;
  } catch {
    return false;
  }
}

export async function auditPage(ds: DataSource, q: { limit: number; offset: number; entityType?: string; entityId?: number }) {
  const [items, total] = await ds.getRepository(AuditEntry).findAndCount({
    where: { ...(q.entityType ? { entityType: q.entityType } : {}), ...(q.entityId ? { entityId: q.entityId } : {}) },
    order: { id: "DESC" },
    skip: q.offset,
    take: q.limit,
  });
  return { items: items.map((a) => ({ ...a, detail: JSON.parse(a.detail) as unknown })), total };
}

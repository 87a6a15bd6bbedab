/** Writes the audit log: who did what to which record. Call it inside the change's transaction. */
import type { EntityManager } from "typeorm";
import { AuditEntry } from "../entities";

export async function audit(
  em: EntityManager,
  at: Date,
  actorId: number | null,
  action: string,
  entityType: string,
  entityId: number | null,
  detail: Record<string, unknown> = {},
): Promise<void> {
  await em.insert(AuditEntry, { at: at.toISOString(), actorId, action, entityType, entityId, detail: JSON.stringify(detail) });
}

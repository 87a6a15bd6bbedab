/** Writes the audit log: who did what to which record. Call it inside the change's transaction. */
import type { EntityManager } from "typeorm";
import { prepared } from "../db/prepared";

export async function audit(
  em: EntityManager,
  at: Date,
  actorId: number | null,
  action: string,
  entityType: string,
  entityId: number | null,
  detail: Record<string, unknown> = {},
): Promise<void> {
  // A prepared insert on the transaction's own connection: TypeORM's insert builder would also
  // read the new row back for its default columns, on every write Phasebook makes.
  prepared(em.connection, `INSERT INTO audit_log (at, actorId, action, entityType, entityId, detail) VALUES (?, ?, ?, ?, ?, ?)`).run(
    at.toISOString(),
    actorId,
    action,
    entityType,
    entityId,
    JSON.stringify(detail),
  );
}

import type { DataSource, EntityManager } from 'typeorm';

export interface AuditEntry {
  plantId: string | null;
  userId: string | null;
  action: string;
  entity: string;
  entityId?: string | null;
  before?: unknown;
  after?: unknown;
}

/** Appends to the audit log, inside the caller's transaction when one is given. */
export async function audit(db: DataSource | EntityManager, e: AuditEntry): Promise<void> {
  await db.query(
    `INSERT INTO audit_event (plant_id, user_id, action, entity, entity_id, before, after) VALUES ($1, $2, $3, $4, $5, $6, $7)`,
    [e.plantId, e.userId, e.action, e.entity, e.entityId ?? null, e.before === undefined ? null : JSON.stringify(e.before), e.after === undefined ? null : JSON.stringify(e.after)],
  );
}

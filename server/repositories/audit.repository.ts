import { auditEvents, type NewAuditEvent } from '../../db/schema';
import type { Executor } from '../db';

/** Records one audit event. */
export async function recordAudit(db: Executor, event: NewAuditEvent): Promise<void> {
  await db.insert(auditEvents).values(event);
}

import 'server-only';
import { desc, eq } from 'drizzle-orm';
import { getDb, type DbOrTx } from '../client';
import { auditEvents } from '../schema';

export interface AuditInput {
  workspaceId: string | null;
  actorId: string | null;
  action: string;
  targetType: string;
  targetId?: string | null;
  data?: Record<string, unknown>;
}

/** Record a write; pass the transaction so the event commits (or rolls back) with it. */
export async function insertAuditEvent(db: DbOrTx, e: AuditInput): Promise<void> {
  await db.insert(auditEvents).values({
    workspaceId: e.workspaceId,
    actorId: e.actorId,
    action: e.action,
    targetType: e.targetType,
    targetId: e.targetId ?? null,
    data: e.data ?? {},
  });
}

export async function listAuditEvents(workspaceId: string, limit = 100) {
  const db = await getDb();
  return db
    .select()
    .from(auditEvents)
    .where(eq(auditEvents.workspaceId, workspaceId))
    .orderBy(desc(auditEvents.createdAt), desc(auditEvents.id))
    .limit(limit);
}

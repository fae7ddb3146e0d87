import 'server-only';
import { and, desc, eq, lt } from 'drizzle-orm';
import { getDb } from '../client';
import { auditEvents, users } from '../schema';

export interface ActivityItem {
  id: number;
  action: string;
  targetType: string;
  targetId: string | null;
  data: Record<string, unknown>;
  createdAt: Date;
  actor: { id: string; name: string } | null;
}

/** The workspace's audit events with the actor's name, newest first (`before`: an id, for paging). */
export async function listActivity(workspaceId: string, opts: { limit?: number; before?: number } = {}): Promise<ActivityItem[]> {
  const db = await getDb();
  const where = [eq(auditEvents.workspaceId, workspaceId)];
  if (opts.before) where.push(lt(auditEvents.id, opts.before));
  const rows = await db
    .select({
      id: auditEvents.id,
      action: auditEvents.action,
      targetType: auditEvents.targetType,
      targetId: auditEvents.targetId,
      data: auditEvents.data,
      createdAt: auditEvents.createdAt,
      actorId: users.id,
      actorName: users.name,
      actorEmail: users.email,
    })
    .from(auditEvents)
    .leftJoin(users, eq(users.id, auditEvents.actorId))
    .where(and(...where))
    .orderBy(desc(auditEvents.id))
    .limit(Math.min(opts.limit ?? 100, 500));
  return rows.map((r) => ({
    id: r.id,
    action: r.action,
    targetType: r.targetType,
    targetId: r.targetId,
    data: (r.data ?? {}) as Record<string, unknown>,
    createdAt: r.createdAt,
    actor: r.actorId ? { id: r.actorId, name: r.actorName ?? r.actorEmail ?? '' } : null,
  }));
}

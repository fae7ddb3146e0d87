import 'server-only';
import { and, desc, eq, isNull, sql } from 'drizzle-orm';
import { getDb, type DbOrTx } from '../client';
import { notifications, users, workspaces } from '../schema';

export type NotificationKind = 'comment' | 'mention';

export interface NotificationData {
  solveId: string;
  commentId: string;
  actorName: string;
  sectionName: string;
  excerpt: string;
}

export interface NotificationItem {
  id: string;
  kind: NotificationKind;
  workspaceId: string | null;
  workspaceName: string | null;
  data: NotificationData;
  readAt: Date | null;
  createdAt: Date;
}

export async function insertNotifications(
  rows: { userId: string; workspaceId: string; kind: NotificationKind; data: NotificationData }[],
  db?: DbOrTx,
): Promise<void> {
  if (!rows.length) return;
  const d = db ?? (await getDb());
  await d.insert(notifications).values(rows);
}

export async function listNotifications(userId: string, limit = 100): Promise<NotificationItem[]> {
  const db = await getDb();
  const rows = await db
    .select({
      id: notifications.id,
      kind: notifications.kind,
      workspaceId: notifications.workspaceId,
      workspaceName: workspaces.name,
      data: notifications.data,
      readAt: notifications.readAt,
      createdAt: notifications.createdAt,
    })
    .from(notifications)
    .leftJoin(workspaces, eq(workspaces.id, notifications.workspaceId))
    .where(eq(notifications.userId, userId))
    .orderBy(desc(notifications.createdAt), desc(notifications.id))
    .limit(Math.min(limit, 500));
  return rows.map((r) => ({ ...r, kind: r.kind as NotificationKind, data: r.data as NotificationData }));
}

export async function countUnreadNotifications(userId: string): Promise<number> {
  const db = await getDb();
  const [r] = await db
    .select({ n: sql<number>`count(*)::int` })
    .from(notifications)
    .where(and(eq(notifications.userId, userId), isNull(notifications.readAt)));
  return Number(r?.n ?? 0);
}

export async function markAllNotificationsRead(userId: string): Promise<number> {
  const db = await getDb();
  const rows = await db
    .update(notifications)
    .set({ readAt: new Date() })
    .where(and(eq(notifications.userId, userId), isNull(notifications.readAt)))
    .returning({ id: notifications.id });
  return rows.length;
}

export async function setNotifyByEmail(userId: string, on: boolean): Promise<void> {
  const db = await getDb();
  await db.update(users).set({ notifyByEmail: on }).where(eq(users.id, userId));
}

export async function getNotifyByEmail(userId: string): Promise<boolean> {
  const db = await getDb();
  const [r] = await db.select({ on: users.notifyByEmail }).from(users).where(eq(users.id, userId)).limit(1);
  return r?.on ?? true;
}

import 'server-only';
import { and, asc, eq } from 'drizzle-orm';
import { getDb } from '../client';
import { workspaceMaterials } from '../schema';
import type { WorkspaceMaterialInput } from '@/lib/validations/material';
import { lockWorkspaceForLimits } from './workspaces';

/** Custom materials kept for a workspace, oldest first. */
export async function listWorkspaceMaterials(workspaceId: string): Promise<(WorkspaceMaterialInput & { key: string })[]> {
  const db = await getDb();
  const rows = await db
    .select({ id: workspaceMaterials.id, content: workspaceMaterials.content })
    .from(workspaceMaterials)
    .where(eq(workspaceMaterials.workspaceId, workspaceId))
    .orderBy(asc(workspaceMaterials.createdAt), asc(workspaceMaterials.id));
  return rows.map((r) => ({ ...(r.content as WorkspaceMaterialInput), key: r.id }));
}

/**
 * Keep a material for the workspace; one with the same material id is replaced. The read and
 * the write are serialised per workspace (workspace row lock), so two concurrent saves of one
 * material id leave one row, not two.
 */
export async function upsertWorkspaceMaterial(workspaceId: string, userId: string, m: WorkspaceMaterialInput): Promise<void> {
  const db = await getDb();
  await db.transaction(async (tx) => {
    await lockWorkspaceForLimits(tx, workspaceId);
    const existing = await tx
      .select({ id: workspaceMaterials.id, content: workspaceMaterials.content })
      .from(workspaceMaterials)
      .where(eq(workspaceMaterials.workspaceId, workspaceId));
    const same = existing.find((r) => (r.content as WorkspaceMaterialInput).id === m.id);
    if (same) {
      await tx
        .update(workspaceMaterials)
        .set({ content: m, updatedAt: new Date() })
        .where(and(eq(workspaceMaterials.id, same.id), eq(workspaceMaterials.workspaceId, workspaceId)));
    } else {
      await tx.insert(workspaceMaterials).values({ workspaceId, content: m, createdBy: userId });
    }
  });
}

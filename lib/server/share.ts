import 'server-only';
/**
 * Opening a read-only share link (issue 7). Members of the workspace may always open its
 * links; anyone else (signed out, or signed in elsewhere) only when the workspace allows
 * public links. Revoked and expired links never open. Returns what the page may show.
 */
import { getShareLinkByTokenHash } from '@/db/queries/share-links';
import { getRevision, getSection } from '@/db/queries/sections';
import { getSolve } from '@/db/queries/solves';
import { getMembershipRow } from '@/db/queries/workspaces';
import { hashToken, isTokenShape } from './invitations';

export type ShareOpen =
  | { status: 'not_found' }
  | { status: 'revoked' | 'expired'; workspaceName: string }
  | { status: 'members_only'; workspaceName: string }
  | {
      status: 'ok';
      workspaceName: string;
      asMember: boolean;
      target:
        | { type: 'section'; name: string; description: string; revisionNumber: number | null; content: unknown; updatedAt: Date }
        | { type: 'solve'; sectionName: string; revisionNumber: number; content: unknown; result: unknown; createdAt: Date; author: string | null };
    };

export async function openShareLink(token: string, viewer: { id: string } | null): Promise<ShareOpen> {
  if (!isTokenShape(token)) return { status: 'not_found' };
  const link = await getShareLinkByTokenHash(hashToken(token));
  if (!link) return { status: 'not_found' };
  if (link.state !== 'ok') return { status: link.state, workspaceName: link.workspaceName };
  const asMember = viewer ? Boolean(await getMembershipRow(viewer.id, link.workspaceId)) : false;
  if (!asMember && !link.allowPublicLinks) return { status: 'members_only', workspaceName: link.workspaceName };
  if (link.targetType === 'section') {
    const s = await getSection(link.workspaceId, link.targetId);
    if (!s || s.deletedAt) return { status: 'not_found' };
    return {
      status: 'ok',
      workspaceName: link.workspaceName,
      asMember,
      target: {
        type: 'section',
        name: s.name,
        description: s.description,
        revisionNumber: s.latestRevision?.number ?? null,
        content: s.latestRevision?.content ?? null,
        updatedAt: s.updatedAt,
      },
    };
  }
  const v = await getSolve(link.workspaceId, link.targetId);
  if (!v) return { status: 'not_found' };
  const rev = await getRevision(link.workspaceId, v.sectionId, v.revisionId);
  return {
    status: 'ok',
    workspaceName: link.workspaceName,
    asMember,
    target: {
      type: 'solve',
      sectionName: v.sectionName,
      revisionNumber: v.revisionNumber,
      content: rev?.content ?? null,
      result: v.result,
      createdAt: v.createdAt,
      author: v.author?.name ?? null,
    },
  };
}

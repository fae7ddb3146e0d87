import 'server-only';
/**
 * Notifications on comments (issue 7): the solve's author hears about every comment by
 * someone else; members @mentioned in it hear about the mention (a mention of the author
 * counts once, as a mention). Each gets an in-app notification and, unless they turned it
 * off, an e-mail. A failure here is logged and never undoes the comment.
 */
import { getSolve } from '@/db/queries/solves';
import { insertNotifications, type NotificationKind } from '@/db/queries/notifications';
import { listMembers } from '@/db/queries/workspaces';
import { getUserById } from '@/db/queries/users';
import { findMentions } from '@/lib/teamwork/mentions';
import { sendMail, type OutgoingMail } from './mail';
import { siteOrigin } from './invitations';

function escapeHtml(s: string) {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

export function commentMail(a: { to: string; kind: NotificationKind; actorName: string; sectionName: string; excerpt: string; url: string; settingsUrl: string }): OutgoingMail {
  const what = a.kind === 'mention' ? `${a.actorName} mentioned you in a comment` : `${a.actorName} commented on your solve`;
  return {
    to: a.to,
    subject: `${what} of ${a.sectionName}`,
    text: `${what} of "${a.sectionName}":\n\n${a.excerpt}\n\nOpen the solve:\n${a.url}\n\nTurn these e-mails off: ${a.settingsUrl}\n`,
    html:
      `<div style="font-family:system-ui,sans-serif;max-width:560px"><p>${escapeHtml(what)} of <strong>${escapeHtml(a.sectionName)}</strong>:</p>` +
      `<blockquote style="border-left:3px solid #d5773b;margin:0;padding:4px 12px;color:#37434a">${escapeHtml(a.excerpt)}</blockquote>` +
      `<p><a href="${escapeHtml(a.url)}">Open the solve</a></p>` +
      `<p style="color:#555;font-size:12px"><a href="${escapeHtml(a.settingsUrl)}">Turn these e-mails off</a></p></div>`,
  };
}

export async function notifyComment(args: { workspaceId: string; solveId: string; commentId: string; authorId: string; body: string }): Promise<{ notified: string[] }> {
  const solve = await getSolve(args.workspaceId, args.solveId);
  if (!solve) return { notified: [] };
  const members = await listMembers(args.workspaceId);
  const actor = members.find((m) => m.userId === args.authorId);
  const mentioned = new Set(findMentions(args.body, members.map((m) => ({ id: m.userId, name: m.name, email: m.email }))));
  const targets = new Map<string, NotificationKind>();
  for (const id of mentioned) if (id !== args.authorId) targets.set(id, 'mention');
  if (solve.author && solve.author.id !== args.authorId && !targets.has(solve.author.id) && members.some((m) => m.userId === solve.author!.id)) {
    targets.set(solve.author.id, 'comment');
  }
  const excerpt = args.body.length > 280 ? `${args.body.slice(0, 277)}…` : args.body;
  const data = { solveId: args.solveId, commentId: args.commentId, actorName: actor?.name ?? 'Someone', sectionName: solve.sectionName, excerpt };
  await insertNotifications([...targets].map(([userId, kind]) => ({ userId, workspaceId: args.workspaceId, kind, data })));
  const url = `${siteOrigin()}/w/${args.workspaceId}/solves/${args.solveId}`;
  const settingsUrl = `${siteOrigin()}/w/${args.workspaceId}/notifications`;
  for (const [userId, kind] of targets) {
    const u = await getUserById(userId);
    if (!u || !u.notifyByEmail) continue;
    try {
      await sendMail(commentMail({ to: u.email, kind, actorName: data.actorName, sectionName: data.sectionName, excerpt, url, settingsUrl }));
    } catch (e) {
      console.error('Edgefield: notification mail failed', e);
    }
  }
  return { notified: [...targets.keys()] };
}

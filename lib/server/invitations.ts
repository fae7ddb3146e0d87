import 'server-only';
/**
 * Invitations by e-mail: a random 32-byte token goes into the link; only its SHA-256 is
 * stored, so a database copy cannot be used to join. The mail is sent through nodemailer
 * (lib/server/mail.ts: real SMTP by configuration, the fake SMTP server in demo mode).
 */
import crypto from 'node:crypto';
import { getDb } from '@/db/client';
import { INVITATION_TTL_MS, countPendingInvitations, insertInvitation } from '@/db/queries/invitations';
import { countMembers } from '@/db/queries/members';
import { getMembershipRow, getWorkspace, lockWorkspaceForLimits } from '@/db/queries/workspaces';
import { getUserByEmail } from '@/db/queries/users';
import type { Role } from '@/db/schema';
import { ApiError } from './http';
import { sendMail, type OutgoingMail } from './mail';
import { assertMemberLimit } from './plans';

export function newToken(): string {
  return crypto.randomBytes(32).toString('base64url');
}

export function hashToken(token: string): string {
  return crypto.createHash('sha256').update(token, 'utf8').digest('hex');
}

/** Tokens are 43 base64url characters; anything else cannot be one. */
export function isTokenShape(token: unknown): token is string {
  return typeof token === 'string' && /^[A-Za-z0-9_-]{43}$/.test(token);
}

/** The site's own origin for links in mails (NEXTAUTH_URL, set at start-up). */
export function siteOrigin(): string {
  const u = process.env.NEXTAUTH_URL || `http://localhost:${process.env.PORT || 3000}`;
  return u.replace(/\/+$/, '');
}

function escapeHtml(s: string) {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

const ROLE_WORDS: Record<Role, string> = {
  owner: 'an owner (manage members and edit everything)',
  editor: 'an editor (draw and change sections, save solves)',
  viewer: 'a viewer (open sections and solves, comment)',
};

export function invitationMail(a: { to: string; url: string; workspaceName: string; inviterName: string; role: Role; expiresAt: Date }): OutgoingMail {
  const when = a.expiresAt.toUTCString().replace(/ GMT$/, ' UTC');
  return {
    to: a.to,
    subject: `${a.inviterName} invited you to ${a.workspaceName} on Edgefield`,
    text:
      `${a.inviterName} invited you to join the workspace "${a.workspaceName}" on Edgefield as ${ROLE_WORDS[a.role]}.\n\n` +
      `Accept the invitation:\n${a.url}\n\n` +
      `The link works once and expires on ${when}. If you do not know the sender, ignore this mail.\n`,
    html:
      `<div style="font-family:system-ui,sans-serif;max-width:520px">` +
      `<p style="font-size:16px"><strong>${escapeHtml(a.inviterName)}</strong> invited you to join ` +
      `<strong>${escapeHtml(a.workspaceName)}</strong> on Edgefield as ${escapeHtml(ROLE_WORDS[a.role])}.</p>` +
      `<p><a href="${escapeHtml(a.url)}" data-invite-link style="display:inline-block;padding:10px 16px;background:#0f4c5c;color:#fff;border-radius:6px;text-decoration:none">Accept the invitation</a></p>` +
      `<p style="color:#555;font-size:13px">Or paste this link into your browser:<br>${escapeHtml(a.url)}</p>` +
      `<p style="color:#555;font-size:13px">The link works once and expires on ${escapeHtml(when)}. If you do not know the sender, ignore this mail.</p>` +
      `</div>`,
  };
}

/**
 * Invite `email` to the workspace with `role` (the caller has checked that `actor` is an
 * owner). 409 when the address already belongs to a member; 402 when the plan's member
 * limit is reached. Sends the mail after the invitation is stored; if sending fails the
 * invitation is revoked again and the error says so.
 */
export async function inviteByEmail(args: { workspaceId: string; email: string; role: Role; actor: { id: string; name: string } }) {
  const { workspaceId, email, role, actor } = args;
  const ws = await getWorkspace(workspaceId);
  if (!ws) throw new ApiError(404, 'not_found', 'The workspace was not found.');
  const existing = await getUserByEmail(email);
  if (existing && (await getMembershipRow(existing.id, workspaceId)))
    throw new ApiError(409, 'already_member', `${email} is already a member of this workspace.`, 'email');
  const db = await getDb();
  const token = newToken();
  const expiresAt = new Date(Date.now() + INVITATION_TTL_MS);
  const inv = await db.transaction(async (tx) => {
    // The workspace row lock serialises concurrent invitations of one workspace, so together
    // they cannot pass the member limit; the plan is read under the same lock.
    const locked = await lockWorkspaceForLimits(tx, workspaceId);
    if (!locked) throw new ApiError(404, 'not_found', 'The workspace was not found.');
    const members = await countMembers(workspaceId, tx);
    const pending = await countPendingInvitations(workspaceId, tx);
    await assertMemberLimit(locked.plan, members + pending);
    return insertInvitation({ workspaceId, email, role, tokenHash: hashToken(token), invitedBy: actor.id, expiresAt }, tx);
  });
  const url = `${siteOrigin()}/invite/${token}`;
  try {
    await sendMail(invitationMail({ to: email, url, workspaceName: ws.name, inviterName: actor.name, role, expiresAt }));
  } catch (e) {
    console.error('Edgefield: invitation mail failed', e);
    const { revokeInvitation } = await import('@/db/queries/invitations');
    await revokeInvitation(workspaceId, inv.id, actor.id);
    throw new ApiError(502, 'mail_failed', 'The invitation mail could not be sent, so no invitation was made. Check the e-mail settings and try again.');
  }
  return { invitation: { id: inv.id, email: inv.email, role: inv.role, expiresAt: inv.expiresAt, createdAt: inv.createdAt } };
}

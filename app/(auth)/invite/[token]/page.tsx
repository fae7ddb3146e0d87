import type { Metadata } from 'next';
import { InviteAccept } from '@/components/teamwork/invite-accept';
import { getInvitationByTokenHash } from '@/db/queries/invitations';
import { getUserByEmail } from '@/db/queries/users';
import { getMembershipRow } from '@/db/queries/workspaces';
import { hashToken, isTokenShape } from '@/lib/server/invitations';
import { getSessionUser } from '@/lib/server/session';

export const metadata: Metadata = { title: 'Invitation' };
export const dynamic = 'force-dynamic';

/**
 * The page an invitation mail links to. It shows which workspace and role the link is for,
 * and lets the invited person create an account, sign in, or (signed in) join.
 */
export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const inv = isTokenShape(token) ? await getInvitationByTokenHash(hashToken(token)) : null;
  const user = await getSessionUser();
  if (!inv) {
    return <InviteAccept token={token} state={{ kind: 'invalid' }} />;
  }
  const view = {
    workspaceName: inv.workspaceName,
    email: inv.email,
    role: inv.role,
    invitedByName: inv.invitedByName,
    expiresAt: inv.expiresAt.toISOString(),
  };
  if (inv.state !== 'pending') {
    const member = user ? await getMembershipRow(user.id, inv.workspaceId) : null;
    return (
      <InviteAccept
        token={token}
        state={{ kind: inv.state, invitation: view, memberWorkspaceId: member ? inv.workspaceId : null }}
      />
    );
  }
  if (user) {
    const matches = user.email.toLowerCase() === inv.email.toLowerCase();
    return (
      <InviteAccept
        token={token}
        state={{ kind: matches ? 'join' : 'wrong_account', invitation: view, signedInAs: user.email }}
      />
    );
  }
  const hasAccount = Boolean(await getUserByEmail(inv.email));
  return <InviteAccept token={token} state={{ kind: hasAccount ? 'sign_in' : 'sign_up', invitation: view }} />;
}

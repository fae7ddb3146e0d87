'use server';
/**
 * Accepting an invitation (issue 7). Two server actions used by /invite/[token]:
 * - `acceptInvitation(token)`: the signed-in person joins (their e-mail must be the invited one).
 * - `signUpWithInvitation(token, form)`: a new person creates an account for the invited
 *   address and joins in one transaction; the page then signs in with the credentials.
 * Both return a discriminated status, never throw for expected refusals.
 */
import { getDb } from '@/db/client';
import { InvitationError, acceptInvitationTx, getInvitationByTokenHash } from '@/db/queries/invitations';
import { getUserByEmail, insertUser } from '@/db/queries/users';
import { inviteSignUpSchema } from '@/lib/validations/members';
import { hashPassword } from '../auth-options';
import { hashToken, isTokenShape } from '../invitations';
import { RATE_LIMIT_MESSAGE, takeForAction } from '../rate-limit';
import { getSessionUser } from '../session';

export type AcceptState =
  | { status: 'ok'; workspaceId: string; role: string }
  | { status: 'error'; code: string; message: string; fieldErrors?: Partial<Record<'name' | 'password', string>> };

const INVALID: AcceptState = {
  status: 'error',
  code: 'not_found',
  message: 'This invitation link is not valid. Ask the workspace owner for a new one.',
};

export async function acceptInvitation(token: string): Promise<AcceptState> {
  if (!isTokenShape(token)) return INVALID;
  const user = await getSessionUser();
  if (!user) return { status: 'error', code: 'unauthorized', message: 'Sign in to accept the invitation.' };
  const db = await getDb();
  try {
    const out = await db.transaction((tx) => acceptInvitationTx(tx, hashToken(token), user));
    return { status: 'ok', ...out };
  } catch (e) {
    if (e instanceof InvitationError) return { status: 'error', code: e.code, message: e.message };
    console.error('Edgefield: accepting an invitation failed', e);
    return { status: 'error', code: 'internal', message: 'Could not accept the invitation. Please try again.' };
  }
}

export async function signUpWithInvitation(token: string, input: { name: string; password: string }): Promise<AcceptState> {
  if (!isTokenShape(token)) return INVALID;
  if (!(await takeForAction('sign-up:ip')).ok) return { status: 'error', code: 'rate_limited', message: RATE_LIMIT_MESSAGE };
  const parsed = inviteSignUpSchema.safeParse(input);
  if (!parsed.success) {
    const fieldErrors: Partial<Record<'name' | 'password', string>> = {};
    for (const issue of parsed.error.issues) {
      const k = issue.path[0];
      if ((k === 'name' || k === 'password') && !fieldErrors[k]) fieldErrors[k] = issue.message;
    }
    return { status: 'error', code: 'invalid', message: 'Please correct the marked fields.', fieldErrors };
  }
  const inv = await getInvitationByTokenHash(hashToken(token));
  if (!inv) return INVALID;
  if (await getUserByEmail(inv.email)) {
    return {
      status: 'error',
      code: 'account_exists',
      message: `An account for ${inv.email} already exists. Sign in to accept the invitation.`,
    };
  }
  const passwordHash = await hashPassword(parsed.data.password);
  const db = await getDb();
  try {
    const out = await db.transaction(async (tx) => {
      const user = await insertUser({ email: inv.email, name: parsed.data.name, passwordHash, emailVerified: new Date() }, tx);
      return acceptInvitationTx(tx, hashToken(token), user);
    });
    return { status: 'ok', ...out };
  } catch (e) {
    if (e instanceof InvitationError) return { status: 'error', code: e.code, message: e.message };
    if (await getUserByEmail(inv.email)) {
      return { status: 'error', code: 'account_exists', message: `An account for ${inv.email} already exists. Sign in to accept the invitation.` };
    }
    console.error('Edgefield: sign-up through an invitation failed', e);
    return { status: 'error', code: 'internal', message: 'Could not create the account. Please try again.' };
  }
}

import 'server-only';
import { cache } from 'react';
import { cookies, headers } from 'next/headers';
import { redirect } from 'next/navigation';
import { getSessionUserRow } from '@/db/queries/users';
import { getAuthSecret } from './secret';
import { readSessionToken, sessionCookieName, sessionUserId } from './session-token';

export interface SessionUser {
  id: string;
  email: string;
  name: string;
}

/**
 * The signed-in user (checked against the database, so a removed account is signed out at
 * once), or null. Memoised per request while rendering (layout and page share one lookup).
 */
export const getSessionUser = cache(async function getSessionUser(): Promise<SessionUser | null> {
  // The session cookie decrypted as next-auth does (lib/server/session-token.ts), without
  // running next-auth's session endpoint per request.
  const token = readSessionToken((await cookies()).getAll(), sessionCookieName(await headers()));
  const id = await sessionUserId(token, getAuthSecret());
  if (!id) return null;
  const user = await getSessionUserRow(id);
  if (!user) return null;
  return { id: user.id, email: user.email, name: user.name ?? user.email };
});

/** For pages and layouts: the signed-in user, or a redirect to /login. */
export async function requireUser(): Promise<SessionUser> {
  const user = await getSessionUser();
  if (!user) redirect('/login');
  return user;
}

import 'server-only';
import { cache } from 'react';
import { getServerSession } from 'next-auth';
import { redirect } from 'next/navigation';
import { getUserById } from '@/db/queries/users';
import { getAuthOptions } from './auth-options';

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
  const session = await getServerSession(getAuthOptions());
  const id = (session?.user as { id?: string } | undefined)?.id;
  if (!id) return null;
  const user = await getUserById(id);
  if (!user) return null;
  return { id: user.id, email: user.email, name: user.name ?? user.email };
});

/** For pages and layouts: the signed-in user, or a redirect to /login. */
export async function requireUser(): Promise<SessionUser> {
  const user = await getSessionUser();
  if (!user) redirect('/login');
  return user;
}

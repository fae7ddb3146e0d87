import 'server-only';
import { eq } from 'drizzle-orm';
import { getDb, type DbOrTx } from '../client';
import { users, type User } from '../schema';

export interface PublicUser {
  id: string;
  email: string;
  name: string;
}

export function toPublicUser(u: Pick<User, 'id' | 'email' | 'name'>): PublicUser {
  return { id: u.id, email: u.email, name: u.name ?? u.email };
}

export async function getUserById(id: string): Promise<User | null> {
  const db = await getDb();
  const [row] = await db.select().from(users).where(eq(users.id, id)).limit(1);
  return row ?? null;
}

/** The columns a signed-in request needs (not the password hash), by id; null when the account is gone. */
export async function getSessionUserRow(id: string): Promise<Pick<User, 'id' | 'email' | 'name'> | null> {
  const db = await getDb();
  const [row] = await db.select({ id: users.id, email: users.email, name: users.name }).from(users).where(eq(users.id, id)).limit(1);
  return row ?? null;
}

export async function getUserByEmail(email: string): Promise<User | null> {
  const db = await getDb();
  const [row] = await db.select().from(users).where(eq(users.email, email.trim().toLowerCase())).limit(1);
  return row ?? null;
}

/** Insert a user (e-mail stored lower-case). Throws on a duplicate e-mail (unique index). */
export async function insertUser(
  data: { email: string; name: string; passwordHash?: string | null; emailVerified?: Date | null },
  db?: DbOrTx,
): Promise<User> {
  const d = db ?? (await getDb());
  const [row] = await d
    .insert(users)
    .values({
      email: data.email.trim().toLowerCase(),
      name: data.name,
      passwordHash: data.passwordHash ?? null,
      emailVerified: data.emailVerified ?? null,
    })
    .returning();
  return row!;
}

/**
 * next-auth 4 configuration: e-mail + password (Credentials, bcrypt) and e-mail sign-in
 * links (Email provider through nodemailer), JWT sessions, users and link tokens stored
 * through @auth/drizzle-adapter.
 *
 * Built lazily by `getAuthOptions()` (the secret may be read from the data folder, which
 * `next build` must never touch). The adapter is wrapped in an object that names each
 * method and awaits the database (next-auth reads the adapter's keys: a Proxy fails).
 */
import bcrypt from 'bcryptjs';
import type { NextAuthOptions } from 'next-auth';
import type { Adapter } from 'next-auth/adapters';
import CredentialsProvider from 'next-auth/providers/credentials';
import EmailProvider from 'next-auth/providers/email';
import { DrizzleAdapter } from '@auth/drizzle-adapter';
import { getDb } from '@/db/client';
import { accounts, sessions, users, verificationTokens } from '@/db/schema';
import { getUserByEmail } from '@/db/queries/users';
import { insertWorkspace } from '@/db/queries/workspaces';
import { signInSchema } from '@/lib/validations/auth';
import { getAuthSecret } from './secret';
import { mailFrom, sendMail, signInMail } from './mail';

/** bcrypt cost factor (2^12 rounds). */
export const BCRYPT_COST = 12;

export async function hashPassword(plain: string): Promise<string> {
  return bcrypt.hash(plain, BCRYPT_COST);
}

export async function verifyPassword(plain: string, hash: string): Promise<boolean> {
  return bcrypt.compare(plain, hash);
}

/** A constant hash to compare against when the user does not exist (same time either way). */
const DUMMY_HASH = '$2b$12$C6UzMDM.H6dfI/f/IKcEeO5F4mZp3u2mv6m9cQm0r3Z5P0Zx6bq8e';

type AnyFn = (...args: never[]) => unknown;

function lazyDrizzleAdapter(): Adapter {
  let real: Promise<Record<string, AnyFn>> | undefined;
  const get = () =>
    (real ??= getDb().then(
      (db) =>
        DrizzleAdapter(db, {
          usersTable: users as never,
          accountsTable: accounts as never,
          sessionsTable: sessions as never,
          verificationTokensTable: verificationTokens as never,
        }) as unknown as Record<string, AnyFn>,
    ));
  const call =
    (name: string) =>
    async (...args: unknown[]) => {
      const a = await get();
      const fn = a[name] as ((...x: unknown[]) => unknown) | undefined;
      if (!fn) throw new Error(`adapter method ${name} missing`);
      return fn(...args);
    };
  return {
    createUser: call('createUser'),
    getUser: call('getUser'),
    getUserByEmail: call('getUserByEmail'),
    getUserByAccount: call('getUserByAccount'),
    updateUser: call('updateUser'),
    deleteUser: call('deleteUser'),
    linkAccount: call('linkAccount'),
    unlinkAccount: call('unlinkAccount'),
    createSession: call('createSession'),
    getSessionAndUser: call('getSessionAndUser'),
    updateSession: call('updateSession'),
    deleteSession: call('deleteSession'),
    createVerificationToken: call('createVerificationToken'),
    useVerificationToken: call('useVerificationToken'),
  } as Adapter;
}

let cached: NextAuthOptions | undefined;

export function getAuthOptions(): NextAuthOptions {
  if (cached) return cached;
  cached = {
    secret: getAuthSecret(),
    adapter: lazyDrizzleAdapter(),
    // Credentials only works with JWT sessions; set explicitly because an adapter is present.
    session: { strategy: 'jwt', maxAge: 30 * 24 * 60 * 60 },
    pages: {
      signIn: '/login',
      verifyRequest: '/login?check=email',
      error: '/login',
    },
    providers: [
      CredentialsProvider({
        id: 'credentials',
        name: 'E-mail and password',
        credentials: {
          email: { label: 'E-mail', type: 'email' },
          password: { label: 'Password', type: 'password' },
        },
        async authorize(raw) {
          const parsed = signInSchema.safeParse(raw ?? {});
          if (!parsed.success) return null;
          const user = await getUserByEmail(parsed.data.email);
          const ok = await verifyPassword(parsed.data.password, user?.passwordHash ?? DUMMY_HASH);
          if (!user || !user.passwordHash || !ok) return null;
          return { id: user.id, email: user.email, name: user.name ?? user.email };
        },
      }),
      EmailProvider({
        from: mailFrom(),
        maxAge: 24 * 60 * 60,
        // Not used (sendVerificationRequest below sends), but the provider requires a value.
        server: { host: '127.0.0.1', port: 25 },
        async sendVerificationRequest({ identifier, url }) {
          await sendMail(signInMail(identifier, url));
        },
      }),
    ],
    callbacks: {
      async jwt({ token, user }) {
        if (user) {
          token.sub = user.id;
          token.email = user.email;
          token.name = user.name;
        }
        return token;
      },
      async session({ session, token }) {
        if (session.user) {
          (session.user as { id?: string }).id = token.sub;
        }
        return session;
      },
    },
    events: {
      // A person who first arrives through an e-mail link gets a workspace of their own.
      async createUser({ user }) {
        const label = user.name || user.email?.split('@')[0] || 'My';
        await insertWorkspace({ name: `${label}'s workspace`, ownerId: user.id });
      },
    },
  };
  return cached;
}

/**
 * Sign-in and sign-up on a migrated database: the demo seed, passwords stored only as bcrypt
 * hashes (cost ≥ 10), the credentials provider's authorize(), the sign-up server action
 * (validation, duplicate e-mail → field error, a workspace of one's own), the lazily wrapped
 * Drizzle adapter used by e-mail links.
 */
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
vi.mock('server-only', () => ({}));

import { eq, sql } from 'drizzle-orm';
import type { AdapterUser } from 'next-auth/adapters';
import { setDbForTesting, type DbHandle } from '@/db/client';
import { memberships, sectionRevisions, sections, users, workspaces } from '@/db/schema';
import { listWorkspacesForUser } from '@/db/queries/workspaces';
import { seedDemo } from '@/lib/demo/seed';
import { DEMO_ACCOUNTS, DEMO_WORKSPACE_NAME, OTHER_DEMO_ACCOUNT } from '@/lib/demo/accounts';
import { getAuthOptions } from '@/lib/server/auth-options';
import { signUp } from '@/lib/server/actions/auth';
import { sectionSchema } from '@/lib/section/schema';
import { parseSectionValue } from '@/lib/section/parse';
import { createTestDb } from './helpers/db';

let handle: DbHandle;
const prevSecret = process.env.NEXTAUTH_SECRET;

beforeAll(async () => {
  process.env.NEXTAUTH_SECRET = 'test-secret-not-used-anywhere-else';
  handle = await createTestDb();
  setDbForTesting(handle);
  expect(await seedDemo(handle.db)).toBe(true);
});
afterAll(async () => {
  if (prevSecret === undefined) delete process.env.NEXTAUTH_SECRET;
  else process.env.NEXTAUTH_SECRET = prevSecret;
  setDbForTesting(undefined);
  await handle?.close();
});

type Authorize = (c: Record<string, string>, req: unknown) => Promise<{ id: string; email: string } | null>;
function authorize(): Authorize {
  const p = getAuthOptions().providers.find((x) => x.id === 'credentials') as unknown as { options: { authorize: Authorize } };
  return p.options.authorize;
}

describe('demo seed', () => {
  it('creates the fictional team with owner, editor and viewer, and a second team apart', async () => {
    const ws = await handle.db.select().from(workspaces);
    expect(ws.map((w) => w.name)).toContain(DEMO_WORKSPACE_NAME);
    const main = ws.find((w) => w.name === DEMO_WORKSPACE_NAME)!;
    const members = await handle.db.select().from(memberships).where(eq(memberships.workspaceId, main.id));
    expect(members.map((m) => m.role).sort()).toEqual(['editor', 'owner', 'viewer']);
    const [other] = await handle.db.select().from(users).where(eq(users.email, OTHER_DEMO_ACCOUNT.email));
    const otherWs = await listWorkspacesForUser(other!.id);
    expect(otherWs).toHaveLength(1);
    expect(otherWs[0]!.id).not.toBe(main.id);
  });

  it('seeds several sections whose every revision is a valid section file', async () => {
    const secs = await handle.db.select().from(sections);
    expect(secs.length).toBeGreaterThanOrEqual(5);
    const revs = await handle.db.select().from(sectionRevisions);
    for (const r of revs) expect(sectionSchema.safeParse(r.content).success).toBe(true);
    for (const s of secs) {
      const latest = revs.find((r) => r.id === s.latestRevisionId);
      expect(latest, s.name).toBeDefined();
      // Resolved and checked as the solver will see it: no errors (a real, solvable drawing).
      const checked = parseSectionValue(latest!.content);
      expect(checked.ok, `${s.name}: ${checked.ok ? '' : checked.message}`).toBe(true);
    }
    expect(revs.some((r) => r.number > 1)).toBe(true); // some history to look at
  });

  it('seeds only once', async () => {
    expect(await seedDemo(handle.db)).toBe(false);
    const [n] = await handle.db.select({ n: sql<number>`count(*)::int` }).from(workspaces);
    expect(Number(n!.n)).toBe(2);
  });

  it('stores passwords only as bcrypt hashes of cost ≥ 10', async () => {
    const rows = await handle.db.select().from(users);
    for (const a of DEMO_ACCOUNTS) {
      const u = rows.find((r) => r.email === a.email)!;
      expect(u.passwordHash).not.toContain(a.password);
      const m = /^\$2[aby]\$(\d\d)\$/.exec(u.passwordHash!);
      expect(m).not.toBeNull();
      expect(Number(m![1])).toBeGreaterThanOrEqual(10);
    }
  });
});

describe('credentials sign-in', () => {
  it('accepts the right password, case-insensitive e-mail', async () => {
    const a = DEMO_ACCOUNTS[0]!;
    const u = await authorize()({ email: a.email.toUpperCase(), password: a.password }, {});
    expect(u?.email).toBe(a.email);
  });
  it('refuses a wrong password, an unknown e-mail and junk', async () => {
    const a = DEMO_ACCOUNTS[1]!;
    expect(await authorize()({ email: a.email, password: a.password + 'x' }, {})).toBeNull();
    expect(await authorize()({ email: 'nobody@harrowlane.example', password: 'whatever-long' }, {})).toBeNull();
    expect(await authorize()({ email: 'not an email', password: '' }, {})).toBeNull();
  });
});

describe('sign-up action', () => {
  const form = (o: Record<string, string>) => {
    const f = new FormData();
    for (const [k, v] of Object.entries(o)) f.set(k, v);
    return f;
  };

  it('creates the account with a hashed password and a workspace of its own', async () => {
    const r = await signUp({ status: 'idle' }, form({ name: 'Pia Lund', email: 'Pia.Lund@Example.com', password: 'a-long-enough-password' }));
    expect(r).toEqual({ status: 'ok', email: 'pia.lund@example.com' });
    const [u] = await handle.db.select().from(users).where(eq(users.email, 'pia.lund@example.com'));
    expect(u!.passwordHash).toMatch(/^\$2[aby]\$/);
    const ws = await listWorkspacesForUser(u!.id);
    expect(ws).toEqual([expect.objectContaining({ role: 'owner', name: "Pia Lund's workspace" })]);
    expect(await authorize()({ email: 'pia.lund@example.com', password: 'a-long-enough-password' }, {})).not.toBeNull();
  });

  it('refuses a known e-mail with a field error', async () => {
    const r = await signUp({ status: 'idle' }, form({ name: 'Again', email: DEMO_ACCOUNTS[0]!.email, password: 'another-long-password' }));
    expect(r.status).toBe('error');
    if (r.status === 'error') expect(r.fieldErrors.email).toMatch(/already exists/);
  });

  it('reports each invalid field', async () => {
    const r = await signUp({ status: 'idle' }, form({ name: '', email: 'nope', password: 'short' }));
    expect(r.status).toBe('error');
    if (r.status === 'error') expect(Object.keys(r.fieldErrors).sort()).toEqual(['email', 'name', 'password']);
  });
});

describe('e-mail link adapter', () => {
  it('names every method and works through the lazily opened database', async () => {
    const adapter = getAuthOptions().adapter!;
    for (const k of ['createUser', 'getUserByEmail', 'createVerificationToken', 'useVerificationToken', 'getUserByAccount']) {
      expect(typeof (adapter as Record<string, unknown>)[k]).toBe('function');
    }
    const found = (await adapter.getUserByEmail!(DEMO_ACCOUNTS[2]!.email)) as AdapterUser | null;
    expect(found?.email).toBe(DEMO_ACCOUNTS[2]!.email);
    const expires = new Date(Date.now() + 60_000);
    await adapter.createVerificationToken!({ identifier: 'x@test.example', token: 'hashed-token', expires });
    const used = await adapter.useVerificationToken!({ identifier: 'x@test.example', token: 'hashed-token' });
    expect(used?.identifier).toBe('x@test.example');
    expect(await adapter.useVerificationToken!({ identifier: 'x@test.example', token: 'hashed-token' })).toBeNull();
  });

  it('gives a person who first arrives by e-mail link a workspace of their own', async () => {
    const opts = getAuthOptions();
    const created = (await opts.adapter!.createUser!({ email: 'newcomer@test.example', emailVerified: null } as never)) as AdapterUser;
    await opts.events!.createUser!({ user: created });
    const ws = await listWorkspacesForUser(created.id);
    expect(ws).toEqual([expect.objectContaining({ role: 'owner' })]);
  });
});

/**
 * The authorisation matrix of EVERY server action, generated from
 * tests/integration/actions-table.ts: each exported function of each 'use server' module is
 * called as each actor (session mocked), the outcome compared with the table, and a refused
 * call must change nothing stored. A scan of the source fails when an action exists that the
 * table does not list (module exports and inline 'use server' functions).
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';

vi.mock('server-only', () => ({}));
const auth = vi.hoisted(() => ({ user: null as null | { id: string; email: string; name: string } }));
vi.mock('@/lib/server/session', () => ({
  getSessionUser: async () => auth.user,
  requireUser: async () => {
    if (!auth.user) throw new Error('redirect /login');
    return auth.user;
  },
}));
vi.mock('@/lib/server/mail', async (importOriginal) => ({
  ...(await importOriginal<typeof import('@/lib/server/mail')>()),
  sendMail: async () => {},
}));
// bcrypt at the production cost takes seconds per account on two shared cores; who may call an
// action does not depend on the hash (tests/integration/auth-and-seed.test.ts checks real hashes).
vi.mock('@/lib/server/auth-options', async (importOriginal) => ({
  ...(await importOriginal<typeof import('@/lib/server/auth-options')>()),
  hashPassword: async (plain: string) => `test-only-hash:${plain.length}`,
}));

import { and, eq } from 'drizzle-orm';
import { setDbForTesting, type DbHandle } from '@/db/client';
import { invitations, memberships, users } from '@/db/schema';
import { resetRateLimits } from '@/lib/server/rate-limit';
import { ACTIONS, INLINE_ACTIONS, type ActionCtx, type ActionRow } from './actions-table';
import { snapshotTables } from './helpers/db-snapshot';
import { createTestDb } from './helpers/db';
import { buildWorld, type World } from './helpers/fixtures';
import { exportedNames, isServerActionModule, scanServerActions } from './helpers/server-actions-scan';
import { actorUser, addShareHolders, randomToken, sha256Hex, type ShareHolders } from './helpers/share-holders';
import { ACTORS, ACTOR_LABEL, type Actor } from './routes-table';

const ROOT = path.resolve('.');

let handle: DbHandle;
let w: World;
let holders: ShareHolders;
let ctx: ActionCtx;
let seq = 0;

beforeAll(async () => {
  handle = await createTestDb();
  setDbForTesting(handle);
  w = await buildWorld(handle.db);
  holders = await addShareHolders(handle.db, w);
  ctx = {
    db: handle.db,
    w,
    holders,
    freshEmail: (prefix) => `${prefix}-${++seq}@test.example`,
    async invite(opts = {}) {
      const token = randomToken();
      const email = opts.email ?? `invitee-${++seq}@test.example`;
      await handle.db.insert(invitations).values({
        workspaceId: w.wsA,
        email,
        role: opts.role ?? 'editor',
        tokenHash: sha256Hex(token),
        invitedBy: w.users.owner.id,
        expiresAt: new Date(Date.now() + 7 * 86400e3),
      });
      return { token, email };
    },
    shareToken: (actor) => (actor === 'shareHolder' || actor === 'shareHolderSignedIn' ? holders.sectionToken : undefined),
  };
});
afterAll(async () => {
  setDbForTesting(undefined);
  await handle?.close();
});

type ActionFn = (...args: unknown[]) => Promise<unknown>;

async function actionFn(row: ActionRow): Promise<ActionFn> {
  const mod = (await import(/* @vite-ignore */ path.join(ROOT, row.file))) as Record<string, unknown>;
  const fn = mod[row.name];
  if (typeof fn !== 'function') throw new Error(`${row.file} exports no function ${row.name}`);
  return fn as ActionFn;
}

function outcomeOf(r: unknown): string {
  const s = r as { status?: string; code?: string } | null;
  if (s?.status === 'ok') return 'ok';
  return s?.code ?? `error (${JSON.stringify(r)})`;
}

async function membershipsOf(userId: string | undefined) {
  if (!userId) return [];
  const rows = await handle.db.select({ ws: memberships.workspaceId, role: memberships.role }).from(memberships).where(eq(memberships.userId, userId));
  return rows.map((r) => `${r.ws}:${r.role}`).sort();
}

describe.each(ACTIONS.map((r) => [`${r.name} (${r.file})`, r] as const))('%s', (_n, row) => {
  ACTORS.forEach((actor: Actor, i) => {
    const expected = row.expect[i]!;
    it(`${row.name} as ${ACTOR_LABEL[actor]} → ${expected}`, async () => {
      const fn = await actionFn(row);
      const user = actorUser(actor, w, holders);
      const args = await row.args(ctx, actor);
      resetRateLimits(); // the sign-up bucket would otherwise run dry over the matrix
      const before = expected === 'ok' ? null : await snapshotTables(handle);
      const mineBefore = await membershipsOf(user?.id);
      auth.user = user;
      const r = await fn(...args);
      expect(outcomeOf(r), JSON.stringify(r)).toBe(expected);
      if (expected !== 'ok') {
        expect((r as { message?: string }).message?.length ?? 0).toBeGreaterThan(10);
        expect(await snapshotTables(handle), 'a refused action changed stored data').toEqual(before);
      }
      // No action in the table gives the caller's own account anything (the invitee's path is below).
      expect(await membershipsOf(user?.id)).toEqual(mineBefore);
    });
  });
});

describe('what the successful calls did', () => {
  it('signUpWithInvitation: the new account joins A with the invited role, nothing more', async () => {
    const row = ACTIONS.find((r) => r.name === 'signUpWithInvitation')!;
    const { token, email } = await ctx.invite({ role: 'viewer' });
    auth.user = w.users.owner; // someone else's session does not matter
    resetRateLimits();
    const r = (await (await actionFn(row))(token, { name: 'Invited Person', password: 'a-long-enough-password' })) as { status: string; workspaceId: string; role: string };
    expect(r).toMatchObject({ status: 'ok', workspaceId: w.wsA, role: 'viewer' });
    const [u] = await handle.db.select().from(users).where(eq(users.email, email));
    expect(await membershipsOf(u!.id)).toEqual([`${w.wsA}:viewer`]);
  });

  it('acceptInvitation: the invited person, signed in, joins with the invited role; the link then stops working', async () => {
    const row = ACTIONS.find((r) => r.name === 'acceptInvitation')!;
    const [invitee] = await handle.db.insert(users).values({ email: 'invitee-accepts@test.example', name: 'Invitee' }).returning();
    const { token } = await ctx.invite({ email: invitee!.email, role: 'editor' });
    auth.user = { id: invitee!.id, email: invitee!.email, name: 'Invitee' };
    const fn = await actionFn(row);
    expect(await fn(token)).toEqual({ status: 'ok', workspaceId: w.wsA, role: 'editor' });
    const [m] = await handle.db.select().from(memberships).where(and(eq(memberships.userId, invitee!.id), eq(memberships.workspaceId, w.wsA)));
    expect(m!.role).toBe('editor');
    expect(outcomeOf(await fn(token))).toBe('accepted');
  });
});

describe('the action table covers every server action', () => {
  const scan = scanServerActions(ROOT);

  it('finds the action modules', () => {
    expect(scan.modules.map((m) => m.file)).toEqual(expect.arrayContaining(['lib/server/actions/auth.ts', 'lib/server/actions/invitations.ts']));
  });

  it.each(scan.modules.map((m) => [m.file, m] as const))("%s: every export is in tests/integration/actions-table.ts", async (_f, m) => {
    expect(m.exports, `${m.file}: 'export *' cannot be checked; export each action by name`).not.toContain('*');
    for (const name of m.exports) {
      expect(
        ACTIONS.some((r) => r.file === m.file && r.name === name),
        `server action ${name} in ${m.file} is not in tests/integration/actions-table.ts`,
      ).toBe(true);
    }
    // The text scan agrees with what the module really exports at run time.
    const mod = (await import(/* @vite-ignore */ path.join(ROOT, m.file))) as Record<string, unknown>;
    const fns = Object.keys(mod).filter((k) => typeof mod[k] === 'function');
    expect(fns.sort()).toEqual([...m.exports].sort());
  });

  it('every row names an exported action of a use-server module', () => {
    for (const r of ACTIONS) {
      const m = scan.modules.find((x) => x.file === r.file);
      expect(m, `${r.file} is not a 'use server' module`).toBeDefined();
      expect(m!.exports, `${r.file} does not export ${r.name}`).toContain(r.name);
    }
  });

  it('every inline use-server function is listed', () => {
    for (const d of scan.inline) {
      expect(
        INLINE_ACTIONS.some((x) => x.file === d.file && x.line === d.line),
        `inline server action at ${d.file}:${d.line} is not in INLINE_ACTIONS of tests/integration/actions-table.ts`,
      ).toBe(true);
    }
    for (const x of INLINE_ACTIONS) expect(scan.inline, `${x.file}:${x.line} no longer holds an inline action`).toContainEqual({ file: x.file, line: x.line });
  });

  it('the scan sees module directives, exports and inline directives (and not mere mentions)', () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'edgefield-actions-scan-'));
    try {
      fs.mkdirSync(path.join(dir, 'app', 'x'), { recursive: true });
      fs.mkdirSync(path.join(dir, 'node_modules', 'pkg'), { recursive: true });
      fs.writeFileSync(
        path.join(dir, 'app', 'x', 'actions.ts'),
        "/** header */\n// more\n'use server';\nimport { z } from 'zod';\nexport type S = { a: 1 };\nexport async function a() {}\nexport const b = async () => 1;\nasync function c() {}\nexport { c as d };\n// export async function commented() {}\n",
      );
      fs.writeFileSync(
        path.join(dir, 'app', 'x', 'page.tsx'),
        "export default function Page() {\n  async function save() {\n    'use server';\n  }\n  return null;\n}\n// a comment about 'use server' modules\n",
      );
      fs.writeFileSync(path.join(dir, 'app', 'x', 'plain.ts'), "export const note = \"files with 'use server' on top\";\n");
      fs.writeFileSync(path.join(dir, 'node_modules', 'pkg', 'index.js'), "'use server';\nexport async function hidden() {}\n");
      fs.mkdirSync(path.join(dir, 'tests'), { recursive: true });
      fs.writeFileSync(path.join(dir, 'tests', 'fake.ts'), "'use server';\nexport async function notShipped() {}\n");
      fs.mkdirSync(path.join(dir, 'lib', 'data'), { recursive: true });
      fs.writeFileSync(path.join(dir, 'lib', 'data', 'save.ts'), "// saves\n\"use server\"\nexport async function save() {}\n");
      const s = scanServerActions(dir);
      expect(s.modules).toEqual([
        { file: 'app/x/actions.ts', exports: ['a', 'b', 'd'] },
        { file: 'lib/data/save.ts', exports: ['save'] },
      ]);
      expect(s.inline).toEqual([{ file: 'app/x/page.tsx', line: 3 }]);
      expect(isServerActionModule('"use client";\n')).toBe(false);
      expect(exportedNames("'use server';\nexport default async function go() {}\nexport * from './x';\n")).toEqual(['default', '*']);
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});

/**
 * The authorisation matrix of the server-rendered pages and layouts, generated from
 * tests/integration/pages-table.ts: each default export is called as each actor (session
 * mocked; redirect() and notFound() are Next's own, recognised by their digest). A scan fails
 * when a page or layout that reads data on the server is not in the table.
 */
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';

vi.mock('server-only', () => ({}));
const auth = vi.hoisted(() => ({ user: null as null | { id: string; email: string; name: string } }));
vi.mock('@/lib/server/session', async () => {
  const { redirect } = await import('next/navigation');
  return {
    getSessionUser: async () => auth.user,
    // As lib/server/session.ts: the signed-in user, or Next's redirect to /login.
    requireUser: async () => {
      if (!auth.user) redirect('/login');
      return auth.user;
    },
  };
});

import { setDbForTesting, type DbHandle } from '@/db/client';
import { createTestDb } from './helpers/db';
import { buildWorld, type World } from './helpers/fixtures';
import { notTheirs, workspaceMarkers } from './helpers/markers';
import { actorUser, addShareHolders, type ShareHolders } from './helpers/share-holders';
import { PAGES, type PageOutcome, type PageRow } from './pages-table';
import { ACTORS, ACTOR_LABEL, type Actor } from './routes-table';

const APP = path.resolve('app');

let handle: DbHandle;
let w: World;
let holders: ShareHolders;

beforeAll(async () => {
  handle = await createTestDb();
  setDbForTesting(handle);
  w = await buildWorld(handle.db);
  holders = await addShareHolders(handle.db, w);
});
afterAll(async () => {
  setDbForTesting(undefined);
  await handle?.close();
});

type PageFn = (props: { params: Promise<Record<string, string>>; searchParams: Promise<Record<string, string>>; children: null }) => Promise<unknown>;

/**
 * The element tree a page returns, as text: the props it hands to its children (what would
 * travel to the browser). Cycles and React's bookkeeping fields are skipped.
 */
function treeText(tree: unknown): string {
  const seen = new WeakSet<object>();
  return JSON.stringify(tree, (k, v) => {
    if (k === '_owner' || k === '_store' || k.startsWith('_debug')) return undefined;
    if (typeof v === 'function') return undefined;
    if (v && typeof v === 'object') {
      if (seen.has(v)) return undefined;
      seen.add(v);
    }
    return v;
  }) ?? '';
}

async function open(
  row: PageRow,
  actor: Actor,
  params?: Record<string, string>,
  searchParams?: Record<string, string>,
): Promise<{ outcome: PageOutcome; detail: string }> {
  const mod = (await import(/* @vite-ignore */ path.join(APP, row.file))) as { default: PageFn };
  auth.user = actorUser(actor, w, holders);
  const share: Record<string, string> = actor === 'shareHolder' || actor === 'shareHolderSignedIn' ? { token: holders.sectionToken, share: holders.sectionToken } : {};
  const was = process.env.EDGEFIELD_DEMO;
  if (row.demo) process.env.EDGEFIELD_DEMO = '1';
  try {
    const tree = await mod.default({
      params: Promise.resolve(params ?? row.params?.(w) ?? {}),
      searchParams: Promise.resolve({ ...(row.searchParams ?? {}), ...(searchParams ?? {}), ...share }),
      children: null,
    });
    return { outcome: 'render', detail: treeText(tree) };
  } catch (e) {
    const digest = String((e as { digest?: unknown }).digest ?? '');
    if (digest.startsWith('NEXT_REDIRECT')) {
      const to = digest.split(';')[2] ?? '';
      return { outcome: to === '/login' || to.startsWith('/login?') ? 'login' : 'redirect', detail: to };
    }
    if (digest === 'NEXT_HTTP_ERROR_FALLBACK;404') return { outcome: 'not_found', detail: '' };
    throw e;
  } finally {
    if (was === undefined) delete process.env.EDGEFIELD_DEMO;
    else process.env.EDGEFIELD_DEMO = was;
  }
}

/** Markers of the workspaces an actor is not in (a redirect or a rendered tree must hold none). */
function foreignMarkers(actor: Actor): string[] {
  return notTheirs(actor).flatMap((ws) => workspaceMarkers(w, ws));
}

describe.each(PAGES.map((r) => [`app/${r.file}`, r] as const))('%s', (name, row) => {
  ACTORS.forEach((actor, i) => {
    const expected = row.expect[i]!;
    it(`${name} as ${ACTOR_LABEL[actor]} → ${expected}`, async () => {
      const r = await open(row, actor);
      expect(r.outcome, r.detail.slice(0, 300)).toBe(expected);
      for (const m of foreignMarkers(actor)) expect(r.detail.includes(m), `${ACTOR_LABEL[actor]} was handed "${m}"`).toBe(false);
    });
  });
  if (row.foreignParams) {
    it(`${name} as owner of A with another workspace’s ids → not_found`, async () => {
      expect((await open(row, 'owner', row.foreignParams!(w))).outcome).toBe('not_found');
    });
  }
  for (const c of row.crossQueries ?? []) {
    it(`${name} as owner of A with ${c.what} → render, nothing of B`, async () => {
      const q = c.searchParams(w);
      const r = await open(row, 'owner', undefined, q);
      expect(r.outcome).toBe('render');
      // The caller's own query may be echoed back; nothing else of B may appear.
      const sent = new Set(Object.values(q));
      for (const m of workspaceMarkers(w, 'B').filter((x) => !sent.has(x))) expect(r.detail.includes(m), `owner of A was handed "${m}"`).toBe(false);
    });
  }
  if (row.demo) {
    it(`${name} outside demo mode → not_found`, async () => {
      const r = await open({ ...row, demo: false }, 'owner');
      expect(r.outcome).toBe('not_found');
    });
  }
});

describe('the page table covers every page and layout that reads data on the server', () => {
  const files: string[] = [];
  const walk = (d: string) => {
    for (const e of fs.readdirSync(d, { withFileTypes: true })) {
      const p = path.join(d, e.name);
      if (e.isDirectory()) {
        if (e.name !== 'api') walk(p);
      } else if (/^(page|layout)\.tsx$/.test(e.name)) files.push(path.relative(APP, p).split(path.sep).join('/'));
    }
  };
  walk(APP);
  const readsData = (f: string) => /from\s+['"]@\/(db\/|lib\/server\/)/.test(fs.readFileSync(path.join(APP, f), 'utf8'));

  it('finds pages that read data', () => {
    expect(files.filter(readsData).length).toBeGreaterThanOrEqual(10);
  });

  it.each(files.filter(readsData))('app/%s is in tests/integration/pages-table.ts', (f) => {
    expect(PAGES.some((p) => p.file === f), `app/${f} reads data on the server but is not in tests/integration/pages-table.ts`).toBe(true);
  });

  it('every row names an existing page or layout', () => {
    for (const p of PAGES) expect(fs.existsSync(path.join(APP, p.file)), `app/${p.file}`).toBe(true);
  });
});

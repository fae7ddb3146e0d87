/**
 * The authorisation matrix of EVERY API route handler, generated from
 * tests/integration/routes-table.ts: one test per row × actor (signed out, viewer, editor,
 * owner, member of another workspace, share-link holder signed out and signed in). The
 * exported GET/POST/... functions are called directly with a Request; the session is mocked
 * (lib/server/session.ts) so each call runs as a chosen user. The database is a migrated
 * in-memory PGlite clone (or DATABASE_URL's server).
 */
import fs from 'node:fs';
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

// Invitation mails (issue 7) are not sent from this test; tests/integration/teamwork-members.test.ts checks them.
vi.mock('@/lib/server/mail', async (importOriginal) => ({
  ...(await importOriginal<typeof import('@/lib/server/mail')>()),
  sendMail: async () => {},
}));

import { setDbForTesting, type DbHandle } from '@/db/client';
import { setSolveField } from '@/db/queries/solves';
import { snapshotTables } from './helpers/db-snapshot';
import { notTheirs, workspaceMarkers } from './helpers/markers';
import { createTestDb } from './helpers/db';
import { buildWorld, type World } from './helpers/fixtures';
import { actorUser, addShareHolders, setPublicLinks, type ShareHolders } from './helpers/share-holders';
import { ACTORS, ACTOR_LABEL, OK, ROUTES, UNCHECKED_ROUTES, expectedFor, type Actor, type Expected, type Method, type RouteRow } from './routes-table';

const API_DIR = path.resolve('app/api');

let handle: DbHandle;
let w: World;
let holders: ShareHolders;
const wasDemo = process.env.EDGEFIELD_DEMO;

beforeAll(async () => {
  process.env.EDGEFIELD_DEMO = '1'; // the demo mailbox route answers only in demo mode
  handle = await createTestDb();
  setDbForTesting(handle);
  w = await buildWorld(handle.db);
  holders = await addShareHolders(handle.db, w);
  await setSolveField(w.wsA, w.solveA, null, new Uint8Array([69, 70, 76, 68]));
});
afterAll(async () => {
  if (wasDemo === undefined) delete process.env.EDGEFIELD_DEMO;
  else process.env.EDGEFIELD_DEMO = wasDemo;
  setDbForTesting(undefined);
  await handle?.close();
});

function routeExists(row: RouteRow) {
  return fs.existsSync(path.join(API_DIR, row.file, 'route.ts'));
}

let counter = 0;
type CallUser = { id: string; email: string; name: string } | null;
interface CallOpts {
  params?: Record<string, string>;
  shareToken?: string;
  /** Replaces the row's body (JSON). */
  body?: unknown;
  /** Replaces the row's query. */
  query?: string;
}
async function call(row: RouteRow, who: CallUser, opts: CallOpts = {}) {
  const { params, shareToken } = opts;
  auth.user = who;
  const mod = (await import(/* @vite-ignore */ path.join(API_DIR, row.file, 'route.ts'))) as Record<
    string,
    (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>
  >;
  const fn = mod[row.method];
  if (!fn) throw new Error(`${row.file} exports no ${row.method}`);
  const n = ++counter;
  const headers: Record<string, string> = {};
  const init: RequestInit = { method: row.method, headers };
  if (row.rawBody) {
    const { contentType, data } = row.rawBody(w);
    init.body = data as unknown as BodyInit;
    headers['content-type'] = contentType;
  } else if (opts.body !== undefined || row.body) {
    init.body = JSON.stringify(opts.body !== undefined ? opts.body : row.body!(w, n));
    headers['content-type'] = 'application/json';
  }
  let query = opts.query ?? row.query ?? '';
  if (shareToken) {
    const t = encodeURIComponent(shareToken);
    query += `${query ? '&' : '?'}token=${t}&share=${t}`;
    headers.authorization = `Bearer ${shareToken}`;
    headers['x-share-token'] = shareToken;
    headers.cookie = `edgefield-share=${t}; share=${t}`;
  }
  const req = new Request(`http://localhost/api/${row.file}${query}`, init);
  const res = await fn(req, { params: Promise.resolve(params ?? row.params?.(w) ?? {}) });
  const text = await res.text();
  let json: unknown = null;
  try {
    json = JSON.parse(text);
  } catch {
    /* binary body */
  }
  return { status: res.status, text, json: json as { error?: { code: string; message: string } } | null };
}

function expectErrorShape(json: { error?: { code: string; message: string } } | null) {
  expect(json?.error).toBeDefined();
  expect(typeof json!.error!.code).toBe('string');
  expect(json!.error!.message.length).toBeGreaterThan(3);
}

const rows = ROUTES.filter(routeExists);

/** Who makes the call for each actor, and whether they hold a share token. */
function caller(actor: Actor) {
  return { user: actorUser(actor, w, holders), share: actor === 'shareHolder' || actor === 'shareHolderSignedIn' };
}

function expectNoMarkers(text: string, wss: ('A' | 'B')[], who: string) {
  for (const ws of wss) for (const m of workspaceMarkers(w, ws)) expect(text.includes(m), `${who} received "${m}" of workspace ${ws}`).toBe(false);
}

async function callAs(row: RouteRow, actor: Actor, opts: { withToken?: boolean } = {}) {
  const { user, share } = caller(actor);
  if (!share && !opts.withToken) return call(row, user);
  // The holder of a link to A's solve (routes about solves) or to A's section (the rest),
  // while A allows public links, presenting the token every way a client could.
  const token = row.file.includes('[solveId]') ? holders.solveToken : holders.sectionToken;
  await setPublicLinks(handle.db, w.wsA, true);
  try {
    return await call(row, user, { shareToken: token });
  } finally {
    await setPublicLinks(handle.db, w.wsA, false);
  }
}

describe.each(rows.map((r) => [`${r.method} /api/${r.file}`, r] as const))('%s', (name, row) => {
  for (const actor of ACTORS) {
    const e = expectedFor(row.expect, actor);
    it(`${name} as ${ACTOR_LABEL[actor]} → ${e === OK ? row.ok.join(' or ') : e}`, async () => {
      const r = await callAs(row, actor);
      if (e === OK) {
        expect(row.ok, JSON.stringify(r.json)).toContain(r.status);
        expectNoMarkers(r.text, notTheirs(actor), ACTOR_LABEL[actor]);
      } else {
        expect(r.status, JSON.stringify(r.json)).toBe(e);
        expectErrorShape(r.json);
      }
    });
  }

  // A member of B who also holds a link of A: the token adds nothing to the B member's column.
  const other = expectedFor(row.expect, 'otherWorkspace');
  it(`${name} as member of another workspace holding a share link of A → ${other === OK ? row.ok.join(' or ') : other}`, async () => {
    const r = await callAs(row, 'otherWorkspace', { withToken: true });
    if (other === OK) {
      expect(row.ok, JSON.stringify(r.json)).toContain(r.status);
      expectNoMarkers(r.text, notTheirs('otherWorkspace'), 'member of B with a token of A');
    } else {
      expect(r.status, JSON.stringify(r.json)).toBe(other);
      expectErrorShape(r.json);
    }
  });

  if (row.access === 'public' || row.access === 'user') return;

  if (row.foreignParams) {
    it(`${name} as owner of A with another workspace’s ids → 404`, async () => {
      const r = await call(row, w.users.owner, { params: row.foreignParams!(w) });
      expect(r.status).toBe(404);
      expectErrorShape(r.json);
    });
  }

  // Path ids swapped one at a time for workspace B's (only rows with several ids: with one id
  // this is the test above).
  const idKeys = row.foreignParams ? [...row.file.matchAll(/\[(\w+)\]/g)].map((m) => m[1]!).filter((k) => k !== 'workspaceId') : [];
  if (idKeys.length > 1) {
    for (const k of idKeys) {
      it(`${name} as owner of A with only ${k} of another workspace → 404`, async () => {
        const r = await call(row, w.users.owner, { params: { ...row.params!(w), [k]: row.foreignParams!(w)[k]! } });
        expect(r.status).toBe(404);
        expectErrorShape(r.json);
      });
    }
  }

  for (const c of row.crossIds ?? []) {
    it(`${name} as owner of A with ${c.what} → ${c.status}`, async () => {
      const before = await snapshotTables(handle);
      const r = await call(row, w.users.owner, { body: c.body?.(w), query: c.query?.(w) });
      expect(r.status, JSON.stringify(r.json)).toBe(c.status);
      if (c.status >= 400) expectErrorShape(r.json);
      expectNoMarkers(r.text, ['B'], 'owner of A');
      expect(await snapshotTables(handle), 'stored data changed').toEqual(before);
    });
  }

  it(`${name} as owner with malformed ids → 404`, async () => {
    const p = Object.fromEntries(Object.keys(row.params!(w)).map((k) => [k, "x'; drop table users;--"]));
    const r = await call(row, w.users.owner, { params: p });
    expect(r.status).toBe(404);
  });
});

describe('demo-only routes outside demo mode', () => {
  const row = ROUTES.find((r) => r.file === 'demo/mailbox' && r.method === 'GET')!;
  for (const actor of ACTORS) {
    it(`GET /api/demo/mailbox without EDGEFIELD_DEMO as ${ACTOR_LABEL[actor]} → 404`, async () => {
      const was = process.env.EDGEFIELD_DEMO;
      delete process.env.EDGEFIELD_DEMO;
      try {
        const r = await callAs(row, actor);
        expect(r.status).toBe(404);
        expectErrorShape(r.json);
      } finally {
        if (was === undefined) delete process.env.EDGEFIELD_DEMO;
        else process.env.EDGEFIELD_DEMO = was;
      }
    });
  }
});

describe('the matrix is consistent', () => {
  const refusal = (e: Expected) => e !== OK;
  it.each(ROUTES.map((r) => [`${r.method} /api/${r.file}`, r] as const))('%s', (_n, row) => {
    const col = (a: Actor) => expectedFor(row.expect, a);
    expect(row.expect).toHaveLength(ACTORS.length);
    // Signed out: allowed (public) or 401; never 403/404, which would say more than "sign in".
    expect([OK, 401]).toContain(col('signedOut'));
    // Roles are ordered: what a viewer may do an editor may, what an editor may an owner may.
    if (col('viewer') === OK) expect(col('editor')).toBe(OK);
    if (col('editor') === OK) expect(col('owner')).toBe(OK);
    // A member below the needed role learns it (403); existence is never hidden from members.
    for (const r of ['viewer', 'editor', 'owner'] as const) if (refusal(col(r))) expect(col(r)).toBe(403);
    // Someone outside A gets 404 for A's data (existence never leaks), or the route is theirs too.
    if (row.access !== 'public' && row.access !== 'user') expect(col('otherWorkspace')).toBe(404);
    // A share token adds nothing on the API: the holder gets what the same person without it gets.
    expect(col('shareHolder')).toBe(col('signedOut'));
    expect(col('shareHolderSignedIn')).toBe(col('otherWorkspace'));
  });

  it('every row names an existing route file', () => {
    for (const r of ROUTES) expect(routeExists(r), `app/api/${r.file}/route.ts does not exist`).toBe(true);
  });

  it('no (route, method) is listed twice', () => {
    const keys = ROUTES.map((r) => `${r.method} ${r.file}`);
    expect(new Set(keys).size).toBe(keys.length);
  });
});

describe('the route table covers every route handler', () => {
  const METHOD_RE = /export\s+(?:const|async function|function)\s+(GET|POST|PUT|PATCH|DELETE|HEAD|OPTIONS)\b|\bas\s+(GET|POST|PUT|PATCH|DELETE|HEAD|OPTIONS)\b/g;
  const files: string[] = [];
  const walk = (d: string) => {
    for (const e of fs.readdirSync(d, { withFileTypes: true })) {
      const p = path.join(d, e.name);
      if (e.isDirectory()) walk(p);
      else if (e.name === 'route.ts') files.push(path.relative(API_DIR, path.dirname(p)).split(path.sep).join('/'));
    }
  };
  walk(API_DIR);

  it('finds the route files', () => {
    expect(files.length).toBeGreaterThanOrEqual(10);
  });

  it.each(files)('app/api/%s: every exported method is in the table', (file) => {
    if (UNCHECKED_ROUTES.some((u) => u.file === file)) return;
    const src = fs.readFileSync(path.join(API_DIR, file, 'route.ts'), 'utf8');
    const methods = new Set<Method>();
    for (const m of src.matchAll(METHOD_RE)) methods.add((m[1] ?? m[2]) as Method);
    expect(methods.size, `${file} exports no handler`).toBeGreaterThan(0);
    for (const m of methods) {
      expect(
        ROUTES.some((r) => r.file === file && r.method === m),
        `${m} /api/${file} is not in tests/integration/routes-table.ts`,
      ).toBe(true);
    }
  });
});

describe('bodies and errors', () => {
  const post = async (file: string, params: Record<string, string>, body: string, headers: Record<string, string> = {}) => {
    auth.user = w.users.editor;
    const mod = (await import(/* @vite-ignore */ path.join(API_DIR, file, 'route.ts'))) as Record<
      string,
      (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>
    >;
    const res = await mod.POST!(
      new Request('http://localhost/x', { method: 'POST', body, headers: { 'content-type': 'application/json', ...headers } }),
      { params: Promise.resolve(params) },
    );
    return { status: res.status, json: (await res.json()) as { error: { code: string; message: string; field?: string } } };
  };

  it('invalid section content → 422 naming the field', async () => {
    const r = await post('workspaces/[workspaceId]/sections', { workspaceId: w.wsA }, JSON.stringify({ name: 'x', content: { format: 'edgefield.section/1', units: 'furlong', nets: [], shapes: [] } }));
    expect(r.status).toBe(422);
    expect(r.json.error.code).toBe('invalid');
    expect(r.json.error.field).toBe('content.units');
  });

  it('malformed JSON → 400, NUL characters → 422, oversized → 413', async () => {
    const params = { workspaceId: w.wsA };
    expect((await post('workspaces/[workspaceId]/sections', params, '{"name": ')).status).toBe(400);
    const nul = await post('workspaces/[workspaceId]/sections', params, JSON.stringify({ name: 'a\u0000b', content: {} }));
    expect(nul.status).toBe(422);
    expect(nul.json.error.field).toBe('name');
    const big = await post('workspaces/[workspaceId]/sections', params, JSON.stringify({ name: 'x'.repeat(3 * 1024 * 1024) }));
    expect(big.status).toBe(413);
    expect(big.json.error.code).toBe('too_large');
  });

  it('saves a section in progress but reports its check errors; a clean one reports ok', async () => {
    const { coaxSection } = await import('./helpers/fixtures');
    const shorted = coaxSection();
    // The core grown into the shield ring: two nets touching, a short circuit.
    shorted.shapes[1] = { id: 'core', type: 'circle', cx: 0, cy: 0, r: 2, conductor: 'core' };
    const params = { workspaceId: w.wsA };
    const bad = await post('workspaces/[workspaceId]/sections', params, JSON.stringify({ name: 'Shorted', content: shorted }));
    expect(bad.status).toBe(201);
    const badChecks = (bad.json as unknown as { checks: { ok: boolean; stage?: string; issues?: { code: string }[] } }).checks;
    expect(badChecks.ok).toBe(false);
    expect(badChecks.stage).toBe('check');
    const good = await post('workspaces/[workspaceId]/sections', params, JSON.stringify({ name: 'Clean', content: coaxSection() }));
    expect((good.json as unknown as { checks: { ok: boolean } }).checks.ok).toBe(true);
  });

  it('a stale baseRevisionId → 409 and nothing saved', async () => {
    const params = { workspaceId: w.wsA, sectionId: w.sectionA };
    const first = await post(`workspaces/[workspaceId]/sections/[sectionId]/revisions`, params, JSON.stringify({ content: (await import('./helpers/fixtures')).coaxSection(), baseRevisionId: w.revisionA }));
    // The table run above already saved newer revisions, so revisionA is stale.
    expect(first.status).toBe(409);
    expect(first.json.error.code).toBe('conflict');
  });

  it('the same solve twice → 201 then 200 with the same id', async () => {
    const body = JSON.stringify({
      sectionId: w.sectionA,
      revisionId: w.revisionA,
      settings: { preset: 'standard' },
      settingsHash: 'dedupe-route',
      result: (await import('./helpers/fixtures')).fakeResult(),
      status: 'done',
    });
    const a = await post('workspaces/[workspaceId]/solves', { workspaceId: w.wsA }, body);
    const b = await post('workspaces/[workspaceId]/solves', { workspaceId: w.wsA }, body);
    expect(a.status).toBe(201);
    expect(b.status).toBe(200);
    expect((b.json as unknown as { solve: { id: string } }).solve.id).toBe((a.json as unknown as { solve: { id: string } }).solve.id);
  });
});

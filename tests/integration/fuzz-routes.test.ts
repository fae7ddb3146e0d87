/**
 * Hostile input at EVERY API route (issue 8), generated from tests/integration/routes-table.ts.
 * Each row is called in-process (as in route-roles.test.ts) by the least role that may call it,
 * so the access check passes and the input reaches validation:
 *
 * - params: each path id replaced, one at a time, by a hostile id (huge, unicode, SQL, '../',
 *   NUL, uuid-like but wrong, a well-formed uuid that does not exist), with junk query keys;
 * - query: every key the route's query schema reads (found from the route source's
 *   `parseSearchParams(req, schema)` call) plus junk keys, with NaN/Infinity/huge numbers,
 *   long strings, unicode, SQL/script fragments and repeated keys;
 * - body (JSON rows): each top-level field of the row's valid body given a value of the wrong
 *   type, malformed JSON, wrong top-level types, deep nesting, 10 MB, a wrong content type;
 *   and free-text strings (unicode, script, SQL) that may legitimately be accepted;
 * - raw (octet-stream / CSV / multipart rows): hostile bytes, sizes and content types.
 *
 * Asserted: never a 5xx, never a thrown exception; a 4xx carries `{ error: { code, message } }`
 * and leaves every table unchanged (helpers/db-snapshot.ts); a success is allowed only where the
 * hostile value is legitimately acceptable, and then the answer carries the text exactly as sent
 * (escaping is the renderer's job). Expectations: common practice, no published source.
 */
import fs from 'node:fs';
import path from 'node:path';
import fc from 'fast-check';
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

import type { ZodType } from 'zod';
import { setDbForTesting, type DbHandle } from '@/db/client';
import { setSolveField } from '@/db/queries/solves';
import { solves } from '@/db/schema';
import { createTestDb } from './helpers/db';
import { snapshotTables } from './helpers/db-snapshot';
import { buildWorld, fakeResult, type World } from './helpers/fixtures';
import { multipartBody } from './helpers/multipart';
import { ROUTES, UNCHECKED_ROUTES, type RouteRow } from './routes-table';

const SEED = 20261202; // fixed: a failure is reproducible
const RUNS = 12; // per route and kind of input: keeps the file well under 90 s on a loaded machine
const API_DIR = path.resolve('app/api');
const TEN_MB = 10 * 1024 * 1024;
const BIG = 'a'.repeat(TEN_MB);

type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;

let handle: DbHandle;
let w: World;
/** A solve of A without a stored field: hostile bytes sent to it reach the field decoder. */
let solveWithoutField: string;
const wasDemo = process.env.EDGEFIELD_DEMO;
beforeAll(async () => {
  process.env.EDGEFIELD_DEMO = '1'; // the demo mailbox answers only in demo mode
  handle = await createTestDb();
  setDbForTesting(handle);
  w = await buildWorld(handle.db);
  await setSolveField(w.wsA, w.solveA, null, new Uint8Array([69, 70, 76, 68]));
  const [s] = await handle.db
    .insert(solves)
    .values({ workspaceId: w.wsA, sectionId: w.sectionA, revisionId: w.revisionA, settings: { preset: 'quick' }, settingsHash: 'fuzz-no-field', result: fakeResult(), status: 'done', authorId: w.users.editor.id })
    .returning();
  solveWithoutField = s!.id;
});

/**
 * Raw-body rows whose own target would refuse every body before reading it: the field row's
 * solveA already holds a field (409), so its bytes go to a solve without one.
 */
const RAW_PARAMS: Record<string, (w: World) => Record<string, string>> = {
  'PUT /api/workspaces/[workspaceId]/solves/[solveId]/field': (w) => ({ workspaceId: w.wsA, solveId: solveWithoutField }),
};
afterAll(async () => {
  if (wasDemo === undefined) delete process.env.EDGEFIELD_DEMO;
  else process.env.EDGEFIELD_DEMO = wasDemo;
  setDbForTesting(undefined);
  await handle?.close();
});

// ---------------------------------------------------------------- hostile values

const hostileIds = fc.oneof(
  fc.constantFrom(
    'x'.repeat(100_000),
    '\u202e\u0645\u0631\u062d\u0628\u0627',
    '\ud83d\ude00',
    "x'; drop table users;--",
    "1' or '1'='1",
    '../../etc/passwd',
    '..',
    'a\u0000b',
    '00000000-0000-0000-0000-00000000000g', // uuid-like, not a uuid
    '00000000-0000-0000-0000-000000000000', // a uuid that does not exist
    'ffffffff-ffff-ffff-ffff-ffffffffffff0',
    '<script>alert(1)</script>',
    '%00',
    '',
    ' ',
    'NaN',
    '-1',
    '1e999',
  ),
  fc.uuid().map((u) => `${u}x`),
  fc.uuid(),
  fc.string({ minLength: 1, maxLength: 80, unit: 'binary' }),
);

const nastyText = fc.constantFrom(
  'NaN', 'Infinity', '-Infinity', '1e999', '-1e999', '5e-324', '0x10', '9'.repeat(400), '', ' ',
  '\u202e\u0645\u0631\u062d\u0628\u0627', '<script>alert(1)</script>', '"><img src=x onerror=alert(1)>',
  "'; drop table users; --", "1' or '1'='1", '${process.exit()}', '__proto__', 'constructor',
  '\ud83d\ude00'.repeat(50), 'a\u0000b', '\ud800', 'x'.repeat(20_000), '../../etc/passwd',
);
const queryValue = fc.oneof(nastyText, fc.string({ maxLength: 40, unit: 'binary' }), fc.double().map(String), fc.integer().map(String));
const junkKey = fc.oneof(fc.constantFrom('__proto__', 'constructor', 'limit[]', 'a.b', '', '\u0000', 'token', 'workspaceId'), fc.string({ maxLength: 12 }));

/** Free text that a name or message may legitimately hold (no NUL, not too long). */
const freeText = fc.oneof(
  fc.constantFrom('\u202e\u0645\u0631\u062d\u0628\u0627', '<script>alert(1)</script>', "'; drop table users; --", '\ud83d\ude00 Ω µm ε', '${x}', 'NaN'),
  fc.string({ minLength: 1, maxLength: 40, unit: 'grapheme' }),
);

/** A value of another JSON type than `v` (or an absurd one of the same type). */
function wrongTypeFor(v: unknown): fc.Arbitrary<unknown> {
  const numbers = fc.constantFrom<unknown>(1e308, -1e308, 5e-324, -1, 0, 2 ** 53 + 1);
  const objects = fc.constantFrom<unknown>({}, { $gt: '' }, { __proto__: { admin: true } }, [], [1, 2], [[[[]]]]);
  const others = fc.constantFrom<unknown>(null, true, false, 'NaN', 'Infinity', '<script>', "'; drop table x;--");
  if (typeof v === 'string') return fc.oneof(numbers, objects, fc.constantFrom<unknown>(null, true, false), fc.constant('x'.repeat(2_000_000)), fc.constant(`a\u0000b`));
  if (typeof v === 'number') return fc.oneof(others, objects, fc.constantFrom<unknown>('1', '1e999'));
  if (typeof v === 'boolean') return fc.oneof(numbers, objects, fc.constantFrom<unknown>(null, 'true', 'false', '1'));
  if (Array.isArray(v)) return fc.oneof(numbers, others, fc.constant<unknown>({}), fc.constant<unknown>([null]));
  if (v && typeof v === 'object') return fc.oneof(numbers, others, fc.constant<unknown>([v]), fc.constant<unknown>([]));
  return fc.oneof(numbers, others, objects);
}

/**
 * Places in a row's valid body that its schema keeps as sent by design, so a value of another
 * type there may be accepted: a solve's settings are free-form (z.record of unknown), and its
 * result is a loose object of which only the parts every view relies on are validated
 * (lib/validations/solve.ts, sectionResultSchema).
 */
const RESULT_CHECKED = [['format'], ['reference'], ['nets'], ['capacitance'], ['capacitance', 'maxwell'], ['capacitance', 'mutual'], ['capacitance', 'vacuum'], ['errorEstimate'], ['errorEstimate', 'relative'], ['mesh'], ['mesh', 'nodes'], ['line'], ['plates']];
const LOOSE_PLACES: Record<string, (p: (string | number)[]) => boolean> = {
  'POST /api/workspaces/[workspaceId]/solves': (p) =>
    (p[0] === 'settings' && p.length >= 2) ||
    (p[0] === 'result' && p.length >= 2 && !RESULT_CHECKED.some((c) => c.length <= p.length - 1 && c.every((k, i) => p[i + 1] === k))),
};

/** Every place in a valid body (fields, nested fields, first array items), down to depth 4. */
function valuePaths(v: unknown, p: (string | number)[] = [], out: (string | number)[][] = []): (string | number)[][] {
  if (p.length) out.push(p);
  if (p.length >= 4 || !v || typeof v !== 'object') return out;
  if (Array.isArray(v)) v.slice(0, 2).forEach((x, i) => valuePaths(x, [...p, i], out));
  else for (const [k, x] of Object.entries(v)) valuePaths(x, [...p, k], out);
  return out;
}
function valueAt(v: unknown, p: (string | number)[]): unknown {
  return p.reduce<unknown>((cur, k) => (cur as Record<string | number, unknown>)[k], v);
}
function withValueAt(v: unknown, p: (string | number)[], x: unknown): unknown {
  const out = structuredClone(v) as Record<string | number, unknown>;
  (valueAt(out, p.slice(0, -1)) as Record<string | number, unknown>)[p[p.length - 1]!] = x;
  return out;
}

const deep = (n: number) => '['.repeat(n) + ']'.repeat(n);

// ---------------------------------------------------------------- the plan per row

function routeSource(row: RouteRow) {
  return fs.readFileSync(path.join(API_DIR, row.file, 'route.ts'), 'utf8');
}

/** The source of this row's handler (from `export const METHOD` to the next exported handler). */
function handlerSource(row: RouteRow): string {
  const src = routeSource(row);
  const start = src.search(new RegExp(`export (const|async function) ${row.method}\\b`));
  if (start < 0) throw new Error(`app/api/${row.file}/route.ts exports no ${row.method}`);
  const rest = src.slice(start + 1);
  const next = rest.search(/export (const|async function) (GET|POST|PUT|PATCH|DELETE)\b/);
  return next < 0 ? rest : rest.slice(0, next);
}

/**
 * The query keys a route reads: the keys of the zod object it hands to parseSearchParams in the
 * handler of this row's method (the schema is imported from lib/validations/*).
 */
async function queryKeys(row: RouteRow): Promise<string[]> {
  const src = routeSource(row);
  const m = /parseSearchParams\(\s*\w+\s*,\s*(\w+)\s*\)/.exec(handlerSource(row));
  if (!m) return [];
  const name = m[1]!;
  const imp = new RegExp(`import\\s*\\{[^}]*\\b${name}\\b[^}]*\\}\\s*from\\s*'@/([^']+)'`).exec(src);
  if (!imp) throw new Error(`${row.file}: cannot find where ${name} comes from`);
  const mod = (await import(/* @vite-ignore */ path.resolve(imp[1]!))) as Record<string, ZodType & { shape?: Record<string, unknown> }>;
  const shape = mod[name]?.shape;
  if (!shape) throw new Error(`${row.file}: ${name} is not a zod object`);
  return Object.keys(shape);
}

type Kind = 'params' | 'query' | 'body' | 'raw' | 'ignored';
function plan(row: RouteRow): Kind[] {
  const kinds: Kind[] = [];
  if (row.params) kinds.push('params');
  const readsQuery = /parseSearchParams\(/.test(handlerSource(row));
  if (row.method === 'GET' || (readsQuery && row.rawBody)) kinds.push('query');
  if (row.body) kinds.push('body');
  if (row.rawBody) kinds.push('raw');
  // A row that reads nothing the caller controls: junk is sent and must be ignored cleanly.
  if (kinds.length === 0) kinds.push('ignored');
  return kinds;
}

function userFor(row: RouteRow) {
  if (row.access === 'public') return null;
  if (row.access === 'user') return w.users.viewer;
  return w.users[row.access];
}

// ---------------------------------------------------------------- calling a route

interface Call {
  params?: Record<string, string>;
  query?: string;
  body?: BodyInit;
  contentType?: string;
}
async function call(row: RouteRow, c: Call = {}) {
  auth.user = userFor(row);
  const mod = (await import(/* @vite-ignore */ path.join(API_DIR, row.file, 'route.ts'))) as Record<string, Handler>;
  const fn = mod[row.method];
  if (!fn) throw new Error(`${row.file} exports no ${row.method}`);
  const headers: Record<string, string> = {};
  if (c.contentType) headers['content-type'] = c.contentType;
  const init: RequestInit = { method: row.method, headers };
  if (c.body !== undefined) init.body = c.body;
  const req = new Request(`http://localhost/api/${row.file}${c.query ?? row.query ?? ''}`, init);
  let res: Response;
  try {
    res = await fn(req, { params: Promise.resolve(c.params ?? row.params?.(w) ?? {}) });
  } catch (e) {
    throw new Error(`${row.method} /api/${row.file} threw: ${String(e)}`);
  }
  const bytes = new Uint8Array(await res.arrayBuffer());
  const text = new TextDecoder().decode(bytes.slice(0, 200_000));
  let json: unknown = null;
  try {
    json = JSON.parse(text);
  } catch {
    /* a PDF, a field blob, ... */
  }
  return { status: res.status, text, json: json as { error?: { code?: unknown; message?: unknown } } | null };
}
type Result = Awaited<ReturnType<typeof call>>;

const show = (v: unknown) => {
  const s = typeof v === 'string' ? v : v instanceof Uint8Array ? `<${v.byteLength} bytes>` : (JSON.stringify(v) ?? String(v));
  return s.length > 200 ? `${s.slice(0, 200)}… (${s.length} chars)` : s;
};

function expectRefused(r: Result, what: string) {
  const msg = `${r.status} ${r.text.slice(0, 300)} for ${what}`;
  expect(r.status, msg).toBeGreaterThanOrEqual(400);
  expect(r.status, msg).toBeLessThan(500);
  expect(typeof r.json?.error?.code, msg).toBe('string');
  expect(typeof r.json?.error?.message, msg).toBe('string');
  // The caller holds the role the row needs: a 401/403 would mean the hostile input never
  // reached validation (and this test would prove nothing).
  expect([401, 403], `refused before validation: ${msg}`).not.toContain(r.status);
}

/** Never 5xx; a 4xx has the error shape; otherwise one of the row's success statuses. */
function expectHandled(row: RouteRow, r: Result, what: string) {
  if (r.status >= 400) expectRefused(r, what);
  else expect(row.ok, `${r.status} ${r.text.slice(0, 300)} for ${what}`).toContain(r.status);
}

function containsString(v: unknown, s: string, depth = 0): boolean {
  if (typeof v === 'string') return v === s;
  if (!v || typeof v !== 'object' || depth > 20) return false;
  return Object.values(v).some((x) => containsString(x, s, depth + 1));
}

/** A success with a JSON answer: the free text sent comes back exactly as sent. */
function expectEchoed(r: Result, sent: string, what: string) {
  if (r.json === null) return; // not JSON (a PDF): nothing stored to compare
  expect(containsString(r.json, sent), `the answer does not carry ${show(sent)} as sent (${what}): ${r.text.slice(0, 300)}`).toBe(true);
}

const querySuffix = (pairs: [string, string][]) =>
  pairs.length ? `?${pairs.map(([k, v]) => `${encodeURIComponent(k)}=${encodeURIComponent(v)}`).join('&')}` : '';

const junkQuery = fc.array(fc.tuple(junkKey, queryValue), { maxLength: 3 }).map(querySuffix);

// ---------------------------------------------------------------- the tests

const rows = ROUTES;
const covered = new Map<string, Kind[]>();
const key = (r: RouteRow) => `${r.method} /api/${r.file}`;

describe.each(rows.map((r) => [key(r), r] as const))('%s under hostile input', (name, row) => {
  const kinds = plan(row);
  covered.set(name, kinds);

  if (kinds.includes('params')) {
    it('hostile path ids → 4xx with the error shape, nothing stored changes', async () => {
      const ids = Object.keys(row.params!(w));
      const before = await snapshotTables(handle);
      await fc.assert(
        fc.asyncProperty(fc.constantFrom(...ids), hostileIds, junkQuery, async (k, id, q) => {
          const params = { ...row.params!(w), [k]: id };
          const c: Call = { params, query: q };
          if (row.rawBody) {
            const { contentType, data } = row.rawBody(w);
            Object.assign(c, { contentType, body: data });
          } else if (row.body) Object.assign(c, { contentType: 'application/json', body: JSON.stringify(row.body(w, 0)) });
          expectRefused(await call(row, c), `${k}=${show(id)} ${q}`);
        }),
        { numRuns: RUNS, seed: SEED },
      );
      expect(await snapshotTables(handle), 'stored data changed').toEqual(before);
    });
  }

  if (kinds.includes('query')) {
    it('hostile query strings (its own keys, junk keys, repeated keys) → handled, never 5xx', async () => {
      const keys = await queryKeys(row);
      const pair = fc.tuple(keys.length ? fc.oneof(fc.constantFrom(...keys), junkKey) : junkKey, queryValue);
      const qs = fc.array(pair, { minLength: 1, maxLength: 5 }).chain((ps) =>
        // repeated keys: the same key twice with different values
        fc.boolean().map((rep) => querySuffix(rep && ps.length ? [...ps, [ps[0]![0], `${ps[0]![1]}x`]] : ps)),
      );
      const hostileNumbers = ['NaN', 'Infinity', '-Infinity', '1e999', '-1e999', '9'.repeat(400), '0x10', '1.5', '-0', ''];
      const fixed = keys.flatMap((k) => hostileNumbers.map((v) => querySuffix([[k, v]])));
      for (const k of keys) fixed.push(querySuffix([[k, 'a'], [k, 'b']]), querySuffix([[k, 'x'.repeat(100_000)]]));
      fixed.push(`?${'%'.repeat(50)}`, `?a=%E0%A4%A`, `?${'&'.repeat(1000)}`);
      const check = async (q: string) => {
        const before = await snapshotTables(handle);
        const c: Call = { query: q };
        if (row.rawBody) {
          const { contentType, data } = row.rawBody(w);
          Object.assign(c, { contentType, body: data });
        }
        const r = await call(row, c);
        expectHandled(row, r, q);
        if (r.status >= 400 || row.method === 'GET') expect(await snapshotTables(handle), `stored data changed for ${q}`).toEqual(before);
        if (r.status < 400 && row.method !== 'GET') {
          // The only free text a write route reads from its query is a name: it comes back as
          // sent (a repeated key: the last value counts, as in parseSearchParams).
          const sp = new URL(`http://x/${q}`).searchParams;
          for (const k of keys) if (sp.has(k)) expectEchoed(r, sp.getAll(k).at(-1)!, q);
        }
      };
      await fc.assert(fc.asyncProperty(qs, check), { numRuns: RUNS, seed: SEED });
      for (const q of fixed) await check(q);
    });
  }

  if (kinds.includes('body')) {
    it('hostile JSON bodies (wrong types per field, malformed, deep, 10 MB, wrong content type) → 4xx, nothing stored changes', async () => {
      const valid = row.body!(w, 0);
      const fields = valid && typeof valid === 'object' ? Object.entries(valid as Record<string, unknown>) : [];
      const places = valuePaths(valid);
      const loose = LOOSE_PLACES[name] ?? (() => false);
      const perField = places.length
        ? fc.constantFrom(...places).chain((p) => wrongTypeFor(valueAt(valid, p)).map((bad) => ({ body: JSON.stringify(withValueAt(valid, p, bad)), loose: loose(p) })))
        : fc.constant({ body: '{"":1}{', loose: false });
      const body = fc.oneof(
        perField,
        fc.string({ maxLength: 200 }).map((s) => ({ body: `${s}{`, loose: false })), // never valid JSON
        fc
          .oneof(fc.double(), fc.string({ maxLength: 50 }), fc.boolean(), fc.constant(null), fc.array(fc.jsonValue({ maxDepth: 2 }), { maxLength: 5 }))
          .map((v) => ({ body: JSON.stringify(v) ?? 'null', loose: false })),
      );
      let before = await snapshotTables(handle);
      const send = async (b: string, contentType = 'application/json') => expectRefused(await call(row, { body: b, contentType }), show(b));
      await fc.assert(
        fc.asyncProperty(body, async (c) => {
          if (!c.loose) return send(c.body);
          // A place the schema keeps as sent by design: refused, or accepted (then the new
          // baseline is taken after checking that nothing changed before this call).
          expect(await snapshotTables(handle), 'stored data changed').toEqual(before);
          const r = await call(row, { body: c.body, contentType: 'application/json' });
          // (the same revision and settings hash again answers 200 with the solve already stored)
          expectHandled({ ...row, ok: [...row.ok, 200] }, r, show(c.body));
          before = await snapshotTables(handle);
        }),
        { numRuns: RUNS * 2, seed: SEED },
      );
      const first = fields[0]?.[0] ?? 'x';
      for (const b of [deep(50_000), `{"${first}":${deep(20_000)}}`, `{"${first}":"${BIG}"}`, BIG, '\ufeff', '', '\u0000']) await send(b);
      // A wrong content type with a body that is not JSON (form fields, XML).
      await send(`${first}=x&role=owner`, 'application/x-www-form-urlencoded');
      await send(`<${first}>x</${first}>`, 'text/xml');
      expect(await snapshotTables(handle), 'stored data changed').toEqual(before);
    });

    const valid = (() => {
      try {
        return row.body!({ ...({} as World), users: {} as World['users'] } as World, 0);
      } catch {
        return null;
      }
    })();
    const hasText = valuePaths(valid).some((p) => typeof valueAt(valid, p) === 'string');
    if (hasText) {
      it('free text with unicode, markup and SQL in each string field → refused (4xx) or stored exactly as sent', async () => {
        const base = row.body!(w, 0);
        const places = valuePaths(base).filter((p) => typeof valueAt(base, p) === 'string');
        await fc.assert(
          fc.asyncProperty(fc.constantFrom(...places), freeText, fc.nat(1_000_000), async (p, text, n) => {
            const before = await snapshotTables(handle);
            const sent = withValueAt(row.body!(w, n), p, text);
            const what = `${p.join('.')}=${show(text)}`;
            const r = await call(row, { body: JSON.stringify(sent), contentType: 'application/json' });
            expectHandled(row, r, what);
            if (r.status >= 400) expect(await snapshotTables(handle), `stored data changed on a refusal (${what})`).toEqual(before);
            else expectEchoed(r, text, what);
          }),
          { numRuns: RUNS, seed: SEED },
        );
      });
    }
  }

  if (kinds.includes('raw')) {
    it('hostile bytes, sizes and content types → 4xx, nothing stored changes', async () => {
      const { contentType } = row.rawBody!(w);
      const isMultipart = contentType.startsWith('multipart/');
      const svgOk = '<svg xmlns="http://www.w3.org/2000/svg"><rect data-layer="top" x="0" y="0" width="4" height="0.2"/></svg>';
      const types = fc.constantFrom(contentType, 'application/json', 'image/png', 'text/csv', 'multipart/form-data; boundary=zz', 'application/octet-stream', '');
      const junkBytes = fc.oneof(
        fc.uint8Array({ maxLength: 2000 }),
        fc.string({ maxLength: 300, unit: 'binary' }).map((s) => new TextEncoder().encode(s)),
        fc.constantFrom(
          'w,C\n1,NaN\n2,Infinity\n',
          'w,C\n1e999,1\n',
          'only-one-column\n1\n2\n',
          '<script>alert(1)</script>',
          "w,C\n'; drop table files;--,1\n",
          '\ufeff',
          '',
        ).map((s) => new TextEncoder().encode(s)),
      );
      const multipartJunk = fc.oneof(
        fc.record({ name: fc.constant('x.svg'), type: fc.constant('image/svg+xml'), text: fc.string({ maxLength: 300 }) }).map((file) =>
          multipartBody({ file, options: JSON.stringify({ name: 'x', units: 'mm', layers: {} }) }),
        ),
        fc.oneof(fc.jsonValue({ maxDepth: 2 }).map((v) => JSON.stringify(v) ?? 'null'), nastyText).map((options) =>
          multipartBody({ file: { name: 'plate.svg', type: 'image/svg+xml', text: svgOk }, options }),
        ),
        wrongTypeFor('mm').map((u) => multipartBody({ file: { name: 'plate.svg', type: 'image/svg+xml', text: svgOk }, options: JSON.stringify({ name: 'x', units: u, layers: { top: { as: 'conductor', net: 't', role: 'signal' } } }) })),
      );
      const before = await snapshotTables(handle);
      const params = RAW_PARAMS[name]?.(w);
      const send = async (ct: string, data: Uint8Array) =>
        expectRefused(await call(row, { params, contentType: ct || undefined, body: data as unknown as BodyInit }), `${ct} ${show(data)}`);
      await fc.assert(fc.asyncProperty(types, junkBytes, (ct, data) => send(ct, data)), { numRuns: RUNS * 2, seed: SEED });
      if (isMultipart) await fc.assert(fc.asyncProperty(multipartJunk, (m) => send(m.contentType, m.data)), { numRuns: RUNS * 2, seed: SEED });
      const big = new TextEncoder().encode(`w,C\n${'1,2\n'.repeat(TEN_MB / 4)}`);
      await send(contentType, big);
      await send(contentType, new Uint8Array(TEN_MB));
      expect(await snapshotTables(handle), 'stored data changed').toEqual(before);
    });
  }

  if (kinds.includes('ignored')) {
    it('junk query and body that the route does not read → handled, never 5xx', async () => {
      await fc.assert(
        fc.asyncProperty(junkQuery, fc.oneof(fc.string({ maxLength: 100 }), fc.constant(deep(10_000))), async (q, b) => {
          expectHandled(row, await call(row, { query: q, body: b, contentType: 'application/json' }), `${q} ${show(b)}`);
        }),
        { numRuns: RUNS, seed: SEED },
      );
    });
  }
});

describe('fuzz coverage', () => {
  /** What a handler reads from the caller, found in its source: each must be fuzzed. */
  const READS: [RegExp, Kind[]][] = [
    [/\breadParams\(/, ['params']],
    [/\bparseSearchParams\(/, ['query']],
    [/\bparseJsonBody\(|\breq\.json\(/, ['body']],
    [/\breadBodyBytes\(|\breadImportForm\(|\.formData\(/, ['raw']],
    [/\breadBodyText\(|\breq\.text\(/, ['body', 'raw']],
  ];

  it.each(ROUTES.map((r) => [key(r), r] as const))('%s: every input its handler reads is fuzzed', (name, row) => {
    const kinds = covered.get(name);
    expect(kinds, `${name} has no fuzz coverage`).toBeDefined();
    expect(kinds!.length, `${name} has no fuzz coverage`).toBeGreaterThan(0);
    const src = handlerSource(row);
    for (const [re, need] of READS) {
      if (re.test(src)) expect(need.some((k) => kinds!.includes(k)), `${name} reads ${re.source} but gets no ${need.join('/')} fuzz`).toBe(true);
    }
  });

  it('every route handler under app/api is a fuzzed row', () => {
    const METHOD_RE = /export\s+(?:const|async function|function)\s+(GET|POST|PUT|PATCH|DELETE)\b/g;
    const missing: string[] = [];
    const walk = (d: string) => {
      for (const e of fs.readdirSync(d, { withFileTypes: true })) {
        const p = path.join(d, e.name);
        if (e.isDirectory()) walk(p);
        else if (e.name === 'route.ts') {
          const file = path.relative(API_DIR, d).split(path.sep).join('/');
          if (UNCHECKED_ROUTES.some((u) => u.file === file)) continue;
          for (const m of fs.readFileSync(p, 'utf8').matchAll(METHOD_RE)) if (!covered.has(`${m[1]} /api/${file}`)) missing.push(`${m[1]} /api/${file}`);
        }
      }
    };
    walk(API_DIR);
    expect(missing, 'route handlers without fuzz coverage (add them to routes-table.ts)').toEqual([]);
    expect(covered.size).toBe(ROUTES.length);
  });
});

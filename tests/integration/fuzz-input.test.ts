/**
 * Hostile input (fast-check): the section-file parser never throws and never lets a
 * non-finite number through; a handful of POST/PATCH routes answer random and hostile bodies
 * (malformed JSON, wrong types, NaN/Infinity as strings, huge/tiny numbers, long strings,
 * NUL, unicode, SQL and script fragments, deep nesting, 10 MB) with a 4xx in the JSON error
 * shape — never a 500 — and nothing stored changes (every table's rows hashed before/after).
 * Every route × method (params, query, bodies, uploads), generated from routes-table.ts:
 * fuzz-routes.test.ts.
 * Expectations: common practice, no published source.
 */
import path from 'node:path';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';

vi.mock('server-only', () => ({}));
const auth = vi.hoisted(() => ({ user: null as null | { id: string; email: string; name: string } }));
vi.mock('@/lib/server/session', () => ({
  getSessionUser: async () => auth.user,
  requireUser: async () => auth.user,
}));
vi.mock('@/lib/server/mail', async (importOriginal) => ({
  ...(await importOriginal<typeof import('@/lib/server/mail')>()),
  sendMail: async () => {},
}));

import { setDbForTesting, type DbHandle } from '@/db/client';
import { parseSectionFile } from '@/lib/section/parse';
import { templateSection } from '@/lib/section/templates';
import { createTestDb } from './helpers/db';
import { snapshotTables } from './helpers/db-snapshot';
import { buildWorld, type World } from './helpers/fixtures';

const SEED = 20261202; // fixed: a failure is reproducible

const nastyStrings = fc.constantFrom(
  'NaN', 'Infinity', '-Infinity', '1e999', '-1e999', '5e-324', '0x10', '', ' ', '\u202e\u0645\u0631\u062d\u0628\u0627',
  '<script>alert(1)</script>', '"><img src=x onerror=alert(1)>', "'; drop table users; --", "1' or '1'='1", '${process.exit()}',
  '__proto__', 'constructor', '\ud83d\ude00'.repeat(50), 'a\u0000b',
);
const nastyNumbers = fc.constantFrom(1e308, -1e308, 5e-324, -5e-324, 0, -0, 2 ** 53 + 1, -1, 1e-300);
const deep = (n: number) => '['.repeat(n) + ']'.repeat(n);
/** A value that is never a valid string field: wrong type, or far too long, or holding NUL. */
const notAString = fc.oneof(
  nastyNumbers,
  fc.double(),
  fc.boolean(),
  fc.constant(null),
  fc.array(fc.jsonValue({ maxDepth: 2 }), { maxLength: 4 }),
  fc.dictionary(fc.string({ maxLength: 8 }), fc.jsonValue({ maxDepth: 1 }), { maxKeys: 3 }),
  fc.string({ maxLength: 20 }).map((s) => 'x'.repeat(20_000) + s),
  fc.string({ maxLength: 20 }).map((s) => `${s}\u0000`),
);

function setAt(obj: unknown, p: (string | number)[], v: unknown) {
  let cur = obj as Record<string | number, unknown>;
  for (const k of p.slice(0, -1)) cur = cur[k] as Record<string | number, unknown>;
  cur[p[p.length - 1]!] = v;
}
/** Numeric places in a template section that must hold a finite (positive) size. */
const SIZE_PATHS: (string | number)[][] = [['shapes', 0, 'width'], ['shapes', 0, 'height'], ['shapes', 0, 'x'], ['shapes', 0, 'r']];
const badNumber = fc.oneof(
  fc.constantFrom('NaN', 'Infinity', '-Infinity', '1e999', '<script>', "'; drop table x;--", 'w +', '((((', 'nosuchvariable * 2'),
  fc.constantFrom({}, [], null, true, -1e308, 1e308, -1),
);
/**
 * Values the section schema itself refuses. A save needs only a schema-valid section (an
 * unsolvable drawing may be saved and is reported with its checks: lib/server/section-checks.ts),
 * so the routes get these; the parser gets badNumber, which it must refuse entirely.
 */
const schemaBadNumber = fc.constantFrom<unknown>({}, [], null, true, 'x'.repeat(201), `a${'\u0000'}b`, [1, 2]);
/** A template section with one size broken (or the whole content replaced by junk). */
const brokenSection = (bad: fc.Arbitrary<unknown>) => fc.oneof(
  fc.tuple(fc.constantFrom('coax', 'plate-pair', 'twin-lead'), fc.constantFrom(...SIZE_PATHS), bad).map(([id, p, v]) => {
    const s = structuredClone(templateSection(id as 'coax')) as unknown;
    const shape = (s as { shapes: Record<string, unknown>[] }).shapes[0]!;
    if (!(String(p[2]) in shape)) setAt(s, ['format'], 'edgefield.section/999');
    else setAt(s, p, v);
    return s;
  }),
  fc.jsonValue({ maxDepth: 3 }),
  nastyStrings,
);
const brokenForParser = brokenSection(badNumber);
const brokenForRoutes = brokenSection(schemaBadNumber);

function walkNumbers(v: unknown, out: number[] = [], depth = 0): number[] {
  if (typeof v === 'number') out.push(v);
  else if (v && typeof v === 'object' && depth < 50) for (const x of Object.values(v)) walkNumbers(x, out, depth + 1);
  return out;
}

describe('parseSectionFile under hostile text', () => {
  const check = (text: string) => {
    const r = parseSectionFile(text);
    if (r.ok) {
      for (const n of walkNumbers(r.resolved)) expect(Number.isFinite(n)).toBe(true);
    } else {
      expect(typeof r.message).toBe('string');
      expect(r.message.length).toBeGreaterThan(3);
      expect(r.message.length).toBeLessThan(5000);
    }
  };

  it('arbitrary strings and JSON values never throw', () => {
    fc.assert(
      fc.property(fc.oneof(fc.string({ maxLength: 300 }), fc.jsonValue({ maxDepth: 4 }).map((v) => JSON.stringify(v) ?? 'null')), (t) => check(t)),
      { numRuns: 300, seed: SEED },
    );
  });

  it('a broken size in a real section is refused with a message, never resolved to a non-finite number', () => {
    fc.assert(
      fc.property(brokenForParser, (s) => {
        const r = parseSectionFile(JSON.stringify(s));
        check(JSON.stringify(s));
        if (typeof s === 'object' && s && 'shapes' in s) expect(r.ok).toBe(false);
      }),
      { numRuns: 200, seed: SEED },
    );
  });

  it('deep nesting, huge files and unicode junk are refused, not thrown', () => {
    for (const t of [deep(100_000), `{"a":${deep(5_000)}}`, 'x'.repeat(5_000_001), '\ufeff{}', '\ud800', '{"format":"edgefield.section/1"'.repeat(1000)]) {
      const r = parseSectionFile(t);
      expect(r.ok).toBe(false);
    }
  });
});

type Route = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
const API = path.resolve('app/api');

let handle: DbHandle;
let w: World;
beforeAll(async () => {
  handle = await createTestDb();
  setDbForTesting(handle);
  w = await buildWorld(handle.db);
});
afterAll(async () => {
  setDbForTesting(undefined);
  await handle?.close();
});

interface Target {
  name: string;
  file: string;
  method: 'POST' | 'PATCH';
  params: (w: World) => Record<string, string>;
  /** An object whose every field is wrong. */
  badObject: fc.Arbitrary<Record<string, unknown>>;
}
const TARGETS: Target[] = [
  { name: 'PATCH workspace', file: 'workspaces/[workspaceId]', method: 'PATCH', params: (w) => ({ workspaceId: w.wsA }), badObject: fc.record({ name: notAString }) },
  {
    name: 'POST sections',
    file: 'workspaces/[workspaceId]/sections',
    method: 'POST',
    params: (w) => ({ workspaceId: w.wsA }),
    badObject: fc.oneof(fc.record({ name: notAString, content: brokenForRoutes }), fc.record({ name: fc.string({ maxLength: 30 }), content: brokenForRoutes })),
  },
  {
    name: 'PATCH section',
    file: 'workspaces/[workspaceId]/sections/[sectionId]',
    method: 'PATCH',
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA }),
    badObject: fc.oneof(fc.record({ name: notAString }), fc.record({ description: notAString.filter((v) => typeof v !== 'string' || v.length > 10_000 || v.includes('\0')) })),
  },
  {
    name: 'POST revisions',
    file: 'workspaces/[workspaceId]/sections/[sectionId]/revisions',
    method: 'POST',
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA }),
    badObject: fc.record({ content: brokenForRoutes, message: fc.option(fc.string({ maxLength: 20 }), { nil: undefined }) }, { requiredKeys: ['content'] }),
  },
  {
    name: 'POST comments',
    file: 'workspaces/[workspaceId]/solves/[solveId]/comments',
    method: 'POST',
    params: (w) => ({ workspaceId: w.wsA, solveId: w.solveA }),
    badObject: fc.record({ body: notAString }),
  },
  {
    name: 'POST solves',
    file: 'workspaces/[workspaceId]/solves',
    method: 'POST',
    params: (w) => ({ workspaceId: w.wsA }),
    badObject: fc.record({
      sectionId: fc.oneof(fc.constant(undefined), nastyStrings),
      revisionId: nastyStrings,
      settings: fc.jsonValue({ maxDepth: 2 }),
      settingsHash: notAString,
      result: fc.jsonValue({ maxDepth: 2 }),
      status: fc.oneof(nastyStrings, nastyNumbers),
    }),
  },
];

/** Bodies that no route may accept. */
function hostileBody(t: Target): fc.Arbitrary<string> {
  return fc.oneof(
    fc.string({ maxLength: 200 }).map((s) => `${s}{`), // never valid JSON
    fc.oneof(fc.double(), fc.string({ maxLength: 50 }), fc.boolean(), fc.constant(null), fc.array(fc.jsonValue({ maxDepth: 2 }), { maxLength: 5 })).map((v) => JSON.stringify(v) ?? 'null'),
    t.badObject.map((o) => JSON.stringify(o)),
  );
}

async function send(t: Target, body: string | Uint8Array) {
  auth.user = w.users.owner;
  const mod = (await import(/* @vite-ignore */ path.join(API, t.file, 'route.ts'))) as Record<string, Route>;
  const res = await mod[t.method]!(
    new Request(`http://localhost/api/${t.file}`, { method: t.method, headers: { 'content-type': 'application/json' }, body: body as BodyInit }),
    { params: Promise.resolve(t.params(w)) },
  );
  const text = await res.text();
  let json: { error?: { code?: unknown; message?: unknown } } | null = null;
  try {
    json = JSON.parse(text);
  } catch {
    /* checked below */
  }
  return { status: res.status, json, text };
}

function expectRefused(r: Awaited<ReturnType<typeof send>>, body: string) {
  const msg = `${r.status} ${r.text.slice(0, 300)} for ${body.slice(0, 200)}`;
  expect(r.status, msg).toBeGreaterThanOrEqual(400);
  expect(r.status, msg).toBeLessThan(500);
  expect(typeof r.json?.error?.code, msg).toBe('string');
  expect(typeof r.json?.error?.message, msg).toBe('string');
  // The message never echoes markup back unescaped into an HTML context: it is JSON, served as JSON.
}

describe.each(TARGETS.map((t) => [t.name, t] as const))('%s under hostile bodies', (_n, t) => {
  it('always a 4xx with the JSON error shape; nothing stored changes', async () => {
    const before = await snapshotTables(handle);
    await fc.assert(
      fc.asyncProperty(hostileBody(t), async (body) => {
        expectRefused(await send(t, body), body);
      }),
      { numRuns: 40, seed: SEED },
    );
    for (const body of [deep(50_000), `{"name":${deep(20_000)}}`, `{"name":"${'a'.repeat(10 * 1024 * 1024)}"}`, '\ufeff', '']) {
      expectRefused(await send(t, body), body);
    }
    expect(await snapshotTables(handle)).toEqual(before);
  });
});

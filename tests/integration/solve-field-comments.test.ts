/**
 * Route handlers of a solve's field blob and comment thread: roles (401/403/404), size limits
 * (413), validation (422) and success, on in-memory PGlite with the real migrations.
 */
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';

vi.mock('server-only', () => ({}));
const who = vi.hoisted(() => ({ current: null as null | { id: string; email: string; name: string } }));
vi.mock('@/lib/server/session', () => ({
  getSessionUser: async () => who.current,
  requireUser: async () => {
    if (!who.current) throw new Error('redirect');
    return who.current;
  },
}));

import { eq } from 'drizzle-orm';
import type { DbHandle } from '@/db/client';
import { setDbForTesting } from '@/db/client';
import { solves } from '@/db/schema';
import { encodeFieldBlob, FIELD_BLOB_HEADER_BYTES, type FieldData } from '@/lib/field/codec';
import { createTestDb } from './helpers/db';
import { buildWorld, type Who, type World } from './helpers/fixtures';
import * as fieldRoute from '@/app/api/workspaces/[workspaceId]/solves/[solveId]/field/route';
import * as commentsRoute from '@/app/api/workspaces/[workspaceId]/solves/[solveId]/comments/route';

let handle: DbHandle;
let world: World;

beforeAll(async () => {
  handle = await createTestDb();
  setDbForTesting(handle);
  world = await buildWorld(handle.db);
});
afterAll(async () => {
  setDbForTesting(undefined);
  await handle?.close();
});

function as(w: Who | null) {
  who.current = w ? world.users[w] : null;
}
const ctx = (workspaceId: string, solveId: string) => ({ params: Promise.resolve({ workspaceId, solveId }) });
const url = (ws: string, id: string, tail: string) => `http://localhost/api/workspaces/${ws}/solves/${id}/${tail}`;

/** A field matching the fixture result's mesh (fakeResult: 40 × 25 nodes, one signal net). */
function fixtureField(nx = 40, ny = 25, fields = 1): FieldData {
  return {
    xs: new Float64Array(nx).map((_, i) => i * 1e-4),
    ys: new Float64Array(ny).map((_, j) => j * 1e-4),
    potentials: Array.from({ length: fields }, () => new Float64Array(nx * ny).map((_, q) => (q % nx) / (nx - 1))),
    cellEpsR: new Float32Array((nx - 1) * (ny - 1)).fill(2.1),
    nodeNet: new Int16Array(nx * ny).fill(-1),
  };
}

function put(ws: string, id: string, body: Uint8Array | string, type = 'application/octet-stream') {
  return fieldRoute.PUT(
    new Request(url(ws, id, 'field'), { method: 'PUT', headers: { 'content-type': type }, body: body as BodyInit }),
    ctx(ws, id),
  );
}
async function storedField(id: string) {
  const [row] = await handle.db.select({ field: solves.field, bytes: solves.fieldBytes }).from(solves).where(eq(solves.id, id));
  return row;
}
async function errorCode(res: Response) {
  const j = (await res.json()) as { error: { code: string; message: string } };
  expect(typeof j.error.message).toBe('string');
  return j.error.code;
}

describe('PUT/GET …/solves/[solveId]/field', () => {
  beforeEach(async () => {
    await handle.db.update(solves).set({ field: null, fieldBytes: null }).where(eq(solves.id, world.solveA));
  });

  it('refuses signed-out (401), viewers (403) and other workspaces (404) and stores nothing', async () => {
    const blob = encodeFieldBlob(fixtureField());
    as(null);
    expect((await put(world.wsA, world.solveA, blob)).status).toBe(401);
    as('viewer');
    expect((await put(world.wsA, world.solveA, blob)).status).toBe(403);
    as('outsider');
    expect((await put(world.wsA, world.solveA, blob)).status).toBe(404);
    as('editor');
    expect((await put(world.wsA, world.solveB, blob)).status).toBe(404); // B's solve through A's URL
    expect((await storedField(world.solveA))?.field).toBeNull();
  });

  it('stores a valid field once and serves it back byte for byte to a viewer', async () => {
    const blob = encodeFieldBlob(fixtureField());
    as('editor');
    const res = await put(world.wsA, world.solveA, blob);
    expect(res.status).toBe(201);
    expect((await storedField(world.solveA))?.bytes).toBe(blob.byteLength);
    as('viewer');
    const got = await fieldRoute.GET(new Request(url(world.wsA, world.solveA, 'field')), ctx(world.wsA, world.solveA));
    expect(got.status).toBe(200);
    expect(got.headers.get('content-type')).toBe('application/octet-stream');
    expect(new Uint8Array(await got.arrayBuffer())).toEqual(blob);
    // a second upload does not replace it
    as('editor');
    const again = await put(world.wsA, world.solveA, encodeFieldBlob({ ...fixtureField(), xs: new Float64Array(40).map((_, i) => i) }));
    expect(again.status).toBe(409);
    expect(await errorCode(again)).toBe('field_exists');
    const after = await storedField(world.solveA);
    expect(new Uint8Array(after!.field!)).toEqual(blob);
  });

  it('refuses corrupted, mismatched, truncated and wrongly typed uploads with 4xx and stores nothing', async () => {
    as('editor');
    const blob = encodeFieldBlob(fixtureField());
    const flipped = blob.slice();
    flipped[FIELD_BLOB_HEADER_BYTES + 40]! ^= 0xff;
    const r1 = await put(world.wsA, world.solveA, flipped);
    expect(r1.status).toBe(422);
    expect(['field_corrupt', 'field_checksum']).toContain(await errorCode(r1));
    const r2 = await put(world.wsA, world.solveA, encodeFieldBlob(fixtureField(41, 25)));
    expect(r2.status).toBe(422);
    expect(await errorCode(r2)).toBe('field_mismatch');
    const r3 = await put(world.wsA, world.solveA, encodeFieldBlob(fixtureField(40, 25, 2)));
    expect(await errorCode(r3)).toBe('field_mismatch');
    const r4 = await put(world.wsA, world.solveA, blob.subarray(0, 20));
    expect(r4.status).toBe(422);
    expect(await errorCode(r4)).toBe('field_too_short');
    const r5 = await put(world.wsA, world.solveA, 'not a field', 'text/plain');
    expect(r5.status).toBe(415);
    expect((await storedField(world.solveA))?.field).toBeNull();
  });

  it('refuses an oversized upload with 413 before reading it all, and a header announcing too much', async () => {
    as('editor');
    const big = new Uint8Array(32 * 1024 * 1024 + 1);
    const r = await put(world.wsA, world.solveA, big);
    expect(r.status).toBe(413);
    expect(await errorCode(r)).toBe('too_large');
    const blob = encodeFieldBlob(fixtureField());
    const dv = new DataView(blob.buffer, blob.byteOffset);
    dv.setUint32(8, 60000, true);
    dv.setUint32(12, 60000, true);
    const r2 = await put(world.wsA, world.solveA, blob);
    expect(r2.status).toBe(413);
    expect((await storedField(world.solveA))?.field).toBeNull();
  });

  it('answers 404 for a solve without a field, and for an unknown solve', async () => {
    as('viewer');
    const r = await fieldRoute.GET(new Request(url(world.wsA, world.solveA, 'field')), ctx(world.wsA, world.solveA));
    expect(r.status).toBe(404);
    expect(await errorCode(r)).toBe('no_field');
    const r2 = await fieldRoute.GET(new Request(url(world.wsA, 'nope', 'field')), ctx(world.wsA, 'nope'));
    expect(r2.status).toBe(404);
    as(null);
    expect((await fieldRoute.GET(new Request(url(world.wsA, world.solveA, 'field')), ctx(world.wsA, world.solveA))).status).toBe(401);
  });
});

describe('GET/POST …/solves/[solveId]/comments', () => {
  const post = (ws: string, id: string, body: unknown) =>
    commentsRoute.POST(
      new Request(url(ws, id, 'comments'), { method: 'POST', headers: { 'content-type': 'application/json' }, body: typeof body === 'string' ? body : JSON.stringify(body) }),
      ctx(ws, id),
    );
  const list = (ws: string, id: string) => commentsRoute.GET(new Request(url(ws, id, 'comments')), ctx(ws, id));

  it('lets a viewer comment and everyone in the workspace read the thread in order', async () => {
    as('viewer');
    const r = await post(world.wsA, world.solveA, { body: 'Peak field near the trace corner looks high, <b>check</b> the radius.' });
    expect(r.status).toBe(201);
    as('editor');
    expect((await post(world.wsA, world.solveA, { body: 'Agreed, will round it.' })).status).toBe(201);
    as('owner');
    const got = await list(world.wsA, world.solveA);
    expect(got.status).toBe(200);
    const j = (await got.json()) as { comments: { body: string; author: { name: string } }[] };
    expect(j.comments.map((c) => c.body)).toEqual(['Peak field near the trace corner looks high, <b>check</b> the radius.', 'Agreed, will round it.']);
    expect(j.comments[0]!.author.name).toBe('Test viewer');
  });

  it('answers 401 signed out, 404 for other workspaces and unknown solves, 422 for empty text, 413 for huge bodies', async () => {
    as(null);
    expect((await post(world.wsA, world.solveA, { body: 'hi' })).status).toBe(401);
    expect((await list(world.wsA, world.solveA)).status).toBe(401);
    as('outsider');
    expect((await post(world.wsA, world.solveA, { body: 'hi' })).status).toBe(404);
    expect((await list(world.wsA, world.solveA)).status).toBe(404);
    as('viewer');
    expect((await post(world.wsA, world.solveB, { body: 'hi' })).status).toBe(404);
    expect((await list(world.wsA, 'missing')).status).toBe(404);
    const empty = await post(world.wsA, world.solveA, { body: '   ' });
    expect(empty.status).toBe(422);
    expect(await errorCode(empty)).toBe('invalid');
    expect((await post(world.wsA, world.solveA, { body: 'x', extra: 1 })).status).toBe(422);
    expect((await post(world.wsA, world.solveA, '{not json')).status).toBeGreaterThanOrEqual(400);
    expect((await post(world.wsA, world.solveA, { body: 'x'.repeat(40_000) })).status).toBe(413);
  });
});

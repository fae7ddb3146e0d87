/**
 * Drawing import and measured data through the route handlers (issue 7): the sample SVG and
 * DXF become sections with their original file kept; malformed, oversized or wrongly typed
 * uploads get a clear error and change nothing; measured CSV is checked, stored and listed.
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

import { sql } from 'drizzle-orm';
import { setDbForTesting, type DbHandle } from '@/db/client';
import { sectionSchema } from '@/lib/section/schema';
import { createTestDb } from './helpers/db';
import { buildWorld, type World } from './helpers/fixtures';
import { multipartBody } from './helpers/multipart';
import * as importsRoute from '@/app/api/workspaces/[workspaceId]/imports/route';
import * as filesRoute from '@/app/api/workspaces/[workspaceId]/sections/[sectionId]/files/route';
import * as fileRoute from '@/app/api/workspaces/[workspaceId]/sections/[sectionId]/files/[fileId]/route';
import * as measurementsRoute from '@/app/api/workspaces/[workspaceId]/sections/[sectionId]/measurements/route';
import * as revisionRoute from '@/app/api/workspaces/[workspaceId]/sections/[sectionId]/revisions/[revisionId]/route';

let handle: DbHandle;
let w: World;
beforeAll(async () => {
  handle = await createTestDb();
  setDbForTesting(handle);
  w = await buildWorld(handle.db);
  auth.user = w.users.editor;
});
afterAll(async () => {
  setDbForTesting(undefined);
  await handle?.close();
});

type Fn = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
const fixture = (f: string) => fs.readFileSync(path.resolve('tests/fixtures/import', f), 'utf8');

async function postImport(file: { name: string; type: string; text: string }, options: unknown) {
  const { contentType, data } = multipartBody({ file, options: JSON.stringify(options) });
  const res = await (importsRoute.POST as Fn)(
    new Request('http://localhost/api/x', { method: 'POST', body: data as BodyInit, headers: { 'content-type': contentType } }),
    { params: Promise.resolve({ workspaceId: w.wsA }) },
  );
  return { status: res.status, json: (await res.json()) as Record<string, any> };
}

async function counts() {
  const one = async (t: string) => Number(((await handle.db.execute(sql.raw(`select count(*)::int as n from ${t}`))) as any).rows[0].n);
  return { sections: await one('sections'), revisions: await one('section_revisions'), files: await one('files') };
}

const svgOptions = {
  name: 'Probe feed (imported)',
  units: 'mm',
  layers: {
    FR4: { as: 'dielectric', material: 'fr4', name: 'FR-4', epsR: 4.3 },
    GND: { as: 'conductor', net: 'gnd', role: 'ground' },
    TRACE: { as: 'conductor', net: 'trace', role: 'signal' },
    wire: { as: 'conductor', net: 'wire', role: 'signal' },
  },
};

describe('drawing import', () => {
  it('the sample SVG becomes a section; the original file is kept byte for byte', async () => {
    const text = fixture('microstrip-and-wire.svg');
    const r = await postImport({ name: 'microstrip-and-wire.svg', type: 'image/svg+xml', text }, svgOptions);
    expect(r.status, JSON.stringify(r.json)).toBe(201);
    expect(r.json.counts).toEqual({ conductors: 3, dielectrics: 1, ignored: 0 });
    const rev = await (revisionRoute.GET as Fn)(new Request('http://localhost/x'), {
      params: Promise.resolve({ workspaceId: w.wsA, sectionId: r.json.sectionId, revisionId: r.json.revisionId }),
    });
    const content = sectionSchema.parse(((await rev.json()) as any).revision.content);
    expect(content.shapes.map((s) => s.id)).toEqual(['fr4-1', 'gnd-1', 'trace-1', 'wire-1']);

    const list = await (filesRoute.GET as Fn)(new Request('http://localhost/x'), { params: Promise.resolve({ workspaceId: w.wsA, sectionId: r.json.sectionId }) });
    const files = ((await list.json()) as any).files;
    expect(files).toHaveLength(1);
    expect(files[0]).toMatchObject({ kind: 'drawing-svg', name: 'microstrip-and-wire.svg', bytes: Buffer.byteLength(text) });
    const dl = await (fileRoute.GET as Fn)(new Request('http://localhost/x'), {
      params: Promise.resolve({ workspaceId: w.wsA, sectionId: r.json.sectionId, fileId: files[0].id }),
    });
    expect(dl.status).toBe(200);
    expect(dl.headers.get('content-disposition')).toMatch(/^attachment/);
    expect(dl.headers.get('content-type')).toBe('application/octet-stream');
    expect(await dl.text()).toBe(text);
  });

  it('the sample DXF becomes a section', async () => {
    const r = await postImport(
      { name: 'electrode-pair.dxf', type: 'image/vnd.dxf', text: fixture('electrode-pair.dxf') },
      {
        name: 'Touch electrodes',
        units: 'mm',
        layers: {
          DRIVE: { as: 'conductor', net: 'drive', role: 'signal' },
          SENSE: { as: 'conductor', net: 'sense', role: 'signal' },
          GLASS: { as: 'dielectric', material: 'glass', epsR: 6.7 },
          SHIELD: { as: 'conductor', net: 'shield', role: 'ground' },
        },
      },
    );
    expect(r.status, JSON.stringify(r.json)).toBe(201);
    expect(r.json.counts).toEqual({ conductors: 4, dielectrics: 1, ignored: 0 });
  });

  it('malformed, oversized, wrongly typed or badly mapped uploads are refused and change nothing', async () => {
    const before = await counts();
    const bad = await postImport({ name: 'broken.svg', type: 'image/svg+xml', text: '<svg><rect width="1" height="1"></svg>' }, svgOptions);
    expect(bad.status).toBe(422);
    expect(bad.json.error.message).toMatch(/not well-formed XML/);
    expect(bad.json.error.field).toBe('file');

    const big = await postImport({ name: 'big.svg', type: 'image/svg+xml', text: `<svg>${' '.repeat(2 * 1024 * 1024 + 10)}</svg>` }, svgOptions);
    expect(big.status).toBe(413);
    expect(big.json.error.message).toMatch(/2 MB/);

    const png = await postImport({ name: 'photo.png', type: 'image/png', text: 'PNG' }, svgOptions);
    expect(png.status).toBe(415);
    expect(png.json.error.message).toMatch(/SVG \(\.svg\) or DXF \(\.dxf\)/);

    const unmapped = await postImport({ name: 'm.svg', type: 'image/svg+xml', text: fixture('microstrip-and-wire.svg') }, { ...svgOptions, layers: { FR4: svgOptions.layers.FR4 } });
    expect(unmapped.status).toBe(422);
    expect(unmapped.json.error.message).toMatch(/Choose what layer/);

    const badOpts = await postImport({ name: 'm.svg', type: 'image/svg+xml', text: fixture('microstrip-and-wire.svg') }, { ...svgOptions, units: 'furlong' });
    expect(badOpts.status).toBe(422);
    expect(badOpts.json.error.field).toBe('options.units');

    expect(await counts()).toEqual(before);
  });
});

describe('measured data', () => {
  async function upload(name: string, text: string, type = 'text/csv') {
    const res = await (measurementsRoute.POST as Fn)(
      new Request(`http://localhost/x?name=${encodeURIComponent(name)}`, { method: 'POST', body: text, headers: { 'content-type': type } }),
      { params: Promise.resolve({ workspaceId: w.wsA, sectionId: w.sectionA }) },
    );
    return { status: res.status, json: (await res.json()) as Record<string, any> };
  }

  it('a valid CSV is stored and listed with values converted to F/m', async () => {
    const r = await upload('sweep.csv', '# bench run 3\ngap (um),C12 (pF/cm),C11 (pF/m)\n100,0.50,80\n200,0.40,75\n');
    expect(r.status, JSON.stringify(r.json)).toBe(201);
    expect(r.json.measurement).toMatchObject({ rows: 2, parameter: { name: 'gap', unit: 'um' } });
    const list = await (measurementsRoute.GET as Fn)(new Request('http://localhost/x'), { params: Promise.resolve({ workspaceId: w.wsA, sectionId: w.sectionA }) });
    const m = ((await list.json()) as any).measurements.find((x: any) => x.name === 'sweep.csv');
    expect(m.data.x).toEqual([100, 200]);
    // 0.5 pF/cm = 50 pF/m (unit definition).
    expect(m.data.series[0].valuesFPerM[0]).toBeCloseTo(50e-12, 20);
    expect(m.data.series[1].valuesFPerM[1]).toBeCloseTo(75e-12, 20);
  });

  it('bad CSV is refused naming the row and column, and nothing is stored', async () => {
    const before = await counts();
    const cases: [string, RegExp][] = [
      ['w (mm),C (pF/m)\n1,abc\n', /Row 2, column 2.*not a number/],
      ['w (mm),C\n1,2\n', /names no unit/],
      ['w (mm),C (pF/furlong)\n1,2\n', /not a capacitance-per-length unit/],
      ['w (mm),C (pF/m)\n1,-2\n', /cannot be negative/],
      ['w (mm),C (pF/m)\n1,2,3\n', /Row 2 has 3 values/],
      ['w (mm),C (pF/m)\n', /at least one row/],
    ];
    for (const [text, re] of cases) {
      const r = await upload('bad.csv', text);
      expect(r.status, text).toBe(422);
      expect(r.json.error.message).toMatch(re);
    }
    const wrongType = await upload('x.csv', 'a,b\n1,2\n', 'image/png');
    expect(wrongType.status).toBe(415);
    expect(await counts()).toEqual(before);
  });

  it('viewers may read but not upload', async () => {
    auth.user = w.users.viewer;
    expect((await upload('v.csv', 'w (mm),C (pF/m)\n1,2\n')).status).toBe(403);
    auth.user = w.users.editor;
  });
});

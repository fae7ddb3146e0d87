/**
 * The real summary worker (workers/summary.worker.ts) in a Node worker thread, driven through
 * comlink's node adapter, both directly and through the page's client
 * (lib/client/summary-client.ts). Checked: the losses and the peak field it returns equal
 * computeLosses / computePeakField called in this process on the same solve, to the last bit
 * (the functions are deterministic; common practice, no published source); the latest request
 * of each kind wins and older answers come back stale; a bad frequency or voltage, or a solve
 * that is not loaded, comes back as a message naming it and the worker goes on; a worker that
 * dies ends the open request with a message and the next request runs on a fresh worker.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Worker } from 'node:worker_threads';
import * as Comlink from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter';
import { solveSection } from '@/lib/engine/solve-section';
import { resolveSection } from '@/lib/section/resolve';
import { computeLosses } from '@/lib/analysis/losses';
import { computePeakField } from '@/lib/analysis/peak-field';
import type { Section } from '@/lib/section/schema';
import type { SummaryWorkerApi } from '@/workers/summary-protocol';
import { SummaryClient, type SummarySolve, type SummaryWorkerHandle } from '@/lib/client/summary-client';

const HOST = new URL('./node-worker-host.mjs', import.meta.url);
const MODULE = '../../../workers/summary.worker.ts';

/** A lossy microstrip (mm) with a dielectric strength, so losses and margins are non-trivial. */
const microstrip: Section = {
  format: 'edgefield.section/1',
  units: 'mm',
  background: { epsR: 1 },
  materials: [{ id: 'fr', name: 'substrate', epsR: 4.4, lossTangent: 0.02, breakdownKVPerMm: 20 }],
  nets: [
    { name: 'sig', role: 'signal' },
    { name: 'gnd', role: 'ground' },
  ],
  shapes: [
    { id: 'plane', type: 'rect', x: -5, y: -0.035, width: 10, height: 0.035, conductor: 'gnd' },
    { id: 'sub', type: 'rect', x: -5, y: 0, width: 10, height: 1.6, dielectric: 'fr' },
    { id: 'trace', type: 'rect', x: -1.5, y: 1.6, width: 3, height: 0.035, conductor: 'sig' },
  ],
  boundary: { left: { type: 'open' }, right: { type: 'open' }, bottom: { type: 'open' }, top: { type: 'open' } },
};

const twinWires: Section = {
  format: 'edgefield.section/1',
  units: 'mm',
  background: { epsR: 1 },
  materials: [],
  nets: [
    { name: 'sig', role: 'signal' },
    { name: 'gnd', role: 'ground' },
  ],
  shapes: [
    { id: 'a', type: 'circle', cx: 0, cy: 0, r: 0.5, conductor: 'sig' },
    { id: 'b', type: 'circle', cx: 2, cy: 0, r: 0.5, conductor: 'gnd' },
  ],
  boundary: { left: { type: 'open' }, right: { type: 'open' }, bottom: { type: 'open' }, top: { type: 'open' } },
};

function solved(section: Section): SummarySolve {
  const r = resolveSection(section);
  if (!r.ok) throw new Error('test section does not resolve');
  const { result, fields } = solveSection(section, { preset: 'quick', keepFields: true });
  if (!fields) throw new Error('no fields');
  return { section: r.section, result, fields };
}

const direct = {
  losses: (s: SummarySolve, frequencyHz: number) => computeLosses(s.section, s.result, s.fields, { frequencyHz }),
  peak: (s: SummarySolve, volts: number) => computePeakField(s.section, s.result, s.fields, { volts }).entries,
};

const started: Worker[] = [];
function nodeSpawn(): SummaryWorkerHandle {
  const w = new Worker(HOST, { workerData: { module: MODULE } });
  started.push(w);
  return {
    endpoint: nodeEndpoint(w),
    terminate: () => void w.terminate(),
    onFailure: (report) => {
      w.on('error', (e) => report(e.message));
      w.on('exit', (code) => report(`the worker exited (code ${code})`));
    },
  };
}

let strip: SummarySolve;
let wires: SummarySolve;
let worker: Worker;
let api: Comlink.Remote<SummaryWorkerApi>;

beforeAll(async () => {
  strip = solved(microstrip);
  wires = solved(twinWires);
  worker = new Worker(HOST, { workerData: { module: MODULE } });
  api = Comlink.wrap<SummaryWorkerApi>(nodeEndpoint(worker));
  expect(await api.ping()).toBe('pong');
});
afterAll(async () => {
  api?.[Comlink.releaseProxy]();
  await worker?.terminate();
  await Promise.all(started.map((w) => w.terminate()));
});

describe('summary worker (workers/summary.worker.ts in a Node worker thread)', () => {
  it('returns the same losses and peak field as the direct calls', async () => {
    expect(await api.load(1, strip.section, strip.result, strip.fields)).toEqual({ ok: true, solveId: 1, value: null });
    const losses = await api.losses(1, 2.5e9);
    expect(losses).toEqual({ ok: true, solveId: 1, value: direct.losses(strip, 2.5e9) });
    if (!losses.ok) return;
    expect(losses.value.alphaDbPerM).toBeGreaterThan(0);
    const peak = await api.peakField(1, 120);
    expect(peak).toEqual({ ok: true, solveId: 1, value: direct.peak(strip, 120) });
    if (!peak.ok) return;
    expect(peak.value.some((e) => e.margin !== undefined)).toBe(true);
  });

  it('a bad frequency or voltage, or a solve not loaded, comes back as a message, and the worker goes on', async () => {
    expect(await api.load(2, wires.section, wires.result, wires.fields)).toMatchObject({ ok: true });
    expect(await api.losses(2, -1)).toEqual({ ok: false, solveId: 2, message: 'Losses: the frequency must be a positive number of hertz' });
    expect(await api.peakField(2, Number.NaN)).toEqual({ ok: false, solveId: 2, message: 'Peak field: the voltage must be a finite number' });
    expect(await api.losses(1, 1e9)).toEqual({ ok: false, solveId: 1, message: 'Losses: solve 1 is not loaded in the summary worker' });
    expect(await api.peakField(2, 50)).toEqual({ ok: true, solveId: 2, value: direct.peak(wires, 50) });
  });
});

describe('summary client (lib/client/summary-client.ts) over the real worker', () => {
  it('the latest request of each kind wins; the other kind is not disturbed', async () => {
    const client = new SummaryClient(nodeSpawn);
    const older = client.losses(strip, 1e9);
    const peak = client.peakField(strip, 100);
    const newer = client.losses(strip, 10e9);
    expect(await older).toEqual({ stale: true });
    expect(await newer).toEqual({ stale: false, ok: true, value: direct.losses(strip, 10e9) });
    expect(await peak).toEqual({ stale: false, ok: true, value: direct.peak(strip, 100) });
    // a new solve: the open answer for the old one is dropped, the new one computed on the new fields
    const old = client.peakField(strip, 100);
    const fresh = client.peakField(wires, 100);
    expect(await old).toEqual({ stale: true });
    expect(await fresh).toEqual({ stale: false, ok: true, value: direct.peak(wires, 100) });
    const bad = await client.losses(wires, 0);
    expect(bad).toEqual({ stale: false, ok: false, message: 'Losses: the frequency must be a positive number of hertz' });
    client.dispose();
  });

  it('a worker that dies ends the open request with a message; the next request runs on a fresh worker', async () => {
    const client = new SummaryClient(nodeSpawn);
    const before = started.length;
    const open = client.losses(strip, 3e9);
    expect(started.length).toBe(before + 1);
    await started[before]!.terminate(); // as a crash: not through the client
    const failed = await open;
    // (Node reports code 0 or 1 for a terminated thread, depending on how far it had started)
    expect(failed).toMatchObject({ stale: false, ok: false });
    expect(failed.stale === false && !failed.ok ? failed.message : '').toMatch(/^Summary worker: the worker exited \(code \d+\)$/);
    const again = await client.losses(strip, 3e9);
    expect(started.length).toBe(before + 2);
    expect(again).toEqual({ stale: false, ok: true, value: direct.losses(strip, 3e9) });
    // dispose: an open request comes back stale (the caller has gone)
    const late = client.peakField(strip, 10);
    client.dispose();
    expect(await late).toEqual({ stale: true });
  });
});

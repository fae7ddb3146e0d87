/**
 * The real solver worker (workers/solver.worker.ts) in a Node worker thread, driven through
 * comlink exactly as the page drives it (lib/client/solver-client.ts): a request with a job id,
 * a Comlink.proxy progress callback, a SharedArrayBuffer cancel flag. Checked: the worker
 * survives a cancelled solve, an invalid section, a section beyond the node limit and a
 * request that is not a section at all, and afterwards returns the same numbers as
 * solveSection called directly (the solver is deterministic; common practice, no published
 * source). The browser's own path (cancel by terminating the worker, then a fresh one) is
 * covered by tests/e2e/solve.spec.ts.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Worker } from 'node:worker_threads';
import * as Comlink from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter';
import { solveSection } from '@/lib/engine/solve-section';
import type { Section } from '@/lib/section/schema';
import type { SolveOutcome, SolveRequest, SolverWorkerApi, WorkerProgress } from '@/workers/protocol';
import { DEFAULT_TOLERANCE } from '@/workers/protocol';

const nets: Section['nets'] = [
  { name: 'sig', role: 'signal' },
  { name: 'gnd', role: 'ground' },
];

/** A microstrip on a εr = 4.4 substrate (mm). */
function microstrip(mesh?: Section['mesh']): Section {
  return {
    format: 'edgefield.section/1',
    units: 'mm',
    background: { epsR: 1 },
    materials: [{ id: 'fr', name: 'substrate', epsR: 4.4 }],
    nets,
    shapes: [
      { id: 'plane', type: 'rect', x: -5, y: -0.035, width: 10, height: 0.035, conductor: 'gnd' },
      { id: 'sub', type: 'rect', x: -5, y: 0, width: 10, height: 1.6, dielectric: 'fr' },
      { id: 'trace', type: 'rect', x: -1.5, y: 1.6, width: 3, height: 0.035, conductor: 'sig' },
    ],
    boundary: { left: { type: 'open' }, right: { type: 'open' }, bottom: { type: 'open' }, top: { type: 'open' } },
    ...(mesh ? { mesh } : {}),
  };
}

const twinWires: Section = {
  format: 'edgefield.section/1',
  units: 'mm',
  background: { epsR: 1 },
  materials: [],
  nets,
  shapes: [
    { id: 'a', type: 'circle', cx: 0, cy: 0, r: 0.5, conductor: 'sig' },
    { id: 'b', type: 'circle', cx: 2, cy: 0, r: 0.5, conductor: 'gnd' },
  ],
  boundary: { left: { type: 'open' }, right: { type: 'open' }, bottom: { type: 'open' }, top: { type: 'open' } },
};

let worker: Worker;
let api: Comlink.Remote<SolverWorkerApi>;
let jobs = 0;

beforeAll(async () => {
  worker = new Worker(new URL('./node-worker-host.mjs', import.meta.url));
  api = Comlink.wrap<SolverWorkerApi>(nodeEndpoint(worker));
  expect(await api.ping()).toBe('pong');
});
afterAll(async () => {
  api?.[Comlink.releaseProxy]();
  await worker?.terminate();
});

interface Run {
  done: Promise<SolveOutcome>;
  progress: WorkerProgress[];
  flag: Int32Array;
}

/** Post one solve; `onProgress` sees every progress message (after it is recorded). */
function post(section: unknown, preset: 'quick' | 'standard' | 'precise', onProgress?: (p: WorkerProgress, run: Run) => void): Run {
  const sab = new SharedArrayBuffer(4);
  const run: Run = { done: undefined as unknown as Promise<SolveOutcome>, progress: [], flag: new Int32Array(sab) };
  const req: SolveRequest = { jobId: ++jobs, section: section as Section, settings: { preset, tolerance: DEFAULT_TOLERANCE }, cancelFlag: sab };
  run.done = api.solve(
    req,
    Comlink.proxy((p: WorkerProgress) => {
      run.progress.push(p);
      onProgress?.(p, run);
    }),
  );
  return run;
}

/** A good solve in the worker equals solveSection in this process, to the last bit. */
async function expectGoodSolve(section: Section, preset: 'quick' | 'standard'): Promise<void> {
  const run = post(section, preset);
  const out = await run.done;
  if (!out.ok) throw new Error(`the worker failed a good section: ${out.message}`);
  const direct = solveSection(section, { preset, tolerance: DEFAULT_TOLERANCE, keepFields: true });
  expect(out.result.capacitance).toEqual(direct.result.capacitance);
  expect(out.result.errorEstimate.relative).toBe(direct.result.errorEstimate.relative);
  expect(out.result.mesh.nodes).toBe(direct.result.mesh.nodes);
  // the field arrays arrive whole (transferred)
  expect(out.fields.xs).toBeInstanceOf(Float64Array);
  expect(out.fields.xs.length * out.fields.ys.length).toBe(out.result.mesh.nodes);
  expect(out.fields.potentials).toHaveLength(1);
  expect(out.fields.potentials[0]!.length).toBe(out.result.mesh.nodes);
  expect(run.progress.length).toBeGreaterThan(0);
  expect(run.progress.every((p) => p.jobId === out.jobId)).toBe(true);
}

describe('solver worker (workers/solver.worker.ts in a Node worker thread)', () => {
  it('solves a section and streams progress', async () => {
    await expectGoodSolve(twinWires, 'quick');
  });

  it('a solve cancelled part-way through its linear solves, then a new solve on the same worker', async () => {
    // Cancel as soon as the first linear solve reports: the shared flag is read between iterations.
    const run = post(microstrip(), 'standard', (p, r) => {
      if (p.stage === 'solve') Atomics.store(r.flag, 0, 1);
    });
    const out = await run.done;
    expect(out).toEqual({ ok: false, jobId: out.jobId, cancelled: true, message: 'Solve cancelled.' });
    expect(run.progress.some((p) => p.stage === 'solve')).toBe(true);
    await expectGoodSolve(microstrip(), 'quick');
  });

  it('a newer solve posted while the older one runs: the older is cancelled, the newer correct', async () => {
    let newer: Run | undefined;
    const older = post(microstrip(), 'standard', (p, r) => {
      if (p.stage === 'setup' && !newer) {
        // what SolverClient.solve does with shared memory: flag the old job, post the new one
        Atomics.store(r.flag, 0, 1);
        newer = post(twinWires, 'quick');
      }
    });
    const a = await older.done;
    expect(a.ok).toBe(false);
    expect(a.ok ? undefined : a.cancelled).toBe(true);
    expect(newer).toBeDefined();
    const b = await newer!.done;
    if (!b.ok) throw new Error(b.message);
    expect(b.result.capacitance).toEqual(solveSection(twinWires, { preset: 'quick' }).result.capacitance);
  });

  it('an invalid section is refused with the checker\'s message, and the worker goes on', async () => {
    const short = structuredClone(twinWires);
    short.shapes[1] = { id: 'b', type: 'circle', cx: 0.9, cy: 0, r: 0.5, conductor: 'gnd' };
    const out = await post(short, 'quick').done;
    expect(out.ok).toBe(false);
    if (out.ok) return;
    expect(out.cancelled).toBe(false);
    expect(out.message).toContain('conductor "a" (net "sig") touches or overlaps conductor "b" (net "gnd")');
    expect(out.issues?.some((i) => i.path === 'shapes.1')).toBe(true);
    await expectGoodSolve(twinWires, 'quick');
  });

  it('a section beyond the node limit is refused with the limit in the message, and the worker goes on', async () => {
    // expert controls that pass the checks (finest 1e-4 of the section) but not the node limit,
    // as in tests/unit/engine/robustness-limits.test.ts
    const fine = microstrip({ preset: 'precise', finest: 1e-3, growth: 1.05 });
    for (const i of [1, 2]) fine.shapes.push({ id: `trace${i}`, type: 'rect', x: -1.5 + 3.1 * i - 6, y: 2 + 0.37 * i, width: 2, height: 0.3, conductor: 'sig' });
    const out = await post(fine, 'precise').done;
    expect(out.ok).toBe(false);
    if (out.ok) return;
    expect(out.cancelled).toBe(false);
    expect(out.message).toMatch(/the mesh would need more than the limit of 4,000,000 nodes/);
    await expectGoodSolve(twinWires, 'quick');
  });

  it('malformed requests (no settings, an unknown preset, a tolerance out of range, a bad cancel flag) are refused, and the worker goes on', async () => {
    const noop = Comlink.proxy(() => {});
    const settings = { preset: 'quick', tolerance: DEFAULT_TOLERANCE };
    const cases: [unknown, string][] = [
      [null, 'bad solve request: the request is not an object'],
      [{ jobId: 7, section: twinWires }, 'bad solve request: the request has no settings'],
      [{ jobId: 7, section: twinWires, settings: { ...settings, preset: 'fast' } }, 'bad solve request: settings.preset must be one of quick, standard, precise (got "fast")'],
      [{ jobId: 7, section: twinWires, settings: { ...settings, tolerance: '1e-10' } }, 'bad solve request: settings.tolerance must be a number (got "1e-10")'],
      [{ jobId: 7, section: twinWires, settings, cancelFlag: new ArrayBuffer(4) }, 'bad solve request: cancelFlag must be a SharedArrayBuffer of at least 4 bytes'],
      // a loose tolerance would report values off by more than their error estimate (lib/engine/solve-section.ts)
      [{ jobId: 7, section: twinWires, settings: { ...settings, tolerance: 0.5 } }, 'the tolerance must be a number from 1e-14 to 0.0001 (got 0.5)'],
      [{ jobId: 7, section: twinWires, settings: { ...settings, tolerance: Number.NaN } }, 'the tolerance must be a number from 1e-14 to 0.0001 (got NaN)'],
    ];
    for (const [req, message] of cases) {
      const out = await api.solve(req as SolveRequest, noop);
      expect(out).toEqual({ ok: false, jobId: req === null ? -1 : 7, cancelled: false, message });
    }
    await expectGoodSolve(twinWires, 'quick');
  });

  it('requests that are not sections (null, a string, NaN coordinates) are refused, and the worker goes on', async () => {
    for (const bad of [null, 'edgefield', { ...twinWires, shapes: [{ ...twinWires.shapes[0]!, cx: Number.NaN }, twinWires.shapes[1]!] }]) {
      const out = await post(bad, 'quick').done;
      expect(out.ok, JSON.stringify(bad)).toBe(false);
      if (!out.ok) {
        expect(out.cancelled).toBe(false);
        expect(out.message.length).toBeGreaterThan(10);
      }
    }
    expect(await api.ping()).toBe('pong');
    await expectGoodSolve(twinWires, 'quick');
  });
});

describe('solver worker warm-up (a fresh worker)', () => {
  it('solves its built-in section once, then answers at once; a real solve afterwards is unchanged', async () => {
    const fresh = new Worker(new URL('./node-worker-host.mjs', import.meta.url));
    const remote = Comlink.wrap<SolverWorkerApi>(nodeEndpoint(fresh));
    try {
      const first = await remote.warmUp();
      expect(first).not.toBeNull();
      expect(first!).toBeGreaterThan(0);
      // once per worker
      expect(await remote.warmUp()).toBe(0);
      const out = await remote.solve(
        { jobId: 1, section: twinWires, settings: { preset: 'quick', tolerance: DEFAULT_TOLERANCE } },
        Comlink.proxy(() => {}),
      );
      if (!out.ok) throw new Error(out.message);
      // deterministic solver: the same numbers as a direct call (common practice, no published source)
      expect(out.result.capacitance).toEqual(solveSection(twinWires, { preset: 'quick', tolerance: DEFAULT_TOLERANCE }).result.capacitance);
    } finally {
      remote[Comlink.releaseProxy]();
      await fresh.terminate();
    }
  });
});

/**
 * Sweep bench harness: the real analysis worker (workers/analysis.worker.ts) runs a 12-point
 * sweep of a microstrip trace width at the standard preset; the page records the wall time
 * from the request to the last point.
 */
import * as Comlink from 'comlink';
import type { AnalysisWorkerApi } from '@/workers/analysis-protocol';
import type { SweepPoint } from '@/lib/analysis/sweep';
import type { Section } from '@/lib/section/schema';

const section = {
  format: 'edgefield.section/1',
  units: 'mm',
  variables: { w: 1.5, h: 0.8, t: 0.035 },
  materials: [{ id: 'laminate', name: 'Glass-epoxy laminate', epsR: 4.4, lossTangent: 0.02 }],
  nets: [{ name: 'feed', role: 'signal' }],
  shapes: [
    { id: 'substrate', type: 'rect', x: -8, y: 0, width: 16, height: 'h', dielectric: 'laminate' },
    { id: 'trace', type: 'rect', x: '-w/2', y: 'h', width: 'w', height: 't', conductor: 'feed' },
  ],
  boundary: { bottom: { type: 'ground', at: 0 } },
} as unknown as Section;

declare global {
  interface Window {
    runSweep: () => Promise<{ ms: number; points: number; failed: number; z0: number[] }>;
  }
}

const worker = new Worker(new URL('../../../workers/analysis.worker.ts', import.meta.url), { type: 'module' });
const api = Comlink.wrap<AnalysisWorkerApi>(worker);

window.runSweep = async () => {
  await api.ping();
  const values = Array.from({ length: 12 }, (_, i) => 0.5 + (2.5 * i) / 11);
  const pts: SweepPoint[] = [];
  const t0 = performance.now();
  await api.sweep(
    { section, target: { kind: 'variable', name: 'w' }, values, settings: { preset: 'standard' } },
    Comlink.proxy((p: SweepPoint) => void pts.push(p)),
    Comlink.proxy(() => {}),
  );
  const ms = performance.now() - t0;
  return { ms, points: pts.length, failed: pts.filter((p) => !p.result).length, z0: pts.map((p) => p.result?.line?.z0Ohm ?? NaN) };
};
document.getElementById('status')!.textContent = 'ready';

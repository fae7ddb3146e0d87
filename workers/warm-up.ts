/**
 * The section the solver worker solves once, at the quick preset, while the page is idle after
 * opening (SolverWorkerApi.warmUp): V8 compiles the mesh, discretisation and multigrid kernels
 * while they run, so a fresh worker's first real solve was about twice as slow as the next
 * ones (Node, standard microstrip: 1070–1084 ms first, 430–520 ms after; after this warm-up
 * the first took 540–604 ms). It holds what typical sections use: a dielectric block, a
 * rectangle and a round conductor, two signal nets and a ground boundary. Its result is
 * thrown away.
 */
import type { Section } from '@/lib/section/schema';

export const WARM_UP_SECTION: Section = {
  format: 'edgefield.section/1',
  units: 'mm',
  background: { epsR: 1 },
  materials: [{ id: 'sub', name: 'substrate', epsR: 4.4 }],
  nets: [
    { name: 'trace', role: 'signal' },
    { name: 'wire', role: 'signal' },
  ],
  shapes: [
    { id: 'sub', type: 'rect', x: -2, y: 0, width: 4, height: 0.5, dielectric: 'sub' },
    { id: 'trace', type: 'rect', x: -0.4, y: 0.5, width: 0.8, height: 0.035, conductor: 'trace' },
    { id: 'wire', type: 'circle', cx: 1.2, cy: 1.2, r: 0.15, conductor: 'wire' },
  ],
  boundary: { left: { type: 'open' }, right: { type: 'open' }, bottom: { type: 'ground', at: 0 }, top: { type: 'open' } },
  mesh: { preset: 'quick' },
};

/**
 * Measurement of the full pipeline (solveProblem) for the bench. Loaded lazily so the other
 * cases run even when lib/fdm/index.ts is missing.
 */
import type { MeshPreset, Problem } from '../../lib/fdm/types';
import { applyOperator } from '../../lib/fdm/operator';
import { assembleSystem } from './systems';
import { cpuMs, median } from './solver-case';

/** Microstrip in metres: 2 mm × 35 µm trace on a 1.6 mm εr 4.4 substrate, ground plane at y = 0. */
export function benchMicrostrip(preset: MeshPreset): Problem {
  return {
    backgroundEpsR: 1,
    dielectrics: [{ geometry: { type: 'rect', x: -10e-3, y: 0, width: 20e-3, height: 1.6e-3 }, epsR: 4.4, material: 0 }],
    conductors: [{ geometry: { type: 'rect', x: -1e-3, y: 1.6e-3, width: 2e-3, height: 35e-6 }, net: 0, shapeId: 'trace' }],
    nets: [{ name: 'trace', ground: false }],
    boundary: { left: { type: 'open' }, right: { type: 'open' }, bottom: { type: 'ground', at: 0 }, top: { type: 'open' } },
    mesh: { preset },
  };
}

export async function measureSolverPipeline(preset: MeshPreset, repeats = 3): Promise<Record<string, unknown>> {
  let solveProblem: ((p: Problem, o?: { tolerance?: number }) => {
    mesh: { nx: number; ny: number; xs: Float64Array; ys: Float64Array; nodes: number };
    timing: { setupMs: number; solveMs: number; totalMs: number };
    solver: { iterations: number; relResidual: number };
  }) | undefined;
  try {
    const mod = (await import('../../lib/fdm/index')) as Record<string, unknown>;
    if (typeof mod.solveProblem === 'function') solveProblem = mod.solveProblem as typeof solveProblem;
  } catch {
    solveProblem = undefined;
  }
  if (!solveProblem) return { skipped: 'lib/fdm/index.ts with solveProblem is not available yet' };
  const problem = benchMicrostrip(preset);
  solveProblem(problem); // warm-up
  const setups: number[] = [], solves: number[] = [], iters: number[] = [], totalCpu: number[] = [];
  let rel = 0;
  let mesh: { nx: number; ny: number; xs: Float64Array; ys: Float64Array; nodes: number } = { nx: 0, ny: 0, xs: new Float64Array(0), ys: new Float64Array(0), nodes: 0 };
  for (let r = 0; r < repeats; r++) {
    const c0 = cpuMs();
    const sol = solveProblem(problem);
    totalCpu.push(cpuMs() - c0);
    setups.push(sol.timing.setupMs);
    solves.push(sol.timing.solveMs);
    iters.push(sol.solver.iterations);
    rel = Math.max(rel, sol.solver.relResidual);
    mesh = sol.mesh;
  }
  // one matvec on an operator of the finest mesh's size (the cost depends on the size only)
  const sys = assembleSystem(mesh.xs, mesh.ys, () => 1, (_i, j) => (j === 0 ? 0 : null));
  const out = new Float64Array(sys.rhs.length);
  const mv: number[] = [];
  for (let r = 0; r < 30; r++) {
    const t0 = performance.now();
    applyOperator(sys.op, sys.rhs, out);
    mv.push(performance.now() - t0);
  }
  const matvecMs = median(mv.slice(5));
  const solveMs = median(solves);
  return {
    _cpu: { totalMs: Number(median(totalCpu).toFixed(1)) },
    unknowns: mesh.nodes,
    setupMs: Number(median(setups).toFixed(1)),
    solveMs: Number(solveMs.toFixed(1)),
    matvecMs: Number(matvecMs.toFixed(3)),
    workUnits: Number((solveMs / matvecMs).toFixed(1)),
    iterations: median(iters),
    relResidual: Number(rel.toExponential(2)),
  };
}

/**
 * Shared measurement of the solver cases: set-up + solve of one linear system with the
 * multigrid-preconditioned CG to relative residual 1e-8, repeated, medians reported.
 * workUnits = solveMs / matvecMs, matvecMs = one applyOperator on the same operator (median of
 * many, measured around the solves so that both see the same machine load).
 */
import { fineProduct, setupHierarchy, solve, type Hierarchy } from '../../lib/fdm/multigrid';
import { applyOperator } from '../../lib/fdm/operator';
import type { LinearSystem } from './systems';

export const BENCH_TOLERANCE = 1e-8;

export interface SolverCaseResult {
  [key: string]: unknown;
  unknowns: number;
  setupMs: number;
  solveMs: number;
  matvecMs: number;
  workUnits: number;
  iterations: number;
  relResidual: number;
}

export function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : 0.5 * (s[m - 1] + s[m]);
}

const round = (v: number, digits: number) => Number(v.toFixed(digits));

/** Process CPU time in ms (all threads; steadier than wall-clock on a loaded machine). */
export function cpuMs(): number {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
}

/**
 * Times a block of `count` consecutive matvecs on `sys`; pushes the wall-clock and CPU timings
 * in ms. The first two of a block only bring the operator back into the caches (a solve or
 * set-up just ran and evicted it) and are not recorded: a product inside CG runs warm too, and
 * a cold one would make the work units look better than they are.
 */
function timeMatvecs(sys: LinearSystem, count: number, out: Float64Array, wall: number[], cpu: number[]): void {
  applyOperator(sys.op, sys.rhs, out);
  applyOperator(sys.op, sys.rhs, out);
  for (let r = 0; r < count; r++) {
    const c0 = cpuMs();
    const t0 = performance.now();
    applyOperator(sys.op, sys.rhs, out);
    wall.push(performance.now() - t0);
    cpu.push(cpuMs() - c0);
  }
}

/**
 * The same timing for the product CG itself uses (symmetric-half storage, padded): on this
 * machine it is faster than applyOperator on the five-array Operator5, so work units against
 * it are the stricter figure. Pushes CPU timings in ms.
 */
function timeHalfProducts(h: Hierarchy, count: number, cpu: number[]): void {
  const off = h.levels[0].off;
  const x = new Float64Array(h.nx * h.ny + 2 * off), out = new Float64Array(x.length);
  for (let k = 0; k < h.nx * h.ny; k++) x[k + off] = Math.sin(k);
  fineProduct(h, x, out);
  fineProduct(h, x, out);
  for (let r = 0; r < count; r++) {
    const c0 = cpuMs();
    fineProduct(h, x, out);
    cpu.push(cpuMs() - c0);
  }
}

/** True relative residual ‖b − A x‖ / ‖b‖. */
export function trueRelResidual(sys: LinearSystem, x: Float64Array): number {
  const q = new Float64Array(x.length);
  applyOperator(sys.op, x, q);
  let rr = 0, bb = 0;
  for (let k = 0; k < x.length; k++) {
    rr += (sys.rhs[k] - q[k]) ** 2;
    bb += sys.rhs[k] ** 2;
  }
  return Math.sqrt(rr / bb);
}

/**
 * Runs set-up + solve `warmups` times, then `repeats` times, and reports the medians of the
 * latter (steady state) and the first run's times (`_firstRun`: includes compiling the
 * kernels in this process).
 *
 * Why two warm-up runs: V8 compiles the kernels (and re-compiles the set-up's loops, which it
 * enters once per call) on the second core while they run, so the first solves of a process
 * are slower and noisier. Measured on the uniform 1M system, 2026-12-02, one process, fresh
 * hierarchy each time, solve ms: 569 466 338 249 251 320 ... and 622 505 365 263 337 261 ...:
 * the third run onwards is at the steady level within the machine's noise.
 */
export function measureSolver(sys: LinearSystem, repeats = 5, warmups = 2): SolverCaseResult {
  const out = new Float64Array(sys.rhs.length);
  const mv: number[] = [], mvCpu: number[] = [];
  // warm-up: compiles the kernels at this size
  timeMatvecs(sys, 10, out, [], []);
  let firstSetup = 0, firstSolve = 0;
  for (let w = 0; w < warmups; w++) {
    const t0 = performance.now();
    const h = setupHierarchy(sys.op);
    const t1 = performance.now();
    solve(h, sys.rhs, { tolerance: BENCH_TOLERANCE });
    if (w === 0) {
      firstSetup = t1 - t0;
      firstSolve = performance.now() - t1;
    }
  }
  const setups: number[] = [], solves: number[] = [], iters: number[] = [];
  const setupsCpu: number[] = [], solvesCpu: number[] = [], halfCpu: number[] = [];
  let relResidual = 0;
  for (let r = 0; r < repeats; r++) {
    timeMatvecs(sys, 5, out, mv, mvCpu);
    const c0 = cpuMs();
    const t0 = performance.now();
    const h = setupHierarchy(sys.op);
    const t1 = performance.now();
    const c1 = cpuMs();
    const res = solve(h, sys.rhs, { tolerance: BENCH_TOLERANCE });
    const t2 = performance.now();
    const c2 = cpuMs();
    timeMatvecs(sys, 5, out, mv, mvCpu);
    timeHalfProducts(h, 5, halfCpu);
    setups.push(t1 - t0);
    solves.push(t2 - t1);
    setupsCpu.push(c1 - c0);
    solvesCpu.push(c2 - c1);
    iters.push(res.iterations);
    relResidual = Math.max(relResidual, trueRelResidual(sys, res.x));
  }
  const matvecMs = median(mv);
  const solveMs = median(solves);
  const matvecCpu = median(mvCpu);
  return {
    _firstRun: { setupMs: round(firstSetup, 1), solveMs: round(firstSolve, 1) },
    _cpu: {
      setupMs: round(median(setupsCpu), 1),
      solveMs: round(median(solvesCpu), 1),
      matvecMs: round(matvecCpu, 3),
      workUnits: round(median(solvesCpu) / matvecCpu, 1),
      // the stricter figure: against the product on the solver's own symmetric-half storage
      matvecHalfMs: round(median(halfCpu), 3),
      workUnitsHalf: round(median(solvesCpu) / median(halfCpu), 1),
    },
    unknowns: sys.unknowns,
    setupMs: round(median(setups), 1),
    solveMs: round(solveMs, 1),
    matvecMs: round(matvecMs, 3),
    workUnits: round(solveMs / matvecMs, 1),
    iterations: median(iters),
    relResidual: Number(relResidual.toExponential(2)),
  };
}

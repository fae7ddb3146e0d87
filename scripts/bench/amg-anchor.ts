/**
 * The general-purpose algebraic multigrid figures the solver is compared with: pyamg 5.3.0,
 * smoothed aggregation V-cycle as a preconditioner of scipy CG, relative residual 1e-8, on the
 * anchor's system (medians of 3 runs on a 2-core machine of the kind the project builds on,
 * measured 2026-12-01; copied from the project's shared amg_anchor.json because pyamg cannot be
 * installed here).
 */
export const AMG_ANCHOR = [
  { unknowns: 243656, matvecMs: 0.73, setupS: 0.49, solveS: 0.5, iterations: 14 },
  { unknowns: 974728, matvecMs: 4.1, setupS: 1.92, solveS: 2.53, iterations: 17 },
  { unknowns: 3898912, matvecMs: 34.34, setupS: 10.55, solveS: 11.39, iterations: 18 },
] as const;

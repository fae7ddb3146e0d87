/**
 * Plain-data types of the numerical core. No DOM, no Node APIs, no framework imports.
 * Lengths here are in metres unless a comment says otherwise; fields are row-major
 * Float64Array(nx*ny) indexed j*nx + i (i along x, j along y).
 */

/** Geometry of one shape, in metres. Same meaning as in the section format. */
export type Geometry =
  | { type: 'rect'; x: number; y: number; width: number; height: number }
  | { type: 'circle'; cx: number; cy: number; r: number }
  | { type: 'ring'; cx: number; cy: number; rInner: number; rOuter: number }
  | { type: 'polygon'; points: [number, number][] }
  | { type: 'strip'; x1: number; y1: number; x2: number; y2: number };

export type BoundarySideSpec =
  | { type: 'open' }
  | { type: 'ground'; at: number }
  | { type: 'mirror'; at: number };

export type MeshPreset = 'quick' | 'standard' | 'precise';

export interface MeshSpec {
  preset: MeshPreset;
  /** Finest spacing in metres (expert override). */
  finest?: number;
  /** Largest neighbour spacing ratio (expert override). */
  growth?: number;
  /** Open sides carried this many structure sizes away (expert override). */
  extent?: number;
}

/**
 * One electrostatic problem: the geometry in metres, permittivities relative.
 * Dielectrics are painted in order (a later one covers an earlier one); conductors cover
 * dielectrics. Nets are referenced by index.
 */
export interface Problem {
  backgroundEpsR: number;
  dielectrics: { geometry: Geometry; epsR: number; /** index into caller's materials */ material: number }[];
  conductors: { geometry: Geometry; /** index into nets */ net: number; /** caller's shape id */ shapeId?: string }[];
  nets: { name: string; ground: boolean }[];
  boundary: { left: BoundarySideSpec; right: BoundarySideSpec; bottom: BoundarySideSpec; top: BoundarySideSpec };
  mesh: MeshSpec;
}

/** A rectilinear tensor-product mesh: node coordinates along x and y (metres, increasing). */
export interface Mesh {
  xs: Float64Array;
  ys: Float64Array;
  nx: number;
  ny: number;
}

/**
 * Symmetric 5-point operator on an nx × ny node grid, all arrays Float64Array(nx*ny):
 *   (A x)_k = c_k x_k − w_k x_{k−1} − e_k x_{k+1} − s_k x_{k−nx} − n_k x_{k+nx}.
 * Couplings are ≥ 0 and symmetric (w_k = e_{k−1}, s_k = n_{k−nx}); couplings that would
 * leave the grid are 0. A fixed (Dirichlet) node has c = 1 and all couplings 0, and no
 * free node couples to it (its influence is moved to the right-hand side). The matrix is
 * symmetric positive definite on the free nodes.
 */
export interface Operator5 {
  nx: number;
  ny: number;
  c: Float64Array;
  w: Float64Array;
  e: Float64Array;
  s: Float64Array;
  n: Float64Array;
}

/** Progress report from a running solve (for the UI and the CLI). */
export interface SolveProgress {
  stage: 'mesh' | 'setup' | 'solve' | 'charges' | 'refine';
  /** Which member of the mesh family (0 = finest) or which signal net, where it applies. */
  level?: number;
  iteration?: number;
  relResidual?: number;
  /** Overall fraction done, 0 to 1, where known. */
  fraction?: number;
}

export interface IterativeSolveOptions {
  /** Relative residual target ‖b − Ax‖/‖b‖ (absolute when b = 0). @default 1e-10 */
  tolerance?: number;
  /** @default 200 */
  maxIterations?: number;
  /** Called after each iteration; return false (or throw) to stop. */
  onIteration?: (iteration: number, relResidual: number) => void | boolean;
  /** Checked between iterations; when true the solve throws a SolveCancelledError. */
  isCancelled?: () => boolean;
}

export interface IterativeSolveResult {
  x: Float64Array;
  converged: boolean;
  iterations: number;
  residualNorms: number[];
  /** Geometric mean reduction of the residual per iteration. */
  convergenceFactor: number;
}

export class SolveCancelledError extends Error {
  constructor() {
    super('solve cancelled');
    this.name = 'SolveCancelledError';
  }
}

/** Options of solveProblem (lib/fdm/solve-problem.ts). */
export interface SolveProblemOptions {
  onProgress?: (p: SolveProgress) => void;
  isCancelled?: () => boolean;
  /** Relative residual target of each linear solve. @default 1e-10 */
  tolerance?: number;
  /** Return the finest mesh's fields (potentials, cell permittivity, node nets). @default false */
  keepFields?: boolean;
}

/** Everything solveProblem finds: capacitance matrices (F/m), error estimate, mesh and fields. */
export interface ProblemSolution {
  /** Indices into problem.nets, in matrix order (non-ground nets with conductors). */
  signalNets: number[];
  /** Maxwell matrix, F/m: reported values (extrapolated where trustworthy). */
  maxwell: number[][];
  /** Same with every εr = 1, F/m. */
  vacuum: number[][];
  /** Raw values on the finest mesh. */
  finest: { maxwell: number[][]; vacuum: number[][] };
  error: {
    /** Estimated relative error of the reported values (largest over the entries that matter, vacuum included). */
    relative: number;
    perEntry: number[][];
    observedOrder?: number;
    monotone: boolean;
    /** Maxwell matrix on each member of the mesh family, finest first. */
    family: { nodes: number; maxwell: number[][] }[];
    note: string;
  };
  /** Finest mesh, node coordinates in metres. */
  mesh: Mesh & { nodes: number; finestSpacing: number; preset: string };
  /** Finest mesh, dielectric solve: one potential per signal net at 1 V (others 0). */
  /** nodeNet: index into problem.nets for conductor nodes, −1 for free nodes, −2 for ground-plane nodes. */
  fields?: {
    potentials: Float64Array[];
    cellEpsR: Float32Array;
    nodeNet: Int16Array;
    /** Finest mesh, vacuum solve (every εr = 1), one per signal net; absent when the medium is uniform (then equal to `potentials`). */
    vacuumPotentials?: Float64Array[];
  };
  solver: { iterations: number; relResidual: number; method: string };
  timing: { setupMs: number; solveMs: number; totalMs: number };
  warnings: string[];
}

/**
 * The result of solving one section: the "edgefield.result/1" JSON that the CLI prints,
 * the worker returns, the API stores and the UI shows, plus the field arrays (kept
 * apart from the JSON because they are large and binary).
 *
 * Units: SI throughout (F/m, H/m, Ω, V, m, s) unless a field name says otherwise.
 * `gap` and `width` of `plates` are in the section's units (the CLI contract says so).
 */
export const RESULT_FORMAT = 'edgefield.result/1' as const;

export interface ErrorEstimate {
  /** Estimated relative error of the reported capacitance (largest over the matrix entries that matter). */
  relative: number;
  /** Estimated relative error per Maxwell entry (same shape as the matrix). */
  perEntry: number[][];
  /** Observed order of convergence over the mesh family, where it could be computed. */
  observedOrder?: number;
  /** False when the values over the mesh family did not converge monotonically. */
  monotone: boolean;
  /** The diagonal Maxwell entries on each member of the mesh family, finest first (for display). */
  family: { nodes: number; maxwell: number[][] }[];
  /** Plain words on how the estimate was made and how far to trust it. */
  note: string;
}

export interface LineValues {
  capacitancePerM: number;
  inductancePerM: number;
  z0Ohm: number;
  epsEff: number;
  velocityMPerS: number;
  delaySPerM: number;
  /** Capacitance with every dielectric replaced by vacuum. */
  vacuumCapacitancePerM: number;
}

export interface PlatesValues {
  /** Clear distance between facing surfaces, section units. */
  gap: number;
  /** Overlap of the two plates, section units. */
  width: number;
  gapToWidth: number;
  /** ε·width/gap of the medium in the gap, F/m. */
  idealPerM: number;
  solvedOverIdeal: number;
  /** Solved two-terminal capacitance between the plates, F/m (see docs/result-format.md). */
  solvedPerM?: number;
  /** Relative permittivity of the medium at the centre of the gap. */
  epsR?: number;
  /** 'vertical': one plate above the other; 'horizontal': side by side. */
  arrangement?: 'vertical' | 'horizontal';
  /** The two plate shapes (lower or left one first). */
  shapeIds?: [string, string];
  /**
   * True when the drawn plates are halves ending on a mirror boundary: width, idealPerM
   * and solvedPerM then describe the whole (mirrored) pair, twice the drawn half.
   */
  mirrored?: boolean;
}

export interface SectionResult {
  format: typeof RESULT_FORMAT;
  /** Ground net names (the 0 V reference); "(boundary)" stands for ground boundaries. */
  reference: string[];
  /** Signal net names, in matrix order. */
  nets: string[];
  capacitance: {
    /** Maxwell (short-circuit) matrix, F/m: Q = C·V. */
    maxwell: number[][];
    /** Mutual (branch) form, F/m: diagonal = capacitance to the reference, off-diagonal = −C_ij. */
    mutual: number[][];
    /** Maxwell matrix with every dielectric replaced by vacuum, F/m. */
    vacuum: number[][];
  };
  errorEstimate: ErrorEstimate;
  /**
   * Present when a boundary side is a mirror: the drawing is part of a symmetric
   * structure. `capacitance` is that of the drawn part; `line` (and `plates`, see
   * `plates.mirrored`) describe the whole structure, `factor` times the drawn part's
   * capacitance (2 per mirror axis; 1 when two mirrors face each other, a periodic cell).
   */
  symmetry?: { mirrors: ('left' | 'right' | 'bottom' | 'top')[]; factor: number };
  /** Present when there is exactly one signal net; for the whole structure when mirrored. */
  line?: LineValues;
  /** Present when the section is a facing plate pair. */
  plates?: PlatesValues;
  mesh: { nodes: number; nx: number; ny: number; preset: string; finestM: number };
  solver: { iterations: number; relResidual: number; method: string };
  timing: { ms: number; setupMs: number; solveMs: number };
  /** Warnings worth showing (for example convergence not monotone). */
  warnings: string[];
}

/** Field arrays of the finest solve, for display and storage. */
export interface SectionFields {
  /** Node coordinates in metres. */
  xs: Float64Array;
  ys: Float64Array;
  /** One potential field per signal net (that net at 1 V, all others at 0 V), row-major j*nx+i. */
  potentials: Float64Array[];
  /** Relative permittivity per cell, Float32Array((nx−1)*(ny−1)), row-major. */
  cellEpsR: Float32Array;
  /** Conductor net index per node (into netNames), −1 where free, −2 on a ground-boundary plane; Int16Array(nx*ny). */
  nodeNet: Int16Array;
  /** Net name of each nodeNet index (nets without shapes are left out of the solve). */
  netNames?: string[];
}

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
  /** Inductance matrix per unit length, H/m: μ0 ε0 C0⁻¹ over the signal nets (lib/analysis/lines.ts). */
  inductancePerM?: number[][];
  /** Exactly two signal nets: even/odd modes, differential and common-mode impedance (public CLI contract). */
  modes?: {
    even: { z0Ohm: number; epsEff: number };
    odd: { z0Ohm: number; epsEff: number };
    differentialOhm: number;
    commonOhm: number;
    symmetric?: boolean;
  };
  /** Three or more signal nets: the propagation modes, by increasing εeff (public CLI contract). */
  modal?: { z0Ohm: number; epsEff: number; voltages?: number[] }[];
  /** Two or more signal nets: weak-coupling crosstalk between neighbouring pairs (lib/analysis/lines.ts). */
  crosstalk?: CrosstalkEntry[];
  /** With a frequency (CLI --frequency): dielectric and conductor losses (lib/analysis/losses.ts). */
  losses?: LossValues;
  /** With a voltage (CLI --volts): peak |E| per material and per conductor (lib/analysis/peak-field.ts). */
  peakField?: PeakFieldEntry[];
  /** How the peak field was computed (voltages applied, caution text). */
  peakFieldInfo?: { volts: number; voltages: Record<string, number>; caution: string };
}

export interface CrosstalkEntry {
  aggressor: string;
  victim: string;
  /** Saturated near-end coefficient, dimensionless. */
  nearEnd: number;
  /** Far-end coefficient per length, s/m (× length / rise time = far-end noise ratio). */
  farEndPerLength: number;
  /** For the coupled length and rise time given (when given). */
  lengthM?: number;
  riseTimeS?: number;
  farEnd?: number;
  saturationLengthM?: number;
}

export interface LossValues {
  frequencyHz: number;
  /** Shunt conductance, S/m: a number for one signal net, the Maxwell-form matrix for several. */
  gPerM: number | number[][];
  /** Series resistance, Ω/m: a number for one signal net, a matrix for several (ground return included). */
  rPerM: number | number[][];
  /** Attenuation, dB/m: a number for one signal net; for several, one per mode (same order as modes even/odd or modal). */
  alphaDbPerM: number | number[];
  /** DC resistance of each signal net's own conductors, Ω/m (same order as nets). */
  rDcPerM?: (number | null)[];
  /** Skin depth per net name (and "(boundary)" for ground planes), m. */
  skinDepthM?: Record<string, number>;
  /** Surface resistance per net name, Ω. */
  surfaceResistanceOhm?: Record<string, number>;
  /** Where the incremental-inductance rule is not trustworthy (skin depth vs thickness, zero-thickness strips). */
  warnings?: string[];
  /** Plain words on the method. */
  method?: string;
}

export interface PeakFieldEntry {
  /** Material id, "background", or a net name (along that conductor). */
  where: string;
  kind?: 'material' | 'conductor';
  /** Largest |E| found, V/m (mesh-dependent where singular). */
  vPerM: number;
  /** Position of the peak, metres (section coordinates × the unit's metres). */
  x: number;
  y: number;
  /** True when the value grows with mesh refinement (a sharp corner or edge). */
  singular: boolean;
  /** Dielectric strength of the material there, V/m (typical figure, not a rating). */
  strengthVPerM?: number;
  /** strength / peak: above 1 means below the typical strength. */
  margin?: number;
  /** Suggested corner radius to tame a singular peak, m (common practice, no published source). */
  suggestedCornerRadiusM?: number;
  /** Peak |E| over cells twice as large (the coarser family spacing), V/m. */
  coarserVPerM?: number;
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
  /** Vacuum-solve potentials of the finest mesh per signal net (only when a dielectric differs from the background). */
  vacuumPotentials?: Float64Array[];
}

/**
 * Solve one section: validate and resolve it, convert it to metres and to the numerical
 * core's Problem, solve, and build the "edgefield.result/1" JSON (lib/engine/types.ts).
 * Synchronous and deterministic: the CLI, the tests and the Web Worker call this same
 * function and get the same numbers for the same section and settings.
 *
 * Conventions (see docs/result-format.md):
 * - reference: the ground nets that have shapes, plus "(boundary)" when a boundary side
 *   is a ground plane.
 * - nets: the signal nets that have shapes, in matrix order (section order).
 * - mutual (branch) form: mutual_ii = Σ_j C_ij (the capacitance of net i to the
 *   reference), mutual_ij = −C_ij (Paul 2008, Analysis of Multiconductor Transmission
 *   Lines, 2nd ed., ch. 3).
 * - line values (exactly one signal net): L' = μ0 ε0 / C0, Z0 = 1/(c √(C C0)),
 *   εeff = C/C0, v = c/√εeff, delay = 1/v, with C0 the capacitance with every dielectric
 *   replaced by vacuum. With mirror boundaries the matrices are those of the drawn part
 *   and the line values those of the whole structure (see mirrorSymmetry).
 * - plates: see plates.ts and twoTerminalCapacitance below.
 */
import { solveProblem } from '../fdm/index';
import type { MeshPreset, ProblemSolution, SolveProgress } from '../fdm/types';
import { parseSectionValue } from '../section/parse';
import { SectionError, type SectionIssue } from '../section/issues';
import type { ResolvedSection, Section } from '../section/schema';
import { C_LIGHT, EPS0, MU0 } from './constants';
import { detectPlates } from './plates';
import { toProblem } from './to-problem';
import { lineAnalysis } from '../analysis/analyse';
import { computeLosses } from '../analysis/losses';
import { computePeakField, FIELD_CAUTION } from '../analysis/peak-field';
import { RESULT_FORMAT, type LineValues, type PlatesValues, type SectionFields, type SectionResult } from './types';

export { SectionError } from '../section/issues';
export { SolveCancelledError } from '../fdm/types';

export interface SolveSectionOptions {
  onProgress?: (p: SolveProgress) => void;
  isCancelled?: () => boolean;
  /** Return the field arrays of the finest mesh. @default false */
  keepFields?: boolean;
  /** Relative residual target of each linear solve. @default 1e-10 (the core's default) */
  tolerance?: number;
  /** Mesh preset; overrides the section's `mesh.preset`. */
  preset?: MeshPreset;
  /** Adds `losses` at this frequency, Hz (lib/analysis/losses.ts). */
  frequencyHz?: number;
  /** Adds `peakField` for this voltage on the first signal net, V (lib/analysis/peak-field.ts). */
  volts?: number;
  /** Voltage per signal net for `peakField` (overrides the first-net default). */
  voltages?: Record<string, number>;
  /** Coupled length (m) and rise time (s) for the crosstalk figures. */
  lengthM?: number;
  riseTimeS?: number;
}

export interface SolveSectionOutput {
  result: SectionResult;
  fields?: SectionFields;
}

/**
 * Accepted relative residual targets of the linear solves. Looser than 1e-4 the algebraic
 * error can exceed the error estimate (a quick-preset microstrip at 1e-3: 1 % off beside a
 * 0.1 % estimate); tighter than 1e-14 is below round-off and only runs into the iteration caps.
 */
export const TOLERANCE_RANGE = { min: 1e-14, max: 1e-4 } as const;

/** Name used in `reference` for ground boundaries. */
export const BOUNDARY_REFERENCE = '(boundary)';

const now = (): number => (typeof performance !== 'undefined' ? performance.now() : Date.now());

/**
 * Two-terminal capacitance between signal nets i and j with the reference left floating:
 * the mutual capacitance in parallel with the series pair of their capacitances to the
 * reference, (C_ii C_jj − C_ij²)/(C_ii + C_jj + 2 C_ij) in Maxwell entries.
 */
export function twoTerminalCapacitance(maxwell: number[][], i: number, j: number): number {
  const cii = maxwell[i]![i]!,
    cjj = maxwell[j]![j]!,
    cij = maxwell[i]![j]!;
  return (cii * cjj - cij * cij) / (cii + cjj + 2 * cij);
}

/**
 * Mutual (branch) form of a Maxwell matrix. A net shielded from the reference (a core inside
 * another signal net's ring) has a capacitance to the reference of exactly 0, which the solve
 * gives as ±(round-off of the linear solves): a negative row sum no larger than `zeroWithin`
 * × C_ii (the estimated relative error) is reported as 0, never as a negative capacitance.
 */
export function mutualForm(maxwell: number[][], zeroWithin = 0): number[][] {
  return maxwell.map((row, i) =>
    row.map((v, j) => {
      if (i !== j) return -v;
      const sum = row.reduce((a, b) => a + b, 0);
      return sum < 0 && -sum <= zeroWithin * v ? 0 : sum;
    }),
  );
}

export function lineValues(c: number, c0: number): LineValues {
  const epsEff = c / c0;
  const velocity = C_LIGHT / Math.sqrt(epsEff);
  return {
    capacitancePerM: c,
    inductancePerM: (MU0 * EPS0) / c0,
    z0Ohm: 1 / (C_LIGHT * Math.sqrt(c * c0)),
    epsEff,
    velocityMPerS: velocity,
    delaySPerM: 1 / velocity,
    vacuumCapacitancePerM: c0,
  };
}

/**
 * Mirror boundaries of a section and the factor from the drawn part to the whole
 * structure: 2 per axis with one mirror; two mirrors facing each other make a periodic
 * cell (factor 1 on that axis). Undefined when there is no mirror.
 */
export function mirrorSymmetry(section: ResolvedSection): SectionResult['symmetry'] {
  const b = section.boundary;
  const mirrors = (['left', 'right', 'bottom', 'top'] as const).filter((k) => b[k].type === 'mirror');
  if (mirrors.length === 0) return undefined;
  const axis = (lo: 'left' | 'bottom', hi: 'right' | 'top') => (mirrors.includes(lo) !== mirrors.includes(hi) ? 2 : 1);
  return { mirrors: [...mirrors], factor: axis('left', 'right') * axis('bottom', 'top') };
}

/** Validate a section (throws SectionError) and return its resolved form and warnings. */
export function validateSection(section: Section | unknown): { resolved: ResolvedSection; warnings: SectionIssue[] } {
  const parsed = parseSectionValue(section);
  if (!parsed.ok) throw new SectionError(parsed.message, parsed.issues);
  return { resolved: parsed.resolved, warnings: parsed.warnings };
}

/** Build the result JSON from a solution (exported for tests). */
export function buildResult(
  resolved: ResolvedSection,
  sol: ProblemSolution,
  netNames: string[],
  extraWarnings: string[],
  ms: number,
): SectionResult {
  const nets = sol.signalNets.map((k) => netNames[k]!);
  const groundNames = resolved.nets.filter((n) => n.role === 'ground' && netNames.includes(n.name)).map((n) => n.name);
  const b = resolved.boundary;
  const reference = [...groundNames, ...([b.left, b.right, b.bottom, b.top].some((s) => s.type === 'ground') ? [BOUNDARY_REFERENCE] : [])];

  const result: SectionResult = {
    format: RESULT_FORMAT,
    reference,
    nets,
    capacitance: { maxwell: sol.maxwell, mutual: mutualForm(sol.maxwell, sol.error.relative), vacuum: sol.vacuum },
    errorEstimate: {
      relative: sol.error.relative,
      perEntry: sol.error.perEntry,
      ...(sol.error.observedOrder !== undefined ? { observedOrder: sol.error.observedOrder } : {}),
      monotone: sol.error.monotone,
      family: sol.error.family,
      note: sol.error.note,
    },
    mesh: { nodes: sol.mesh.nodes, nx: sol.mesh.nx, ny: sol.mesh.ny, preset: sol.mesh.preset, finestM: sol.mesh.finestSpacing },
    solver: { ...sol.solver },
    timing: { ms, setupMs: sol.timing.setupMs, solveMs: sol.timing.solveMs },
    warnings: [...extraWarnings, ...sol.warnings],
  };

  const sym = mirrorSymmetry(resolved);
  if (sym) {
    result.symmetry = sym;
    if (sym.factor === 1) {
      result.warnings.push('two mirror boundaries face each other: the section is one cell of a periodic array, and every value is per cell');
    }
  }
  const factor = sym?.factor ?? 1;
  if (nets.length === 1) result.line = lineValues(factor * sol.maxwell[0]![0]!, factor * sol.vacuum[0]![0]!);

  const pair = detectPlates(resolved);
  if (pair) {
    const idx = pair.nets.map((n) => nets.indexOf(n));
    let solved: number | undefined;
    if (idx[0]! >= 0 && idx[1]! >= 0) solved = twoTerminalCapacitance(sol.maxwell, idx[0]!, idx[1]!);
    else if (idx[0]! >= 0 || idx[1]! >= 0) {
      const i = Math.max(idx[0]!, idx[1]!);
      solved = sol.maxwell[i]![i]!;
    }
    // With a mirror the drawn plates are halves and carry half the charge of the whole.
    if (solved !== undefined && pair.mirrored) solved *= 2;
    if (solved !== undefined) {
      const idealPerM = (EPS0 * pair.epsR * pair.width) / pair.gap;
      const plates: PlatesValues = {
        gap: pair.gap,
        width: pair.width,
        gapToWidth: pair.gap / pair.width,
        idealPerM,
        solvedOverIdeal: solved / idealPerM,
        solvedPerM: solved,
        epsR: pair.epsR,
        arrangement: pair.arrangement,
        shapeIds: pair.shapeIds,
        ...(pair.mirrored ? { mirrored: true } : {}),
      };
      result.plates = plates;
    }
  }
  return result;
}

/**
 * The numbers a result stands on (matrices, error estimate, line and plate values), checked
 * finite before anything is reported: a non-finite value is an internal failure, never a
 * result. Throws an Error naming the first bad entry (the CLI exits 1 on it, the worker
 * reports it). The checks (lib/section/check.ts) keep valid sections away from this.
 */
export function assertFiniteResult(result: SectionResult): void {
  const bad: string[] = [];
  const scan = (v: unknown, where: string) => {
    if (bad.length > 0) return;
    if (typeof v === 'number') {
      if (!Number.isFinite(v)) bad.push(`${where} = ${v}`);
    } else if (Array.isArray(v)) v.forEach((x, i) => scan(x, `${where}[${i}]`));
    else if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) scan(x, `${where}.${k}`);
  };
  scan(result.capacitance, 'capacitance');
  scan(result.errorEstimate.relative, 'errorEstimate.relative');
  scan(result.errorEstimate.perEntry, 'errorEstimate.perEntry');
  if (result.line) scan(result.line, 'line');
  if (result.plates) scan(result.plates, 'plates');
  if (bad.length > 0) {
    throw new Error(`the solver produced a value that is not a finite number (${bad[0]}); no result is reported for this section`);
  }
}

/**
 * Solve a section. Throws SectionError (with the issues) when the section is invalid,
 * SolveCancelledError when cancelled, RangeError when the core refuses the problem
 * (for example beyond the node limit, before any set-up), Error when the solve produced a
 * value that is not finite (assertFiniteResult).
 */
export function solveSection(section: Section, opts: SolveSectionOptions = {}): SolveSectionOutput {
  const t0 = now();
  if (opts.tolerance !== undefined && !(opts.tolerance >= TOLERANCE_RANGE.min && opts.tolerance <= TOLERANCE_RANGE.max)) {
    throw new RangeError(`the tolerance must be a number from ${TOLERANCE_RANGE.min} to ${TOLERANCE_RANGE.max} (got ${opts.tolerance})`);
  }
  const { resolved, warnings } = validateSection(section);
  const { problem, netNames } = toProblem(resolved, opts.preset !== undefined ? { preset: opts.preset } : {});
  const sol = solveProblem(problem, {
    ...(opts.onProgress ? { onProgress: opts.onProgress } : {}),
    ...(opts.isCancelled ? { isCancelled: opts.isCancelled } : {}),
    ...(opts.tolerance !== undefined ? { tolerance: opts.tolerance } : {}),
    keepFields: (opts.keepFields ?? false) || opts.frequencyHz !== undefined || opts.volts !== undefined,
  });
  const ms = now() - t0;
  const result = buildResult(
    resolved,
    sol,
    netNames,
    warnings.map((w) => w.message),
    ms,
  );
  assertFiniteResult(result);
  Object.assign(result, lineAnalysis(result, { lengthM: opts.lengthM, riseTimeS: opts.riseTimeS }));
  const fields: SectionFields | undefined = sol.fields
    ? {
        xs: sol.mesh.xs,
        ys: sol.mesh.ys,
        potentials: sol.fields.potentials,
        cellEpsR: sol.fields.cellEpsR,
        nodeNet: sol.fields.nodeNet,
        netNames,
        ...(sol.fields.vacuumPotentials ? { vacuumPotentials: sol.fields.vacuumPotentials } : {}),
      }
    : undefined;
  if (fields && opts.frequencyHz !== undefined) result.losses = computeLosses(resolved, result, fields, { frequencyHz: opts.frequencyHz });
  if (fields && opts.volts !== undefined) {
    const peak = computePeakField(resolved, result, fields, { volts: opts.volts, ...(opts.voltages ? { voltages: opts.voltages } : {}) });
    result.peakField = peak.entries;
    result.peakFieldInfo = { volts: opts.volts, voltages: peak.voltages, caution: FIELD_CAUTION };
  }
  const out: SolveSectionOutput = { result };
  if (opts.keepFields && fields) out.fields = fields;
  return out;
}

/**
 * Solver robustness over random valid sections (fast-check, quick preset): whatever the
 * shapes, nets, dielectric stack and boundaries, a solve ends within its iteration limit and
 * every number it reports is finite and physically possible.
 *
 * Physical facts checked (sources beside each):
 * - The Maxwell capacitance matrix is symmetric with a positive diagonal and non-positive
 *   off-diagonal entries, and positive definite (Paul 2008, Analysis of Multiconductor
 *   Transmission Lines, 2nd ed., ch. 3: reciprocity, energy positivity, and a conductor at 0 V
 *   carries a charge of sign opposite to the driven one).
 * - C' lies between its values with every εr replaced by the smallest and by the largest εr
 *   present (the stored energy grows with ε everywhere, Thomson's principle; Jackson 1999,
 *   Classical Electrodynamics, 3rd ed., §1.12), so εeff = C/C0 lies in [min εr, max εr]
 *   within the estimated error.
 * - Line values L' = μ0ε0/C0, Z0 = 1/(c√(C C0)) are finite and positive when C and C0 are
 *   (Pozar 2012, Microwave Engineering, 4th ed., §2.1 and §3.8).
 * No timing: "no hang" is shown by iteration counts against the solver's own iteration cap.
 *
 * The seed is fixed and printed by fast-check on failure, with the shrunk section; set
 * EDGEFIELD_FC_SEED to explore other random sections.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { CholeskyDecomposition, Matrix } from 'ml-matrix';
import { mutualForm, solveSection } from '@/lib/engine/solve-section';
import type { SectionResult } from '@/lib/engine/types';
import { parseSectionValue } from '@/lib/section/parse';
import type { Section } from '@/lib/section/schema';
import { FAMILY_LEVELS } from '@/lib/fdm/mesh';

const SEED = process.env.EDGEFIELD_FC_SEED ? Number(process.env.EDGEFIELD_FC_SEED) : 20261203;
const RUNS = process.env.EDGEFIELD_FC_RUNS ? Number(process.env.EDGEFIELD_FC_RUNS) : 24;
/** Iteration cap of each linear solve in solveProblem (lib/fdm/solve-problem.ts, `maxIterations: 500`). */
const MAX_ITERATIONS_PER_SOLVE = 500;

const num = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true }).map((v) => Math.round(v * 1e4) / 1e4);
/** Log-uniform εr in [lo, hi], rounded to 4 significant digits. */
const epsR = (lo: number, hi: number) => num(Math.log10(lo), Math.log10(hi)).map((e) => Math.min(hi, Math.max(lo, Number((10 ** e).toPrecision(4)))));

// ---------- random valid sections ----------
// Conductors sit in the cells of a 3 × 3 grid (pitch 1.5, each shape within 0.45 of its
// cell centre), so shapes of different nets never touch; boundary planes lie at −0.75 and
// 3.75, half a pitch from the outer cells, so no shape crosses them.

type CellShape =
  | { type: 'rect'; w: number; h: number }
  | { type: 'circle'; r: number }
  | { type: 'ring'; rOuter: number; frac: number }
  | { type: 'coax'; rOuter: number; frac: number; core: number }
  | { type: 'strip'; vertical: boolean; len: number }
  | { type: 'polygon'; radii: number[]; turn: number };

const cellShape: fc.Arbitrary<CellShape> = fc.oneof(
  fc.record({ type: fc.constant('rect' as const), w: num(0.05, 0.9), h: num(0.02, 0.9) }),
  fc.record({ type: fc.constant('circle' as const), r: num(0.05, 0.45) }),
  fc.record({ type: fc.constant('ring' as const), rOuter: num(0.2, 0.45), frac: num(0.3, 0.9) }),
  fc.record({ type: fc.constant('coax' as const), rOuter: num(0.3, 0.45), frac: num(0.5, 0.85), core: num(0.2, 0.7) }),
  fc.record({ type: fc.constant('strip' as const), vertical: fc.boolean(), len: num(0.1, 0.9) }),
  // star-shaped polygon: 3 to 7 corners at equal angle steps, radii 0.1 to 0.45 (simple by construction)
  fc.record({ type: fc.constant('polygon' as const), radii: fc.array(num(0.1, 0.45), { minLength: 3, maxLength: 7 }), turn: num(0, 1) }),
);

type Side = 'open' | 'ground' | 'mirror';
const side: fc.Arbitrary<Side> = fc.constantFrom<Side>('open', 'ground', 'mirror');

interface Params {
  cells: number[];
  shapes: CellShape[];
  signalNets: number;
  sides: { left: Side; right: Side; bottom: Side; top: Side };
  backgroundEpsR: number;
  layers: { thickness: number; epsR: number }[];
}

const params: fc.Arbitrary<Params> = fc.record({
  cells: fc.shuffledSubarray([0, 1, 2, 3, 4, 5, 6, 7, 8], { minLength: 1, maxLength: 4 }),
  shapes: fc.array(cellShape, { minLength: 4, maxLength: 4 }),
  signalNets: fc.integer({ min: 1, max: 3 }),
  sides: fc.record({ left: side, right: side, bottom: side, top: side }),
  backgroundEpsR: fc.oneof(fc.constant(1), epsR(1, 10)),
  layers: fc.array(fc.record({ thickness: num(0.2, 1.6), epsR: epsR(1, 100) }), { maxLength: 3 }),
});

const LO = -0.75;
const HI = 3.75;

/**
 * The section, or null where the random choice leaves nothing to solve (no ground plane and
 * only one conductor, which must then be the ground net).
 */
function build(p: Params): Section | null {
  const groundSide = Object.values(p.sides).includes('ground');
  // Conductors: cell shapes, a coax cell adds its core as a second conductor.
  const conductors: { shape: Record<string, unknown> }[] = [];
  p.cells.forEach((cell, i) => {
    const cx = 1.5 * (cell % 3),
      cy = 1.5 * Math.floor(cell / 3);
    const s = p.shapes[i]!;
    const id = `c${i}`;
    switch (s.type) {
      case 'rect':
        conductors.push({ shape: { id, type: 'rect', x: cx - s.w / 2, y: cy - s.h / 2, width: s.w, height: s.h } });
        break;
      case 'circle':
        conductors.push({ shape: { id, type: 'circle', cx, cy, r: s.r } });
        break;
      case 'ring':
        conductors.push({ shape: { id, type: 'ring', cx, cy, rInner: s.rOuter * s.frac, rOuter: s.rOuter } });
        break;
      case 'coax':
        conductors.push({ shape: { id, type: 'ring', cx, cy, rInner: s.rOuter * s.frac, rOuter: s.rOuter } });
        conductors.push({ shape: { id: `${id}core`, type: 'circle', cx, cy, r: s.rOuter * s.frac * s.core } });
        break;
      case 'strip':
        conductors.push({
          shape: s.vertical
            ? { id, type: 'strip', x1: cx, y1: cy - s.len / 2, x2: cx, y2: cy + s.len / 2 }
            : { id, type: 'strip', x1: cx - s.len / 2, y1: cy, x2: cx + s.len / 2, y2: cy },
        });
        break;
      case 'polygon': {
        const n = s.radii.length;
        const points = s.radii.map((r, k) => {
          const a = (2 * Math.PI * (k + s.turn)) / n;
          return [Math.round((cx + r * Math.cos(a)) * 1e6) / 1e6, Math.round((cy + r * Math.sin(a)) * 1e6) / 1e6] as [number, number];
        });
        conductors.push({ shape: { id, type: 'polygon', points } });
        break;
      }
    }
  });
  // Nets: without a ground plane the first conductor is the ground net.
  const first = groundSide ? 0 : 1;
  if (conductors.length - first < 1) return null;
  const nSig = Math.min(p.signalNets, conductors.length - first);
  const nets: Section['nets'] = [{ name: 'gnd', role: 'ground' }];
  for (let s = 0; s < nSig; s++) nets.push({ name: `sig${s + 1}`, role: 'signal' });
  const shapes: Section['shapes'] = [];
  const materials: Section['materials'] = [];

  // Dielectric stack: horizontal layers from the bottom plane (or y = −1.5) upwards, across the
  // domain between the side planes (or x from −1.5 to 4.5), clipped at the top plane.
  const planeOr = (s: Side, at: number, open: number) => (s === 'open' ? open : at);
  const x0 = planeOr(p.sides.left, LO, -1.5),
    x1 = planeOr(p.sides.right, HI, 4.5),
    yTop = planeOr(p.sides.top, HI, Infinity);
  let y = planeOr(p.sides.bottom, LO, -1.5);
  p.layers.forEach((l, i) => {
    const h = Math.min(l.thickness, yTop - y);
    if (!(h > 0.05)) return;
    materials.push({ id: `m${i}`, name: `layer ${i}`, epsR: l.epsR });
    shapes.push({ id: `d${i}`, type: 'rect', x: x0, y, width: x1 - x0, height: h, dielectric: `m${i}` });
    y += h;
  });
  conductors.forEach((c, i) => {
    const net = i < first ? 'gnd' : `sig${((i - first) % nSig) + 1}`;
    shapes.push({ ...c.shape, conductor: net } as Section['shapes'][number]);
  });
  const plane = (s: Side, at: number) => (s === 'open' ? { type: 'open' as const } : { type: s, at });
  return {
    format: 'edgefield.section/1',
    units: 'mm',
    background: { epsR: p.backgroundEpsR },
    materials,
    nets,
    shapes,
    boundary: {
      left: plane(p.sides.left, LO),
      right: plane(p.sides.right, HI),
      bottom: plane(p.sides.bottom, LO),
      top: plane(p.sides.top, HI),
    },
    mesh: { preset: 'quick' },
  };
}

// ---------- checks ----------

/** Path of every number in a JSON-like value that is not finite. */
function nonFinite(v: unknown, path = 'result'): string[] {
  if (typeof v === 'number') return Number.isFinite(v) ? [] : [`${path} = ${v}`];
  if (Array.isArray(v)) return v.flatMap((x, i) => nonFinite(x, `${path}[${i}]`));
  if (ArrayBuffer.isView(v)) return Array.from(v as unknown as ArrayLike<number>).flatMap((x, i) => nonFinite(Number(x), `${path}[${i}]`));
  if (v && typeof v === 'object') return Object.entries(v).flatMap(([k, x]) => nonFinite(x, `${path}.${k}`));
  return [];
}

function expectMaxwell(m: number[][], n: number, what: string): void {
  expect(m.length, what).toBe(n);
  for (let i = 0; i < n; i++) {
    expect(m[i]!.length, what).toBe(n);
    expect(m[i]![i]!, `${what}: diagonal ${i}`).toBeGreaterThan(0);
    for (let j = 0; j < n; j++) {
      // the reported matrices are symmetrised (lib/fdm/solve-problem.ts), so exactly symmetric
      expect(m[i]![j]!, `${what}: symmetry ${i},${j}`).toBe(m[j]![i]!);
      if (i !== j) expect(m[i]![j]!, `${what}: off-diagonal ${i},${j}`).toBeLessThanOrEqual(0);
    }
  }
  expect(new CholeskyDecomposition(new Matrix(m)).isPositiveDefinite(), `${what}: positive definite`).toBe(true);
}

function check(section: Section, result: SectionResult): void {
  expect(nonFinite(result)).toEqual([]);
  const n = result.nets.length;
  expect(n).toBeGreaterThan(0);
  expectMaxwell(result.capacitance.maxwell, n, 'maxwell');
  expectMaxwell(result.capacitance.vacuum, n, 'vacuum');
  for (const member of result.errorEstimate.family ?? []) expectMaxwell(member.maxwell, n, `mesh family member of ${member.nodes} nodes`);

  const err = result.errorEstimate.relative;
  expect(err).toBeGreaterThanOrEqual(0);
  expect(Number.isFinite(err)).toBe(true);

  // Diagonal dominance: each net's capacitance to the reference (the row sum) is ≥ 0 within the
  // estimated error (Paul 2008, ch. 3), and the mutual form, which reports it, has no negative entry.
  result.capacitance.maxwell.forEach((row, i) => {
    expect(row.reduce((a, b) => a + b, 0), `row sum ${i}`).toBeGreaterThanOrEqual(-err * row[i]!);
  });
  for (const row of result.capacitance.mutual) for (const v of row) expect(v).toBeGreaterThanOrEqual(0);

  // No hang: every linear solve converged within its cap; the total is bounded by the caps
  // (one solve per signal net on each mesh of the family, twice with a vacuum pass).
  const solves = FAMILY_LEVELS * n * 2;
  expect(result.solver.iterations).toBeGreaterThan(0);
  expect(result.solver.iterations).toBeLessThanOrEqual(solves * MAX_ITERATIONS_PER_SOLVE);
  expect(result.warnings.filter((w) => /did not reach the tolerance|energy identity/.test(w))).toEqual([]);
  expect(result.solver.relResidual).toBeLessThan(1e-8);

  if (n === 1) {
    const line = result.line!;
    for (const k of ['capacitancePerM', 'inductancePerM', 'z0Ohm', 'epsEff', 'velocityMPerS', 'delaySPerM', 'vacuumCapacitancePerM'] as const) {
      expect(line[k], `line.${k}`).toBeGreaterThan(0);
    }
    const eps = [section.background.epsR as number, ...section.materials.map((m) => m.epsR as number)];
    expect(line.epsEff).toBeGreaterThanOrEqual(Math.min(...eps) * (1 - 2 * err) - 1e-12);
    expect(line.epsEff).toBeLessThanOrEqual(Math.max(...eps) * (1 + 2 * err) + 1e-12);
  } else {
    expect(result.line).toBeUndefined();
  }
}

describe('a net shielded from the reference', () => {
  it('a core inside another signal net\'s ring: its capacitance to the reference is 0, not a negative round-off', () => {
    // The core's field ends on the ring, so it carries no charge when every signal net is at
    // 1 V: C_core,core + C_core,ring = 0 (Gauss's law; common practice, no published source).
    const section: Section = {
      format: 'edgefield.section/1',
      units: 'mm',
      background: { epsR: 1 },
      materials: [],
      nets: [
        { name: 'core', role: 'signal' },
        { name: 'shield', role: 'signal' },
      ],
      shapes: [
        { id: 'core', type: 'circle', cx: 0, cy: 1, r: 0.2, conductor: 'core' },
        { id: 'shield', type: 'ring', cx: 0, cy: 1, rInner: 0.5, rOuter: 0.6, conductor: 'shield' },
      ],
      boundary: { left: { type: 'open' }, right: { type: 'open' }, bottom: { type: 'ground', at: 0 }, top: { type: 'open' } },
      mesh: { preset: 'quick' },
    };
    const { result } = solveSection(section);
    check(section, result);
    const m = result.capacitance.maxwell;
    const err = result.errorEstimate.relative;
    expect(Math.abs(m[0]![0]! + m[0]![1]!)).toBeLessThanOrEqual(err * m[0]![0]!);
    const mutual = result.capacitance.mutual;
    expect(mutual[0]![0]).toBeGreaterThanOrEqual(0);
    expect(mutual[0]![0]).toBeLessThanOrEqual(err * m[0]![0]!);
    expect(mutual[0]![1]).toBe(-m[0]![1]!);
    expect(mutual[1]![1]).toBeGreaterThan(0);
  });

  it('mutualForm reports a negative row sum within the stated error as 0, and keeps a larger one', () => {
    const m = [
      [2, -2.000001],
      [-2.000001, 5],
    ];
    expect(mutualForm(m, 1e-6)[0]![0]).toBe(0);
    expect(mutualForm(m, 0)[0]![0]).toBeCloseTo(-1e-6, 12);
    expect(mutualForm(m, 1e-7)[0]![0]).toBeCloseTo(-1e-6, 12);
    expect(mutualForm(m, 1e-6)[1]).toEqual([2.000001, 5 - 2.000001]);
  });
});

describe('solver robustness over random valid sections (quick preset)', () => {
  it(`${RUNS} random sections: finite results, a Maxwell matrix of the right signs, bounded iterations`, () => {
    let solved = 0;
    const seen = new Set<string>();
    fc.assert(
      fc.property(params, (p) => {
        const section = build(p);
        if (section === null) return;
        const v = parseSectionValue(section);
        if (!v.ok) throw new Error(`the generator made an invalid section: ${v.message}\n${JSON.stringify(section)}`);
        const { result } = solveSection(section);
        check(section, result);
        solved++;
        for (const s of section.shapes) seen.add(s.conductor !== undefined ? `shape ${s.type}` : 'dielectric layer');
        for (const b of Object.values(section.boundary)) seen.add(`boundary ${b.type}`);
        if (section.materials.some((m) => (m.epsR as number) > 10)) seen.add('εr above 10');
        if (result.nets.length > 1) seen.add('several signal nets');
      }),
      { numRuns: RUNS, seed: SEED },
    );
    // most random choices leave something to solve, and the runs covered every kind of input
    expect(solved).toBeGreaterThanOrEqual(RUNS / 2);
    // (for the fixed seed and run count; other seeds explore and may miss a kind)
    if (!process.env.EDGEFIELD_FC_SEED && !process.env.EDGEFIELD_FC_RUNS) {
      expect([...seen].sort()).toEqual(
        ['boundary ground', 'boundary mirror', 'boundary open', 'dielectric layer', 'εr above 10', 'several signal nets', 'shape circle', 'shape polygon', 'shape rect', 'shape ring', 'shape strip'].sort(),
      );
    }
  });
});

/**
 * Property tests of the whole pipeline (section → checks → mesh → solve → result) over
 * random valid small sections at the quick preset, with fast-check.
 *
 * Physical facts checked (sources beside each):
 * - The Maxwell capacitance matrix is symmetric, positive definite, with non-positive
 *   off-diagonal entries (Paul 2008, Analysis of Multiconductor Transmission Lines, 2nd ed.,
 *   ch. 3; reciprocity and energy positivity).
 * - Capacitance per unit length of a 2D structure is unchanged by a uniform scaling of the
 *   geometry (Laplace's equation has no length scale; C' is dimensionless × ε0) and by a
 *   translation (common practice, no published source).
 * - Multiplying every εr by k multiplies C by k (the field equation div(ε grad φ) = 0 is
 *   unchanged, the charges scale with ε; common practice, no published source).
 * - A section symmetric about x = 0 solved whole, and its right half solved with a mirror
 *   boundary (zero normal field) at x = 0, agree: the half carries half the charge
 *   (method of images / symmetry, common practice, no published source).
 *
 * Tolerances come from the error estimates the solver reports: two solves of the same
 * physical quantity must agree within the sum of their estimated errors, scaled by the
 * size of the matrix entries (√(C_ii C_jj)).
 *
 * The seed is fixed so that CI runs are reproducible; set EDGEFIELD_FC_SEED to explore
 * other random sections.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { CholeskyDecomposition, Matrix } from 'ml-matrix';
import { solveSection } from '@/lib/engine/solve-section';
import type { SectionResult } from '@/lib/engine/types';
import { parseSectionValue } from '@/lib/section/parse';
import type { Section } from '@/lib/section/schema';

const SEED = process.env.EDGEFIELD_FC_SEED ? Number(process.env.EDGEFIELD_FC_SEED) : 20261202;
const num = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true }).map((v) => Math.round(v * 1e4) / 1e4);

// ---------- random valid sections ----------

type CellShape =
  | { type: 'rect'; w: number; h: number }
  | { type: 'circle'; r: number }
  | { type: 'ring'; rOuter: number; frac: number }
  | { type: 'strip'; vertical: boolean; len: number }
  | { type: 'polygon'; a: number; b: number; c: number };

const cellShape: fc.Arbitrary<CellShape> = fc.oneof(
  fc.record({ type: fc.constant('rect' as const), w: num(0.2, 0.9), h: num(0.2, 0.9) }),
  fc.record({ type: fc.constant('circle' as const), r: num(0.1, 0.45) }),
  fc.record({ type: fc.constant('ring' as const), rOuter: num(0.25, 0.45), frac: num(0.3, 0.8) }),
  fc.record({ type: fc.constant('strip' as const), vertical: fc.boolean(), len: num(0.2, 0.9) }),
  fc.record({ type: fc.constant('polygon' as const), a: num(0.15, 0.45), b: num(0.15, 0.45), c: num(-0.4, 0.4) }),
);

interface Params {
  cells: number[];
  shapes: CellShape[];
  signalNets: number;
  groundBoundary: boolean;
  backgroundEpsR: number;
  dielectrics: { x: number; y: number; w: number; h: number; epsR: number }[];
}

const params: fc.Arbitrary<Params> = fc
  .record({
    cells: fc.shuffledSubarray([0, 1, 2, 3, 4, 5, 6, 7, 8], { minLength: 2, maxLength: 3 }),
    shapes: fc.array(cellShape, { minLength: 3, maxLength: 3 }),
    signalNets: fc.integer({ min: 1, max: 2 }),
    groundBoundary: fc.boolean(),
    backgroundEpsR: fc.oneof(fc.constant(1), num(1, 3)),
    dielectrics: fc.array(fc.record({ x: num(-1, 3), y: num(-0.9, 3), w: num(0.5, 3), h: num(0.5, 3), epsR: num(1.5, 6) }), { maxLength: 2 }),
  })
  // With a ground boundary every conductor can be a signal; without, one is the ground net.
  .filter((p) => p.cells.length - (p.groundBoundary ? 0 : 1) >= 1);

interface Variant {
  /** Multiply every length by this and write the section in these units. */
  scale?: number;
  units?: Section['units'];
  dx?: number;
  dy?: number;
  /** Multiply every εr by this. */
  epsK?: number;
}

function build(p: Params, v: Variant = {}): Section {
  const k = v.scale ?? 1;
  const X = (x: number) => (x + (v.dx ?? 0)) * k;
  const Y = (y: number) => (y + (v.dy ?? 0)) * k;
  const L = (l: number) => l * k;
  const e = v.epsK ?? 1;
  const nSig = p.groundBoundary ? Math.min(p.signalNets, p.cells.length) : Math.min(p.signalNets, p.cells.length - 1);
  const nets: Section['nets'] = [{ name: 'g', role: 'ground' }];
  for (let s = 0; s < nSig; s++) nets.push({ name: `s${s + 1}`, role: 'signal' });
  const shapes: Section['shapes'] = [];
  p.dielectrics.forEach((d, i) => shapes.push({ id: `d${i}`, type: 'rect', x: X(d.x), y: Y(d.y), width: L(d.w), height: L(d.h), dielectric: `m${i}` }));
  p.cells.forEach((cell, i) => {
    const cx = 1.5 * (cell % 3),
      cy = 1.5 * Math.floor(cell / 3);
    const net = p.groundBoundary ? `s${(i % nSig) + 1}` : i === 0 ? 'g' : `s${((i - 1) % nSig) + 1}`;
    const s = p.shapes[i]!;
    const id = `c${i}`;
    switch (s.type) {
      case 'rect':
        shapes.push({ id, type: 'rect', x: X(cx - s.w / 2), y: Y(cy - s.h / 2), width: L(s.w), height: L(s.h), conductor: net });
        break;
      case 'circle':
        shapes.push({ id, type: 'circle', cx: X(cx), cy: Y(cy), r: L(s.r), conductor: net });
        break;
      case 'ring':
        shapes.push({ id, type: 'ring', cx: X(cx), cy: Y(cy), rInner: L(s.rOuter * s.frac), rOuter: L(s.rOuter), conductor: net });
        break;
      case 'strip':
        shapes.push(
          s.vertical
            ? { id, type: 'strip', x1: X(cx), y1: Y(cy - s.len / 2), x2: X(cx), y2: Y(cy + s.len / 2), conductor: net }
            : { id, type: 'strip', x1: X(cx - s.len / 2), y1: Y(cy), x2: X(cx + s.len / 2), y2: Y(cy), conductor: net },
        );
        break;
      case 'polygon':
        shapes.push({ id, type: 'polygon', points: [[X(cx - s.a), Y(cy - s.b)], [X(cx + s.a), Y(cy - s.b)], [X(cx + s.c), Y(cy + s.b)]], conductor: net });
        break;
    }
  });
  return {
    format: 'edgefield.section/1',
    units: v.units ?? 'mm',
    background: { epsR: p.backgroundEpsR * e },
    materials: p.dielectrics.map((d, i) => ({ id: `m${i}`, name: `material ${i}`, epsR: d.epsR * e })),
    nets,
    shapes,
    boundary: {
      left: { type: 'open' },
      right: { type: 'open' },
      bottom: p.groundBoundary ? { type: 'ground', at: Y(-1) } : { type: 'open' },
      top: { type: 'open' },
    },
    mesh: { preset: 'quick' },
  };
}

// ---------- checks ----------

function solve(s: Section): SectionResult {
  const v = parseSectionValue(s);
  if (!v.ok) throw new Error(`generator made an invalid section: ${v.message}\n${JSON.stringify(s)}`);
  return solveSection(s).result;
}

/** Symmetric, positive definite, non-positive off-diagonal (Paul 2008, ch. 3). */
function expectMaxwellProperties(r: SectionResult): void {
  for (const m of [r.capacitance.maxwell, r.capacitance.vacuum]) {
    const n = m.length;
    expect(n).toBe(r.nets.length);
    for (let i = 0; i < n; i++) {
      expect(Number.isFinite(m[i]![i]!)).toBe(true);
      expect(m[i]![i]!).toBeGreaterThan(0);
      for (let j = 0; j < n; j++) {
        const scale = Math.sqrt(m[i]![i]! * m[j]![j]!);
        // Symmetric to round-off (the operator is symmetric and both solves converge to 1e-10).
        expect(Math.abs(m[i]![j]! - m[j]![i]!)).toBeLessThanOrEqual(1e-8 * scale);
        if (i !== j) expect(m[i]![j]!).toBeLessThanOrEqual(r.errorEstimate.relative * scale);
      }
    }
    expect(new CholeskyDecomposition(new Matrix(m)).isPositiveDefinite()).toBe(true);
  }
  expect(r.errorEstimate.relative).toBeGreaterThan(0);
  expect(r.errorEstimate.relative).toBeLessThan(0.05);
}

/** a ≈ b × factor within the two solves' estimated errors, entry by entry. */
function expectAgree(a: SectionResult, b: SectionResult, factor: number, what: string): void {
  const tol = a.errorEstimate.relative + b.errorEstimate.relative;
  const ma = a.capacitance.maxwell,
    mb = b.capacitance.maxwell;
  expect(a.nets).toEqual(b.nets);
  for (let i = 0; i < ma.length; i++) {
    for (let j = 0; j < ma.length; j++) {
      const scale = Math.sqrt(ma[i]![i]! * ma[j]![j]!);
      const diff = Math.abs(ma[i]![j]! - factor * mb[i]![j]!);
      expect(diff, `${what}: entry ${i},${j}: ${ma[i]![j]} vs ${factor} × ${mb[i]![j]} (tolerance ${tol} relative)`).toBeLessThanOrEqual(tol * scale);
    }
  }
}

describe('properties over random valid sections (quick preset)', () => {
  it('Maxwell matrix properties; C unchanged by scaling (mm → µm, × 1000) and translation; εr × k gives C × k', () => {
    fc.assert(
      fc.property(params, num(-40, 40), num(-40, 40), num(1.5, 4), (p, dx, dy, k) => {
        const a = solve(build(p));
        expectMaxwellProperties(a);

        const scaled = solve(build(p, { scale: 1000, units: 'um' }));
        expectMaxwellProperties(scaled);
        expectAgree(scaled, a, 1, 'scaled');

        const moved = solve(build(p, { dx, dy }));
        expectMaxwellProperties(moved);
        expectAgree(moved, a, 1, `translated by (${dx}, ${dy})`);

        const denser = solve(build(p, { epsK: k }));
        expectMaxwellProperties(denser);
        expectAgree(denser, a, k, `εr × ${k}`);
        const tol = a.errorEstimate.relative + denser.errorEstimate.relative;
        a.capacitance.vacuum.forEach((row, i) =>
          row.forEach((v, j) => {
            const scale = Math.sqrt(a.capacitance.vacuum[i]![i]! * a.capacitance.vacuum[j]![j]!);
            expect(Math.abs(denser.capacitance.vacuum[i]![j]! - v)).toBeLessThanOrEqual(tol * scale);
          }),
        );
      }),
      { numRuns: 6, seed: SEED },
    );
  });
});

// ---------- mirror symmetry ----------

type SymItem =
  | { kind: 'rect'; w: number; h: number }
  | { kind: 'strip'; len: number }
  | { kind: 'circles'; d: number; r: number }
  | { kind: 'rects'; d: number; w: number; h: number };

const symItem: fc.Arbitrary<SymItem> = fc.oneof(
  fc.record({ kind: fc.constant('rect' as const), w: num(0.3, 2), h: num(0.1, 0.8) }),
  fc.record({ kind: fc.constant('strip' as const), len: num(0.3, 2) }),
  fc.record({ kind: fc.constant('circles' as const), d: num(0.5, 1.5), r: num(0.1, 0.4) }),
  fc.record({ kind: fc.constant('rects' as const), d: num(0.5, 1.5), w: num(0.1, 0.4), h: num(0.1, 0.8) }),
);

interface SymParams {
  items: SymItem[];
  twoSignals: boolean;
  groundPlate: boolean;
  dielectric: { w: number; h: number; epsR: number } | null;
}

const symParams: fc.Arbitrary<SymParams> = fc.record({
  items: fc.array(symItem, { minLength: 1, maxLength: 2 }),
  twoSignals: fc.boolean(),
  groundPlate: fc.boolean(),
  dielectric: fc.option(fc.record({ w: num(0.5, 4), h: num(0.3, 2), epsR: num(2, 8) }), { nil: null }),
});

/** The symmetric section whole, or its right half (x ≥ 0) with a mirror at x = 0. */
function buildSym(p: SymParams, half: boolean): Section {
  const twoSignals = p.twoSignals && p.items.length > 1;
  const nets: Section['nets'] = [{ name: 'g', role: 'ground' }, { name: 's1', role: 'signal' }];
  if (twoSignals) nets.push({ name: 's2', role: 'signal' });
  const shapes: Section['shapes'] = [];
  const lo = (w: number) => (half ? 0 : -w / 2);
  const wid = (w: number) => (half ? w / 2 : w);
  if (p.dielectric) {
    const d = p.dielectric;
    shapes.push({ id: 'diel', type: 'rect', x: lo(d.w), y: -0.9, width: wid(d.w), height: d.h, dielectric: 'm' });
  }
  if (p.groundPlate) shapes.push({ id: 'plate', type: 'rect', x: lo(6), y: -1.4, width: wid(6), height: 0.2, conductor: 'g' });
  p.items.forEach((it, i) => {
    const y = 1.5 * i;
    const net = twoSignals ? `s${i + 1}` : 's1';
    const id = `i${i}`;
    switch (it.kind) {
      case 'rect':
        shapes.push({ id, type: 'rect', x: lo(it.w), y, width: wid(it.w), height: it.h, conductor: net });
        break;
      case 'strip':
        shapes.push({ id, type: 'strip', x1: lo(it.len), y1: y, x2: it.len / 2, y2: y, conductor: net });
        break;
      case 'circles':
        shapes.push({ id: `${id}r`, type: 'circle', cx: it.d, cy: y, r: it.r, conductor: net });
        if (!half) shapes.push({ id: `${id}l`, type: 'circle', cx: -it.d, cy: y, r: it.r, conductor: net });
        break;
      case 'rects':
        shapes.push({ id: `${id}r`, type: 'rect', x: it.d - it.w / 2, y, width: it.w, height: it.h, conductor: net });
        if (!half) shapes.push({ id: `${id}l`, type: 'rect', x: -it.d - it.w / 2, y, width: it.w, height: it.h, conductor: net });
        break;
    }
  });
  return {
    format: 'edgefield.section/1',
    units: 'mm',
    background: { epsR: 1 },
    materials: p.dielectric ? [{ id: 'm', name: 'fill', epsR: p.dielectric.epsR }] : [],
    nets,
    shapes,
    boundary: {
      left: half ? { type: 'mirror', at: 0 } : { type: 'open' },
      right: { type: 'open' },
      bottom: p.groundPlate ? { type: 'open' } : { type: 'ground', at: -1.5 },
      top: { type: 'open' },
    },
    mesh: { preset: 'quick' },
  };
}

describe('mirror boundary', () => {
  it('a symmetric section solved whole equals twice its half solved with a mirror boundary', () => {
    fc.assert(
      fc.property(symParams, (p) => {
        const whole = solve(buildSym(p, false));
        const half = solve(buildSym(p, true));
        expectMaxwellProperties(half);
        expectAgree(whole, half, 2, 'whole vs 2 × half');
        // The line values of the half describe the whole structure.
        expect(half.symmetry).toEqual({ mirrors: ['left'], factor: 2 });
        if (whole.line) {
          const tol = whole.errorEstimate.relative + half.errorEstimate.relative;
          expect(Math.abs(half.line!.z0Ohm / whole.line.z0Ohm - 1)).toBeLessThanOrEqual(tol);
          expect(Math.abs(half.line!.epsEff / whole.line.epsEff - 1)).toBeLessThanOrEqual(2 * tol);
        }
      }),
      { numRuns: 6, seed: SEED + 1 },
    );
  });
});

/**
 * Degenerate sections are refused with a message that names the shape, net or field, through
 * every door: the file parser (parseSectionFile), solveSection (SectionError, nothing solved)
 * and the CLI (status 2, the message on stderr, nothing on stdout). None of them may reach the
 * solver and come back as NaN.
 *
 * What counts as degenerate follows from elementary geometry and from the size limits of
 * lib/section/check.ts (common practice, no published source). The sections at the size
 * limits that must still solve are checked against scale invariance: C' of a 2D structure does
 * not depend on its size (Laplace's equation has no length scale; common practice, no
 * published source), so the same two wires at 1e-12 m and at 1e5 m give one C'.
 */
import { describe, expect, it } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { spawnSync } from 'node:child_process';
import { parseSectionFile } from '@/lib/section/parse';
import { SectionError, solveSection } from '@/lib/engine/solve-section';
import { MAX_EPS_R, MAX_FINEST_RATIO, MAX_SIZE_M, MAX_SIZE_RATIO, MIN_FEATURE_M } from '@/lib/section/check';
import type { Section } from '@/lib/section/schema';

const nets = [
  { name: 'sig', role: 'signal' },
  { name: 'gnd', role: 'ground' },
];
const groundPlate = { id: 'plate', type: 'rect', x: -5, y: -2, width: 10, height: 0.5, conductor: 'gnd' };

/** A section around the given shapes (mm, quick preset). */
function section(shapes: unknown[], extra: Record<string, unknown> = {}): Record<string, unknown> {
  return { format: 'edgefield.section/1', units: 'mm', nets, shapes, mesh: { preset: 'quick' }, ...extra };
}

interface Case {
  name: string;
  /** The file's text (hand-written JSON), or a value written with JSON.stringify. */
  text: string;
  /** Every one of these appears in the message. */
  expect: string[];
}

const json = (v: unknown) => JSON.stringify(v, null, 2);
const wire = (extra: Record<string, unknown> = {}) => ({ id: 'w', type: 'circle', cx: 0, cy: 0, r: 1, conductor: 'sig', ...extra });

const cases: Case[] = [
  // zero-size shapes
  { name: 'a rect of zero width', text: json(section([groundPlate, { id: 'r0', type: 'rect', x: 0, y: 0, width: 0, height: 1, conductor: 'sig' }])), expect: ['rect "r0": width must be greater than 0 (is 0)'] },
  { name: 'a circle of zero radius', text: json(section([groundPlate, wire({ r: 0 })])), expect: ['circle "w": r must be greater than 0 (is 0)'] },
  { name: 'a ring of zero width', text: json(section([groundPlate, { id: 'ring', type: 'ring', cx: 0, cy: 0, rInner: 1, rOuter: 1, conductor: 'sig' }])), expect: ['ring "ring"', 'rInner (1) must be smaller than rOuter (1)'] },
  { name: 'a strip of zero length', text: json(section([groundPlate, { id: 's0', type: 'strip', x1: 1, y1: 1, x2: 1, y2: 1, conductor: 'sig' }])), expect: ['strip "s0"'] },
  { name: 'a polygon with its points on one line', text: json(section([groundPlate, { id: 'flat', type: 'polygon', points: [[0, 0], [1, 1], [2, 2]], conductor: 'sig' }])), expect: ['polygon "flat": has zero area'] },
  // touching conductors, covered nets, no reference
  {
    name: 'conductors of different nets touching',
    text: json(section([groundPlate, { id: 'trace', type: 'rect', x: -1, y: -1.5, width: 2, height: 0.1, conductor: 'sig' }])),
    expect: ['conductor "plate" (net "gnd") touches or overlaps conductor "trace" (net "sig")', 'short circuit'],
  },
  {
    name: 'a signal net whose every shape lies inside a ground conductor',
    text: json(section([{ id: 'block', type: 'rect', x: -3, y: -3, width: 6, height: 6, conductor: 'gnd' }, wire(), { ...wire({ id: 'w2', cx: 1.5, r: 0.5 }) }])),
    expect: ['conductor "block" (net "gnd") touches or overlaps conductor "w" (net "sig")', 'conductor "block" (net "gnd") touches or overlaps conductor "w2" (net "sig")'],
  },
  {
    name: 'a signal conductor enclosed by a ground ring with no room for a field (gap 1e-7 of the size)',
    text: json(section([{ id: 'shield', type: 'ring', cx: 0, cy: 0, rInner: 1, rOuter: 2, conductor: 'gnd' }, wire({ r: 1 - 4e-7 })])),
    expect: ['conductor "shield" (net "gnd") and conductor "w" (net "sig") are only 4e-7 mm apart', `at most ${MAX_SIZE_RATIO} is allowed`],
  },
  { name: 'no reference', text: json(section([wire()], { nets: [{ name: 'sig', role: 'signal' }] })), expect: ['the section has no reference'] },
  // boundaries
  {
    name: 'a mirror boundary through a conductor',
    text: json(section([wire()], { boundary: { left: { type: 'mirror', at: 0 }, bottom: { type: 'ground', at: -3 } } })),
    expect: ['shape "w" crosses the left mirror boundary at x = 0'],
  },
  {
    name: 'a signal conductor on a ground plane',
    text: json(section([wire({ cy: 1 })], { boundary: { bottom: { type: 'ground', at: 0 } } })),
    expect: ['conductor "w" of signal net "sig" touches the bottom ground boundary at y = 0: a short circuit to ground'],
  },
  // sizes beyond the mesh's reach
  {
    name: `a section with a feature below ${MIN_FEATURE_M} m`,
    text: json(section([{ ...groundPlate, x: -5e-13, y: -5e-13, width: 1e-12, height: 2e-13 }, wire({ cx: 0, cy: 1e-12, r: 4e-14 })], { units: 'm' })),
    expect: ['shape "w" is smaller than 1e-12 m'],
  },
  {
    name: `a section more than ${MAX_SIZE_M} m across`,
    text: json(section([{ ...groundPlate, x: -1e6, y: -1e5, width: 2e6, height: 1e5 }, wire({ cy: 1e5, r: 5e4 })], { units: 'm' })),
    expect: ['the section is 2000000 m across; at most 1000000 m is allowed'],
  },
  {
    name: 'an expert finest mesh spacing of 1e-12 of the section',
    text: json(section([groundPlate, wire()], { mesh: { preset: 'quick', finest: 1e-11 } })),
    expect: ['mesh: finest spacing 1e-11 mm is 1000000000000 times smaller than the whole section (10 mm)', `at most ${MAX_FINEST_RATIO} is allowed`],
  },
  {
    name: 'an expert finest mesh spacing of 2e-6 of the section',
    text: json(section([groundPlate, wire()], { mesh: { preset: 'precise', finest: 2e-5, growth: 1.05 } })),
    expect: ['mesh: finest spacing 0.00002 mm is 500000 times smaller than the whole section (10 mm)'],
  },
  // values that are not finite numbers, in hand-written JSON
  { name: 'a coordinate written as NaN', text: json(section([groundPlate, wire()])).replace('"cx": 0', '"cx": NaN'), expect: ['not valid JSON', 'line '] },
  { name: 'a coordinate written as Infinity', text: json(section([groundPlate, wire()])).replace('"r": 1', '"r": Infinity'), expect: ['not valid JSON', 'line '] },
  { name: 'a radius of 1e999 (Infinity after parsing)', text: json(section([groundPlate, wire()])).replace('"r": 1', '"r": 1e999'), expect: ['shapes[1] (id "w"): r: must be a finite number'] },
  { name: 'a ground plane at -1e999', text: json(section([wire()], { boundary: { bottom: { type: 'ground', at: -3 } } })).replace('"at": -3', '"at": -1e999'), expect: ['boundary.bottom', 'must be a finite number'] },
  { name: 'an expression that divides by zero', text: json(section([groundPlate, wire({ cx: '0/0' })])), expect: ['shape "w": cx: division by zero'] },
  { name: 'an expression that overflows', text: json(section([groundPlate, wire({ r: '1e308*10' })])), expect: ['shape "w": r: result is not a finite number'] },
  { name: 'an expression naming Infinity', text: json(section([groundPlate, wire({ cx: 'Infinity' })])), expect: ['shape "w": cx: unknown name \'Infinity\''] },
  { name: 'an expression with sqrt of a negative number', text: json(section([groundPlate, wire({ r: 'sqrt(-1)' })])), expect: ['shape "w": r: result is not a finite number'] },
  // permittivities the solver cannot carry
  {
    name: `a material with εr above ${MAX_EPS_R}`,
    text: json(section([{ id: 'sub', type: 'rect', x: -5, y: -1.5, width: 10, height: 1, dielectric: 'hi' }, groundPlate, wire()], { materials: [{ id: 'hi', name: 'very high', epsR: 1e7 }] })),
    expect: ['material "hi": epsR must be at most 1000000 (is 10000000)'],
  },
  { name: 'a background εr of 1e300', text: json(section([groundPlate, wire()], { background: { epsR: 1e300 } })), expect: ['background: epsR must be at most 1000000 (is 1e+300)'] },
];

describe('degenerate sections are refused with a message naming what is wrong', () => {
  for (const c of cases) {
    it(c.name, () => {
      const parsed = parseSectionFile(c.text);
      expect(parsed.ok).toBe(false);
      if (parsed.ok) return;
      for (const e of c.expect) expect(parsed.message).toContain(e);

      // solveSection refuses the same (when the text is JSON at all), before any solving
      let value: unknown;
      try {
        value = JSON.parse(c.text);
      } catch {
        return;
      }
      let stages = 0;
      let thrown: unknown;
      try {
        solveSection(value as Section, { onProgress: () => stages++ });
      } catch (e) {
        thrown = e;
      }
      expect(thrown).toBeInstanceOf(SectionError);
      for (const e of c.expect) expect((thrown as Error).message).toContain(e);
      expect(stages).toBe(0);
    });
  }
});

describe('sections at the size limits still solve, and give the same C\' as at ordinary sizes', () => {
  // Two wires of radius r, centres 3r apart, one of them the ground net; r in metres.
  const wires = (r: number): Section =>
    ({
      format: 'edgefield.section/1',
      units: 'm',
      nets,
      shapes: [
        { id: 'a', type: 'circle', cx: 0, cy: 0, r, conductor: 'sig' },
        { id: 'b', type: 'circle', cx: 3 * r, cy: 0, r, conductor: 'gnd' },
      ],
      mesh: { preset: 'quick' },
    }) as unknown as Section;

  it('wires of radius 1e-12 m, 1 mm and 2e5 m (a section 1e6 m across)', () => {
    const [tiny, mm, huge] = [1e-12, 1e-3, 2e5].map((r) => solveSection(wires(r)).result);
    for (const r of [tiny, mm, huge]) {
      const c = r!.capacitance.maxwell[0]![0]!;
      expect(Number.isFinite(c) && c > 0).toBe(true);
      expect(r!.warnings.filter((w) => /tolerance|energy|monotone/.test(w))).toEqual([]);
    }
    const c0 = mm!.capacitance.maxwell[0]![0]!;
    const tol = 2 * mm!.errorEstimate.relative;
    expect(Math.abs(tiny!.capacitance.maxwell[0]![0]! / c0 - 1)).toBeLessThanOrEqual(tol);
    expect(Math.abs(huge!.capacitance.maxwell[0]![0]! / c0 - 1)).toBeLessThanOrEqual(tol);
  });
});

describe('solve CLI: degenerate files exit with status 2 and the message on stderr', () => {
  const root = path.resolve(import.meta.dirname, '../../..');
  const dir = mkdtempSync(path.join(tmpdir(), 'edgefield-degenerate-'));
  const picked = ['a coordinate written as NaN', 'a radius of 1e999 (Infinity after parsing)', 'a mirror boundary through a conductor', 'a signal conductor enclosed by a ground ring with no room for a field (gap 1e-7 of the size)'];
  for (const name of picked) {
    it(name, () => {
      const c = cases.find((x) => x.name === name)!;
      const file = path.join(dir, `${picked.indexOf(name)}.json`);
      writeFileSync(file, c.text);
      const r = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/solve.ts', file, '--json'], { cwd: root, encoding: 'utf8' });
      expect(r.status).toBe(2);
      expect(r.stdout).toBe('');
      for (const e of c.expect) expect(r.stderr).toContain(e);
    });
  }
});

import { describe, expect, it } from 'vitest';
import { solveSection } from '@/lib/engine/solve-section';
import type { Section } from '@/lib/section/schema';
import { applySweepValue, runSweep, sweepCsv, sweepValues } from '@/lib/analysis/sweep';
import { fringingRow, fringingThresholds, withGapToWidth } from '@/lib/analysis/fringing-study';
import { goalSeek } from '@/lib/analysis/goal-seek';
import { toCsv } from '@/lib/analysis/csv';

const microstrip = (w: number): Section =>
  ({
    format: 'edgefield.section/1',
    units: 'mm',
    variables: { w, h: 0.8, t: 0.035 },
    materials: [{ id: 'fr4', name: 'glass-epoxy laminate', epsR: 4.4 }],
    nets: [{ name: 'trace', role: 'signal' }],
    shapes: [
      { id: 'substrate', type: 'rect', x: -10, y: 0, width: 20, height: 'h', dielectric: 'fr4' },
      { id: 'trace', type: 'rect', x: '-w/2', y: 'h', width: 'w', height: 't', conductor: 'trace' },
    ],
    boundary: { bottom: { type: 'ground', at: 0 } },
  }) as unknown as Section;

const plates: Section = {
  format: 'edgefield.section/1',
  units: 'mm',
  nets: [
    { name: 'top', role: 'signal' },
    { name: 'bottom', role: 'ground' },
  ],
  shapes: [
    { id: 'bottom', type: 'strip', x1: 0, y1: 0, x2: 2, y2: 0, conductor: 'bottom' },
    { id: 'top', type: 'strip', x1: 0, y1: 0.5, x2: 2, y2: 0.5, conductor: 'top' },
  ],
} as unknown as Section;

describe('sweep values', () => {
  it('linear, logarithmic and list ranges', () => {
    expect(sweepValues({ kind: 'linear', from: 1, to: 2, points: 5 })).toEqual([1, 1.25, 1.5, 1.75, 2]);
    const log = sweepValues({ kind: 'log', from: 0.01, to: 10, points: 4 });
    expect(log[0]).toBe(0.01);
    expect(log[3]).toBe(10);
    expect(log[1]).toBeCloseTo(0.1, 12);
    expect(sweepValues({ kind: 'list', values: [3, 1, 2] })).toEqual([3, 1, 2]);
    expect(() => sweepValues({ kind: 'log', from: 0, to: 1, points: 3 })).toThrow(RangeError);
    expect(() => sweepValues({ kind: 'linear', from: 0, to: 1, points: 1 })).toThrow(RangeError);
  });

  it('sets a variable or a material value on a copy', () => {
    const s = microstrip(1);
    expect(applySweepValue(s, { kind: 'variable', name: 'w' }, 2).variables!.w).toBe(2);
    expect(s.variables!.w).toBe(1);
    expect(applySweepValue(s, { kind: 'material', id: 'fr4', property: 'epsR' }, 3).materials[0]!.epsR).toBe(3);
    expect(() => applySweepValue(s, { kind: 'variable', name: 'nope' }, 2)).toThrow(/no variable/);
  });

  it('CSV quotes commas and defuses formulas', () => {
    expect(toCsv([['a,b', '=1+1', 2]])).toBe('"a,b",\'=1+1,2\r\n');
  });
});

describe('sweep of a microstrip width', () => {
  it('Z0 falls as the trace widens; points keep their order; cancel keeps what it has', async () => {
    const values = [0.5, 1, 1.5, 2];
    const solve = (s: Section) => solveSection(s, { preset: 'quick' }).result;
    const { points } = await runSweep(microstrip(1), { kind: 'variable', name: 'w' }, values, solve);
    const z = points.map((p) => p.result!.line!.z0Ohm);
    // wider strip, lower impedance (Hammerstad & Jensen 1980: Z0 decreases monotonically with w/h)
    for (let i = 1; i < z.length; i++) expect(z[i]!).toBeLessThan(z[i - 1]!);
    const csv = sweepCsv('w', 'mm', points);
    expect(csv.split('\r\n')[0]).toContain('Z0 (Ω)');
    expect(csv.split('\r\n')).toHaveLength(values.length + 2);
    let n = 0;
    const part = await runSweep(microstrip(1), { kind: 'variable', name: 'w' }, values, solve, { isCancelled: () => n >= 2, onPoint: () => n++ });
    expect(part.cancelled).toBe(true);
    expect(part.points).toHaveLength(2);
  }, 240_000);
});

describe('fringing study', () => {
  it('moves the upper plate to the ratio asked and compares with Palmer 1937', () => {
    const s = withGapToWidth(plates, 0.1);
    const r = solveSection(s, { preset: 'quick' }).result;
    expect(r.plates!.gapToWidth).toBeCloseTo(0.1, 12);
    const row = fringingRow(r)!;
    // Palmer 1937 (Trans. AIEE 56:363) for thin plates, d ≪ w: within about 1% at w/d = 10
    // (REFERENCES §6: about 0.4% low at w/d = 10 against the exact mid-plane solution; from one check, verify).
    expect(Math.abs(row.solvedOverIdeal / row.palmerOverIdeal - 1)).toBeLessThan(0.01);
    // Hammerstad & Jensen 1980 via the mid-plane: within 0.2% of the exact value (their stated 0.03% on Z01, plus our solve)
    expect(Math.abs(row.solvedOverIdeal / row.hammerstadJensenOverIdeal - 1)).toBeLessThan(2e-3);
    expect(row.idealError).toBeLessThan(0);
  }, 120_000);

  it('thresholds interpolate to the crossing and say when the range misses', () => {
    const rows = [0.01, 0.1, 1].map((g, i) => ({ gapToWidth: g, solvedOverIdeal: 1, palmerOverIdeal: 1, hammerstadJensenOverIdeal: 1, idealError: [-0.005, -0.02, -0.5][i]!, relativeErrorEstimate: 0 }));
    const [t1, t5, t10] = fringingThresholds(rows);
    expect(t1!.ratio!).toBeGreaterThan(0.01);
    expect(t1!.ratio!).toBeLessThan(0.1);
    expect(t5!.ratio!).toBeGreaterThan(0.1);
    expect(fringingThresholds([{ ...rows[2]! }])[0]!.outside).toBe('below');
  });
});

describe('goal seek', () => {
  it('finds the width of a 50 Ω microstrip on εr = 4.4', async () => {
    const solve = (s: Section) => solveSection(s, { preset: 'quick' }).result;
    const out = await goalSeek({ section: microstrip(1), variable: 'w', lo: 0.5, hi: 3, metric: 'z0', target: 50 }, solve);
    expect(out.ok).toBe(true);
    if (!out.ok) return;
    expect(Math.abs(out.achieved / 50 - 1)).toBeLessThan(1e-3);
    // A direct solve at that width confirms it (same preset).
    const direct = solveSection(microstrip(out.value), { preset: 'quick' }).result.line!.z0Ohm;
    expect(Math.abs(direct / 50 - 1)).toBeLessThan(5e-3);
    // Hammerstad & Jensen 1980 give w/h ≈ 1.9 for 50 Ω on εr = 4.4 (thin strip; the 35 µm
    // thickness makes it a little narrower): within 10% (from memory, common design-chart value).
    expect(out.value / 0.8).toBeGreaterThan(1.6);
    expect(out.value / 0.8).toBeLessThan(2.1);
  }, 300_000);

  it('says clearly when the target is out of reach', async () => {
    const solve = (s: Section) => solveSection(s, { preset: 'quick' }).result;
    const out = await goalSeek({ section: microstrip(1), variable: 'w', lo: 0.5, hi: 3, metric: 'z0', target: 5 }, solve);
    expect(out.ok).toBe(false);
    if (out.ok) return;
    expect(out.message).toMatch(/not reachable in this range/);
    expect(out.evaluations).toHaveLength(2);
  }, 120_000);
});

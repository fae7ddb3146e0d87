/**
 * Measured capacitance sets on sweep charts (components/analysis/measured-overlay.ts): which
 * set matches which sweep, and the unit conversions of both axes. The CSV text goes through
 * the real parser (lib/import/measured-csv.ts), so the F/m values are the parser's.
 * Unit definitions: 1 in = 25.4 mm and 1 mil = 0.001 in exactly (international yard and
 * pound agreement, 1959); metric prefixes from the SI brochure (BIPM 2019).
 */
import { describe, expect, it } from 'vitest';
import { parseMeasuredCsv } from '@/lib/import/measured-csv';
import { metricById } from '@/lib/analysis/metrics';
import { matchMeasured, parameterFactor, parameterMatches, type MeasuredSet, type SweepAxis } from '@/components/analysis/measured-overlay';

const set = (name: string, csv: string): MeasuredSet => ({ id: name, name, data: parseMeasuredCsv(csv) });
const widthMm: SweepAxis = { target: { kind: 'variable', name: 'w' }, units: 'mm' };
const c11 = metricById('c11');

describe('parameterMatches', () => {
  it('a dimension matches its variable name, case and spacing aside, and nothing else', () => {
    expect(parameterMatches('w', widthMm)).toBe(true);
    expect(parameterMatches(' W ', widthMm)).toBe(true);
    expect(parameterMatches('gap', widthMm)).toBe(false);
    expect(parameterMatches('w2', widthMm)).toBe(false);
  });
  it('εr of a material: plain names, or prefixed with the material id or name', () => {
    const axis: SweepAxis = { target: { kind: 'material', id: 'laminate', property: 'epsR' }, units: 'mm', materialNames: { laminate: 'Glass-epoxy laminate' } };
    for (const n of ['εr', 'epsR', 'eps_r', 'Dk', 'laminate εr', 'Glass-epoxy laminate epsR']) expect(parameterMatches(n, axis), n).toBe(true);
    for (const n of ['tanδ', 'w', 'core εr', 'εr2']) expect(parameterMatches(n, axis), n).toBe(false);
  });
  it('tanδ and the background εr', () => {
    expect(parameterMatches('tanδ', { target: { kind: 'material', id: 'core', property: 'lossTangent' }, units: 'mm' })).toBe(true);
    expect(parameterMatches('loss tangent', { target: { kind: 'material', id: 'core', property: 'lossTangent' }, units: 'mm' })).toBe(true);
    expect(parameterMatches('εr', { target: { kind: 'material', id: 'core', property: 'lossTangent' }, units: 'mm' })).toBe(false);
    expect(parameterMatches('background εr', { target: { kind: 'background', property: 'epsR' }, units: 'mm' })).toBe(true);
    expect(parameterMatches('core εr', { target: { kind: 'background', property: 'epsR' }, units: 'mm' })).toBe(false);
  });
});

describe('parameterFactor', () => {
  it('converts lengths to the section unit', () => {
    const f = (unit: string | null, units: SweepAxis['units']) => parameterFactor(unit, { target: { kind: 'variable', name: 'w' }, units });
    expect(f('mm', 'mm')).toEqual({ ok: true, factor: 1 });
    expect(f('um', 'mm')).toEqual({ ok: true, factor: 1e-3 });
    expect(f('mil', 'mm')).toEqual({ ok: true, factor: 0.0254 });
    expect(f('in', 'mil')).toEqual({ ok: true, factor: 1000 });
    expect(f('mm', 'um')).toEqual({ ok: true, factor: 1000 });
    expect(f('cm', 'in')).toEqual({ ok: true, factor: Number((1 / 2.54).toPrecision(12)) });
  });
  it('refuses a missing or unknown length unit with a message naming it', () => {
    const none = parameterFactor(null, widthMm);
    expect(none.ok).toBe(false);
    if (!none.ok) expect(none.reason).toContain('w (mm)');
    const bad = parameterFactor('furlong', widthMm);
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.reason).toContain('"furlong"');
  });
  it('εr takes no unit', () => {
    const axis: SweepAxis = { target: { kind: 'material', id: 'core', property: 'epsR' }, units: 'mm' };
    expect(parameterFactor(null, axis)).toEqual({ ok: true, factor: 1 });
    expect(parameterFactor('-', axis)).toEqual({ ok: true, factor: 1 });
    expect(parameterFactor('mm', axis).ok).toBe(false);
  });
});

describe('matchMeasured', () => {
  it('micrometres and pF/cm on a millimetre sweep of C11 in pF/m', () => {
    const m = matchMeasured(set('bench-a.csv', 'w (µm),C (pF/cm)\n500,0.5\n1000,0.8\n'), widthMm, c11, { min: 0.5, max: 1 });
    expect(m.ok).toBe(true);
    if (!m.ok) return;
    expect(m.series).toHaveLength(1);
    expect(m.series[0]!.name).toBe('bench-a.csv · C (pF/cm)');
    expect(m.series[0]!.points.map((p) => p[0])).toEqual([0.5, 1]);
    // 0.5 pF/cm = 50 pF/m, 0.8 pF/cm = 80 pF/m
    expect(m.series[0]!.points[0]![1]).toBeCloseTo(50, 10);
    expect(m.series[0]!.points[1]![1]).toBeCloseTo(80, 10);
    expect(m.notes.join(' ')).toContain('converted from µm to mm');
  });
  it('one series per capacitance column; mils to millimetres; pF/in to pF/m', () => {
    const m = matchMeasured(set('two.csv', 'w [mil],C11 (pF/in),C12 (fF/mm)\n10,2.54,30\n'), widthMm, metricById('lineC'));
    expect(m.ok).toBe(true);
    if (!m.ok) return;
    expect(m.series.map((s) => s.name)).toEqual(['two.csv · C11 (pF/in)', 'two.csv · C12 (fF/mm)']);
    expect(m.series[0]!.points[0]![0]).toBeCloseTo(0.254, 12);
    expect(m.series[0]!.points[0]![1]).toBeCloseTo(100, 9); // 2.54 pF/in = 100 pF/m
    expect(m.series[1]!.points[0]![1]).toBeCloseTo(30, 9); // 30 fF/mm = 30 pF/m
  });
  it('a set of another quantity does not match, and says which column to rename', () => {
    const m = matchMeasured(set('gap.csv', 'gap (mm),C (pF/m)\n1,40\n'), widthMm, c11);
    expect(m.ok).toBe(false);
    if (!m.ok) expect(m.reason).toMatch(/"gap \(mm\)".*the dimension w \(mm\).*"w \(mm\)"/);
  });
  it('a non-capacitance chart value gets a note instead of points', () => {
    const m = matchMeasured(set('a.csv', 'w (mm),C (pF/m)\n1,40\n'), widthMm, metricById('z0'));
    expect(m.ok).toBe(false);
    if (!m.ok) expect(m.reason).toContain('capacitance');
  });
  it('a length column without a unit cannot be placed', () => {
    const m = matchMeasured(set('a.csv', 'w,C (pF/m)\n1,40\n'), widthMm, c11);
    expect(m.ok).toBe(false);
    if (!m.ok) expect(m.reason).toContain('gives no unit');
  });
  it('notes points outside the swept range and at x ≤ 0 on a log axis', () => {
    const m = matchMeasured(set('a.csv', 'εr,C (pF/m)\n0,10\n2,40\n4.4,80\n9,120\n'), { target: { kind: 'material', id: 'core', property: 'epsR' }, units: 'mm' }, c11, { min: 1, max: 5, log: true });
    expect(m.ok).toBe(true);
    if (!m.ok) return;
    expect(m.xFactor).toBe(1);
    expect(m.notes.join(' ')).toContain('2 of 4 measured points lie outside');
    expect(m.notes.join(' ')).toContain('1 measured point at zero or below');
  });
});

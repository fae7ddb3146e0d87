import { describe, expect, it } from 'vitest';
import type { PeakFieldEntry } from '@/lib/engine/types';
import { parseSummaryInputs, peakSummary } from '@/components/results/line-summary';

const entry = (where: string, vPerM: number, extra: Partial<PeakFieldEntry> = {}): PeakFieldEntry => ({ where, vPerM, x: 0, y: 0, singular: false, kind: 'material', ...extra });

describe('results summary: inputs and peak field digest', () => {
  it('reads GHz and volts, and names the field that is wrong', () => {
    expect(parseSummaryInputs('2.5', '-48')).toEqual({ frequencyHz: 2.5e9, volts: -48 });
    expect(parseSummaryInputs('0,5', '100')).toEqual({ frequencyHz: 0.5e9, volts: 100 });
    for (const bad of ['', '0', '-1', 'abc', 'NaN', '1e9']) {
      const r = parseSummaryInputs(bad, '100');
      expect('error' in r && r.error.startsWith('Frequency:')).toBe(true);
    }
    for (const bad of ['', '0', 'x', 'Infinity', '2e7']) {
      const r = parseSummaryInputs('1', bad);
      expect('error' in r && r.error.startsWith('Voltage:')).toBe(true);
    }
  });

  it('takes the largest field over the materials (not the conductor rows) and the smallest margin', () => {
    const entries = [
      entry('background', 7.7e6),
      entry('glass-epoxy', 8.2e6, { strengthVPerM: 20e6, margin: 20e6 / 8.2e6 }),
      entry('film', 3e6, { strengthVPerM: 5e6, margin: 5e6 / 3e6 }),
      entry('trace', 9e6, { kind: 'conductor', strengthVPerM: 1e6, margin: 1e6 / 9e6 }),
    ];
    const s = peakSummary(entries);
    expect(s.peak?.where).toBe('glass-epoxy');
    expect(s.weakest?.where).toBe('film');
    const air = peakSummary([entry('background', 1e5)]);
    expect(air.peak?.vPerM).toBe(1e5);
    expect(air.weakest).toBeNull(); // no strength given: no margin
    expect(peakSummary([])).toEqual({ peak: null, weakest: null });
  });
});

import { describe, expect, it } from 'vitest';
import { formatCapPerLength, formatRelError, sig, withPrefix } from '@/lib/field/format';
import { colorLut, quantile, scaleValue } from '@/lib/field/colormap';

describe('number formatting', () => {
  it('uses SI prefixes and per-length units', () => {
    expect(withPrefix(1.2345e-10, 'F/m')).toBe('123.5 pF/m');
    expect(withPrefix(2.5e6, 'V/m', 3)).toBe('2.50 MV/m');
    expect(formatCapPerLength(1e-10, 'pF/m')).toBe('100.0 pF/m');
    // 1 pF/m = 1e-12 F/m = 1e-18 F/µm = 1e-3 fF/µm
    expect(formatCapPerLength(1e-10, 'fF/µm')).toBe('0.1000 fF/µm');
    expect(formatRelError(1.234e-4)).toBe('±0.012 %');
    expect(sig(-0.5, 3)).toBe('−0.500');
  });
});

describe('colour scales', () => {
  // Known fact (the viridis definition, van der Walt & Smith 2015): it starts at dark purple
  // #440154 and ends at yellow #fde725.
  it('builds the viridis table from its published end points', () => {
    const lut = colorLut('viridis');
    expect(Array.from(lut.subarray(0, 3))).toEqual([0x44, 0x01, 0x54]);
    expect(Array.from(lut.subarray(765, 768))).toEqual([0xfd, 0xe7, 0x25]);
  });
  it('maps linear and log scales and clips', () => {
    expect(scaleValue({ kind: 'linear', min: 0, max: 10 }, 5)).toBe(0.5);
    expect(scaleValue({ kind: 'linear', min: 0, max: 10 }, 50)).toBe(1);
    expect(scaleValue({ kind: 'log', min: 1, max: 100 }, 10)).toBeCloseTo(0.5, 12);
    expect(quantile(Float64Array.from([5, 1, 3, 2, 4]), 0.5)).toBe(3);
  });
});

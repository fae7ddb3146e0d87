/** List summaries and relative times shown on the workspace pages (common practice, no published source). */
import { describe, expect, it } from 'vitest';
import { formatPerMetre, summariseResult } from '@/app/(workspace)/w/[workspaceId]/_components/format';
import { relativeTime } from '@/components/ui/time';

describe('formatPerMetre', () => {
  it('picks the SI prefix that keeps 1 to 999 before the unit', () => {
    expect(formatPerMetre(8.93e-11, 'F')).toBe('89.3 pF/m');
    expect(formatPerMetre(2.5e-7, 'H')).toBe('250 nH/m');
    expect(formatPerMetre(1.2e-15, 'F')).toBe('1.20 fF/m');
    expect(formatPerMetre(3.3e-6, 'H')).toBe('3.30 µH/m');
  });
  it('keeps values below the smallest prefix in femto, and refuses non-numbers', () => {
    expect(formatPerMetre(5e-17, 'F')).toBe('0.0500 fF/m');
    expect(formatPerMetre(Number.NaN, 'F')).toBe('—');
  });
});

describe('summariseResult', () => {
  it('shows Z0 and εeff for a single line', () => {
    expect(summariseResult({ nets: ['trace'], line: { z0Ohm: 49.987, epsEff: 3.3101 } })).toBe('Z₀ 49.99 Ω · εeff 3.310');
  });
  it('shows the fringing excess for a plate pair', () => {
    expect(summariseResult({ nets: ['top'], plates: { solvedOverIdeal: 1.0842 } })).toBe('fringing +8.42 %');
  });
  it('falls back to C11 with its error for several nets', () => {
    expect(
      summariseResult({
        nets: ['a', 'b'],
        capacitance: { maxwell: [[1.234e-10, -2e-11], [-2e-11, 1.1e-10]] },
        errorEstimate: { relative: 0.00042 },
      }),
    ).toBe('C₁₁ 123 pF/m ±0.042 %');
  });
  it('returns null for anything else', () => {
    expect(summariseResult(null)).toBeNull();
    expect(summariseResult({})).toBeNull();
    expect(summariseResult('x')).toBeNull();
  });
});

describe('relativeTime', () => {
  const now = new Date('2026-03-12T12:00:00Z');
  it('says just now, minutes, hours and days', () => {
    expect(relativeTime(new Date('2026-03-12T11:59:40Z'), now)).toBe('just now');
    expect(relativeTime(new Date('2026-03-12T11:55:00Z'), now)).toBe('5 minutes ago');
    expect(relativeTime(new Date('2026-03-12T09:00:00Z'), now)).toBe('3 hours ago');
    expect(relativeTime(new Date('2026-03-11T12:00:00Z'), now)).toBe('yesterday');
  });
  it('gives the date after a week', () => {
    expect(relativeTime(new Date('2026-02-01T12:00:00Z'), now)).toBe('1 Feb 2026');
  });
});

/**
 * Readable numbers with units for results and field views (SI prefixes, per-length units).
 */

const PREFIXES: [number, string][] = [
  [1e12, 'T'],
  [1e9, 'G'],
  [1e6, 'M'],
  [1e3, 'k'],
  [1, ''],
  [1e-3, 'm'],
  [1e-6, 'µ'],
  [1e-9, 'n'],
  [1e-12, 'p'],
  [1e-15, 'f'],
  [1e-18, 'a'],
];

/** Significant digits, no exponent for ordinary magnitudes, no trailing "-0". */
export function sig(v: number, digits = 4): string {
  if (!Number.isFinite(v)) return v > 0 ? '∞' : v < 0 ? '−∞' : '—';
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e-3 && a < 1e6) {
    const d = Math.max(0, digits - 1 - Math.floor(Math.log10(a)));
    return v.toFixed(Math.min(d, 12)).replace('-', '−');
  }
  return v.toExponential(digits - 1).replace('-', '−');
}

/** v with an SI prefix on `unit`, e.g. (1.2e-10, 'F/m') → "120.0 pF/m". */
export function withPrefix(v: number, unit: string, digits = 4): string {
  if (!Number.isFinite(v)) return `${sig(v)} ${unit}`;
  const a = Math.abs(v);
  if (a === 0) return `0 ${unit}`;
  for (const [f, p] of PREFIXES) {
    if (a >= f * 0.9995) return `${sig(v / f, digits)} ${p}${unit}`;
  }
  const [f, p] = PREFIXES[PREFIXES.length - 1]!;
  return `${sig(v / f, digits)} ${p}${unit}`;
}

export type CapUnit = 'pF/m' | 'nF/m' | 'fF/µm' | 'pF/mm' | 'pF/in' | 'fF/mm';

/** Factor from F/m to each per-length capacitance unit. */
export const CAP_UNIT_FACTOR: Record<CapUnit, number> = {
  'pF/m': 1e12,
  'nF/m': 1e9,
  'fF/µm': 1e15 * 1e-6,
  'fF/mm': 1e15 * 1e-3,
  'pF/mm': 1e12 * 1e-3,
  'pF/in': 1e12 * 0.0254,
};

export function formatCapPerLength(fPerM: number, unit: CapUnit, digits = 4): string {
  return `${sig(fPerM * CAP_UNIT_FACTOR[unit], digits)} ${unit}`;
}

/** Relative error as "±0.012 %". */
export function formatRelError(rel: number | undefined): string {
  if (rel === undefined || !Number.isFinite(rel)) return '±?';
  const pct = Math.abs(rel) * 100;
  if (pct < 0.0001) return '< ±0.0001 %';
  return `±${sig(pct, 2)} %`;
}

/** Lengths for the "for a length of" input: metres per unit. */
export const LENGTH_UNITS = { m: 1, mm: 1e-3, cm: 1e-2, um: 1e-6, in: 0.0254, mil: 25.4e-6 } as const;
export type LengthUnit = keyof typeof LENGTH_UNITS;

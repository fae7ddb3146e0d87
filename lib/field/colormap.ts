/**
 * Colour maps as 256-entry RGB lookup tables. Viridis and cividis are perceptually uniform
 * sequential maps (van der Walt & Smith 2015, for matplotlib; Nuñez, Anderton & Renslow 2018,
 * cividis), taken from d3-scale-chromatic rather than copied by hand.
 */
import { interpolateCividis, interpolateViridis } from 'd3-scale-chromatic';

export type ColorMapName = 'viridis' | 'cividis';

const cache = new Map<ColorMapName, Uint8Array>();

function parseColor(c: string): [number, number, number] {
  const hex = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(c);
  if (hex) return [parseInt(hex[1]!, 16), parseInt(hex[2]!, 16), parseInt(hex[3]!, 16)];
  const rgb = /^rgb\((\d+),\s*(\d+),\s*(\d+)\)$/.exec(c);
  if (rgb) return [Number(rgb[1]), Number(rgb[2]), Number(rgb[3])];
  throw new Error(`unexpected colour ${c}`);
}

/** 256 × RGB, entry q for t = q/255. */
export function colorLut(name: ColorMapName): Uint8Array {
  let lut = cache.get(name);
  if (!lut) {
    const f = name === 'viridis' ? interpolateViridis : interpolateCividis;
    lut = new Uint8Array(256 * 3);
    for (let q = 0; q < 256; q++) {
      const [r, g, b] = parseColor(f(q / 255));
      lut[3 * q] = r;
      lut[3 * q + 1] = g;
      lut[3 * q + 2] = b;
    }
    cache.set(name, lut);
  }
  return lut;
}

/** CSS colour of t in [0, 1]. */
export function colorAt(name: ColorMapName, t: number): string {
  const lut = colorLut(name);
  const q = Math.max(0, Math.min(255, Math.round(t * 255)));
  return `rgb(${lut[3 * q]}, ${lut[3 * q + 1]}, ${lut[3 * q + 2]})`;
}

/** How values map to [0, 1]. */
export interface ColorScale {
  kind: 'linear' | 'log';
  min: number;
  max: number;
}

export function scaleValue(s: ColorScale, v: number): number {
  if (!Number.isFinite(v)) return Number.NaN;
  let t: number;
  if (s.kind === 'log') {
    const lo = Math.log10(s.min);
    const hi = Math.log10(s.max);
    t = v <= 0 ? 0 : (Math.log10(v) - lo) / (hi - lo);
  } else {
    t = (v - s.min) / (s.max - s.min);
  }
  if (!(t >= 0)) return 0;
  return t > 1 ? 1 : t;
}

/**
 * The value at quantile q (0..1) of the finite entries of `values` picked by `include`
 * (used to clip the |E| colour range below the singular corner values).
 */
export function quantile(values: Float64Array, q: number, include?: (k: number) => boolean): number {
  const picked: number[] = [];
  for (let k = 0; k < values.length; k++) {
    const v = values[k]!;
    if (Number.isFinite(v) && (!include || include(k))) picked.push(v);
  }
  if (picked.length === 0) return Number.NaN;
  const a = Float64Array.from(picked).sort();
  const pos = Math.min(a.length - 1, Math.max(0, q * (a.length - 1)));
  const lo = Math.floor(pos);
  const hi = Math.ceil(pos);
  return a[lo]! + (pos - lo) * (a[hi]! - a[lo]!);
}

'use client';
/** A vertical colour bar with ticks and units, drawn from the same lookup table as the field. */
import { useEffect, useRef } from 'react';
import { colorLut, type ColorMapName, type ColorScale } from '@/lib/field/colormap';

export interface ColorBarProps {
  map: ColorMapName;
  scale: ColorScale;
  title: string;
  /** Formats a tick value with its unit. */
  format: (v: number) => string;
  /** The top colour also stands for everything above the range. */
  clippedTop?: boolean;
  testId?: string;
}

function ticksFor(s: ColorScale): number[] {
  if (s.kind === 'log') {
    const lo = Math.ceil(Math.log10(s.min));
    const hi = Math.floor(Math.log10(s.max));
    const out: number[] = [s.min];
    for (let e = lo; e <= hi; e++) {
      const v = 10 ** e;
      if (v > s.min * 1.3 && v < s.max / 1.3) out.push(v);
    }
    out.push(s.max);
    return out;
  }
  return [0, 0.25, 0.5, 0.75, 1].map((t) => s.min + t * (s.max - s.min));
}

function position(s: ColorScale, v: number): number {
  if (s.kind === 'log') return (Math.log10(v) - Math.log10(s.min)) / (Math.log10(s.max) - Math.log10(s.min));
  return (v - s.min) / (s.max - s.min);
}

export function ColorBar({ map, scale, title, format, clippedTop, testId }: ColorBarProps) {
  const ref = useRef<HTMLCanvasElement>(null);
  useEffect(() => {
    const c = ref.current;
    if (!c) return;
    const ctx = c.getContext('2d');
    if (!ctx) return;
    const lut = colorLut(map);
    const img = ctx.createImageData(1, 256);
    for (let q = 0; q < 256; q++) {
      const src = (255 - q) * 3; // top row = high values
      img.data[4 * q] = lut[src]!;
      img.data[4 * q + 1] = lut[src + 1]!;
      img.data[4 * q + 2] = lut[src + 2]!;
      img.data[4 * q + 3] = 255;
    }
    ctx.putImageData(img, 0, 0);
  }, [map]);
  const ticks = ticksFor(scale);
  const H = 200;
  return (
    <figure className="flex flex-col gap-1" data-testid={testId} aria-label={`${title}, colour bar`}>
      <figcaption className="max-w-36 text-xs font-medium leading-tight text-ink-soft">{title}</figcaption>
      <div className="flex items-stretch gap-1.5">
        <canvas ref={ref} width={1} height={256} className="w-4 rounded-sm border border-line" style={{ height: H, imageRendering: 'auto' }} />
        <div className="relative" style={{ height: H, minWidth: 84 }}>
          {ticks.map((v, k) => {
            const top = (1 - position(scale, v)) * H;
            const isTop = k === ticks.length - 1;
            return (
              <span
                key={k}
                className="absolute left-0 -translate-y-1/2 whitespace-nowrap text-xs tabular-nums text-ink"
                style={{ top }}
              >
                <span className="mr-1 inline-block h-px w-1.5 bg-ink-muted align-middle" />
                {isTop && clippedTop ? '≥ ' : ''}
                {format(v)}
              </span>
            );
          })}
        </div>
      </div>
    </figure>
  );
}

'use client';
/** φ and |E| along a cut line, as a small two-axis SVG chart, with a copy-as-text button. */
import type { CutSamples } from '@/lib/field/cut-line';
import { sig, withPrefix } from '@/lib/field/format';
import { CopyButton } from '@/components/results/copy-button';

export interface CutPlotProps {
  samples: CutSamples;
  /** Metres per section unit and its label, for the distance axis. */
  unit: number;
  unitLabel: string;
  /** Applied volts (samples are per volt). */
  volts: number;
}

const W = 640;
const H = 200;
const PAD = { l: 66, r: 72, t: 14, b: 34 };

function extent(a: Float64Array): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of a) {
    if (!Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (!Number.isFinite(lo)) return [0, 1];
  if (hi === lo) return [lo - 0.5, hi + 0.5];
  return [lo, hi];
}

function path(xs: Float64Array, ys: Float64Array, fx: (v: number) => number, fy: (v: number) => number): string {
  let d = '';
  let pen = false;
  for (let q = 0; q < xs.length; q++) {
    const y = ys[q]!;
    if (!Number.isFinite(y)) {
      pen = false;
      continue;
    }
    d += `${pen ? 'L' : 'M'}${fx(xs[q]!).toFixed(1)},${fy(y).toFixed(1)}`;
    pen = true;
  }
  return d;
}

export function CutPlot({ samples, unit, unitLabel, volts }: CutPlotProps) {
  const n = samples.s.length;
  const s = samples.s.map((v) => v / unit);
  const phi = samples.phi.map((v) => v * volts);
  const mag = samples.mag.map((v) => v * Math.abs(volts));
  const sMax = s[n - 1] || 1;
  const [pLo, pHi] = extent(phi);
  const [, eHi0] = extent(mag);
  const eHi = eHi0 > 0 ? eHi0 : 1;
  const fx = (v: number) => PAD.l + (v / sMax) * (W - PAD.l - PAD.r);
  const fyP = (v: number) => PAD.t + (1 - (v - pLo) / (pHi - pLo)) * (H - PAD.t - PAD.b);
  const fyE = (v: number) => PAD.t + (1 - v / eHi) * (H - PAD.t - PAD.b);
  const text = () => {
    const rows = [`distance (${unitLabel})\tx (${unitLabel})\ty (${unitLabel})\tpotential (V)\t|E| (V/m)`];
    for (let q = 0; q < n; q++) {
      rows.push([s[q], samples.x[q]! / unit, samples.y[q]! / unit, phi[q], mag[q]].map((v) => (Number.isFinite(v!) ? String(v) : '')).join('\t'));
    }
    return rows.join('\n');
  };
  const ticks = [0, 0.25, 0.5, 0.75, 1];
  return (
    <figure className="rounded-md border border-line bg-surface p-3" data-testid="cut-plot">
      <div className="mb-1 flex items-center justify-between gap-2">
        <figcaption className="text-sm font-medium text-ink">
          Along the cut line: <span className="text-copper-600">potential</span> and <span className="text-steel-600">|E|</span>
          {volts !== 1 ? ` for ${sig(volts, 3)} V applied` : ' per volt applied'}
        </figcaption>
        <CopyButton label="Copy samples" text={text} />
      </div>
      <svg viewBox={`0 0 ${W} ${H}`} className="h-auto w-full" role="img" aria-label="Potential and field strength along the cut line">
        <rect x={PAD.l} y={PAD.t} width={W - PAD.l - PAD.r} height={H - PAD.t - PAD.b} fill="var(--color-grey-25)" stroke="var(--color-line)" />
        {ticks.map((t) => (
          <g key={t}>
            <text x={PAD.l - 6} y={fyP(pLo + t * (pHi - pLo)) + 4} textAnchor="end" fontSize="11" fill="var(--color-copper-700)">
              {sig(pLo + t * (pHi - pLo), 3)} V
            </text>
            <text x={W - PAD.r + 6} y={fyE(t * eHi) + 4} fontSize="11" fill="var(--color-steel-700)">
              {withPrefix(t * eHi, 'V/m', 3)}
            </text>
            <text x={fx(t * sMax)} y={H - PAD.b + 16} textAnchor="middle" fontSize="11" fill="var(--color-ink-soft)">
              {sig(t * sMax, 3)}
            </text>
          </g>
        ))}
        <text x={(PAD.l + W - PAD.r) / 2} y={H - 4} textAnchor="middle" fontSize="11" fill="var(--color-ink-soft)">
          distance along the cut ({unitLabel})
        </text>
        <path d={path(s, phi, fx, fyP)} fill="none" stroke="var(--color-copper-500)" strokeWidth="2" />
        <path d={path(s, mag, fx, fyE)} fill="none" stroke="var(--color-steel-600)" strokeWidth="2" />
      </svg>
    </figure>
  );
}

'use client';
/**
 * A line chart of results against a swept value (recharts), log or linear x. Measured data
 * (markersOnly) draws as hollow diamonds without a line, so it never reads as a solved curve.
 */
import { CartesianGrid, ComposedChart, Legend, Line, ResponsiveContainer, Scatter, Tooltip, XAxis, YAxis, type ScatterShapeProps } from 'recharts';

export interface ChartSeries {
  name: string;
  points: [number, number][];
  dashed?: boolean;
  /** Measured data: markers without a line. */
  markersOnly?: boolean;
  /** Fixed colour (measured sets keep theirs when others are hidden). */
  colour?: string;
  /** data-testid of each marker (markersOnly) and data-series of the series' group. */
  testId?: string;
}

const COLOURS = ['#0f766e', '#b45309', '#6d28d9', '#64748b', '#be123c', '#1d4ed8', '#4d7c0f'];
/**
 * A hollow diamond marker with a test id; recharts passes the point's pixel centre. Drawn above
 * the solved curve's dots (zIndex 700 > recharts' 600 for dots), unfilled so a dot it covers shows.
 */
function diamond(colour: string, testId: string | undefined) {
  function DiamondMarker({ cx, cy }: ScatterShapeProps) {
    if (cx === undefined || cy === undefined) return <g />;
    const r = 5;
    return <path d={`M${cx},${cy - r}L${cx + r},${cy}L${cx},${cy + r}L${cx - r},${cy}Z`} fill="none" stroke={colour} strokeWidth={2} data-testid={testId} />;
  }
  return DiamondMarker;
}

/** 1-2-5 ticks of a logarithmic axis inside [lo, hi] (recharts' own log ticks overlapped here); undefined when fewer than two. */
function logTicks(lo: number, hi: number): number[] | undefined {
  if (!(lo > 0) || !(hi > lo)) return undefined;
  const t: number[] = [];
  for (let e = Math.floor(Math.log10(lo)); e <= Math.ceil(Math.log10(hi)); e++)
    for (const m of [1, 2, 5]) {
      const v = Number((m * 10 ** e).toPrecision(12));
      if (v >= lo * (1 - 1e-12) && v <= hi * (1 + 1e-12)) t.push(v);
    }
  return t.length >= 2 ? t : undefined;
}

const fmt = (v: number) => (Math.abs(v) >= 1e4 || (Math.abs(v) < 1e-2 && v !== 0) ? v.toExponential(1) : String(Number(v.toPrecision(3))));

export function AnalysisChart({ series, logX, xLabel, yLabel, testId }: { series: ChartSeries[]; logX?: boolean; xLabel: string; yLabel: string; testId?: string }) {
  const usable = series.map((s) => ({ ...s, points: s.points.filter(([x, y]) => Number.isFinite(x) && Number.isFinite(y) && (!logX || x > 0)) }));
  const xs = usable.flatMap((s) => s.points.map((p) => p[0]));
  if (xs.length === 0) return null;
  const hasMarkers = usable.some((s) => s.markersOnly && s.points.length > 0);
  const ticks = logX ? logTicks(Math.min(...xs), Math.max(...xs)) : undefined;
  return (
    <figure className="w-full" data-testid={testId} aria-label={`${yLabel} against ${xLabel}`}>
      <div className="h-72 w-full">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
            <CartesianGrid stroke="#e3e7ee" />
            <XAxis
              type="number"
              dataKey="x"
              scale={logX ? 'log' : 'linear'}
              domain={[Math.min(...xs), Math.max(...xs)]}
              // With measured markers: padded and unclipped so markers at the ends show whole.
              allowDataOverflow={!hasMarkers}
              {...(ticks ? { ticks } : {})}
              {...(hasMarkers ? { padding: { left: 8, right: 8 } } : {})}
              tickFormatter={fmt}
              label={{ value: xLabel, position: 'insideBottom', offset: -12, fontSize: 12 }}
              fontSize={11}
            />
            <YAxis type="number" dataKey="y" domain={['auto', 'auto']} tickFormatter={fmt} fontSize={11} width={64} label={{ value: yLabel, angle: -90, position: 'insideLeft', fontSize: 12, style: { textAnchor: 'middle' } }} />
            <Tooltip formatter={(v) => (typeof v === 'number' ? fmt(v) : String(v))} labelFormatter={(v) => `${xLabel}: ${typeof v === 'number' ? fmt(v) : String(v)}`} />
            <Legend verticalAlign="top" height={28} wrapperStyle={{ fontSize: 12 }} />
            {usable.map((s, i) =>
              s.markersOnly ? (
                <Scatter
                  key={s.name}
                  name={s.name}
                  data={s.points.map(([x, y]) => ({ x, y }))}
                  fill={s.colour ?? COLOURS[i % COLOURS.length]}
                  stroke={s.colour ?? COLOURS[i % COLOURS.length]}
                  legendType="diamond"
                  shape={diamond(s.colour ?? COLOURS[i % COLOURS.length]!, s.testId)}
                  className="measured-series"
                  zIndex={700}
                  isAnimationActive={false}
                />
              ) : (
                <Line
                  key={s.name}
                  name={s.name}
                  data={s.points.map(([x, y]) => ({ x, y }))}
                  dataKey="y"
                  type="monotone"
                  stroke={s.colour ?? COLOURS[i % COLOURS.length]}
                  strokeWidth={s.dashed ? 1.5 : 2}
                  strokeDasharray={s.dashed ? '5 4' : undefined}
                  dot={s.dashed ? false : { r: 3 }}
                  isAnimationActive={false}
                />
              ),
            )}
          </ComposedChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}

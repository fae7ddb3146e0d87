import type { ImportedDrawing } from '@/lib/import/types';
import type { LayerMapping } from '@/lib/import/to-section';

const COLOURS = { conductor: '#d5773b', ground: '#4e5b61', dielectric: '#8fb3cb', ignore: 'transparent' } as const;

/** A small picture of the imported outlines, coloured by what each layer will become. */
export function DrawingPreview({ drawing, layers }: { drawing: ImportedDrawing; layers: Record<string, LayerMapping> }) {
  const b = drawing.bbox;
  if (!b) return null;
  const w = Math.max(b.xmax - b.xmin, 1e-12);
  const h = Math.max(b.ymax - b.ymin, 1e-12);
  const pad = 0.05 * Math.max(w, h);
  const colour = (layer: string) => {
    const m = layers[layer];
    if (!m) return { fill: '#eceff0', stroke: '#b9c2c3' };
    if (m.as === 'ignore') return { fill: 'none', stroke: '#b9c2c3' };
    if (m.as === 'dielectric') return { fill: COLOURS.dielectric, stroke: '#3f7398' };
    return { fill: m.role === 'ground' ? COLOURS.ground : COLOURS.conductor, stroke: '#37434a' };
  };
  // y up in the drawing, y down on screen: flip with a transform.
  return (
    <svg
      viewBox={`${b.xmin - pad} ${-(b.ymax + pad)} ${w + 2 * pad} ${h + 2 * pad}`}
      className="h-56 w-full rounded-md border border-line bg-grey-25"
      role="img"
      aria-label={`Preview of ${drawing.shapes.length} imported shapes`}
      data-testid="import-preview"
      preserveAspectRatio="xMidYMid meet"
    >
      <g transform="scale(1,-1)" strokeWidth={Math.max(w, h) / 400} vectorEffect="non-scaling-stroke">
        {/* dielectrics first, as in the section */}
        {[...drawing.shapes]
          .sort((p, q) => Number(layers[p.layer]?.as === 'conductor') - Number(layers[q.layer]?.as === 'conductor'))
          .map((s, i) => {
            const c = colour(s.layer);
            const common = { fill: c.fill, stroke: c.stroke, fillOpacity: 0.85, strokeDasharray: layers[s.layer]?.as === 'ignore' ? `${w / 100}` : undefined };
            if (s.type === 'rect') return <rect key={i} x={s.x} y={s.y} width={s.width} height={s.height} {...common} />;
            if (s.type === 'circle') return <circle key={i} cx={s.cx} cy={s.cy} r={s.r} {...common} />;
            return <polygon key={i} points={s.points.map((p) => p.join(',')).join(' ')} {...common} />;
          })}
      </g>
    </svg>
  );
}

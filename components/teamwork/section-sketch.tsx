import { resolveSection } from '@/lib/section/resolve';
import type { ResolvedShape, Section } from '@/lib/section/schema';
import type { ShapeChange } from '@/lib/teamwork/section-diff';

const CHANGE_STROKE: Record<ShapeChange, string> = {
  added: '#2c7a4b',
  removed: '#b02a20',
  changed: '#94600a',
  unchanged: 'transparent',
};

function bbox(shapes: ResolvedShape[]) {
  let x0 = Infinity;
  let y0 = Infinity;
  let x1 = -Infinity;
  let y1 = -Infinity;
  const add = (x: number, y: number) => {
    if (!Number.isFinite(x) || !Number.isFinite(y)) return;
    x0 = Math.min(x0, x);
    x1 = Math.max(x1, x);
    y0 = Math.min(y0, y);
    y1 = Math.max(y1, y);
  };
  for (const s of shapes) {
    if (s.type === 'rect') {
      add(s.x, s.y);
      add(s.x + s.width, s.y + s.height);
    } else if (s.type === 'circle') {
      add(s.cx - s.r, s.cy - s.r);
      add(s.cx + s.r, s.cy + s.r);
    } else if (s.type === 'ring') {
      add(s.cx - s.rOuter, s.cy - s.rOuter);
      add(s.cx + s.rOuter, s.cy + s.rOuter);
    } else if (s.type === 'polygon') s.points.forEach((p) => add(p[0], p[1]));
    else {
      add(s.x1, s.y1);
      add(s.x2, s.y2);
    }
  }
  return Number.isFinite(x0) ? { x0, y0, x1, y1 } : null;
}

/**
 * A read-only drawing of a section (server-renderable SVG), with shapes outlined by how they
 * changed: green added, amber changed, red dashed removed (drawn from the other revision).
 */
export function SectionSketch({
  section,
  changes,
  ghosts,
  frame,
  label,
  'data-testid': testId,
}: {
  section: Section;
  changes?: Record<string, ShapeChange>;
  /** Shapes to draw as removed outlines (from the other revision). */
  ghosts?: Section;
  /** A shared frame so two sketches line up; computed from both when given. */
  frame?: { x0: number; y0: number; x1: number; y1: number } | null;
  label: string;
  'data-testid'?: string;
}) {
  const r = resolveSection(section);
  const resolved = r.ok ? r.section : r.partial;
  const ghostShapes = ghosts ? (() => {
    const g = resolveSection(ghosts);
    return (g.ok ? g.section : g.partial).shapes.filter((s) => changes?.[s.id] === 'removed');
  })() : [];
  const box = frame ?? bbox([...resolved.shapes, ...ghostShapes]);
  if (!box) return <p className="text-sm text-ink-muted">Nothing drawn.</p>;
  const w = Math.max(box.x1 - box.x0, 1e-12);
  const h = Math.max(box.y1 - box.y0, 1e-12);
  const pad = 0.06 * Math.max(w, h);
  const sw = Math.max(w, h) / 250;
  const netRole = new Map(resolved.nets.map((n) => [n.name, n.role]));
  const fill = (s: ResolvedShape) =>
    s.conductor !== undefined ? (netRole.get(s.conductor) === 'ground' ? '#68767b' : '#d5773b') : '#d9e7f0';
  const draw = (s: ResolvedShape, key: string, stroke: string, dashed: boolean, filled: boolean) => {
    const common = {
      fill: filled ? fill(s) : 'none',
      stroke,
      strokeWidth: stroke === 'transparent' ? 0 : sw * 2.2,
      strokeDasharray: dashed ? `${sw * 5} ${sw * 3}` : undefined,
      'data-shape': s.id,
      'data-change': changes?.[s.id] ?? 'unchanged',
    };
    if (s.type === 'rect') return <rect key={key} x={s.x} y={s.y} width={s.width} height={s.height} {...common} />;
    if (s.type === 'circle') return <circle key={key} cx={s.cx} cy={s.cy} r={s.r} {...common} />;
    if (s.type === 'ring')
      return (
        <path
          key={key}
          fillRule="evenodd"
          d={`M ${s.cx + s.rOuter} ${s.cy} a ${s.rOuter} ${s.rOuter} 0 1 0 ${-2 * s.rOuter} 0 a ${s.rOuter} ${s.rOuter} 0 1 0 ${2 * s.rOuter} 0 Z M ${s.cx + s.rInner} ${s.cy} a ${s.rInner} ${s.rInner} 0 1 0 ${-2 * s.rInner} 0 a ${s.rInner} ${s.rInner} 0 1 0 ${2 * s.rInner} 0 Z`}
          {...common}
        />
      );
    if (s.type === 'polygon') return <polygon key={key} points={s.points.map((p) => p.join(',')).join(' ')} {...common} />;
    return <line key={key} x1={s.x1} y1={s.y1} x2={s.x2} y2={s.y2} {...common} stroke={stroke === 'transparent' ? fill(s) : stroke} strokeWidth={sw * 3} />;
  };
  return (
    <svg
      viewBox={`${box.x0 - pad} ${-(box.y1 + pad)} ${w + 2 * pad} ${h + 2 * pad}`}
      className="h-64 w-full rounded-md border border-line bg-grey-25"
      role="img"
      aria-label={label}
      data-testid={testId}
      preserveAspectRatio="xMidYMid meet"
    >
      <g transform="scale(1,-1)">
        {resolved.shapes.map((s, i) => draw(s, `s${i}`, CHANGE_STROKE[changes?.[s.id] ?? 'unchanged'], false, true))}
        {ghostShapes.map((s, i) => draw(s, `g${i}`, CHANGE_STROKE.removed, true, false))}
      </g>
    </svg>
  );
}

export function sketchFrame(...sections: Section[]) {
  const shapes = sections.flatMap((s) => {
    const r = resolveSection(s);
    return (r.ok ? r.section : r.partial).shapes;
  });
  return bbox(shapes);
}

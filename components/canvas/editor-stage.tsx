'use client';

/**
 * The Konva drawing surface of the section editor. Loaded only in the browser (through
 * next/dynamic with ssr: false from section-editor.tsx).
 *
 * Layers, bottom to top:
 *  1. grid (adaptive to the zoom, one custom shape, never listens)
 *  2. shapes: dielectrics, then the caller's world layer (field views), then conductors,
 *     in world coordinates under one transform; React-memoised so pan/zoom and drags do
 *     not re-render them
 *  3. drag: the shapes being moved or reshaped; during a move only this layer and the
 *     guides are redrawn, imperatively, without any React render per mouse move
 *  4. overlay (screen coordinates): boundary planes, issue marks, selection, handles,
 *     dimensions, drawing previews, snap guides, box selection, rulers and scale bar
 * Hit-testing is our own (lib/editor/geometry.ts), so Konva builds no hit canvases.
 */
import Konva from 'konva';
import { memo, useCallback, useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { Circle, Group, Layer, Line, Rect, Ring, Shape as KShape, Stage, Text } from 'react-konva';
import type { ResolvedSection, ResolvedShape, Units } from '@/lib/section/schema';
import { boxFromPoints, hitTest, shapeBox, shapesInBox, type Box, type Pt } from '@/lib/editor/geometry';
import { applyPatch, dragHandle, geometryFromDrag, handlesFor, type DrawTool, type GeometryPatch } from '@/lib/editor/handles';
import { buildSnapTargets, selectionBox, snapMove, snapPoint, type Guide, type SnapTargets } from '@/lib/editor/snap';
import { gridSteps, panBy, scaleBar, toScreen, toWorld, visibleBox, zoomAt, type View } from '@/lib/editor/view';
import { formatLength, UNIT_LABELS } from '@/lib/editor/units';
import { dielectricFill } from '@/lib/editor/palette';

export type Tool = 'select' | 'pan' | 'rect' | 'circle' | 'ring' | 'polygon' | 'strip';

export interface LayerVisibility {
  conductors: boolean;
  dielectrics: boolean;
  boundary: boolean;
  dimensions: boolean;
}

export interface EditorStageProps {
  width: number;
  height: number;
  resolved: ResolvedSection;
  units: Units;
  view: View;
  onViewChange: (v: View) => void;
  selection: ReadonlySet<string>;
  onSelectionChange: (ids: string[]) => void;
  tool: Tool;
  readOnly: boolean;
  snapEnabled: boolean;
  gridVisible: boolean;
  layers: LayerVisibility;
  /** Shapes with problems: the worst severity per id. */
  marked: ReadonlyMap<string, 'error' | 'warning'>;
  netColors: ReadonlyMap<string, string>;
  onMove: (ids: string[], dx: number, dy: number) => void;
  onGeometry: (shape: ResolvedShape, patch: GeometryPatch) => void;
  onCreate: (tool: Tool, geometry: Record<string, number> | { points: [number, number][] }) => void;
  /** Konva nodes in world coordinates drawn above dielectrics and below conductors (field views). */
  worldLayer?: ReactNode;
}

const ACCENT = '#a44f19';
const GUIDE = '#2f5e80';
const ERROR = '#b02a20';
const WARNING = '#94600a';
const RULER = 22;
const HANDLE = 4.5;
const DRAG_THRESHOLD = 3;

type Mode =
  | { kind: 'idle' }
  | { kind: 'pan'; start: Pt; view: View }
  | { kind: 'move'; start: Pt; startWorld: Pt; ids: string[]; box: Box; targets: SnapTargets; started: boolean; dx: number; dy: number; hit: string | null; shift: boolean }
  | { kind: 'box'; start: Pt; shift: boolean }
  | { kind: 'draw'; tool: DrawTool; a: Pt; targets: SnapTargets }
  | { kind: 'handle'; shape: ResolvedShape; key: string; targets: SnapTargets };

function sameShape(a: ResolvedShape, b: ResolvedShape): boolean {
  if (a === b) return true;
  if (a.type !== b.type || a.id !== b.id || a.conductor !== b.conductor || a.dielectric !== b.dielectric) return false;
  if (a.type === 'polygon' && b.type === 'polygon') {
    return a.points.length === b.points.length && a.points.every((p, i) => p[0] === b.points[i]![0] && p[1] === b.points[i]![1]);
  }
  const ra = a as Record<string, unknown>;
  const rb = b as Record<string, unknown>;
  for (const k of Object.keys(ra)) if (ra[k] !== rb[k]) return false;
  return true;
}

interface ShapeNodeProps {
  s: ResolvedShape;
  fill: string;
  stroke: string;
  strong?: boolean;
}

/** One shape in world coordinates. Memoised on the shape's values, not its identity. */
const ShapeNode = memo(
  function ShapeNode({ s, fill, stroke, strong }: ShapeNodeProps) {
    const common = { stroke, strokeWidth: strong ? 2 : 1, strokeScaleEnabled: false, perfectDrawEnabled: false, listening: false } as const;
    if (![...Object.values(s)].every((v) => typeof v !== 'number' || Number.isFinite(v))) return null;
    switch (s.type) {
      case 'rect':
        return <Rect x={s.x} y={s.y} width={s.width} height={s.height} fill={fill} {...common} />;
      case 'circle':
        return <Circle x={s.cx} y={s.cy} radius={Math.max(0, s.r)} fill={fill} {...common} />;
      case 'ring':
        return (
          <Ring x={s.cx} y={s.cy} innerRadius={Math.max(0, s.rInner)} outerRadius={Math.max(0, s.rOuter)} fill={fill} {...common} />
        );
      case 'polygon':
        if (!s.points.every(([x, y]) => Number.isFinite(x) && Number.isFinite(y))) return null;
        return <Line points={s.points.flat()} closed fill={fill} {...common} />;
      case 'strip':
        return (
          <Line
            points={[s.x1, s.y1, s.x2, s.y2]}
            stroke={fill}
            strokeWidth={strong ? 4 : 3}
            lineCap="round"
            strokeScaleEnabled={false}
            perfectDrawEnabled={false}
            listening={false}
          />
        );
    }
  },
  (a, b) => a.fill === b.fill && a.stroke === b.stroke && a.strong === b.strong && sameShape(a.s, b.s),
);

function colorsFor(s: ResolvedShape, netColors: ReadonlyMap<string, string>, eps: ReadonlyMap<string, number>): { fill: string; stroke: string } {
  if (s.conductor !== undefined) {
    const c = netColors.get(s.conductor) ?? '#868e96';
    return { fill: c, stroke: shade(c) };
  }
  return { fill: dielectricFill(eps.get(s.dielectric ?? '') ?? 1), stroke: '#8c9a7e' };
}

function shade(hex: string): string {
  const n = parseInt(hex.slice(1), 16);
  const f = (v: number) => Math.round(v * 0.7).toString(16).padStart(2, '0');
  return `#${f((n >> 16) & 255)}${f((n >> 8) & 255)}${f(n & 255)}`;
}

export function EditorStage(props: EditorStageProps) {
  const {
    width,
    height,
    resolved,
    units,
    view,
    onViewChange,
    selection,
    onSelectionChange,
    tool,
    readOnly,
    snapEnabled,
    gridVisible,
    layers,
    marked,
    netColors,
    onMove,
    onGeometry,
    onCreate,
    worldLayer,
  } = props;

  const stageRef = useRef<Konva.Stage>(null);
  const dragGroupRef = useRef<Konva.Group>(null);
  const dragLayerRef = useRef<Konva.Layer>(null);
  const guideLayerRef = useRef<Konva.Layer>(null);
  const guideXRef = useRef<Konva.Line>(null);
  const guideYRef = useRef<Konva.Line>(null);
  const boxRef = useRef<Konva.Rect>(null);
  const mode = useRef<Mode>({ kind: 'idle' });
  const spaceDown = useRef(false);
  const pinch = useRef<{ dist: number; centre: Pt } | null>(null);
  const altDown = useRef(false);

  // State that changes at most once per gesture (or per mouse move for previews that are small).
  const [dragIds, setDragIds] = useState<ReadonlySet<string>>(new Set());
  const [preview, setPreview] = useState<ResolvedShape | null>(null);
  const [polyPts, setPolyPts] = useState<Pt[]>([]);
  const [hover, setHover] = useState<Pt | null>(null);
  const [cursorGuides, setCursorGuides] = useState<Guide[]>([]);

  const viewRef = useRef(view);
  viewRef.current = view;
  const resolvedRef = useRef(resolved);
  resolvedRef.current = resolved;

  const materialEps = useMemo(() => new Map(resolved.materials.map((m) => [m.id, m.epsR])), [resolved.materials]);
  const shapes = resolved.shapes;
  const byId = useMemo(() => new Map(shapes.map((s) => [s.id, s])), [shapes]);
  const steps = gridSteps(view);
  const snapGrid = snapEnabled ? steps.minor : 0;
  const hidden = useMemo(() => ({ conductors: !layers.conductors, dielectrics: !layers.dielectrics }), [layers.conductors, layers.dielectrics]);

  useEffect(() => {
    const down = (e: KeyboardEvent) => {
      if (e.key === ' ' && !(e.target instanceof HTMLInputElement || e.target instanceof HTMLTextAreaElement || e.target instanceof HTMLSelectElement)) {
        spaceDown.current = true;
      }
      altDown.current = e.altKey;
    };
    const up = (e: KeyboardEvent) => {
      if (e.key === ' ') spaceDown.current = false;
      altDown.current = e.altKey;
    };
    window.addEventListener('keydown', down);
    window.addEventListener('keyup', up);
    return () => {
      window.removeEventListener('keydown', down);
      window.removeEventListener('keyup', up);
    };
  }, []);

  // Polygon tool: Enter finishes, Escape cancels, Backspace removes the last point.
  const finishPolygon = useCallback(() => {
    setPolyPts((pts) => {
      if (pts.length >= 3) onCreate('polygon', { points: pts.map((p) => [p.x, p.y] as [number, number]) });
      return [];
    });
  }, [onCreate]);
  useEffect(() => {
    if (tool !== 'polygon') {
      setPolyPts([]);
      return;
    }
    const key = (e: KeyboardEvent) => {
      if (e.key === 'Enter') {
        e.preventDefault();
        finishPolygon();
      } else if (e.key === 'Escape') {
        setPolyPts([]);
      } else if (e.key === 'Backspace') {
        setPolyPts((p) => p.slice(0, -1));
      }
    };
    window.addEventListener('keydown', key, true);
    return () => window.removeEventListener('keydown', key, true);
  }, [tool, finishPolygon]);

  const pointer = (): Pt | null => {
    const p = stageRef.current?.getPointerPosition();
    return p ? { x: p.x, y: p.y } : null;
  };

  const showGuides = (guides: Guide[]) => {
    const v = viewRef.current;
    const gx = guides.find((g) => g.axis === 'x');
    const gy = guides.find((g) => g.axis === 'y');
    const lx = guideXRef.current;
    const ly = guideYRef.current;
    if (lx) {
      lx.visible(!!gx);
      if (gx) {
        const sx = v.ox + gx.value * v.scale;
        lx.points([sx, 0, sx, height]);
      }
    }
    if (ly) {
      ly.visible(!!gy);
      if (gy) {
        const sy = v.oy - gy.value * v.scale;
        ly.points([0, sy, width, sy]);
      }
    }
    guideLayerRef.current?.batchDraw();
  };

  const snapOpts = () => ({ tol: 7 / viewRef.current.scale, grid: altDown.current ? 0 : snapGrid, objects: snapEnabled && !altDown.current });

  const onPointerDown = (e: Konva.KonvaEventObject<PointerEvent>) => {
    const sp = pointer();
    if (!sp) return;
    const evt = e.evt;
    altDown.current = evt.altKey;
    if (evt.button === 1 || tool === 'pan' || spaceDown.current) {
      mode.current = { kind: 'pan', start: sp, view: viewRef.current };
      return;
    }
    if (evt.button !== 0) return;
    const v = viewRef.current;
    const wp = toWorld(v, sp);
    const all = resolvedRef.current.shapes;
    if (!readOnly && (tool === 'rect' || tool === 'circle' || tool === 'ring' || tool === 'strip')) {
      const targets = buildSnapTargets(all, new Set(), resolvedRef.current.boundary);
      const a = snapPoint(wp, targets, snapOpts()).point;
      mode.current = { kind: 'draw', tool, a, targets };
      return;
    }
    if (!readOnly && tool === 'polygon') {
      const targets = buildSnapTargets(all, new Set(), resolvedRef.current.boundary);
      const p = snapPoint(wp, targets, snapOpts()).point;
      const first = polyPts[0];
      if (first && polyPts.length >= 3 && Math.hypot((first.x - p.x) * v.scale, (first.y - p.y) * v.scale) < 8) {
        finishPolygon();
        return;
      }
      setPolyPts((pts) => [...pts, p]);
      return;
    }
    // Select tool: handles first (single selection), then shapes, then box selection.
    if (!readOnly && selection.size === 1) {
      const only = byId.get([...selection][0]!);
      if (only) {
        for (const h of handlesFor(only)) {
          const hs = toScreen(v, h);
          if (Math.abs(hs.x - sp.x) <= HANDLE + 3 && Math.abs(hs.y - sp.y) <= HANDLE + 3) {
            mode.current = { kind: 'handle', shape: only, key: h.key, targets: buildSnapTargets(all, new Set([only.id]), resolvedRef.current.boundary) };
            return;
          }
        }
      }
    }
    const idx = hitTest(all, wp, 5 / v.scale, hidden);
    const hit = idx >= 0 ? all[idx]! : null;
    if (hit) {
      if (evt.shiftKey) {
        const next = new Set(selection);
        if (next.has(hit.id)) next.delete(hit.id);
        else next.add(hit.id);
        onSelectionChange([...next]);
        return;
      }
      const ids = selection.has(hit.id) ? [...selection] : [hit.id];
      if (!selection.has(hit.id)) onSelectionChange(ids);
      if (readOnly) return;
      const box = selectionBox(all, new Set(ids)) ?? shapeBox(hit);
      mode.current = {
        kind: 'move',
        start: sp,
        startWorld: wp,
        ids,
        box,
        targets: buildSnapTargets(all, new Set(ids), resolvedRef.current.boundary),
        started: false,
        dx: 0,
        dy: 0,
        hit: hit.id,
        shift: false,
      };
      return;
    }
    mode.current = { kind: 'box', start: sp, shift: evt.shiftKey };
  };

  const onPointerMove = () => {
    const sp = pointer();
    if (!sp) return;
    const v = viewRef.current;
    const m = mode.current;
    const wp = toWorld(v, sp);
    switch (m.kind) {
      case 'idle': {
        if (tool === 'polygon' && polyPts.length > 0) {
          const targets = buildSnapTargets(resolvedRef.current.shapes, new Set(), resolvedRef.current.boundary);
          const r = snapPoint(wp, targets, snapOpts());
          setHover(r.point);
          setCursorGuides(r.guides);
        } else if (hover) {
          setHover(null);
        }
        return;
      }
      case 'pan':
        onViewChange(panBy(m.view, sp.x - m.start.x, sp.y - m.start.y));
        return;
      case 'move': {
        if (!m.started) {
          if (Math.hypot(sp.x - m.start.x, sp.y - m.start.y) < DRAG_THRESHOLD) return;
          m.started = true;
          setDragIds(new Set(m.ids));
        }
        const r = snapMove(m.box, wp.x - m.startWorld.x, wp.y - m.startWorld.y, m.targets, snapOpts());
        m.dx = r.dx;
        m.dy = r.dy;
        const g = dragGroupRef.current;
        if (g) {
          g.position({ x: r.dx * v.scale, y: -r.dy * v.scale });
          dragLayerRef.current?.batchDraw();
        }
        showGuides(r.guides);
        return;
      }
      case 'box': {
        const b = boxRef.current;
        if (b) {
          b.visible(true);
          b.setAttrs({ x: Math.min(m.start.x, sp.x), y: Math.min(m.start.y, sp.y), width: Math.abs(sp.x - m.start.x), height: Math.abs(sp.y - m.start.y) });
          guideLayerRef.current?.batchDraw();
        }
        return;
      }
      case 'draw': {
        const r = snapPoint(wp, m.targets, snapOpts());
        showGuides(r.guides);
        const g = geometryFromDrag(m.tool, m.a, r.point, 0);
        setPreview(g ? ({ id: '__preview', type: m.tool, conductor: '__preview', ...g } as ResolvedShape) : null);
        return;
      }
      case 'handle': {
        const r = snapPoint(wp, m.targets, snapOpts());
        showGuides(r.guides);
        setPreview(applyPatch(m.shape, dragHandle(m.shape, m.key, r.point)));
        return;
      }
    }
  };

  const endGesture = () => {
    const m = mode.current;
    mode.current = { kind: 'idle' };
    const sp = pointer();
    const v = viewRef.current;
    showGuides([]);
    switch (m.kind) {
      case 'move': {
        if (m.started) {
          dragGroupRef.current?.position({ x: 0, y: 0 });
          if (m.dx !== 0 || m.dy !== 0) onMove(m.ids, m.dx, m.dy);
          setDragIds(new Set());
        } else if (m.hit && selection.size > 1 && selection.has(m.hit)) {
          onSelectionChange([m.hit]);
        }
        return;
      }
      case 'box': {
        boxRef.current?.visible(false);
        guideLayerRef.current?.batchDraw();
        if (!sp) return;
        if (Math.hypot(sp.x - m.start.x, sp.y - m.start.y) < DRAG_THRESHOLD) {
          if (!m.shift) onSelectionChange([]);
          return;
        }
        const box = boxFromPoints(toWorld(v, m.start), toWorld(v, sp));
        const visible = resolvedRef.current.shapes.filter((s) => (s.conductor !== undefined ? layers.conductors : layers.dielectrics));
        const ids = shapesInBox(visible, box);
        onSelectionChange(m.shift ? [...new Set([...selection, ...ids])] : ids);
        return;
      }
      case 'draw': {
        setPreview(null);
        if (!sp) return;
        const raw = toWorld(v, sp);
        const b = snapPoint(raw, m.targets, snapOpts()).point;
        // When both ends snap to the same line the shape would have no size: then the end
        // point is taken as drawn.
        const g = geometryFromDrag(m.tool, m.a, b, 2 / v.scale) ?? geometryFromDrag(m.tool, m.a, raw, 2 / v.scale);
        if (g) onCreate(m.tool, g);
        return;
      }
      case 'handle': {
        setPreview(null);
        if (!sp) return;
        const p = snapPoint(toWorld(v, sp), m.targets, snapOpts()).point;
        onGeometry(m.shape, dragHandle(m.shape, m.key, p));
        return;
      }
      default:
        return;
    }
  };

  // The Stage gets stable handlers that call the latest closures through a ref, so a
  // gesture never runs with the tool or selection of an earlier render.
  const onDouble = () => {
    if (tool === 'polygon') finishPolygon();
  };
  const latest = useRef({ onPointerDown, onPointerMove, endGesture, onDouble });
  latest.current = { onPointerDown, onPointerMove, endGesture, onDouble };
  const stableDouble = useCallback(() => latest.current.onDouble(), []);
  const stableDown = useCallback((e: Konva.KonvaEventObject<PointerEvent>) => latest.current.onPointerDown(e), []);
  const stableMove = useCallback(() => latest.current.onPointerMove(), []);
  const stableUp = useCallback(() => latest.current.endGesture(), []);
  useEffect(() => {
    const up = () => {
      if (mode.current.kind !== 'idle') latest.current.endGesture();
    };
    window.addEventListener('pointerup', up);
    return () => window.removeEventListener('pointerup', up);
  }, []);

  const onWheel = (e: Konva.KonvaEventObject<WheelEvent>) => {
    e.evt.preventDefault();
    const sp = pointer();
    if (!sp) return;
    const dy = e.evt.deltaMode === 1 ? e.evt.deltaY * 16 : e.evt.deltaY;
    if (e.evt.shiftKey && !e.evt.ctrlKey) {
      onViewChange(panBy(viewRef.current, -dy, 0));
      return;
    }
    onViewChange(zoomAt(viewRef.current, Math.exp(-dy * (e.evt.ctrlKey ? 0.01 : 0.0015)), sp));
  };

  const onTouchMove = (e: Konva.KonvaEventObject<TouchEvent>) => {
    const t = e.evt.touches;
    if (t.length !== 2) {
      pinch.current = null;
      return;
    }
    e.evt.preventDefault();
    mode.current = { kind: 'idle' };
    const rect = stageRef.current?.container().getBoundingClientRect();
    const a = { x: t[0]!.clientX - (rect?.left ?? 0), y: t[0]!.clientY - (rect?.top ?? 0) };
    const b = { x: t[1]!.clientX - (rect?.left ?? 0), y: t[1]!.clientY - (rect?.top ?? 0) };
    const dist = Math.hypot(a.x - b.x, a.y - b.y);
    const centre = { x: (a.x + b.x) / 2, y: (a.y + b.y) / 2 };
    const prev = pinch.current;
    pinch.current = { dist, centre };
    if (!prev || prev.dist === 0) return;
    const moved = panBy(viewRef.current, centre.x - prev.centre.x, centre.y - prev.centre.y);
    onViewChange(zoomAt(moved, dist / prev.dist, centre));
  };

  // ------------------------------------------------------------- shapes (memoised)
  const staticShapes = useMemo(() => {
    const diel: ReactNode[] = [];
    const cond: ReactNode[] = [];
    for (const s of shapes) {
      if (dragIds.has(s.id) || (preview && preview.id === s.id)) continue;
      const { fill, stroke } = colorsFor(s, netColors, materialEps);
      if (s.conductor !== undefined) {
        if (layers.conductors) cond.push(<ShapeNode key={s.id} s={s} fill={fill} stroke={stroke} />);
      } else if (layers.dielectrics) {
        diel.push(<ShapeNode key={s.id} s={s} fill={fill} stroke={stroke} />);
      }
    }
    return { diel, cond };
  }, [shapes, dragIds, preview, netColors, materialEps, layers.conductors, layers.dielectrics]);

  const dragShapes = useMemo(() => {
    const out: ReactNode[] = [];
    for (const id of dragIds) {
      const s = byId.get(id);
      if (!s) continue;
      const { fill, stroke } = colorsFor(s, netColors, materialEps);
      out.push(<ShapeNode key={id} s={s} fill={fill} stroke={ACCENT} strong />);
      void stroke;
    }
    return out;
  }, [dragIds, byId, netColors, materialEps]);

  const worldProps = { x: view.ox, y: view.oy, scaleX: view.scale, scaleY: -view.scale };
  const vb = visibleBox(view, width, height);

  // ------------------------------------------------------------- overlay (screen coordinates)
  const overlay: ReactNode[] = [];
  if (layers.boundary) {
    for (const side of ['left', 'right', 'bottom', 'top'] as const) {
      const b = resolved.boundary[side];
      const vertical = side === 'left' || side === 'right';
      if (b.type === 'open') {
        const label = `open`;
        const pos =
          side === 'left'
            ? { x: RULER + 6, y: height / 2 }
            : side === 'right'
              ? { x: width - 40, y: height / 2 }
              : side === 'bottom'
                ? { x: width / 2 - 12, y: height - 34 }
                : { x: width / 2 - 12, y: RULER + 6 };
        overlay.push(<Text key={`bo-${side}`} {...pos} text={label} fontSize={10} fill="#8e9a9d" listening={false} />);
        continue;
      }
      if (!Number.isFinite(b.at)) continue;
      const s = vertical ? view.ox + b.at * view.scale : view.oy - b.at * view.scale;
      const pts = vertical ? [s, 0, s, height] : [0, s, width, s];
      const ground = b.type === 'ground';
      overlay.push(
        <Line key={`bl-${side}`} points={pts} stroke={ground ? '#37434a' : '#3f7398'} strokeWidth={ground ? 2.5 : 1.5} dash={ground ? undefined : [10, 4, 2, 4]} listening={false} />,
      );
      if (ground) {
        // Hatching on the outer side of the plane.
        const hatch: number[] = [];
        const outward = side === 'left' || side === 'bottom' ? -1 : 1;
        const len = vertical ? height : width;
        for (let t = 0; t < len; t += 12) {
          if (vertical) hatch.push(s, t, s + outward * 8, t + 8);
          else hatch.push(t, s, t + 8, s - outward * 8);
        }
        overlay.push(
          <KShape
            key={`bh-${side}`}
            listening={false}
            stroke="#6b777c"
            strokeWidth={1}
            sceneFunc={(ctx, shape) => {
              ctx.beginPath();
              for (let i = 0; i < hatch.length; i += 4) {
                ctx.moveTo(hatch[i]!, hatch[i + 1]!);
                ctx.lineTo(hatch[i + 2]!, hatch[i + 3]!);
              }
              ctx.strokeShape(shape);
            }}
          />,
        );
      }
      const label = `${ground ? 'ground plane' : 'mirror'} ${side} at ${formatLength(b.at, units)}`;
      overlay.push(
        <Text
          key={`bt-${side}`}
          x={vertical ? s + 6 : RULER + 8}
          y={vertical ? RULER + 8 : s - 16}
          text={label}
          fontSize={11}
          fill={ground ? '#37434a' : '#2f5e80'}
          listening={false}
        />,
      );
    }
  }

  for (const [id, sev] of marked) {
    const s = byId.get(id);
    if (!s || dragIds.has(id)) continue;
    const b = shapeBox(s);
    if (![b.minX, b.minY, b.maxX, b.maxY].every(Number.isFinite)) continue;
    const a = toScreen(view, { x: b.minX, y: b.maxY });
    const c = toScreen(view, { x: b.maxX, y: b.minY });
    const colour = sev === 'error' ? ERROR : WARNING;
    overlay.push(
      <Rect key={`mk-${id}`} x={a.x - 3} y={a.y - 3} width={c.x - a.x + 6} height={c.y - a.y + 6} stroke={colour} strokeWidth={1.5} dash={[5, 3]} listening={false} />,
      <Circle key={`mc-${id}`} x={c.x + 3} y={a.y - 3} radius={7} fill={colour} listening={false} />,
      <Text key={`mt-${id}`} x={c.x - 4} y={a.y - 9} width={14} align="center" text="!" fontStyle="bold" fontSize={11} fill="#fff" listening={false} />,
    );
  }

  const showSelection = dragIds.size === 0;
  if (showSelection) {
    for (const id of selection) {
      const s0 = byId.get(id);
      if (!s0) continue;
      const s = preview && preview.id === id ? preview : s0;
      const b = shapeBox(s);
      if (![b.minX, b.minY, b.maxX, b.maxY].every(Number.isFinite)) continue;
      const a = toScreen(view, { x: b.minX, y: b.maxY });
      const c = toScreen(view, { x: b.maxX, y: b.minY });
      overlay.push(
        <Rect key={`sel-${id}`} x={a.x - 2} y={a.y - 2} width={c.x - a.x + 4} height={c.y - a.y + 4} stroke={ACCENT} strokeWidth={1} dash={[4, 3]} listening={false} />,
      );
      if (layers.dimensions) overlay.push(...dimensionNodes(s, view, units));
    }
    if (!readOnly && selection.size === 1) {
      const s0 = byId.get([...selection][0]!);
      if (s0) {
        const s = preview && preview.id === s0.id ? preview : s0;
        for (const h of handlesFor(s)) {
          const p = toScreen(view, h);
          if (!Number.isFinite(p.x) || !Number.isFinite(p.y)) continue;
          overlay.push(
            <Rect
              key={`h-${s.id}-${h.key}`}
              x={p.x - HANDLE}
              y={p.y - HANDLE}
              width={HANDLE * 2}
              height={HANDLE * 2}
              fill="#fff"
              stroke={ACCENT}
              strokeWidth={1.5}
              listening={false}
            />,
          );
        }
      }
    }
  }
  if (preview && preview.id === '__preview') {
    overlay.push(...previewNodes(preview, view));
    if (layers.dimensions) overlay.push(...dimensionNodes(preview, view, units));
  }
  if (polyPts.length > 0) {
    const pts = [...polyPts, ...(hover ? [hover] : [])].flatMap((p) => {
      const s = toScreen(view, p);
      return [s.x, s.y];
    });
    overlay.push(<Line key="poly" points={pts} stroke={ACCENT} strokeWidth={1.5} dash={[6, 3]} listening={false} />);
    polyPts.forEach((p, i) => {
      const s = toScreen(view, p);
      overlay.push(<Rect key={`pp-${i}`} x={s.x - 3} y={s.y - 3} width={6} height={6} fill={i === 0 ? ACCENT : '#fff'} stroke={ACCENT} listening={false} />);
    });
    for (const g of cursorGuides) {
      const sx = view.ox + g.value * view.scale;
      const sy = view.oy - g.value * view.scale;
      overlay.push(
        <Line key={`cg-${g.axis}`} points={g.axis === 'x' ? [sx, 0, sx, height] : [0, sy, width, sy]} stroke={GUIDE} strokeWidth={1} dash={[3, 3]} listening={false} />,
      );
    }
  }

  const cursor = tool === 'pan' ? 'grab' : tool === 'select' ? 'default' : 'crosshair';

  return (
    <Stage
      ref={stageRef}
      width={width}
      height={height}
      onPointerDown={stableDown}
      onPointerMove={stableMove}
      onPointerUp={stableUp}
      onDblClick={stableDouble}
      onWheel={onWheel}
      onTouchMove={onTouchMove}
      onTouchEnd={() => {
        pinch.current = null;
      }}
      style={{ cursor, touchAction: 'none' }}
    >
      <Layer listening={false}>
        <KShape
          listening={false}
          sceneFunc={(ctx) => {
            ctx.fillStyle = '#fbfcfb';
            ctx.fillRect(0, 0, width, height);
            if (!gridVisible) return;
            const drawLines = (step: number, colour: string) => {
              ctx.beginPath();
              for (let x = Math.ceil(vb.minX / step) * step; x <= vb.maxX; x += step) {
                const sx = Math.round(view.ox + x * view.scale) + 0.5;
                ctx.moveTo(sx, 0);
                ctx.lineTo(sx, height);
              }
              for (let y = Math.ceil(vb.minY / step) * step; y <= vb.maxY; y += step) {
                const sy = Math.round(view.oy - y * view.scale) + 0.5;
                ctx.moveTo(0, sy);
                ctx.lineTo(width, sy);
              }
              ctx.strokeStyle = colour;
              ctx.lineWidth = 1;
              ctx.stroke();
            };
            drawLines(steps.minor, '#eef1f0');
            drawLines(steps.major, '#dde3e2');
            // Axes through the origin.
            ctx.beginPath();
            const x0 = Math.round(view.ox) + 0.5;
            const y0 = Math.round(view.oy) + 0.5;
            ctx.moveTo(x0, 0);
            ctx.lineTo(x0, height);
            ctx.moveTo(0, y0);
            ctx.lineTo(width, y0);
            ctx.strokeStyle = '#c4cccc';
            ctx.stroke();
          }}
        />
      </Layer>
      <Layer listening={false}>
        <Group {...worldProps}>{staticShapes.diel}</Group>
        {worldLayer ? <Group {...worldProps}>{worldLayer}</Group> : null}
        <Group {...worldProps}>{staticShapes.cond}</Group>
      </Layer>
      <Layer ref={dragLayerRef} listening={false}>
        <Group ref={dragGroupRef}>
          <Group {...worldProps}>
            {dragShapes}
            {preview && preview.id !== '__preview' ? (
              <ShapeNode s={preview} fill={colorsFor(preview, netColors, materialEps).fill} stroke={ACCENT} strong />
            ) : null}
          </Group>
        </Group>
      </Layer>
      <Layer listening={false}>
        {overlay}
        <Rulers view={view} width={width} height={height} units={units} minor={steps.minor} major={steps.major} />
      </Layer>
      <Layer ref={guideLayerRef} listening={false}>
        <Line ref={guideXRef} points={[0, 0, 0, 0]} stroke={GUIDE} strokeWidth={1} dash={[4, 3]} visible={false} />
        <Line ref={guideYRef} points={[0, 0, 0, 0]} stroke={GUIDE} strokeWidth={1} dash={[4, 3]} visible={false} />
        <Rect ref={boxRef} stroke={GUIDE} strokeWidth={1} dash={[3, 3]} fill="rgba(47,94,128,0.07)" visible={false} />
      </Layer>
    </Stage>
  );
}

function previewNodes(s: ResolvedShape, view: View): ReactNode[] {
  const b = shapeBox(s);
  const a = toScreen(view, { x: b.minX, y: b.maxY });
  const c = toScreen(view, { x: b.maxX, y: b.minY });
  const common = { stroke: ACCENT, strokeWidth: 1.5, dash: [6, 3] as number[], listening: false };
  switch (s.type) {
    case 'rect':
      return [<Rect key="pv" x={a.x} y={a.y} width={c.x - a.x} height={c.y - a.y} fill="rgba(164,79,25,0.08)" {...common} />];
    case 'circle':
    case 'ring': {
      const cc = toScreen(view, { x: s.cx, y: s.cy });
      const out = [<Circle key="pv" x={cc.x} y={cc.y} radius={(s.type === 'circle' ? s.r : s.rOuter) * view.scale} {...common} />];
      if (s.type === 'ring') out.push(<Circle key="pv2" x={cc.x} y={cc.y} radius={s.rInner * view.scale} {...common} />);
      return out;
    }
    case 'strip': {
      const p = toScreen(view, { x: s.x1, y: s.y1 });
      const q = toScreen(view, { x: s.x2, y: s.y2 });
      return [<Line key="pv" points={[p.x, p.y, q.x, q.y]} {...common} strokeWidth={3} />];
    }
    default:
      return [];
  }
}

/** Dimension annotations (width, height, radius, length) for one shape, in screen space. */
function dimensionNodes(s: ResolvedShape, view: View, units: Units): ReactNode[] {
  const out: ReactNode[] = [];
  const b = shapeBox(s);
  if (![b.minX, b.minY, b.maxX, b.maxY].every(Number.isFinite)) return out;
  const a = toScreen(view, { x: b.minX, y: b.maxY });
  const c = toScreen(view, { x: b.maxX, y: b.minY });
  const colour = '#37434a';
  const label = (key: string, x: number, y: number, text: string, rotate = 0) =>
    out.push(
      <Group key={`${s.id}-${key}-t`} x={x} y={y} rotation={rotate} listening={false}>
        <Rect x={-text.length * 3.1 - 4} y={-8} width={text.length * 6.2 + 8} height={16} fill="rgba(255,255,255,0.92)" cornerRadius={3} />
        <Text x={-text.length * 3.1} y={-6} text={text} fontSize={11} fontFamily="ui-monospace, monospace" fill={colour} />
      </Group>,
    );
  const horizontal = (key: string, y: number, x1: number, x2: number, value: number) => {
    out.push(<Line key={`${s.id}-${key}`} points={[x1, y, x2, y]} stroke={colour} strokeWidth={1} listening={false} />);
    out.push(<Line key={`${s.id}-${key}-e1`} points={[x1, y - 4, x1, y + 4]} stroke={colour} strokeWidth={1} listening={false} />);
    out.push(<Line key={`${s.id}-${key}-e2`} points={[x2, y - 4, x2, y + 4]} stroke={colour} strokeWidth={1} listening={false} />);
    if (x2 - x1 > 8) label(key, (x1 + x2) / 2, y, formatLength(value, units));
  };
  const vertical = (key: string, x: number, y1: number, y2: number, value: number) => {
    out.push(<Line key={`${s.id}-${key}`} points={[x, y1, x, y2]} stroke={colour} strokeWidth={1} listening={false} />);
    out.push(<Line key={`${s.id}-${key}-e1`} points={[x - 4, y1, x + 4, y1]} stroke={colour} strokeWidth={1} listening={false} />);
    out.push(<Line key={`${s.id}-${key}-e2`} points={[x - 4, y2, x + 4, y2]} stroke={colour} strokeWidth={1} listening={false} />);
    if (y2 - y1 > 8) label(key, x, (y1 + y2) / 2, formatLength(value, units), -90);
  };
  switch (s.type) {
    case 'rect':
    case 'polygon':
      horizontal('w', c.y + 14, a.x, c.x, b.maxX - b.minX);
      vertical('h', c.x + 14, a.y, c.y, b.maxY - b.minY);
      break;
    case 'strip':
      if (s.y1 === s.y2) horizontal('w', c.y + 14, a.x, c.x, b.maxX - b.minX);
      else vertical('h', c.x + 14, a.y, c.y, b.maxY - b.minY);
      break;
    case 'circle':
    case 'ring': {
      const cc = toScreen(view, { x: s.cx, y: s.cy });
      const r = s.type === 'circle' ? s.r : s.rOuter;
      out.push(<Line key={`${s.id}-r`} points={[cc.x, cc.y, cc.x + r * view.scale, cc.y]} stroke={colour} strokeWidth={1} listening={false} />);
      label('r', cc.x + (r * view.scale) / 2, cc.y - 10, `r ${formatLength(r, units)}`);
      if (s.type === 'ring') {
        out.push(<Line key={`${s.id}-ri`} points={[cc.x, cc.y, cc.x, cc.y - s.rInner * view.scale]} stroke={colour} strokeWidth={1} listening={false} />);
        label('ri', cc.x + 4, cc.y - (s.rInner * view.scale) / 2, `ri ${formatLength(s.rInner, units)}`, -90);
      }
      break;
    }
  }
  return out;
}

interface RulersProps {
  view: View;
  width: number;
  height: number;
  units: Units;
  minor: number;
  major: number;
}

/** Rulers along the top and left edges, labelled in section units, and a scale bar. */
const Rulers = memo(function Rulers({ view, width, height, units, minor, major }: RulersProps) {
  const vb = visibleBox(view, width, height);
  const bar = scaleBar(view);
  const labelStep = major * view.scale < 70 ? major * 2 : major;
  const fmt = (v: number) => formatLength(Math.abs(v) < labelStep * 1e-9 ? 0 : v);
  return (
    <>
      <KShape
        listening={false}
        sceneFunc={(ctx) => {
          ctx.fillStyle = 'rgba(245,247,246,0.96)';
          ctx.fillRect(0, 0, width, RULER);
          ctx.fillRect(0, 0, RULER, height);
          ctx.strokeStyle = '#b9c2c3';
          ctx.lineWidth = 1;
          ctx.beginPath();
          ctx.moveTo(0, RULER + 0.5);
          ctx.lineTo(width, RULER + 0.5);
          ctx.moveTo(RULER + 0.5, 0);
          ctx.lineTo(RULER + 0.5, height);
          for (let x = Math.ceil(vb.minX / minor) * minor; x <= vb.maxX; x += minor) {
            const sx = Math.round(view.ox + x * view.scale) + 0.5;
            if (sx < RULER) continue;
            const isMajor = Math.abs(x / major - Math.round(x / major)) < 1e-6;
            ctx.moveTo(sx, RULER);
            ctx.lineTo(sx, RULER - (isMajor ? 9 : 4));
          }
          for (let y = Math.ceil(vb.minY / minor) * minor; y <= vb.maxY; y += minor) {
            const sy = Math.round(view.oy - y * view.scale) + 0.5;
            if (sy < RULER) continue;
            const isMajor = Math.abs(y / major - Math.round(y / major)) < 1e-6;
            ctx.moveTo(RULER, sy);
            ctx.lineTo(RULER - (isMajor ? 9 : 4), sy);
          }
          ctx.stroke();
          ctx.fillStyle = '#4e5b61';
          ctx.font = '10px ui-monospace, monospace';
          ctx.textBaseline = 'top';
          for (let x = Math.ceil(vb.minX / labelStep) * labelStep; x <= vb.maxX; x += labelStep) {
            const sx = view.ox + x * view.scale;
            if (sx < RULER + 4) continue;
            ctx.fillText(fmt(x), sx + 2, 2);
          }
          for (let y = Math.ceil(vb.minY / labelStep) * labelStep; y <= vb.maxY; y += labelStep) {
            const sy = view.oy - y * view.scale;
            if (sy < RULER + 4) continue;
            ctx.save();
            ctx.translate(2, sy - 2);
            ctx.rotate(-Math.PI / 2);
            ctx.fillText(fmt(y), 0, 0);
            ctx.restore();
          }
          ctx.fillStyle = '#37434a';
          ctx.font = '600 10px ui-sans-serif, system-ui, sans-serif';
          ctx.fillText(UNIT_LABELS[units], 3, 6);
          // Scale bar, bottom left.
          const x0 = RULER + 14;
          const y0 = height - 16;
          ctx.fillStyle = 'rgba(255,255,255,0.85)';
          ctx.fillRect(x0 - 6, y0 - 18, bar.px + 12, 26);
          ctx.strokeStyle = '#222d34';
          ctx.lineWidth = 2;
          ctx.beginPath();
          ctx.moveTo(x0, y0 - 4);
          ctx.lineTo(x0, y0);
          ctx.lineTo(x0 + bar.px, y0);
          ctx.lineTo(x0 + bar.px, y0 - 4);
          ctx.stroke();
          ctx.fillStyle = '#222d34';
          ctx.font = '11px ui-monospace, monospace';
          ctx.fillText(formatLength(bar.length, units), x0, y0 - 15);
        }}
      />
    </>
  );
});

import { describe, expect, it } from 'vitest';
import type { ResolvedShape } from '@/lib/section/schema';
import { buildSnapTargets, snapMove, snapPoint, snapToGrid } from '@/lib/editor/snap';
import { fitView, gridSteps, niceStep, toScreen, toWorld, zoomAt } from '@/lib/editor/view';
import { hitTest, shapeBox, shapesInBox } from '@/lib/editor/geometry';
import { dragHandle, geometryFromDrag, handlesFor } from '@/lib/editor/handles';

const A: ResolvedShape = { id: 'a', type: 'rect', conductor: 'n', x: 0, y: 0, width: 10, height: 2 };
const B: ResolvedShape = { id: 'b', type: 'circle', conductor: 'n', cx: 20, cy: 5, r: 1 };
const D: ResolvedShape = { id: 'd', type: 'rect', dielectric: 'm', x: -50, y: -50, width: 100, height: 100 };

describe('snapping (common practice, no published source)', () => {
  it('snaps a point to corners and centres before the grid, and says what it snapped to', () => {
    const t = buildSnapTargets([A, B]);
    const r = snapPoint({ x: 10.2, y: 1.9 }, t, { tol: 0.5, grid: 1 });
    expect(r.point).toEqual({ x: 10, y: 2 });
    expect(r.guides.map((g) => g.kind)).toEqual(['corner', 'corner']);
    const c = snapPoint({ x: 20.1, y: 7.3 }, t, { tol: 0.5, grid: 1 });
    expect(c.point.x).toBe(20);
    expect(c.point.y).toBe(7); // no target near y = 7.3: grid
    expect(c.guides.map((g) => g.axis)).toEqual(['x']);
  });

  it('falls back to the grid and can be switched off', () => {
    const t = buildSnapTargets([A]);
    expect(snapPoint({ x: 33.3, y: -4.6 }, t, { tol: 0.5, grid: 0.5 }).point).toEqual({ x: 33.5, y: -4.5 });
    expect(snapPoint({ x: 10.2, y: 1.9 }, t, { tol: 0.5, objects: false }).point).toEqual({ x: 10.2, y: 1.9 });
    expect(snapToGrid(0.30000000000000004, 0.1)).toBe(0.3);
  });

  it('snaps a moving box by its edges or centre to other shapes', () => {
    const t = buildSnapTargets([B], new Set(['a']));
    // Moving A right by 9.3: its right edge (19.3) snaps to the circle's left edge (19) ... or centre 20.
    const m = snapMove(shapeBox(A), 9.3, 0, t, { tol: 0.5 });
    expect(m.dx).toBeCloseTo(9, 12);
    expect(m.guides[0]).toMatchObject({ axis: 'x', value: 19 });
    // Box centre 5 + 14.8 = 19.8 → circle centre 20.
    expect(snapMove(shapeBox(A), 14.8, 0, t, { tol: 0.5 }).dx).toBeCloseTo(15, 12);
  });

  it('includes boundary planes as targets', () => {
    const t = buildSnapTargets([], new Set(), {
      left: { type: 'open' },
      right: { type: 'open' },
      bottom: { type: 'ground', at: -3 },
      top: { type: 'open' },
    });
    const r = snapPoint({ x: 0, y: -2.8 }, t, { tol: 0.5 });
    expect(r.point.y).toBe(-3);
    expect(r.guides[0]!.kind).toBe('boundary');
  });
});

describe('view transform (common practice, no published source)', () => {
  it('round-trips world and screen with y up', () => {
    const v = { scale: 20, ox: 100, oy: 300 };
    expect(toScreen(v, { x: 1, y: 2 })).toEqual({ x: 120, y: 260 });
    expect(toWorld(v, toScreen(v, { x: -3.5, y: 7.25 }))).toEqual({ x: -3.5, y: 7.25 });
  });
  it('zooms about a fixed screen point', () => {
    const v = { scale: 10, ox: 0, oy: 0 };
    const at = { x: 50, y: 80 };
    const before = toWorld(v, at);
    const z = zoomAt(v, 3, at);
    expect(z.scale).toBe(30);
    const after = toWorld(z, at);
    expect(after.x).toBeCloseTo(before.x, 12);
    expect(after.y).toBeCloseTo(before.y, 12);
  });
  it('fits a box centred in the viewport', () => {
    const v = fitView({ minX: 0, minY: 0, maxX: 10, maxY: 5 }, 400, 300, 0);
    expect(v.scale).toBe(40);
    expect(toScreen(v, { x: 5, y: 2.5 })).toEqual({ x: 200, y: 150 });
  });
  it('picks nice 1-2-5 steps and a grid that adapts to the zoom', () => {
    expect(niceStep(0.013)).toBeCloseTo(0.02, 15);
    expect(niceStep(3)).toBe(5);
    expect(niceStep(7)).toBe(10);
    expect(gridSteps({ scale: 100, ox: 0, oy: 0 }).minor).toBeCloseTo(0.2, 15);
    expect(gridSteps({ scale: 1000, ox: 0, oy: 0 }).minor).toBeCloseTo(0.02, 15);
  });
});

describe('hit-testing and handles (common practice, no published source)', () => {
  it('picks conductors above dielectrics and later shapes above earlier ones', () => {
    expect(hitTest([A, D], { x: 1, y: 1 }, 0)).toBe(0);
    expect(hitTest([D, A], { x: 1, y: 1 }, 0)).toBe(1);
    expect(hitTest([A, D], { x: 30, y: 30 }, 0)).toBe(1);
    expect(hitTest([A], { x: 30, y: 30 }, 0)).toBe(-1);
    expect(hitTest([A, D], { x: 1, y: 1 }, 0, { conductors: true })).toBe(1);
    expect(shapesInBox([A, B, D], { minX: -1, minY: -1, maxX: 30, maxY: 10 })).toEqual(['a', 'b']);
  });
  it('thin strips are hit within the tolerance', () => {
    const s: ResolvedShape = { id: 's', type: 'strip', conductor: 'n', x1: 0, y1: 0, x2: 4, y2: 0 };
    expect(hitTest([s], { x: 2, y: 0.05 }, 0.1)).toBe(0);
    expect(hitTest([s], { x: 2, y: 0.5 }, 0.1)).toBe(-1);
  });
  it('resizes a rectangle from a corner and reshapes a strip along its axis', () => {
    const h = handlesFor(A).find((x) => x.key === 'ne')!;
    expect(h).toMatchObject({ x: 10, y: 2 });
    expect(dragHandle(A, 'ne', { x: 12, y: 3 })).toEqual({ x: 0, y: 0, width: 12, height: 3 });
    // Dragging the west handle past the east edge flips, never a negative width.
    expect(dragHandle(A, 'w', { x: 14, y: 1 })).toEqual({ x: 10, y: 0, width: 4, height: 2 });
    const s: ResolvedShape = { id: 's', type: 'strip', conductor: 'n', x1: 0, y1: 0, x2: 4, y2: 0 };
    expect(dragHandle(s, 'b', { x: 6, y: 1 })).toEqual({ x2: 6, y2: 0 });
  });
  it('makes geometry from drawing drags, refusing accidental clicks', () => {
    expect(geometryFromDrag('rect', { x: 2, y: 3 }, { x: 0, y: 0 }, 0.1)).toEqual({ x: 0, y: 0, width: 2, height: 3 });
    expect(geometryFromDrag('rect', { x: 0, y: 0 }, { x: 0.01, y: 2 }, 0.1)).toBeNull();
    expect(geometryFromDrag('strip', { x: 0, y: 1 }, { x: 5, y: 1.4 }, 0.1)).toEqual({ x1: 0, y1: 1, x2: 5, y2: 1 });
    expect(geometryFromDrag('circle', { x: 0, y: 0 }, { x: 3, y: 4 }, 0.1)).toEqual({ cx: 0, cy: 0, r: 5 });
  });
});

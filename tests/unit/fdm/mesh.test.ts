import { describe, expect, it } from 'vitest';
import { buildMesh, FAMILY_STEP, MESH_PRESET_PARAMS, subsampleAxis } from '../../../lib/fdm/mesh';
import type { Geometry } from '../../../lib/fdm/types';

const has = (a: Float64Array, v: number) => Array.from(a).some((x) => Math.abs(x - v) < 1e-12);

describe('graded mesh', () => {
  const conductors: Geometry[] = [
    { type: 'rect', x: -0.5, y: 0.1, width: 1, height: 0.05 },
    { type: 'circle', cx: 0.2, cy: -0.3, r: 0.1 },
    { type: 'strip', x1: -0.4, y1: -0.45, x2: 0.1, y2: -0.45 },
  ];
  const dielectrics: Geometry[] = [{ type: 'rect', x: -3, y: -0.5, width: 6, height: 0.6 }];
  const p = MESH_PRESET_PARAMS.standard;
  const { xs, ys } = buildMesh(
    { conductors, dielectrics, limits: { bottom: -0.5 }, structure: { x0: -0.5, y0: -0.5, x1: 0.5, y1: 0.15 } },
    p,
  );

  it('puts every edge, strip, circle extreme and centre, interface and plane on a mesh line', () => {
    for (const x of [-0.5, 0.5, 0.1, 0.2, 0.3, -0.4, -3, 3]) expect(has(xs, x)).toBe(true);
    for (const y of [0.1, 0.15, -0.2, -0.3, -0.4, -0.45, -0.5]) expect(has(ys, y)).toBe(true);
    expect(ys[0]).toBe(-0.5); // the ground plane ends the domain
  });

  it('is strictly increasing', () => {
    for (const a of [xs, ys]) for (let i = 1; i < a.length; i++) expect(a[i]).toBeGreaterThan(a[i - 1]);
  });

  it('carries open sides at least `extent` structure sizes beyond the shapes', () => {
    expect(xs[0]).toBeLessThanOrEqual(-3 - p.extent * 1);
    expect(xs[xs.length - 1]).toBeGreaterThanOrEqual(3 + p.extent * 1);
    expect(ys[ys.length - 1]).toBeGreaterThanOrEqual(0.15 + p.extent);
  });

  it('is fine at corners and strip edges, relative to the local feature size', () => {
    const near = (a: Float64Array, v: number) => {
      const i = Array.from(a).findIndex((x) => Math.abs(x - v) < 1e-12);
      return Math.min(i > 0 ? a[i] - a[i - 1] : Infinity, i < a.length - 1 ? a[i + 1] - a[i] : Infinity);
    };
    // rect corner at y = 0.1 on a trace 0.05 thick: spacing ≤ thickness / mGap
    expect(near(ys, 0.1)).toBeLessThanOrEqual((0.05 / p.mGap) * 1.1); // placement rounds within ~10%
    expect(near(xs, -0.4)).toBeLessThanOrEqual(p.hSing * 1.1);
  });

  it('grows smoothly: neighbouring spacings differ by at most the far growth ratio (plus rounding)', () => {
    for (const a of [xs, ys]) {
      for (let i = 2; i < a.length; i++) {
        const r = (a[i] - a[i - 1]) / (a[i - 1] - a[i - 2]);
        expect(Math.max(r, 1 / r)).toBeLessThan(p.growthFar * 1.35);
      }
    }
  });

  it('nests the family: every 4th node of the finest is the coarsest member and keeps the key lines', () => {
    expect((xs.length - 1) % FAMILY_STEP).toBe(0);
    expect((ys.length - 1) % FAMILY_STEP).toBe(0);
    const cx = subsampleAxis(xs, FAMILY_STEP);
    const cy = subsampleAxis(ys, FAMILY_STEP);
    for (const x of [-0.5, 0.5, 0.1, 0.2, 0.3, -0.4]) expect(has(cx, x)).toBe(true);
    for (const y of [0.1, 0.15, -0.2, -0.3, -0.4, -0.45]) expect(has(cy, y)).toBe(true);
    expect(cx[cx.length - 1]).toBe(xs[xs.length - 1]);
  });
});

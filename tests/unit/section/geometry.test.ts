/**
 * The exact region distance of lib/section/geometry.ts against brute force: boundaries
 * sampled densely, containment tested point by point (a plain sampling argument, common
 * practice, no published source). For disjoint shapes the sampled boundary distance is an
 * upper bound that approaches the exact one within the sampling step; for overlapping or
 * touching shapes some sample lies inside the other shape or on its boundary.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { regionDistance, shapeRegion, polygonSelfIntersection } from '@/lib/section/geometry';
import type { ResolvedShape } from '@/lib/section/schema';

const num = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });

const shapeArb: fc.Arbitrary<ResolvedShape> = fc.oneof(
  fc.record({ x: num(-2, 2), y: num(-2, 2), w: num(0.1, 2), h: num(0.1, 2) }).map(({ x, y, w, h }) => ({ id: 'r', type: 'rect' as const, x, y, width: w, height: h, conductor: 'a' })),
  fc.record({ cx: num(-2, 2), cy: num(-2, 2), r: num(0.05, 1.5) }).map(({ cx, cy, r }) => ({ id: 'c', type: 'circle' as const, cx, cy, r, conductor: 'a' })),
  fc.record({ cx: num(-2, 2), cy: num(-2, 2), ro: num(0.3, 1.5), f: num(0.2, 0.9) }).map(({ cx, cy, ro, f }) => ({ id: 'g', type: 'ring' as const, cx, cy, rInner: ro * f, rOuter: ro, conductor: 'a' })),
  fc.record({ x: num(-2, 2), y: num(-2, 2), l: num(0.1, 2), v: fc.boolean() }).map(({ x, y, l, v }) => ({ id: 's', type: 'strip' as const, x1: x, y1: y, x2: v ? x : x + l, y2: v ? y + l : y, conductor: 'a' })),
  // Triangles with a minimum size, either orientation.
  fc.record({ x: num(-2, 2), y: num(-2, 2), a: num(0.2, 1.5), b: num(0.2, 1.5), c: num(-1, 1), flip: fc.boolean() }).map(({ x, y, a, b, c, flip }) => ({
    id: 'p',
    type: 'polygon' as const,
    points: (flip ? [[x, y], [x + c, y + b], [x + a, y]] : [[x, y], [x + a, y], [x + c, y + b]]) as [number, number][],
    conductor: 'a',
  })),
);

/** Points along a shape's boundary, at most `step` apart. */
function boundarySamples(s: ResolvedShape, step: number): [number, number][] {
  const out: [number, number][] = [];
  const seg = (ax: number, ay: number, bx: number, by: number) => {
    const n = Math.max(1, Math.ceil(Math.hypot(bx - ax, by - ay) / step));
    for (let i = 0; i <= n; i++) out.push([ax + ((bx - ax) * i) / n, ay + ((by - ay) * i) / n]);
  };
  const circ = (cx: number, cy: number, r: number) => {
    const n = Math.max(16, Math.ceil((2 * Math.PI * r) / step));
    for (let i = 0; i < n; i++) out.push([cx + r * Math.cos((2 * Math.PI * i) / n), cy + r * Math.sin((2 * Math.PI * i) / n)]);
  };
  switch (s.type) {
    case 'rect':
      seg(s.x, s.y, s.x + s.width, s.y);
      seg(s.x + s.width, s.y, s.x + s.width, s.y + s.height);
      seg(s.x + s.width, s.y + s.height, s.x, s.y + s.height);
      seg(s.x, s.y + s.height, s.x, s.y);
      break;
    case 'circle':
      circ(s.cx, s.cy, s.r);
      break;
    case 'ring':
      circ(s.cx, s.cy, s.rOuter);
      circ(s.cx, s.cy, s.rInner);
      break;
    case 'strip':
      seg(s.x1, s.y1, s.x2, s.y2);
      break;
    case 'polygon':
      s.points.forEach((p, i) => {
        const q = s.points[(i + 1) % s.points.length]!;
        seg(p[0], p[1], q[0], q[1]);
      });
      break;
  }
  return out;
}

describe('regionDistance against brute-force sampling', () => {
  it('agrees on random pairs of every shape type', () => {
    const step = 0.02;
    fc.assert(
      fc.property(shapeArb, shapeArb, (a, b) => {
        const ra = shapeRegion(a),
          rb = shapeRegion(b);
        const d = regionDistance(ra, rb);
        expect(regionDistance(rb, ra)).toBeCloseTo(d, 12);
        const sa = boundarySamples(a, step),
          sb = boundarySamples(b, step);
        const inside = sa.some(([x, y]) => rb.contains(x, y)) || sb.some(([x, y]) => ra.contains(x, y));
        let sampled = Infinity;
        for (const p of sa) for (const q of sb) sampled = Math.min(sampled, Math.hypot(p[0] - q[0], p[1] - q[1]));
        if (d > 1e-9) {
          // Disjoint: no sample inside the other; the sampled distance bounds d from above.
          expect(inside).toBe(false);
          expect(sampled).toBeGreaterThanOrEqual(d - 1e-12);
          expect(sampled).toBeLessThanOrEqual(d + 2 * step);
        } else {
          expect(inside || sampled <= 2 * step).toBe(true);
        }
      }),
      { numRuns: 250, seed: 7 },
    );
  });
});

describe('polygonSelfIntersection', () => {
  it('finds crossings, touching vertices and fold-backs, and passes simple polygons', () => {
    expect(polygonSelfIntersection([[0, 0], [2, 0], [2, 2], [1, -1]], 1e-9)).not.toBeNull();
    expect(polygonSelfIntersection([[0, 0], [4, 0], [4, 4], [2, 0.0], [0, 4]], 1e-9)).not.toBeNull(); // vertex on an edge
    expect(polygonSelfIntersection([[0, 0], [2, 0], [1, 0], [1, 1]], 1e-9)).not.toBeNull(); // folds back
    expect(polygonSelfIntersection([[0, 0], [4, 0], [4, 4], [2, 1], [0, 4]], 1e-9)).toBeNull(); // concave, simple
    const star = Array.from({ length: 10 }, (_, i) => {
      const r = i % 2 ? 0.4 : 1;
      return [r * Math.cos((Math.PI * i) / 5), r * Math.sin((Math.PI * i) / 5)] as [number, number];
    });
    expect(polygonSelfIntersection(star, 1e-9)).toBeNull();
    const pentagram = Array.from({ length: 5 }, (_, i) => [Math.cos((4 * Math.PI * i) / 5), Math.sin((4 * Math.PI * i) / 5)] as [number, number]);
    expect(polygonSelfIntersection(pentagram, 1e-9)).not.toBeNull();
  });
});

import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { checkSection } from '@/lib/section/check';
import { parseSectionFile } from '@/lib/section/parse';
import { resolved, twoNets } from './helpers';
import { SHARED_SAMPLES } from '../../support/shared';

// The geometric predicates are checked against configurations whose answer follows from
// elementary plane geometry (common practice, no published source).

type Shape = Record<string, unknown>;

/** Shape of each type whose rightmost point is (X, 0.5). */
const rightAt: Record<string, (X: number) => Shape> = {
  rect: (X) => ({ type: 'rect', x: X - 1, y: 0, width: 1, height: 1 }),
  circle: (X) => ({ type: 'circle', cx: X - 0.5, cy: 0.5, r: 0.5 }),
  ring: (X) => ({ type: 'ring', cx: X - 0.5, cy: 0.5, rInner: 0.25, rOuter: 0.5 }),
  polygon: (X) => ({ type: 'polygon', points: [[X - 1, 0], [X, 0.5], [X - 1, 1]] }),
  strip: (X) => ({ type: 'strip', x1: X - 1, y1: 0.5, x2: X, y2: 0.5 }),
};
/** Shape of each type whose leftmost point is (X, 0.5). */
const leftAt: Record<string, (X: number) => Shape> = {
  rect: (X) => ({ type: 'rect', x: X, y: 0, width: 1, height: 1 }),
  circle: (X) => ({ type: 'circle', cx: X + 0.5, cy: 0.5, r: 0.5 }),
  ring: (X) => ({ type: 'ring', cx: X + 0.5, cy: 0.5, rInner: 0.25, rOuter: 0.5 }),
  polygon: (X) => ({ type: 'polygon', points: [[X, 0.5], [X + 1, 0], [X + 1, 1]] }),
  strip: (X) => ({ type: 'strip', x1: X, y1: 0.5, x2: X + 1, y2: 0.5 }),
};
const TYPES = Object.keys(rightAt);

function pair(a: Shape, b: Shape, netB = 'g') {
  return resolved({
    nets: twoNets,
    shapes: [
      { id: 'A', conductor: 'a', ...a },
      { id: 'B', conductor: netB, ...b },
    ],
  });
}
const errors = (s: ReturnType<typeof resolved>) => checkSection(s).filter((i) => i.severity === 'error');
const codes = (s: ReturnType<typeof resolved>) => errors(s).map((i) => i.code);

describe('short circuits: exact predicates for every pair of shape types', () => {
  for (const ta of TYPES) {
    for (const tb of TYPES) {
      it(`${ta} and ${tb}: touching and overlapping are shorts, a small gap is not`, () => {
        for (const x of [1, 0.9]) {
          const s = pair(rightAt[ta]!(1), leftAt[tb]!(x));
          const short = errors(s).find((i) => i.code === 'short-circuit');
          expect(short, `${ta}/${tb} at ${x}`).toBeDefined();
          expect(short!.shapeIds).toEqual(['A', 'B']);
          expect(short!.message).toContain('"A"');
          expect(short!.message).toContain('"B"');
          expect(short!.message).toContain('nets "a" and "g"');
        }
        // 1e-3 of a 2-unit section is far above the 1e-9 relative tolerance.
        expect(codes(pair(rightAt[ta]!(1), leftAt[tb]!(1.001)))).toEqual([]);
        // Same net: touching and overlapping are fine.
        expect(codes(pair(rightAt[ta]!(1), leftAt[tb]!(0.9), 'a')).filter((c) => c === 'short-circuit')).toEqual([]);
      });
    }
  }

  it('two touching rects of different nets are a short; of the same net they are fine', () => {
    const shapes = (netB: string) => [
      { id: 'left', type: 'rect', x: 0, y: 0, width: 1, height: 1, conductor: 'a' },
      { id: 'right', type: 'rect', x: 1, y: 0.5, width: 1, height: 1, conductor: netB },
    ];
    const bad = errors(resolved({ nets: twoNets, shapes: shapes('g') }));
    expect(bad).toHaveLength(1);
    expect(bad[0]!.message).toBe(
      'conductor "left" (net "a") touches or overlaps conductor "right" (net "g"): a short circuit between nets "a" and "g"',
    );
    expect(errors(resolved({ nets: [...twoNets, { name: 'g2', role: 'ground' }], shapes: [...shapes('a'), { id: 'x', type: 'circle', cx: 5, cy: 5, r: 1, conductor: 'g' }] }))).toEqual([]);
  });

  it('rects touching only at a corner are a short', () => {
    const s = resolved({ nets: twoNets, shapes: [
      { id: 'p', type: 'rect', x: 0, y: 0, width: 1, height: 1, conductor: 'a' },
      { id: 'q', type: 'rect', x: 1, y: 1, width: 1, height: 1, conductor: 'g' },
    ] });
    expect(codes(s)).toEqual(['short-circuit']);
  });

  it('a circle inside the ring gap, not touching, is fine (a coax)', () => {
    const s = resolved({ nets: twoNets, shapes: [
      { id: 'core', type: 'circle', cx: 0, cy: 0, r: 0.5, conductor: 'a' },
      { id: 'shield', type: 'ring', cx: 0.2, cy: 0, rInner: 1, rOuter: 1.2, conductor: 'g' },
    ] });
    expect(checkSection(s)).toEqual([]);
  });

  it('a circle inside the ring gap touching the inner wall is a short', () => {
    const s = resolved({ nets: twoNets, shapes: [
      { id: 'core', type: 'circle', cx: 0.5, cy: 0, r: 0.5, conductor: 'a' },
      { id: 'shield', type: 'ring', cx: 0, cy: 0, rInner: 1, rOuter: 1.2, conductor: 'g' },
    ] });
    expect(codes(s)).toEqual(['short-circuit']);
  });

  it('a conductor wholly inside another net\'s conductor is a short, and the net is warned about', () => {
    const s = resolved({ nets: twoNets, shapes: [
      { id: 'block', type: 'rect', x: -2, y: -2, width: 4, height: 4, conductor: 'g' },
      { id: 'wire', type: 'circle', cx: 0, cy: 0, r: 0.5, conductor: 'a' },
    ] });
    const issues = checkSection(s);
    expect(issues.map((i) => i.code)).toEqual(['short-circuit', 'net-inside-conductor']);
    expect(issues[1]!.message).toBe('signal net "a" lies entirely inside conductor "block" of net "g"; it is shorted to that net');
  });

  it('a strip inside a rect of another net is a short; inside a ring hole it is fine', () => {
    expect(codes(resolved({ nets: twoNets, shapes: [
      { id: 'r', type: 'rect', x: 0, y: 0, width: 4, height: 4, conductor: 'g' },
      { id: 's', type: 'strip', x1: 1, y1: 2, x2: 3, y2: 2, conductor: 'a' },
    ] }))).toEqual(['short-circuit']);
    expect(codes(resolved({ nets: twoNets, shapes: [
      { id: 'r', type: 'ring', cx: 0, cy: 0, rInner: 3, rOuter: 4, conductor: 'g' },
      { id: 's', type: 'strip', x1: -1, y1: 0, x2: 1, y2: 0, conductor: 'a' },
    ] }))).toEqual([]);
  });

  it('a concave polygon: a circle in its notch, not touching, is fine', () => {
    // U shape: outer [0,3]x[0,3] with a notch [1,2]x[1,3].
    const u = { id: 'u', type: 'polygon', points: [[0, 0], [3, 0], [3, 3], [2, 3], [2, 1], [1, 1], [1, 3], [0, 3]], conductor: 'g' };
    expect(codes(resolved({ nets: twoNets, shapes: [u, { id: 'c', type: 'circle', cx: 1.5, cy: 2, r: 0.4, conductor: 'a' }] }))).toEqual([]);
    expect(codes(resolved({ nets: twoNets, shapes: [u, { id: 'c', type: 'circle', cx: 1.5, cy: 2, r: 0.5, conductor: 'a' }] }))).toEqual(['short-circuit']);
  });
});

describe('checkSection: every error names what is wrong', () => {
  const base = (shapes: Shape[], extra: Record<string, unknown> = {}) => resolved({ nets: twoNets, shapes, ...extra });
  const ground = { id: 'gnd', type: 'rect', x: -10, y: -3, width: 20, height: 1, conductor: 'g' };
  const first = (s: ReturnType<typeof resolved>, code: string) => {
    const i = checkSection(s).find((x) => x.code === code);
    expect(i, `expected an issue ${code}`).toBeDefined();
    return i!;
  };

  it('unknown net and unknown material', () => {
    const s = base([ground, { id: 'w', type: 'circle', cx: 0, cy: 0, r: 1, conductor: 'sig' }, { id: 'd', type: 'rect', x: 3, y: 0, width: 1, height: 1, dielectric: 'fr4' }]);
    expect(first(s, 'unknown-net').message).toBe('shape "w": unknown net "sig" (nets: "a", "g")');
    expect(first(s, 'unknown-net').path).toEqual(['shapes', 1, 'conductor']);
    expect(first(s, 'unknown-material').message).toBe('shape "d": unknown material "fr4" (the section defines no materials)');
  });

  it('duplicate shape ids, net names and material ids', () => {
    const s = resolved({
      nets: [...twoNets, { name: 'a', role: 'ground' }],
      materials: [{ id: 'm', name: 'M', epsR: 2 }, { id: 'm', name: 'M2', epsR: 3 }],
      shapes: [ground, { id: 'gnd', type: 'circle', cx: 0, cy: 0, r: 1, conductor: 'a' }],
    });
    expect(first(s, 'duplicate-shape').message).toBe('shape id "gnd" is used more than once');
    expect(first(s, 'duplicate-net').message).toBe('net "a" is defined more than once');
    expect(first(s, 'duplicate-material').message).toBe('material "m" is defined more than once');
  });

  it('zero and negative sizes', () => {
    const s = base([
      ground,
      { id: 'r0', type: 'rect', x: 0, y: 0, width: 0, height: 1, conductor: 'a' },
      { id: 'rn', type: 'rect', x: 2, y: 0, width: 1, height: -1, conductor: 'a' },
      { id: 'c0', type: 'circle', cx: 5, cy: 0, r: 0, conductor: 'a' },
      { id: 'ri', type: 'ring', cx: 8, cy: 0, rInner: 1, rOuter: 1, conductor: 'a' },
    ]);
    const msgs = checkSection(s).filter((i) => i.code === 'size').map((i) => i.message);
    expect(msgs).toEqual([
      'rect "r0": width must be greater than 0 (is 0)',
      'rect "rn": height must be greater than 0 (is -1)',
      'circle "c0": r must be greater than 0 (is 0)',
      'ring "ri": rInner (1) must be smaller than rOuter (1)',
    ]);
  });

  it('polygons: zero area, repeated points, self-intersection', () => {
    const s = base([
      ground,
      { id: 'line', type: 'polygon', points: [[0, 0], [1, 1], [2, 2]], conductor: 'a' },
      { id: 'rep', type: 'polygon', points: [[3, 0], [4, 0], [4, 0], [4, 1]], conductor: 'a' },
      { id: 'closed', type: 'polygon', points: [[5, 0], [6, 0], [6, 1], [5, 0]], conductor: 'a' },
      { id: 'bow', type: 'polygon', points: [[7, 0], [8, 1], [8, 0], [7, 1]], conductor: 'a' },
    ]);
    const byShape = (id: string) => checkSection(s).find((i) => i.shapeIds?.[0] === id && i.severity === 'error')!;
    expect(byShape('line').message).toBe('polygon "line": has zero area (its points lie on one line)');
    expect(byShape('rep').message).toBe('polygon "rep": points 1 and 2 are the same (4, 0)');
    expect(byShape('closed').message).toContain('the last point repeats the first');
    expect(byShape('bow').code).toBe('polygon-self-intersection');
    expect(byShape('bow').message).toBe('polygon "bow": edges 0 and 2 cross or touch; a polygon must not intersect itself');
  });

  it('a polygon touching itself at a vertex is self-intersecting', () => {
    // Two squares joined at one corner by a single outline (a figure of eight).
    const s = base([ground, { id: 'eight', type: 'polygon', points: [[0, 0], [1, 0], [1, 1], [2, 1], [2, 2], [1, 2], [1, 1], [0, 1]], conductor: 'a' }]);
    expect(first(s, 'polygon-self-intersection').shapeIds).toEqual(['eight']);
  });

  it('strips must be axis-aligned and have length', () => {
    const s = base([ground, { id: 'slant', type: 'strip', x1: 0, y1: 0, x2: 1, y2: 1, conductor: 'a' }, { id: 'dot', type: 'strip', x1: 3, y1: 0, x2: 3, y2: 0, conductor: 'a' }]);
    expect(first(s, 'strip-not-axis-aligned').message).toBe('strip "slant": must be horizontal (y1 = y2) or vertical (x1 = x2); it runs from (0, 0) to (1, 1)');
    expect(first(s, 'size').message).toBe('strip "dot": has zero length (both ends at 3, 0)');
  });

  it('no reference', () => {
    const s = resolved({ nets: twoNets, shapes: [{ id: 'w', type: 'circle', cx: 0, cy: 0, r: 1, conductor: 'a' }] });
    expect(first(s, 'no-reference').message).toContain('no reference');
    const withPlane = resolved({ nets: twoNets, shapes: [{ id: 'w', type: 'circle', cx: 0, cy: 0, r: 1, conductor: 'a' }], boundary: { bottom: { type: 'ground', at: -2 } } });
    expect(errors(withPlane)).toEqual([]);
  });

  it('shapes across or beyond ground and mirror boundaries; signal conductors on a ground plane', () => {
    const boundary = { left: { type: 'mirror', at: 0 }, bottom: { type: 'ground', at: 0 } };
    const s = resolved({
      nets: twoNets,
      boundary,
      shapes: [
        { id: 'across', type: 'rect', x: -1, y: 1, width: 2, height: 1, conductor: 'a' },
        { id: 'below', type: 'circle', cx: 3, cy: -2, r: 1, conductor: 'a' },
        { id: 'onplane', type: 'rect', x: 5, y: 0, width: 1, height: 1, conductor: 'a' },
        { id: 'onmirror', type: 'rect', x: 0, y: 3, width: 1, height: 1, conductor: 'a' },
        { id: 'sub', type: 'rect', x: 0, y: 0, width: 9, height: 0.5, dielectric: 'm' },
      ],
      materials: [{ id: 'm', name: 'M', epsR: 4 }],
    });
    const msgs = errors(s).map((i) => i.message);
    expect(msgs).toContain('shape "across" crosses the left mirror boundary at x = 0');
    expect(msgs).toContain('shape "below" lies beyond the bottom ground boundary at y = 0');
    expect(msgs).toContain('conductor "onplane" of signal net "a" touches the bottom ground boundary at y = 0: a short circuit to ground');
    expect(msgs.some((m) => m.includes('"onmirror"'))).toBe(false);
    expect(msgs.some((m) => m.includes('"sub"'))).toBe(false);
    expect(msgs).toHaveLength(3);
  });

  it('boundary sides in the wrong order', () => {
    const s = resolved({ nets: twoNets, shapes: [{ id: 'w', type: 'circle', cx: 0, cy: 0, r: 1, conductor: 'a' }], boundary: { left: { type: 'ground', at: 5 }, right: { type: 'ground', at: -5 } } });
    expect(first(s, 'boundary-order').message).toBe('boundary: left (at 5) must lie left of right (at -5)');
  });

  it('material and background values', () => {
    const s = resolved({
      nets: twoNets,
      background: { epsR: 0.5, lossTangent: -1 },
      materials: [{ id: 'm', name: 'M', epsR: 0.9, lossTangent: -0.01, breakdownKVPerMm: 0 }],
      shapes: [ground, { id: 'w', type: 'circle', cx: 0, cy: 0, r: 1, conductor: 'a' }],
    });
    const msgs = checkSection(s).filter((i) => i.code === 'value').map((i) => i.message);
    expect(msgs).toEqual([
      'material "m": epsR must be at least 1 (is 0.9)',
      'material "m": lossTangent must not be negative (is -0.01)',
      'material "m": breakdownKVPerMm must be greater than 0 (is 0)',
      'background: epsR must be at least 1 (is 0.5)',
      'background: lossTangent must not be negative (is -1)',
    ]);
  });

  it('size limits: ratio of section size to the smallest feature', () => {
    const ok = base([{ ...ground, x: 0, width: 1e5 }, { id: 'tiny', type: 'circle', cx: 0, cy: 5, r: 0.06, conductor: 'a' }]);
    expect(checkSection(ok).filter((i) => i.code === 'limit')).toEqual([]);
    const s = base([{ ...ground, x: 0, width: 1e5 }, { id: 'tiny', type: 'circle', cx: 0, cy: 5, r: 0.04, conductor: 'a' }]);
    const limit = first(s, 'limit');
    expect(limit.shapeIds).toEqual(['tiny']);
    expect(limit.message).toBe('shape "tiny" is 1250000 times smaller than the whole section (100000 mm); at most 1000000 is allowed');
  });

  it('total polygon vertices', () => {
    const poly = (k: number) => ({ id: `p${k}`, type: 'polygon', conductor: 'g', points: Array.from({ length: 1500 }, (_, i) => {
      const t = (2 * Math.PI * i) / 1500;
      return [k * 3 + Math.cos(t), Math.sin(t)];
    }) });
    const s = base([...Array.from({ length: 14 }, (_, k) => poly(k)), { id: 'w', type: 'circle', cx: 0, cy: 5, r: 0.5, conductor: 'a' }]);
    expect(first(s, 'limit').message).toBe('the polygons have 21000 points in all; at most 20000 are allowed');
  });

  it('nothing to solve without a signal conductor', () => {
    const s = base([ground]);
    expect(first(s, 'no-signal').message).toBe('nothing to solve: no signal net has a conductor shape');
  });
});

describe('checkSection warnings', () => {
  it('a net without shapes', () => {
    const s = resolved({ nets: [...twoNets, { name: 'spare', role: 'signal' }], shapes: [
      { id: 'w', type: 'circle', cx: 0, cy: 0, r: 1, conductor: 'a' },
      { id: 'p', type: 'rect', x: -5, y: -3, width: 10, height: 1, conductor: 'g' },
    ] });
    const issues = checkSection(s);
    expect(issues).toEqual([{ severity: 'warning', code: 'empty-net', message: 'signal net "spare" has no shapes; it is left out of the solve', path: ['nets', 2], net: 'spare' }]);
  });

  it('a dielectric hidden by later dielectrics and conductors', () => {
    const s = resolved({
      nets: twoNets,
      materials: [{ id: 'm', name: 'M', epsR: 2 }, { id: 'n', name: 'N', epsR: 3 }],
      shapes: [
        { id: 'low', type: 'rect', x: 0, y: 0, width: 2, height: 1, dielectric: 'm' },
        { id: 'left-cover', type: 'rect', x: -1, y: -1, width: 2, height: 3, dielectric: 'n' },
        { id: 'right-cover', type: 'rect', x: 1, y: -1, width: 2, height: 3, conductor: 'g' },
        { id: 'w', type: 'circle', cx: 0, cy: 5, r: 1, conductor: 'a' },
        { id: 'visible', type: 'rect', x: 10, y: 0, width: 2, height: 1, dielectric: 'm' },
        { id: 'under-earlier', type: 'rect', x: 10.5, y: 0.25, width: 1, height: 0.5, dielectric: 'n' },
      ],
    });
    const hidden = checkSection(s).filter((i) => i.code === 'hidden-dielectric');
    expect(hidden.map((i) => i.shapeIds)).toEqual([['low']]);
    expect(hidden[0]!.message).toBe('dielectric "low" is covered entirely by "left-cover", "right-cover"; it has no effect');
  });
});

describe('shared samples and documentation examples', () => {
  const dir = SHARED_SAMPLES;
  const files = readdirSync(dir).filter((f) => f.endsWith('.section.json'));
  it('finds the samples', () => expect(files.length).toBeGreaterThanOrEqual(3));
  for (const f of files) {
    it(`${f} passes every check with no warning`, () => {
      const r = parseSectionFile(readFileSync(path.join(dir, f), 'utf8'));
      expect(r.ok ? r.warnings : r.message).toEqual([]);
    });
  }
});

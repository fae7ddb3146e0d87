import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { makeGrid, type FieldGrid } from '@/lib/field/grid';
import { cellField } from '@/lib/field/gradient';
import { colorLut, scaleValue, type ColorScale } from '@/lib/field/colormap';
import { conductorCells, rasterSmoothMagnitude, sampleSmooth, smoothField, smoothScaleAt } from '@/lib/field/smooth';

/** A graded axis: spacings growing geometrically (ratio r) from h0. */
function graded(n: number, h0: number, r: number, start = 0): Float64Array {
  const a = new Float64Array(n);
  a[0] = start;
  let h = h0;
  for (let k = 1; k < n; k++) {
    a[k] = a[k - 1]! + h;
    h *= r;
  }
  return a;
}

function nodeField(xs: Float64Array, ys: Float64Array, f: (x: number, y: number) => number): Float64Array {
  const out = new Float64Array(xs.length * ys.length);
  for (let j = 0; j < ys.length; j++) for (let i = 0; i < xs.length; i++) out[j * xs.length + i] = f(xs[i]!, ys[j]!);
  return out;
}

const allFree = (g: FieldGrid) => new Int16Array(g.nx * g.ny).fill(-1);

describe('smooth |E| for display (node recovery + bilinear per pixel)', () => {
  // Common practice, no published source: a weighted mean of equal values is that value and
  // bilinear interpolation reproduces a constant, so a uniform field comes back exactly everywhere.
  it('is exact for a linear potential on graded meshes, at every corner and any point', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -5, max: 5, noNaN: true }),
        fc.double({ min: -5, max: 5, noNaN: true }),
        fc.double({ min: 1, max: 1.4, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (a, b, r, fx, fy) => {
          const xs = graded(9, 1e-3, r, -2e-3);
          const ys = graded(7, 2e-3, 2.4 - r, 1e-3);
          const g = makeGrid(xs, ys);
          const phi = nodeField(xs, ys, (x, y) => a * x * 1e3 + b * y * 1e3 + 0.3);
          const s = smoothField(g, cellField(g, phi), allFree(g));
          for (let k = 0; k < s.cornerEx.length; k++) {
            expect(s.cornerEx[k]).toBeCloseTo(-a * 1e3, 6);
            expect(s.cornerEy[k]).toBeCloseTo(-b * 1e3, 6);
          }
          // inside the mesh, edges included (clamped: fx·span can round past the last node)
          const x = Math.min(xs[8]!, xs[0]! + fx * (xs[8]! - xs[0]!));
          const y = Math.min(ys[6]!, ys[0]! + fy * (ys[6]! - ys[0]!));
          const p = sampleSmooth(g, s, x, y)!;
          expect(p.ex).toBeCloseTo(-a * 1e3, 6);
          expect(p.ey).toBeCloseTo(-b * 1e3, 6);
          expect(p.mag).toBeCloseTo(Math.hypot(a, b) * 1e3, 6);
        },
      ),
      { numRuns: 40 },
    );
  });

  // Common practice, no published source: cell-centre gradients of the bilinear interpolant are
  // exact for quadratic φ, and the tensor-product weights interpolate a linear E exactly to the
  // node; bilinear interpolation inside a cell is then exact for that linear E.
  it('is exact for a quadratic potential (E linear in x and y) at interior nodes and inside interior cells', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -3, max: 3, noNaN: true }),
        fc.double({ min: -3, max: 3, noNaN: true }),
        fc.double({ min: -3, max: 3, noNaN: true }),
        fc.double({ min: 1, max: 1.5, noNaN: true }),
        (al, be, ga, r) => {
          const xs = graded(10, 0.5, r, -1);
          const ys = graded(8, 0.3, 2.5 - r, 0.2);
          const g = makeGrid(xs, ys);
          const phi = nodeField(xs, ys, (x, y) => al * x * x + be * x * y + ga * y * y);
          const exact = (x: number, y: number) => ({ ex: -(2 * al * x + be * y), ey: -(be * x + 2 * ga * y) });
          const s = smoothField(g, cellField(g, phi), allFree(g));
          const cx = g.nx - 1;
          // interior nodes: the corner values of the four cells around them
          for (let j = 1; j < g.ny - 1; j++)
            for (let i = 1; i < g.nx - 1; i++) {
              const e = exact(xs[i]!, ys[j]!);
              const c = j * cx + i; // the cell north-east of the node: the node is its corner 0
              expect(s.cornerEx[4 * c]).toBeCloseTo(e.ex, 9);
              expect(s.cornerEy[4 * c]).toBeCloseTo(e.ey, 9);
              const sw = (j - 1) * cx + (i - 1); // the node is corner 3 of the south-west cell
              expect(s.cornerEx[4 * sw + 3]).toBeCloseTo(e.ex, 9);
              expect(s.cornerEy[4 * sw + 3]).toBeCloseTo(e.ey, 9);
            }
          // a point inside a cell away from the mesh edge
          const x = 0.3 * xs[3]! + 0.7 * xs[4]!;
          const y = 0.6 * ys[2]! + 0.4 * ys[3]!;
          const p = sampleSmooth(g, s, x, y)!;
          const e = exact(x, y);
          expect(p.ex).toBeCloseTo(e.ex, 9);
          expect(p.ey).toBeCloseTo(e.ey, 9);
        },
      ),
      { numRuns: 40 },
    );
  });

  it('takes the recovered node value at a node, the same from every cell around a free node (continuous picture)', () => {
    const xs = graded(7, 0.2, 1.3);
    const ys = graded(6, 0.1, 1.5);
    const g = makeGrid(xs, ys);
    const phi = nodeField(xs, ys, (x, y) => Math.sin(2 * x) * Math.exp(y));
    const s = smoothField(g, cellField(g, phi), allFree(g));
    const cx = g.nx - 1;
    const i = 3;
    const j = 2;
    const corners = [
      [j * cx + i, 0],
      [j * cx + i - 1, 1],
      [(j - 1) * cx + i, 2],
      [(j - 1) * cx + i - 1, 3],
    ] as const;
    const v = s.cornerEx[4 * corners[0][0] + corners[0][1]]!;
    for (const [c, q] of corners) expect(s.cornerEx[4 * c + q]).toBe(v);
    const at = sampleSmooth(g, s, xs[i]!, ys[j]!)!;
    expect(at.ex).toBeCloseTo(v, 12);
    expect(at.ey).toBeCloseTo(s.cornerEy[4 * corners[0][0]]!, 12);
    // and the picture is continuous across the node: points just either side agree
    const eps = 1e-9;
    const l = sampleSmooth(g, s, xs[i]! - eps, ys[j]! + eps)!;
    const rgt = sampleSmooth(g, s, xs[i]! + eps, ys[j]! - eps)!;
    expect(Math.abs(l.mag - rgt.mag)).toBeLessThan(1e-6 * Math.max(1, l.mag));
  });

  it('leaves conductor cells empty and does not let their zero field pull the surface values down', () => {
    // a conductor filling the rows j ≤ 2 at 0 V, a uniform field above it
    const xs = graded(8, 0.1, 1.2);
    const ys = graded(9, 0.05, 1.25);
    const g = makeGrid(xs, ys);
    const yTop = ys[2]!;
    const phi = nodeField(xs, ys, (_x, y) => (y <= yTop ? 0 : 4 * (y - yTop)));
    const nodeNet = allFree(g);
    for (let j = 0; j <= 2; j++) for (let i = 0; i < g.nx; i++) nodeNet[j * g.nx + i] = 0;
    const metal = conductorCells(g, nodeNet);
    const cx = g.nx - 1;
    expect(metal[0 * cx + 3]).toBe(1);
    expect(metal[1 * cx + 3]).toBe(1);
    expect(metal[2 * cx + 3]).toBe(0);
    const s = smoothField(g, cellField(g, phi), nodeNet, metal);
    // inside the metal: no value, no picture
    expect(sampleSmooth(g, s, 0.5 * (xs[3]! + xs[4]!), 0.5 * (ys[0]! + ys[1]!))).toBeNull();
    expect(Number.isNaN(s.cornerEx[4 * (1 * cx + 3)]!)).toBe(true);
    // on the surface (j = 2) and above: the full uniform field, E = −4 ŷ
    for (let i = 0; i < g.nx - 1; i++) {
      const c = 2 * cx + i;
      for (let q = 0; q < 4; q++) {
        expect(s.cornerEx[4 * c + q]).toBeCloseTo(0, 12);
        expect(s.cornerEy[4 * c + q]).toBeCloseTo(-4, 12);
      }
    }
    const img = rasterSmoothMagnitude(g, s, { x0: xs[0]!, y0: ys[0]!, x1: xs[g.nx - 1]!, y1: ys[g.ny - 1]! }, 40, 60, { kind: 'linear', min: 0, max: 4 }, colorLut('viridis'));
    // the bottom pixel row lies in the metal: transparent; the top row is painted at the top colour
    const lut = colorLut('viridis');
    const bottom = (59 * 40 + 20) * 4;
    expect(img.data[bottom + 3]).toBe(0);
    const top = (0 * 40 + 20) * 4;
    expect([img.data[top], img.data[top + 1], img.data[top + 2], img.data[top + 3]]).toEqual([lut[255 * 3], lut[255 * 3 + 1], lut[255 * 3 + 2], 255]);
  });

  it('keeps the jump across a zero-thickness strip: the field points away on both sides, not cancelled', () => {
    // a strip along y = 0 from x = −1 to 1 at 1 V; φ falls off linearly above and below
    const xs = Float64Array.from([-3, -2, -1, -0.5, 0, 0.5, 1, 2, 3]);
    const ys = Float64Array.from([-2, -1, -0.4, 0, 0.4, 1, 2]);
    const g = makeGrid(xs, ys);
    const phi = nodeField(xs, ys, (_x, y) => 1 - 0.25 * Math.abs(y));
    const nodeNet = allFree(g);
    const jm = 3;
    for (let i = 2; i <= 6; i++) nodeNet[jm * g.nx + i] = 0;
    const s = smoothField(g, cellField(g, phi), nodeNet);
    // just above and just below the middle of the strip
    const above = sampleSmooth(g, s, 0.1, 1e-9)!;
    const below = sampleSmooth(g, s, 0.1, -1e-9)!;
    expect(above.ey).toBeCloseTo(0.25, 12);
    expect(below.ey).toBeCloseTo(-0.25, 12);
    expect(above.mag).toBeCloseTo(0.25, 12);
    expect(below.mag).toBeCloseTo(0.25, 12);
    // a naive shared node value would average the two sides to zero on the strip
    const cx = g.nx - 1;
    expect(s.cornerEy[4 * (jm * cx + 4)]).toBeCloseTo(0.25, 12); // cell above, its corner on the strip
    expect(s.cornerEy[4 * ((jm - 1) * cx + 4) + 2]).toBeCloseTo(-0.25, 12); // cell below
  });

  it('keeps the jump of the normal field at a dielectric interface sharp when given the cell permittivities', () => {
    // εr = 4 below y = 0, 1 above; D = εE continuous: E = 1 below and 4 above (pointing down)
    const xs = graded(7, 0.1, 1.3, -0.5);
    const ys = Float64Array.from([-1, -0.5, -0.2, 0, 0.15, 0.4, 1]);
    const g = makeGrid(xs, ys);
    const phi = nodeField(xs, ys, (_x, y) => (y < 0 ? y : 4 * y));
    const cx = g.nx - 1;
    const eps = new Float32Array(cx * (g.ny - 1));
    for (let j = 0; j < g.ny - 1; j++) for (let i = 0; i < cx; i++) eps[j * cx + i] = ys[j]! < 0 ? 4 : 1;
    const E = cellField(g, phi);
    const sharp = smoothField(g, E, allFree(g), undefined, eps);
    expect(sampleSmooth(g, sharp, 0.1, 1e-9)!.ey).toBeCloseTo(-4, 12);
    expect(sampleSmooth(g, sharp, 0.1, -1e-9)!.ey).toBeCloseTo(-1, 12);
    // D·n is continuous across the interface in the picture too
    expect(1 * sampleSmooth(g, sharp, 0.1, 1e-9)!.ey).toBeCloseTo(4 * sampleSmooth(g, sharp, 0.1, -1e-9)!.ey, 12);
    // without the permittivities the two sides are averaged at the interface nodes
    const blurred = smoothField(g, E, allFree(g));
    const up = sampleSmooth(g, blurred, 0.1, 1e-9)!.ey;
    expect(up).toBeGreaterThan(-4 + 0.5);
    expect(up).toBeLessThan(-1 - 0.5);
    expect(() => smoothField(g, E, allFree(g), undefined, new Float32Array(3))).toThrow(/cellEps has 3 values/);
  });

  it('paints each pixel with the colour of the interpolated |E| at its centre (log scale too)', () => {
    const xs = graded(12, 0.05, 1.3);
    const ys = graded(10, 0.04, 1.35);
    const g = makeGrid(xs, ys);
    const phi = nodeField(xs, ys, (x, y) => Math.log(0.05 + Math.hypot(x - 0.2, y - 0.1)));
    const s = smoothField(g, cellField(g, phi), allFree(g));
    const rect = { x0: -0.1, y0: ys[0]!, x1: xs[g.nx - 1]!, y1: ys[g.ny - 1]! + 0.1 };
    const W = 37;
    const H = 29;
    for (const scale of [
      { kind: 'log', min: 0.05, max: 20 },
      { kind: 'linear', min: 0, max: 10 },
    ] as ColorScale[]) {
      const lut = colorLut('cividis');
      const img = rasterSmoothMagnitude(g, s, rect, W, H, scale, lut, 200);
      let painted = 0;
      let outside = 0;
      for (let py = 0; py < H; py++)
        for (let px = 0; px < W; px++) {
          const x = rect.x0 + ((px + 0.5) / W) * (rect.x1 - rect.x0);
          const y = rect.y1 - ((py + 0.5) / H) * (rect.y1 - rect.y0);
          const o = (py * W + px) * 4;
          const u = smoothScaleAt(g, s, x, y, scale);
          if (Number.isNaN(u)) {
            expect(img.data[o + 3]).toBe(0);
            outside++;
            continue;
          }
          const q = Math.round(u * 255) * 3;
          expect([img.data[o], img.data[o + 1], img.data[o + 2], img.data[o + 3]]).toEqual([lut[q], lut[q + 1], lut[q + 2], 200]);
          painted++;
        }
      expect(painted).toBeGreaterThan(W * H * 0.5);
      expect(outside).toBeGreaterThan(0); // the rectangle reaches past the mesh on two sides
      expect(scaleValue(scale, 1)).toBeGreaterThan(0);
    }
  });

  it('refuses fields that do not match the grid', () => {
    const g = makeGrid(Float64Array.from([0, 1, 2]), Float64Array.from([0, 1]));
    const E = cellField(g, new Float64Array(6));
    expect(() => smoothField(g, E, new Int16Array(5))).toThrow(/nodeNet has 5 values, the grid 6 nodes/);
    expect(() => smoothField(g, { ex: new Float64Array(3), ey: new Float64Array(3), mag: new Float64Array(3) }, new Int16Array(6))).toThrow(RangeError);
  });
});

describe('cut line with the smooth field', () => {
  it('reads |E| from the smooth field the picture shows, 0 inside conductor cells', async () => {
    const { sampleCut } = await import('@/lib/field/cut-line');
    const xs = graded(8, 0.1, 1.2);
    const ys = graded(9, 0.05, 1.25);
    const g = makeGrid(xs, ys);
    const phi = nodeField(xs, ys, (x, y) => (y <= ys[2]! ? 0 : x * x + 3 * (y - ys[2]!)));
    const nodeNet = allFree(g);
    for (let j = 0; j <= 2; j++) for (let i = 0; i < g.nx; i++) nodeNet[j * g.nx + i] = 0;
    const s = smoothField(g, cellField(g, phi), nodeNet);
    const x0 = 0.5 * (xs[2]! + xs[3]!);
    const cut = sampleCut(g, phi, x0, ys[0]!, x0 + 0.05, ys[8]!, 25, s);
    let inMetal = 0;
    for (let q = 0; q < 25; q++) {
      const p = sampleSmooth(g, s, cut.x[q]!, cut.y[q]!);
      if (p) expect(cut.mag[q]).toBe(p.mag);
      else {
        expect(cut.mag[q]).toBe(0);
        inMetal++;
      }
    }
    expect(inMetal).toBeGreaterThan(0);
    // without the smooth field: the gradient of the bilinear potential of the cell, as before
    const raw = sampleCut(g, phi, x0, ys[0]!, x0 + 0.05, ys[8]!, 25);
    expect(raw.mag[24]).not.toBe(cut.mag[24]);
  });
});

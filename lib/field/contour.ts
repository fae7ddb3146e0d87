/**
 * Iso-lines of a node field on the tensor mesh by marching squares, joined into polylines.
 *
 * Inside a cell the field is interpolated linearly along each edge (the same linear
 * interpolation a uniform-grid marching-squares routine uses, but with the true node
 * coordinates, so graded meshes need no resampling). Saddle cells are resolved with the
 * average of the four corners. Output coordinates are in the grid's units (metres).
 *
 * A small routine of our own rather than a package: the common marching-squares packages
 * return filled bands on uniform grids, closed along the domain border, whereas equipotential
 * lines on a graded mesh need open polylines in mesh coordinates.
 */
import type { FieldGrid } from './grid';

export interface IsoLine {
  level: number;
  /** Polylines as flat [x0, y0, x1, y1, ...]. */
  lines: Float64Array[];
}

/**
 * Iso-lines of `values` (node field, row-major j*nx+i) at `level`. A node counts as
 * "above" when value > level. NaN nodes are treated as below.
 */
export function isoLine(grid: FieldGrid, values: Float64Array, level: number): IsoLine {
  const { xs, ys, nx, ny } = grid;
  if (values.length !== nx * ny) throw new RangeError(`values has ${values.length} entries, the grid ${nx * ny} nodes`);
  const hCount = (nx - 1) * ny; // horizontal edges: id j*(nx−1)+i, between (i,j) and (i+1,j)
  const hId = (i: number, j: number) => j * (nx - 1) + i;
  const vId = (i: number, j: number) => hCount + j * nx + i; // vertical edge between (i,j) and (i,j+1)
  const px = new Map<number, number>();
  const py = new Map<number, number>();
  const link = new Map<number, number[]>();

  const crossH = (i: number, j: number): number => {
    const id = hId(i, j);
    if (!px.has(id)) {
      const a = values[j * nx + i]!;
      const b = values[j * nx + i + 1]!;
      const t = clamp01((level - a) / (b - a));
      px.set(id, xs[i]! + t * (xs[i + 1]! - xs[i]!));
      py.set(id, ys[j]!);
    }
    return id;
  };
  const crossV = (i: number, j: number): number => {
    const id = vId(i, j);
    if (!px.has(id)) {
      const a = values[j * nx + i]!;
      const b = values[(j + 1) * nx + i]!;
      const t = clamp01((level - a) / (b - a));
      px.set(id, xs[i]!);
      py.set(id, ys[j]! + t * (ys[j + 1]! - ys[j]!));
    }
    return id;
  };
  const connect = (p: number, q: number) => {
    let lp = link.get(p);
    if (!lp) link.set(p, (lp = []));
    lp.push(q);
    let lq = link.get(q);
    if (!lq) link.set(q, (lq = []));
    lq.push(p);
  };

  for (let j = 0; j < ny - 1; j++) {
    for (let i = 0; i < nx - 1; i++) {
      const k = j * nx + i;
      const v0 = values[k]!; // bottom-left
      const v1 = values[k + 1]!; // bottom-right
      const v2 = values[k + nx + 1]!; // top-right
      const v3 = values[k + nx]!; // top-left
      const code = (v0 > level ? 1 : 0) | (v1 > level ? 2 : 0) | (v2 > level ? 4 : 0) | (v3 > level ? 8 : 0);
      if (code === 0 || code === 15) continue;
      const B = () => crossH(i, j);
      const T = () => crossH(i, j + 1);
      const L = () => crossV(i, j);
      const R = () => crossV(i + 1, j);
      switch (code) {
        case 1: case 14: connect(L(), B()); break;
        case 2: case 13: connect(B(), R()); break;
        case 3: case 12: connect(L(), R()); break;
        case 4: case 11: connect(R(), T()); break;
        case 6: case 9: connect(B(), T()); break;
        case 7: case 8: connect(L(), T()); break;
        case 5: case 10: {
          const centreAbove = (v0 + v1 + v2 + v3) / 4 > level;
          // code 5: bottom-left and top-right above. If the centre is above they join through it.
          const joinedDiag = code === 5 ? centreAbove : !centreAbove;
          if (joinedDiag) {
            connect(L(), T());
            connect(B(), R());
          } else {
            connect(L(), B());
            connect(R(), T());
          }
          break;
        }
      }
    }
  }
  return { level, lines: chain(link, px, py) };
}

/** Several levels at once. */
export function isoLines(grid: FieldGrid, values: Float64Array, levels: readonly number[]): IsoLine[] {
  return levels.map((l) => isoLine(grid, values, l));
}

function clamp01(t: number): number {
  if (!(t >= 0)) return 0;
  return t > 1 ? 1 : t;
}

function chain(link: Map<number, number[]>, px: Map<number, number>, py: Map<number, number>): Float64Array[] {
  const used = new Set<number>();
  const out: Float64Array[] = [];
  const walk = (start: number) => {
    const pts: number[] = [px.get(start)!, py.get(start)!];
    used.add(start);
    let prev = -1;
    let cur = start;
    for (;;) {
      const nb = link.get(cur)!;
      let next = -1;
      for (const n of nb) {
        if (n !== prev && !used.has(n)) {
          next = n;
          break;
        }
      }
      if (next < 0) {
        // close a loop when we come back to the start
        if (nb.includes(start) && cur !== start && pts.length > 4) pts.push(px.get(start)!, py.get(start)!);
        break;
      }
      used.add(next);
      pts.push(px.get(next)!, py.get(next)!);
      prev = cur;
      cur = next;
    }
    out.push(Float64Array.from(pts));
  };
  // open chains first (ends on the mesh border have one neighbour), then closed loops
  for (const [id, nb] of link) if (nb.length === 1 && !used.has(id)) walk(id);
  for (const id of link.keys()) if (!used.has(id)) walk(id);
  return out;
}

/** Length of a flat polyline. */
export function polylineLength(p: Float64Array): number {
  let s = 0;
  for (let q = 2; q < p.length; q += 2) s += Math.hypot(p[q]! - p[q - 2]!, p[q + 1]! - p[q - 1]!);
  return s;
}

/** The point at fraction f (0..1) of a polyline's length, with the local direction angle (radians). */
export function pointAlong(p: Float64Array, f: number): { x: number; y: number; angle: number } {
  const total = polylineLength(p);
  let target = f * total;
  for (let q = 2; q < p.length; q += 2) {
    const dx = p[q]! - p[q - 2]!;
    const dy = p[q + 1]! - p[q - 1]!;
    const d = Math.hypot(dx, dy);
    if (d >= target && d > 0) {
      const t = target / d;
      return { x: p[q - 2]! + t * dx, y: p[q - 1]! + t * dy, angle: Math.atan2(dy, dx) };
    }
    target -= d;
  }
  return { x: p[p.length - 2] ?? 0, y: p[p.length - 1] ?? 0, angle: 0 };
}

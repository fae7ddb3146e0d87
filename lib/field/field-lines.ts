/**
 * Field lines (lines of force) from the driven conductors, traced along E = −∇φ.
 *
 * Seeds sit in the cells that touch a driven conductor, spaced at equal steps of the flux
 * leaving it (|E| × cell size summed around the surface), so the density of lines follows
 * the surface charge. Each line is integrated with the midpoint rule (second order), with a
 * step of a fraction of the local cell size, until it reaches another conductor, leaves the
 * mesh, stalls where E vanishes, or reaches the step limit.
 */
import { type FieldGrid, findInterval } from './grid';
import { type CellField, samplePoint } from './gradient';

export interface FieldLineOptions {
  /** Lines per driven net. @default 24 */
  linesPerNet?: number;
  /** Step as a fraction of the local smaller cell side. @default 0.5 */
  stepFraction?: number;
  /** @default 4000 */
  maxSteps?: number;
  /** Only seed inside this rectangle (metres), for example the region on screen. */
  seedRect?: { x0: number; y0: number; x1: number; y1: number };
}

/**
 * @param phi the potential (V) to trace
 * @param nodeNet conductor net index per node, −1 where free (any other negative value, such as −2 for a
 *   ground-boundary plane, counts as a conductor that is not driven)
 * @param volts drive per net index (lines start on nets with v ≠ 0, along E where v > 0, against E where v < 0)
 * @returns polylines, flat [x0, y0, x1, y1, ...] in metres
 */
export function fieldLines(
  grid: FieldGrid,
  phi: Float64Array,
  cells: CellField,
  nodeNet: Int16Array,
  volts: readonly number[],
  opts: FieldLineOptions = {},
): Float64Array[] {
  const { linesPerNet = 24, stepFraction = 0.5, maxSteps = 4000, seedRect } = opts;
  const { xs, ys, nx, ny } = grid;
  const cx = nx - 1;
  const out: Float64Array[] = [];
  for (let net = 0; net < volts.length; net++) {
    const v = volts[net]!;
    if (v === 0) continue;
    const dir = v > 0 ? 1 : -1;
    // surface cells of this net: some corner on the net, some corner free
    const seedCells: number[] = [];
    const weights: number[] = [];
    for (let j = 0; j < ny - 1; j++) {
      for (let i = 0; i < cx; i++) {
        const k = j * nx + i;
        const c = [nodeNet[k]!, nodeNet[k + 1]!, nodeNet[k + nx]!, nodeNet[k + nx + 1]!];
        if (!c.includes(net) || !c.includes(-1)) continue;
        const xc = 0.5 * (xs[i]! + xs[i + 1]!);
        const yc = 0.5 * (ys[j]! + ys[j + 1]!);
        if (seedRect && (xc < seedRect.x0 || xc > seedRect.x1 || yc < seedRect.y0 || yc > seedRect.y1)) continue;
        const size = Math.sqrt((xs[i + 1]! - xs[i]!) * (ys[j + 1]! - ys[j]!));
        seedCells.push(j * cx + i);
        weights.push(cells.mag[j * cx + i]! * size);
      }
    }
    let total = 0;
    for (const w of weights) total += w;
    if (!(total > 0)) continue;
    const step = total / linesPerNet;
    let acc = 0;
    let nextAt = step / 2;
    for (let s = 0; s < seedCells.length && out.length < 10_000; s++) {
      acc += weights[s]!;
      while (acc >= nextAt) {
        nextAt += step;
        const cell = seedCells[s]!;
        const i = cell % cx;
        const j = (cell - i) / cx;
        const x0 = 0.5 * (xs[i]! + xs[i + 1]!);
        const y0 = 0.5 * (ys[j]! + ys[j + 1]!);
        const line = trace(grid, phi, nodeNet, net, x0, y0, dir, stepFraction, maxSteps);
        if (line.length >= 4) out.push(line);
      }
    }
  }
  return out;
}

function trace(
  grid: FieldGrid,
  phi: Float64Array,
  nodeNet: Int16Array,
  startNet: number,
  x0: number,
  y0: number,
  dir: number,
  stepFraction: number,
  maxSteps: number,
): Float64Array {
  const { xs, ys, nx } = grid;
  const pts: number[] = [x0, y0];
  let x = x0;
  let y = y0;
  let leftStart = false;
  for (let n = 0; n < maxSteps; n++) {
    const i = findInterval(xs, x);
    const j = findInterval(ys, y);
    if (i < 0 || j < 0) break;
    const k = j * nx + i;
    const corners = [nodeNet[k]!, nodeNet[k + 1]!, nodeNet[k + nx]!, nodeNet[k + nx + 1]!];
    let other = false;
    let own = false;
    for (const c of corners) {
      if (c !== -1 && c !== startNet) other = true;
      if (c === startNet) own = true;
    }
    if (other) break; // reached another conductor
    if (own && leftStart) break; // came back to the conductor it started on
    if (!own) leftStart = true;
    const h = stepFraction * Math.min(xs[i + 1]! - xs[i]!, ys[j + 1]! - ys[j]!);
    const a = samplePoint(grid, phi, x, y);
    if (!a || !(a.mag > 0)) break;
    const xm = x + 0.5 * h * dir * (a.ex / a.mag);
    const ym = y + 0.5 * h * dir * (a.ey / a.mag);
    const b = samplePoint(grid, phi, xm, ym);
    if (!b || !(b.mag > 0)) break;
    x += h * dir * (b.ex / b.mag);
    y += h * dir * (b.ey / b.mag);
    pts.push(x, y);
  }
  return Float64Array.from(pts);
}

/**
 * Which material fills each cell of the finest mesh: painted at the cell centre in the
 * section's order (later dielectrics cover earlier ones; conductors cover dielectrics).
 * Values: index into `section.materials`, −1 for the background, −2 inside a conductor
 * (unless `conductors: false`, which paints only the dielectrics).
 * Cells cut by an outline take the material at their centre (a first-order approximation
 * at slanted or curved interfaces, good enough for loss and peak-field shares).
 */
import { insideGeometry } from '../fdm/index';
import { shapeGeometry } from '../engine/to-problem';
import { METRES_PER_UNIT, type ResolvedSection } from '../section/schema';

export const CELL_BACKGROUND = -1;
export const CELL_CONDUCTOR = -2;

export function cellMaterialMap(
  section: ResolvedSection,
  xs: Float64Array,
  ys: Float64Array,
  opts: { conductors?: boolean } = {},
): Int16Array {
  const { conductors = true } = opts;
  const k = METRES_PER_UNIT[section.units];
  const nx = xs.length - 1;
  const ny = ys.length - 1;
  const out = new Int16Array(nx * ny).fill(CELL_BACKGROUND);
  const matIndex = new Map(section.materials.map((m, i) => [m.id, i]));
  const span = Math.max(xs[xs.length - 1]! - xs[0]!, ys[ys.length - 1]! - ys[0]!);
  const tol = 1e-12 * span;
  const paint = (value: number, g: ReturnType<typeof shapeGeometry>) => {
    // bounding box to limit the scan
    let x0 = Infinity, x1 = -Infinity, y0 = Infinity, y1 = -Infinity;
    const grow = (x: number, y: number) => {
      x0 = Math.min(x0, x); x1 = Math.max(x1, x); y0 = Math.min(y0, y); y1 = Math.max(y1, y);
    };
    switch (g.type) {
      case 'rect': grow(g.x, g.y); grow(g.x + g.width, g.y + g.height); break;
      case 'circle': grow(g.cx - g.r, g.cy - g.r); grow(g.cx + g.r, g.cy + g.r); break;
      case 'ring': grow(g.cx - g.rOuter, g.cy - g.rOuter); grow(g.cx + g.rOuter, g.cy + g.rOuter); break;
      case 'strip': return; // zero area: covers no cell centre
      case 'polygon': for (const [x, y] of g.points) grow(x, y); break;
    }
    for (let j = 0; j < ny; j++) {
      const yc = 0.5 * (ys[j]! + ys[j + 1]!);
      if (yc < y0 || yc > y1) continue;
      for (let i = 0; i < nx; i++) {
        const xc = 0.5 * (xs[i]! + xs[i + 1]!);
        if (xc < x0 || xc > x1) continue;
        if (insideGeometry(g, xc, yc, tol)) out[j * nx + i] = value;
      }
    }
  };
  for (const s of section.shapes) {
    if (s.dielectric === undefined) continue;
    const m = matIndex.get(s.dielectric);
    if (m !== undefined) paint(m, shapeGeometry(s, k));
  }
  if (conductors) for (const s of section.shapes) if (s.conductor !== undefined) paint(CELL_CONDUCTOR, shapeGeometry(s, k));
  return out;
}

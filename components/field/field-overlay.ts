/**
 * The picture laid over the drawing in the editor: potential or |E| of the first signal net
 * at 1 V, painted once per solve into an offscreen canvas over the structure's region.
 */
import type { SectionFields, SectionResult } from '@/lib/engine/types';
import type { ResolvedSection } from '@/lib/section/schema';
import { METRES_PER_UNIT } from '@/lib/section/schema';
import { makeGrid } from '@/lib/field/grid';
import { cellField } from '@/lib/field/gradient';
import { colorLut, quantile } from '@/lib/field/colormap';
import { rasterNodes, type WorldRect } from '@/lib/field/raster';
import { conductorCells, rasterSmoothMagnitude, smoothField } from '@/lib/field/smooth';
import { structureRect } from './field-model';

export type OverlayKind = 'potential' | 'field';

export interface FieldOverlay {
  image: HTMLCanvasElement;
  rect: WorldRect;
  unit: number;
  kind: OverlayKind;
}

export function paintOverlay(result: SectionResult, fields: SectionFields, section: ResolvedSection | null, kind: OverlayKind, maxPx = 1200): FieldOverlay | null {
  if (!fields.potentials.length || typeof document === 'undefined') return null;
  const unit = section ? METRES_PER_UNIT[section.units] : 1;
  const grid = makeGrid(fields.xs, fields.ys);
  const phi = fields.potentials[0]!;
  const base = structureRect(section, fields, unit);
  // a wider margin than the field view's focus, so the picture reaches past the drawing
  const w = base.x1 - base.x0;
  const h = base.y1 - base.y0;
  const mesh = { x0: fields.xs[0]!, y0: fields.ys[0]!, x1: fields.xs[fields.xs.length - 1]!, y1: fields.ys[fields.ys.length - 1]! };
  const rect = {
    x0: Math.max(mesh.x0, base.x0 - 0.5 * w),
    x1: Math.min(mesh.x1, base.x1 + 0.5 * w),
    y0: Math.max(mesh.y0, base.y0 - 0.5 * h),
    y1: Math.min(mesh.y1, base.y1 + 0.5 * h),
  };
  const rw = rect.x1 - rect.x0;
  const rh = rect.y1 - rect.y0;
  const [pw, ph] = rw >= rh ? [maxPx, Math.max(2, Math.round((maxPx * rh) / rw))] : [Math.max(2, Math.round((maxPx * rw) / rh)), maxPx];
  const conductorCell = conductorCells(grid, fields.nodeNet);
  const metal = (c: number) => conductorCell[c] === 1;
  let img;
  if (kind === 'field') {
    const E = cellField(grid, phi);
    let top = quantile(E.mag, 0.99, (c) => !metal(c));
    if (!(top > 0)) top = 1;
    // smooth: E recovered at the cell corners and interpolated per pixel
    const smooth = smoothField(grid, E, fields.nodeNet, conductorCell, fields.cellEpsR);
    img = rasterSmoothMagnitude(grid, smooth, rect, pw, ph, { kind: 'linear', min: 0, max: top }, colorLut('viridis'));
  } else {
    let lo = Infinity;
    let hi = -Infinity;
    for (const v of phi) {
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
    img = rasterNodes(grid, phi, rect, pw, ph, { kind: 'linear', min: lo, max: hi > lo ? hi : lo + 1 }, colorLut('cividis'), metal);
  }
  const c = document.createElement('canvas');
  c.width = img.width;
  c.height = img.height;
  c.getContext('2d')!.putImageData(new ImageData(img.data as Uint8ClampedArray<ArrayBuffer>, img.width, img.height), 0, 0);
  return { image: c, rect, unit, kind };
}

/**
 * The view transform between world (section units, y up) and screen (CSS pixels, y down):
 *   screenX = ox + x·scale,  screenY = oy − y·scale.
 */
import type { Box, Pt } from './geometry';

export interface View {
  /** Pixels per section unit. */
  scale: number;
  ox: number;
  oy: number;
}

export const MIN_SCALE = 1e-6;
export const MAX_SCALE = 1e12;

export function toScreen(v: View, p: Pt): Pt {
  return { x: v.ox + p.x * v.scale, y: v.oy - p.y * v.scale };
}

export function toWorld(v: View, p: Pt): Pt {
  return { x: (p.x - v.ox) / v.scale, y: (v.oy - p.y) / v.scale };
}

/** Zoom by `factor` keeping the world point under screen point `at` fixed. */
export function zoomAt(v: View, factor: number, at: Pt): View {
  const scale = Math.min(MAX_SCALE, Math.max(MIN_SCALE, v.scale * factor));
  const f = scale / v.scale;
  return { scale, ox: at.x - (at.x - v.ox) * f, oy: at.y - (at.y - v.oy) * f };
}

export function panBy(v: View, dx: number, dy: number): View {
  return { ...v, ox: v.ox + dx, oy: v.oy + dy };
}

/** A view that shows `box` centred in a `width`×`height` viewport with `pad` pixels spare on each side. */
export function fitView(box: Box, width: number, height: number, pad = 48): View {
  let w = box.maxX - box.minX;
  let h = box.maxY - box.minY;
  if (!(w > 0) && !(h > 0)) {
    w = h = Math.max(1, Math.abs(box.minX) || 1);
  }
  if (!(w > 0)) w = h;
  if (!(h > 0)) h = w;
  const scale = Math.max(MIN_SCALE, Math.min((width - 2 * pad) / w, (height - 2 * pad) / h));
  const cx = (box.minX + box.maxX) / 2;
  const cy = (box.minY + box.maxY) / 2;
  return { scale, ox: width / 2 - cx * scale, oy: height / 2 + cy * scale };
}

/** The smallest "nice" step (1, 2 or 5 × 10ⁿ) that is at least `min`. */
export function niceStep(min: number): number {
  if (!(min > 0) || !Number.isFinite(min)) return 1;
  const p = Math.pow(10, Math.floor(Math.log10(min)));
  for (const m of [1, 2, 5, 10]) if (m * p >= min * (1 - 1e-12)) return m * p;
  return 10 * p;
}

/** Grid spacing for the current zoom: minor lines at least `minPx` apart, major every 5 or 10 minor. */
export function gridSteps(v: View, minPx = 12): { minor: number; major: number } {
  const minor = niceStep(minPx / v.scale);
  const lead = Math.round(minor / Math.pow(10, Math.floor(Math.log10(minor))));
  return { minor, major: minor * (lead === 2 ? 5 : 10) };
}

/** The visible world box of a viewport. */
export function visibleBox(v: View, width: number, height: number): Box {
  const a = toWorld(v, { x: 0, y: height });
  const b = toWorld(v, { x: width, y: 0 });
  return { minX: a.x, minY: a.y, maxX: b.x, maxY: b.y };
}

/** A scale bar: a nice length about `targetPx` long. */
export function scaleBar(v: View, targetPx = 100): { length: number; px: number } {
  const length = niceStep(targetPx / v.scale / 2.2);
  return { length, px: length * v.scale };
}

/**
 * Everything a field view derives from one solve and one drive, computed once (not per
 * frame): the potential for the chosen drive, E per cell, conductor mask, peak field,
 * equipotential lines and field lines. Pure TypeScript over lib/field.
 */
import type { SectionFields, SectionResult } from '@/lib/engine/types';
import type { ResolvedSection } from '@/lib/section/schema';
import { METRES_PER_UNIT } from '@/lib/section/schema';
import { shapeBBox } from '@/lib/section/geometry';
import { makeGrid, type FieldGrid } from '@/lib/field/grid';
import { cellField, peakField, superpose, type CellField, type PeakField } from '@/lib/field/gradient';
import { isoLines, type IsoLine } from '@/lib/field/contour';
import { fieldLines } from '@/lib/field/field-lines';
import { quantile } from '@/lib/field/colormap';
import { smoothField, type SmoothField } from '@/lib/field/smooth';
import type { WorldRect } from '@/lib/field/raster';

export interface Drive {
  /** Volts per signal net (matrix order). */
  volts: number[];
}

export interface FieldModel {
  grid: FieldGrid;
  /** Metres per section unit. */
  unit: number;
  phi: Float64Array;
  phiMin: number;
  phiMax: number;
  cells: CellField;
  /** 1 where all four corners of a cell are conductor nodes (no field inside metal). */
  conductorCell: Uint8Array;
  peak: PeakField | null;
  /** E recovered at the cell corners, for the smooth |E| picture and the probe (worked out on first use). */
  smooth: SmoothField;
  /** |E| at the 99th percentile of the cells near the structure (top of the linear colour range). */
  eClip: number;
  /** Smallest positive |E| worth showing on a log scale. */
  eFloor: number;
  iso: IsoLine[];
  lines: Float64Array[];
  /** The structure's bounding box grown by a margin (metres): the region worth drawing. */
  focus: WorldRect;
  /** Mesh extent (metres). */
  meshRect: WorldRect;
}

export function structureRect(section: ResolvedSection | null, fields: SectionFields, unit: number): WorldRect {
  let x0 = Infinity;
  let y0 = Infinity;
  let x1 = -Infinity;
  let y1 = -Infinity;
  if (section) {
    for (const s of section.shapes) {
      const b = shapeBBox(s);
      if (![b.xmin, b.xmax, b.ymin, b.ymax].every(Number.isFinite)) continue;
      x0 = Math.min(x0, b.xmin * unit);
      y0 = Math.min(y0, b.ymin * unit);
      x1 = Math.max(x1, b.xmax * unit);
      y1 = Math.max(y1, b.ymax * unit);
    }
  }
  if (!Number.isFinite(x0)) {
    // fall back to the conductor nodes
    const nx = fields.xs.length;
    for (let q = 0; q < fields.nodeNet.length; q++) {
      if (fields.nodeNet[q]! < 0) continue; // free (−1) or a boundary plane (−2)
      const i = q % nx;
      const j = (q - i) / nx;
      x0 = Math.min(x0, fields.xs[i]!);
      x1 = Math.max(x1, fields.xs[i]!);
      y0 = Math.min(y0, fields.ys[j]!);
      y1 = Math.max(y1, fields.ys[j]!);
    }
  }
  const xs = fields.xs;
  const ys = fields.ys;
  const mesh = { x0: xs[0]!, y0: ys[0]!, x1: xs[xs.length - 1]!, y1: ys[ys.length - 1]! };
  if (!Number.isFinite(x0)) return mesh;
  const w = Math.max(x1 - x0, (y1 - y0) * 0.5, 1e-12);
  const h = Math.max(y1 - y0, (x1 - x0) * 0.5, 1e-12);
  const m = 0.35;
  return {
    x0: Math.max(mesh.x0, x0 - m * w),
    x1: Math.min(mesh.x1, x1 + m * w),
    y0: Math.max(mesh.y0, y0 - m * h),
    y1: Math.min(mesh.y1, y1 + m * h),
  };
}

export function defaultDrive(result: SectionResult): Drive {
  return { volts: result.nets.map((_, k) => (k === 0 ? 1 : 0)) };
}

export function buildFieldModel(
  result: SectionResult,
  fields: SectionFields,
  section: ResolvedSection | null,
  drive: Drive,
  opts: { levels?: number; linesPerNet?: number } = {},
): FieldModel {
  const { levels = 9, linesPerNet = 28 } = opts;
  const unit = section ? METRES_PER_UNIT[section.units] : 1;
  const grid = makeGrid(fields.xs, fields.ys);
  const phi = fields.potentials.length === 1 ? scaled(fields.potentials[0]!, drive.volts[0] ?? 1) : superpose(fields.potentials, drive.volts);
  let phiMin = Infinity;
  let phiMax = -Infinity;
  for (let q = 0; q < phi.length; q++) {
    const v = phi[q]!;
    if (v < phiMin) phiMin = v;
    if (v > phiMax) phiMax = v;
  }
  const cells = cellField(grid, phi);
  const { nx, ny } = grid;
  const cx = nx - 1;
  const conductorCell = new Uint8Array(cx * (ny - 1));
  const nn = fields.nodeNet;
  for (let j = 0; j < ny - 1; j++) {
    for (let i = 0; i < cx; i++) {
      const k = j * nx + i;
      if (nn[k]! !== -1 && nn[k + 1]! !== -1 && nn[k + nx]! !== -1 && nn[k + nx + 1]! !== -1) conductorCell[j * cx + i] = 1;
    }
  }
  const free = (c: number) => conductorCell[c] === 0;
  const peak = peakField(grid, cells, free);
  const focus = structureRect(section, fields, unit);
  const inFocus = (c: number) => {
    if (!free(c)) return false;
    const i = c % cx;
    const j = (c - i) / cx;
    const x = grid.xs[i]!;
    const y = grid.ys[j]!;
    return x >= focus.x0 && x <= focus.x1 && y >= focus.y0 && y <= focus.y1;
  };
  // The parts only some views need are computed on first use and kept (not per frame).
  let eRange: { clip: number; floor: number } | null = null;
  const range = () => {
    if (!eRange) {
      let clip = quantile(cells.mag, 0.99, inFocus);
      if (!(clip > 0)) clip = peak?.mag ?? 1;
      let floor = quantile(cells.mag, 0.05, inFocus);
      if (!(floor > 0) || floor >= clip) floor = clip * 1e-3;
      eRange = { clip, floor };
    }
    return eRange;
  };
  let iso: IsoLine[] | null = null;
  let lines: Float64Array[] | null = null;
  let smooth: SmoothField | null = null;
  return {
    grid,
    unit,
    phi,
    phiMin,
    phiMax,
    cells,
    conductorCell,
    peak,
    get smooth() {
      return (smooth ??= smoothField(grid, cells, nn, conductorCell, fields.cellEpsR));
    },
    get eClip() {
      return range().clip;
    },
    get eFloor() {
      return range().floor;
    },
    get iso() {
      if (!iso) {
        const span = phiMax - phiMin;
        const lv: number[] = [];
        if (span > 0) for (let q = 1; q <= levels; q++) lv.push(phiMin + (q / (levels + 1)) * span);
        iso = isoLines(grid, phi, lv);
      }
      return iso;
    },
    get lines() {
      if (!lines) {
        // nodeNet holds indices into the section's nets; the drive is per signal net (matrix order)
        let maxNet = -1;
        for (let q = 0; q < nn.length; q++) if (nn[q]! > maxNet) maxNet = nn[q]!;
        const voltsByNodeNet = new Array<number>(Math.max(0, maxNet + 1)).fill(0);
        result.nets.forEach((name, k) => {
          const idx = nodeNetIndexOf(section, fields.netNames, name, k);
          if (idx >= 0 && idx < voltsByNodeNet.length) voltsByNodeNet[idx] = drive.volts[k] ?? 0;
        });
        lines = fieldLines(grid, phi, cells, nn, voltsByNodeNet, { linesPerNet });
      }
      return lines;
    },
    focus,
    meshRect: { x0: grid.xs[0]!, y0: grid.ys[0]!, x1: grid.xs[nx - 1]!, y1: grid.ys[ny - 1]! },
  };
}

function scaled(p: Float64Array, v: number): Float64Array {
  if (v === 1) return p;
  const out = new Float64Array(p.length);
  for (let q = 0; q < p.length; q++) out[q] = v * p[q]!;
  return out;
}

/**
 * The nodeNet value of signal net `name` (matrix position k): its index in the engine's
 * `netNames` when known, else among the section's nets, else position k.
 */
export function nodeNetIndexOf(section: ResolvedSection | null, netNames: readonly string[] | undefined, name: string, k: number): number {
  if (netNames) {
    const i = netNames.indexOf(name);
    if (i >= 0) return i;
  }
  if (!section) return k;
  const idx = section.nets.findIndex((n) => n.name === name);
  return idx >= 0 ? idx : k;
}

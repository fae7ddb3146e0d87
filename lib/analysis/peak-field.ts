/**
 * Peak electric field for a voltage the user enters: the largest |E| in each material and
 * along each conductor of the finest mesh, where it is, and the margin against the
 * material's typical dielectric strength.
 *
 * |E| per cell from the four node potentials (the mean of the two edge differences in x and
 * in y: the cell-centre gradient of the bilinear interpolant). A peak that grows when the
 * cells get smaller belongs to a singular corner or edge (E ~ r^(π/β − 1) near a conducting
 * wedge: Jackson, Classical Electrodynamics, 3rd ed., §2.11): the same peak is taken over cells
 * twice as large (the coarser member of the mesh family) and a ratio above 1.1 flags it.
 * Its value then depends on the mesh; a rounded corner is the remedy.
 */
import type { PeakFieldEntry, SectionFields, SectionResult } from '../engine/types';
import { METRES_PER_UNIT, type ResolvedSection } from '../section/schema';
import { CELL_CONDUCTOR, cellMaterialMap } from './cell-material';
import { shapeAreaThickness } from './losses';

export const FIELD_CAUTION =
  '2D quasi-static model; sharp corners are singular, so peak values depend on the mesh; not a substitute for clearance, creepage and insulation standards (for example IEC 60664-1), local codes or licensed practice.';

/** Ratio of fine to coarse peak above which the peak is called singular (common practice, no published source). */
export const SINGULAR_RATIO = 1.1;

export interface PeakFieldOptions {
  /** Voltage of the first signal net (others at 0 V) unless `voltages` is given. */
  volts: number;
  /** Voltage of each signal net by name; nets left out are at 0 V. */
  voltages?: Record<string, number>;
}

interface Peak {
  v: number;
  x: number;
  y: number;
  cell: number;
}

function scan(
  xs: Float64Array,
  ys: Float64Array,
  phi: Float64Array,
  nodeNet: Int16Array,
  mat: Int16Array,
  step: number,
  nxFine: number,
): { byMaterial: Map<number, Peak>; byNet: Map<number, Peak> } {
  const byMaterial = new Map<number, Peak>();
  const byNet = new Map<number, Peak>();
  const nx = xs.length;
  const ny = ys.length;
  const I: number[] = [];
  for (let i = 0; i < nx; i += step) I.push(i);
  if (I[I.length - 1] !== nx - 1) I.push(nx - 1);
  const J: number[] = [];
  for (let j = 0; j < ny; j += step) J.push(j);
  if (J[J.length - 1] !== ny - 1) J.push(ny - 1);
  const put = (map: Map<number, Peak>, key: number, v: number, x: number, y: number, cell: number) => {
    const p = map.get(key);
    if (!p || v > p.v) map.set(key, { v, x, y, cell });
  };
  for (let b = 0; b + 1 < J.length; b++) {
    const j0 = J[b]!, j1 = J[b + 1]!;
    const hy = ys[j1]! - ys[j0]!;
    for (let a = 0; a + 1 < I.length; a++) {
      const i0 = I[a]!, i1 = I[a + 1]!;
      const hx = xs[i1]! - xs[i0]!;
      const k00 = j0 * nx + i0, k10 = j0 * nx + i1, k01 = j1 * nx + i0, k11 = j1 * nx + i1;
      const ex = (phi[k10]! - phi[k00]! + phi[k11]! - phi[k01]!) / (2 * hx);
      const ey = (phi[k01]! - phi[k00]! + phi[k11]! - phi[k10]!) / (2 * hy);
      const e = Math.hypot(ex, ey);
      if (!(e > 0)) continue;
      const xc = 0.5 * (xs[i0]! + xs[i1]!);
      const yc = 0.5 * (ys[j0]! + ys[j1]!);
      // materials of the fine cells inside this cell
      for (let jj = j0; jj < j1; jj++)
        for (let ii = i0; ii < i1; ii++) {
          const c = jj * (nxFine - 1) + ii;
          const m = mat[c]!;
          if (m !== CELL_CONDUCTOR) put(byMaterial, m, e, xc, yc, c);
        }
      const cell = j0 * (nxFine - 1) + i0;
      for (const kk of [k00, k10, k01, k11]) {
        const net = nodeNet[kk]!;
        if (net !== -1) put(byNet, net, e, xc, yc, cell);
      }
    }
  }
  return { byMaterial, byNet };
}

/** Peak |E| per material and per conductor for the given voltages (volts on the first signal net by default). */
export function computePeakField(
  section: ResolvedSection,
  result: SectionResult,
  fields: SectionFields,
  opts: PeakFieldOptions,
): { entries: PeakFieldEntry[]; voltages: Record<string, number> } {
  if (!Number.isFinite(opts.volts)) throw new RangeError('the voltage must be a finite number');
  const { xs, ys, nodeNet } = fields;
  const netNames = fields.netNames ?? result.nets;
  const voltages: Record<string, number> = {};
  result.nets.forEach((n, i) => (voltages[n] = opts.voltages ? (opts.voltages[n] ?? 0) : i === 0 ? opts.volts : 0));
  const N = xs.length * ys.length;
  const phi = new Float64Array(N);
  result.nets.forEach((n, m) => {
    const v = voltages[n]!;
    if (v === 0) return;
    const p = fields.potentials[m]!;
    for (let k = 0; k < N; k++) phi[k]! += v * p[k]!;
  });
  const mat = cellMaterialMap(section, xs, ys);
  const fine = scan(xs, ys, phi, nodeNet, mat, 1, xs.length);
  const coarse = scan(xs, ys, phi, nodeNet, mat, 2, xs.length);

  const k = METRES_PER_UNIT[section.units];
  let minThickness = Infinity;
  let minStrip = Infinity;
  for (const s of section.shapes) {
    if (s.conductor === undefined) continue;
    const t = shapeAreaThickness(s).thickness * k;
    if (t > 0) minThickness = Math.min(minThickness, t);
    else if (s.type === 'strip') minStrip = Math.min(minStrip, Math.hypot(s.x2 - s.x1, s.y2 - s.y1) * k);
  }
  const radius = 0.1 * (Number.isFinite(minThickness) ? minThickness : minStrip);

  const strengthOf = (m: number) => {
    if (m < 0) return undefined;
    const kv = section.materials[m]?.breakdownKVPerMm;
    return kv !== undefined && kv > 0 ? kv * 1e6 : undefined;
  };
  const entry = (where: string, kind: 'material' | 'conductor', p: Peak, c: Peak | undefined, m: number): PeakFieldEntry => {
    const singular = c !== undefined && p.v > SINGULAR_RATIO * c.v;
    const strength = strengthOf(m);
    return {
      where,
      kind,
      vPerM: p.v,
      x: p.x,
      y: p.y,
      singular,
      ...(strength !== undefined ? { strengthVPerM: strength, margin: strength / p.v } : {}),
      ...(singular && Number.isFinite(radius) ? { suggestedCornerRadiusM: radius } : {}),
      ...(c ? { coarserVPerM: c.v } : {}),
    };
  };
  const entries: PeakFieldEntry[] = [];
  const mats = [...fine.byMaterial.keys()].sort((a, b) => a - b);
  for (const m of mats) {
    const where = m >= 0 ? section.materials[m]!.id : 'background';
    entries.push(entry(where, 'material', fine.byMaterial.get(m)!, coarse.byMaterial.get(m), m));
  }
  const nets = [...fine.byNet.keys()].sort((a, b) => (a === -2 ? 1 : b === -2 ? -1 : a - b));
  for (const n of nets) {
    const p = fine.byNet.get(n)!;
    const where = n === -2 ? '(boundary)' : netNames[n]!;
    entries.push(entry(where, 'conductor', p, coarse.byNet.get(n), mat[p.cell] ?? -1));
  }
  return { entries, voltages };
}

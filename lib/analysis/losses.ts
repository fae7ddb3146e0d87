/**
 * Losses of a line at one frequency, from the finest-mesh fields (quasi-TEM, small losses).
 *
 * Dielectric: G_ij = ω Σ_k tanδ_k ε_k ∫_k ∇φ_i·∇φ_j dA — each material's share of the stored
 * energy (REFERENCES §5; homogeneous line: G = ω C tanδ exactly). The cell sums give the share
 * W_ij/E_ij, which scales the reported (extrapolated) C_ij, so a homogeneous line gives
 * G = ω C tanδ to round-off.
 *
 * Conductor: the incremental-inductance rule of Wheeler (Proc. IRE 30:412, 1942) in its
 * surface-current form R = Rs ∮ J² dl / I², Rs = √(π f μ0 / σ), with J = c·σ_s from the
 * vacuum solve's surface charge (the current of a TEM line follows the charge of the
 * vacuum problem). For several nets, the current of line i with the others carrying none
 * is J⁽ⁱ⁾ = Σ_m (C0⁻¹)_mi σ⁽ᵐ⁾, returning on the reference, and R_ij = Σ Rs J⁽ⁱ⁾ J⁽ʲ⁾ dl.
 * Exact for a coax: R = Rs/(2π)·(1/a + 1/b) (Pozar 2012, Microwave Engineering, 4th ed., §2.7).
 * Surface field: on each link from a free node into a conductor, the potential difference
 * over the true distance to the surface (Shortley & Weller 1938) is E_n·|n_x| (or |n_y|), n
 * the surface normal of the shape there; ∮ E_n² dl is the sum over links of that squared
 * difference quotient × dual face / (|n_x|³ + |n_y|³) (each surface point counted by the x
 * and y links crossing it, weighted n_x² and n_y²). Valid only where the skin depth is
 * small against thickness and corner radii; warnings say where it is not.
 *
 * Attenuation: α = (R/(2Z0) + G·Z0/2) · 8.686 dB/Np for one line; for several lines, per
 * mode, the power lost per length over twice the power carried (½IᵀRI + ½vᵀGv)/(vᵀI).
 */
import { Matrix, inverse } from 'ml-matrix';
import { insideGeometry } from '../fdm/index';
import type { LossValues, SectionFields, SectionResult } from '../engine/types';
import { shapeGeometry } from '../engine/to-problem';
import type { Geometry } from '../fdm/index';
import { METRES_PER_UNIT, type ResolvedSection, type ResolvedShape } from '../section/schema';
import { polygonArea, polygonPerimeter } from '../section/geometry';
import { cellMaterialMap } from './cell-material';
import { C_LIGHT, COPPER_S_PER_M, EPS0, MU0 } from './constants';
import { modalAnalysis } from './lines';

export const NP_TO_DB = 20 / Math.LN10; // 8.686 dB per neper

export const skinDepth = (frequencyHz: number, conductivity: number): number => 1 / Math.sqrt(Math.PI * frequencyHz * MU0 * conductivity);
export const surfaceResistance = (frequencyHz: number, conductivity: number): number => Math.sqrt((Math.PI * frequencyHz * MU0) / conductivity);

const BOUNDARY = '(boundary)';

/** Cross-section area (section units²) and a thickness measure (2A/P; 0 for strips) of a conductor shape. */
export function shapeAreaThickness(s: ResolvedShape): { area: number; thickness: number } {
  switch (s.type) {
    case 'rect':
      return { area: s.width * s.height, thickness: Math.min(s.width, s.height) };
    case 'circle':
      return { area: Math.PI * s.r * s.r, thickness: 2 * s.r };
    case 'ring':
      return { area: Math.PI * (s.rOuter ** 2 - s.rInner ** 2), thickness: s.rOuter - s.rInner };
    case 'strip':
      return { area: 0, thickness: 0 };
    case 'polygon': {
      const a = Math.abs(polygonArea(s.points));
      return { area: a, thickness: (2 * a) / polygonPerimeter(s.points) };
    }
  }
}

/** Energy-weighted cell sums for every signal pair: E_ij = Σ εr Q_ij, W_ij = Σ tanδ εr Q_ij. */
function energyShares(section: ResolvedSection, fields: SectionFields): { E: number[][]; W: number[][] } {
  const { xs, ys, potentials } = fields;
  const nx = xs.length;
  const ny = ys.length;
  const mat = cellMaterialMap(section, xs, ys, { conductors: false });
  const epsOf = (m: number) => (m >= 0 ? section.materials[m]!.epsR : section.background.epsR);
  const tanOf = (m: number) => (m >= 0 ? (section.materials[m]!.lossTangent ?? 0) : (section.background.lossTangent ?? 0));
  const S = potentials.length;
  const E = Array.from({ length: S }, () => new Array<number>(S).fill(0));
  const W = Array.from({ length: S }, () => new Array<number>(S).fill(0));
  const gx = new Float64Array(2 * S);
  const gy = new Float64Array(2 * S);
  for (let j = 0; j < ny - 1; j++) {
    const hy = ys[j + 1]! - ys[j]!;
    for (let i = 0; i < nx - 1; i++) {
      const hx = xs[i + 1]! - xs[i]!;
      const k = j * nx + i;
      const m = mat[j * (nx - 1) + i]!;
      const eps = epsOf(m);
      const tan = tanOf(m);
      for (let a = 0; a < S; a++) {
        const p = potentials[a]!;
        gx[2 * a] = (p[k + 1]! - p[k]!) / hx;
        gx[2 * a + 1] = (p[k + nx + 1]! - p[k + nx]!) / hx;
        gy[2 * a] = (p[k + nx]! - p[k]!) / hy;
        gy[2 * a + 1] = (p[k + nx + 1]! - p[k + 1]!) / hy;
      }
      const area = hx * hy;
      for (let a = 0; a < S; a++) {
        for (let b = a; b < S; b++) {
          const q = 0.5 * area * (gx[2 * a]! * gx[2 * b]! + gx[2 * a + 1]! * gx[2 * b + 1]! + gy[2 * a]! * gy[2 * b]! + gy[2 * a + 1]! * gy[2 * b + 1]!);
          E[a]![b]! += eps * q;
          W[a]![b]! += tan * eps * q;
        }
      }
    }
  }
  for (let a = 0; a < S; a++)
    for (let b = 0; b < a; b++) {
      E[a]![b] = E[b]![a]!;
      W[a]![b] = W[b]![a]!;
    }
  return { E, W };
}

/** Dielectric conductance matrix (Maxwell form) of the drawn part, S/m. */
export function conductanceMatrix(section: ResolvedSection, result: SectionResult, fields: SectionFields, frequencyHz: number): number[][] {
  const { E, W } = energyShares(section, fields);
  const w = 2 * Math.PI * frequencyHz;
  const C = result.capacitance.maxwell;
  return C.map((row, i) =>
    row.map((cij, j) => {
      const eij = E[i]![j]!;
      const scale = Math.sqrt(Math.abs(E[i]![i]! * E[j]![j]!));
      if (Math.abs(eij) > 1e-9 * scale) return w * cij * (W[i]![j]! / eij);
      return w * EPS0 * W[i]![j]!;
    }),
  );
}

interface SurfaceLink {
  /** owner: problem net index, or −2 for ground boundary planes */
  owner: number;
  /** dual-face length of the link, m */
  face: number;
  /** quadrature weight of the link for ∮ E_n² dl, m: face / (|n_x|³ + |n_y|³) */
  weight: number;
  /** potential difference over the distance to the surface, per volt of each excitation, 1/m */
  grad: Float64Array;
}

/** Outward normal (up to sign) of a conductor shape at a surface point, as |n_x|, |n_y|. */
function surfaceNormal(g: Geometry, x: number, y: number, linkHorizontal: boolean): [number, number] {
  switch (g.type) {
    case 'circle':
    case 'ring': {
      const dx = x - g.cx, dy = y - g.cy;
      const r = Math.hypot(dx, dy) || 1;
      return [Math.abs(dx) / r, Math.abs(dy) / r];
    }
    case 'rect': {
      const dl = Math.abs(x - g.x), dr = Math.abs(x - (g.x + g.width));
      const db = Math.abs(y - g.y), dt = Math.abs(y - (g.y + g.height));
      const dxm = Math.min(dl, dr), dym = Math.min(db, dt);
      if (Math.abs(dxm - dym) <= 1e-9 * (g.width + g.height)) return linkHorizontal ? [1, 0] : [0, 1];
      return dxm < dym ? [1, 0] : [0, 1];
    }
    case 'strip': {
      const horizontalStrip = g.y1 === g.y2;
      // a link along the strip meets its end; a link across it meets its face
      if (horizontalStrip) return linkHorizontal ? [1, 0] : [0, 1];
      return linkHorizontal ? [1, 0] : [0, 1];
    }
    case 'polygon': {
      let best = Infinity;
      let n: [number, number] = linkHorizontal ? [1, 0] : [0, 1];
      const pts = g.points;
      for (let k = 0; k < pts.length; k++) {
        const [ax, ay] = pts[k]!;
        const [bx, by] = pts[(k + 1) % pts.length]!;
        const ex = bx - ax, ey = by - ay;
        const l2 = ex * ex + ey * ey;
        if (!(l2 > 0)) continue;
        const t = Math.max(0, Math.min(1, ((x - ax) * ex + (y - ay) * ey) / l2));
        const d = Math.hypot(ax + t * ex - x, ay + t * ey - y);
        if (d < best) {
          best = d;
          const l = Math.sqrt(l2);
          n = [Math.abs(ey) / l, Math.abs(ex) / l];
        }
      }
      return n;
    }
  }
}

/** Links from free nodes into conductors, with the vacuum gradient of each excitation. */
function surfaceLinks(section: ResolvedSection, result: SectionResult, fields: SectionFields): SurfaceLink[] {
  const { xs, ys, nodeNet } = fields;
  const pots = fields.vacuumPotentials ?? fields.potentials;
  const netNames = fields.netNames ?? result.nets;
  const nx = xs.length;
  const ny = ys.length;
  const S = result.nets.length;
  const sigIdx = result.nets.map((n) => netNames.indexOf(n));
  const k = METRES_PER_UNIT[section.units];
  const shapesByNet = new Map<number, Geometry[]>();
  for (const s of section.shapes) {
    if (s.conductor === undefined) continue;
    const idx = netNames.indexOf(s.conductor);
    if (idx < 0) continue;
    if (!shapesByNet.has(idx)) shapesByNet.set(idx, []);
    shapesByNet.get(idx)!.push(shapeGeometry(s, k));
  }
  const span = Math.max(xs[nx - 1]! - xs[0]!, ys[ny - 1]! - ys[0]!);
  const tol = 1e-12 * span;
  const hit = (net: number, x: number, y: number) => (shapesByNet.get(net) ?? []).find((g) => insideGeometry(g, x, y, tol));
  const dual = (a: Float64Array, i: number) => 0.5 * ((i + 1 < a.length ? a[i + 1]! : a[i]!) - (i > 0 ? a[i - 1]! : a[i]!));
  const links: SurfaceLink[] = [];
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const ka = j * nx + i;
      if (nodeNet[ka] !== -1) continue;
      const visit = (kb: number, bi: number, bj: number, horizontal: boolean) => {
        const owner = nodeNet[kb]!;
        if (owner === -1) return;
        const ax = xs[i]!, ay = ys[j]!, bx = xs[bi]!, by = ys[bj]!;
        const len = Math.abs(bx - ax) + Math.abs(by - ay);
        let d = len;
        let n: [number, number] = horizontal ? [1, 0] : [0, 1];
        const g = owner >= 0 ? hit(owner, bx, by) : undefined;
        if (g) {
          let lo = 0, hi = 1;
          for (let it = 0; it < 40; it++) {
            const t = 0.5 * (lo + hi);
            if (insideGeometry(g, ax + t * (bx - ax), ay + t * (by - ay), tol)) hi = t;
            else lo = t;
          }
          d = Math.max(hi * len, 1e-3 * len);
          n = surfaceNormal(g, ax + hi * (bx - ax), ay + hi * (by - ay), horizontal);
        }
        const face = horizontal ? dual(ys, j) : dual(xs, i);
        const grad = new Float64Array(S);
        for (let m = 0; m < S; m++) grad[m] = ((owner === sigIdx[m] ? 1 : 0) - pots[m]![ka]!) / d;
        links.push({ owner, face, weight: face / (n[0] ** 3 + n[1] ** 3), grad });
      };
      if (i > 0) visit(ka - 1, i - 1, j, true);
      if (i < nx - 1) visit(ka + 1, i + 1, j, true);
      if (j > 0) visit(ka - nx, i, j - 1, false);
      if (j < ny - 1) visit(ka + nx, i, j + 1, false);
    }
  }
  return links;
}

export interface LossOptions {
  frequencyHz: number;
}

/** Losses of the solved section at one frequency. `fields` must be the finest-mesh fields of the same solve. */
export function computeLosses(section: ResolvedSection, result: SectionResult, fields: SectionFields, opts: LossOptions): LossValues {
  const f = opts.frequencyHz;
  if (!(f > 0) || !Number.isFinite(f)) throw new RangeError('the frequency must be a positive number of hertz');
  const S = result.nets.length;
  const netNames = fields.netNames ?? result.nets;
  const sigIdx = result.nets.map((n) => netNames.indexOf(n));
  const factor = result.symmetry?.factor ?? 1;
  const warnings: string[] = [];
  const k = METRES_PER_UNIT[section.units];

  // ---- conductivity, skin depth, thickness per net
  const sigma = (name: string) => section.nets.find((n) => n.name === name)?.conductivitySPerM ?? COPPER_S_PER_M;
  const skinDepthM: Record<string, number> = {};
  const surfaceResistanceOhm: Record<string, number> = {};
  for (const name of netNames) {
    skinDepthM[name] = skinDepth(f, sigma(name));
    surfaceResistanceOhm[name] = surfaceResistance(f, sigma(name));
  }
  const hasPlane = fields.nodeNet.some((v) => v === -2);
  if (hasPlane) {
    skinDepthM[BOUNDARY] = skinDepth(f, COPPER_S_PER_M);
    surfaceResistanceOhm[BOUNDARY] = surfaceResistance(f, COPPER_S_PER_M);
  }
  let sharpCorners = false;
  const strips = new Set<string>();
  for (const s of section.shapes) {
    if (s.conductor === undefined) continue;
    const { thickness } = shapeAreaThickness(s);
    const delta = skinDepthM[s.conductor];
    if (delta === undefined) continue;
    if (s.type === 'strip') strips.add(s.conductor);
    else if (thickness * k < 3 * delta)
      warnings.push(
        `shape "${s.id}" (net ${s.conductor}): the skin depth ${(delta * 1e6).toPrecision(3)} µm is not small against its thickness ${(thickness * k * 1e6).toPrecision(3)} µm: the surface rule then gives too low an R' (the real value is at least the DC value)`,
      );
    if (s.type === 'rect' || s.type === 'polygon') sharpCorners = true;
  }
  for (const n of strips)
    warnings.push(`net ${n} has zero-thickness strips: the edge current of an infinitely thin strip is singular, so its R' grows with mesh refinement; give the conductor its real thickness`);
  if (sharpCorners)
    warnings.push('sharp conductor corners: the rule assumes corner radii of several skin depths; current crowding at a sharp corner is overstated slightly and depends on the mesh');

  // ---- G
  const Gd = conductanceMatrix(section, result, fields, f);

  // ---- R
  const links = surfaceLinks(section, result, fields);
  const C0 = Array.from({ length: S }, () => new Array<number>(S).fill(0));
  for (const l of links) {
    const r = sigIdx.indexOf(l.owner);
    if (r < 0) continue;
    for (let m = 0; m < S; m++) C0[r]![m]! += EPS0 * l.face * l.grad[m]!;
  }
  const C0sym = C0.map((row, i) => row.map((v, j) => 0.5 * (v + C0[j]![i]!)));
  const Cinv = inverse(new Matrix(C0sym)).to2DArray();
  const Rd = Array.from({ length: S }, () => new Array<number>(S).fill(0));
  const J = new Float64Array(S);
  for (const l of links) {
    const name = l.owner === -2 ? BOUNDARY : netNames[l.owner]!;
    const rs = surfaceResistanceOhm[name] ?? surfaceResistance(f, COPPER_S_PER_M);
    // surface current density of unit current on line i: J = c·σ, σ = ε0 E_n
    for (let i = 0; i < S; i++) {
      let s = 0;
      for (let m = 0; m < S; m++) s += Cinv[m]![i]! * EPS0 * l.grad[m]!;
      J[i] = s;
    }
    for (let i = 0; i < S; i++) for (let j = 0; j < S; j++) Rd[i]![j]! += rs * J[i]! * J[j]! * l.weight;
  }

  // ---- DC resistance of each signal net's own conductors
  const rDcPerM = result.nets.map((name) => {
    let area = 0;
    for (const s of section.shapes) if (s.conductor === name) area += shapeAreaThickness(s).area * k * k;
    return area > 0 ? 1 / (sigma(name) * area) : null;
  });

  // ---- attenuation
  let alphaDbPerM: number | number[];
  let gPerM: number | number[][];
  let rPerM: number | number[][];
  if (S === 1) {
    const G = Gd[0]![0]! * factor;
    const R = Rd[0]![0]! / factor;
    const z0 = result.line?.z0Ohm ?? 1 / (C_LIGHT * Math.sqrt(result.capacitance.maxwell[0]![0]! * result.capacitance.vacuum[0]![0]!)) / factor;
    gPerM = G;
    rPerM = R;
    alphaDbPerM = (R / (2 * z0) + (G * z0) / 2) * NP_TO_DB;
  } else {
    gPerM = Gd;
    rPerM = Rd;
    const modes = modalAnalysis(result.capacitance.maxwell, result.capacitance.vacuum);
    if (S === 2) {
      // even (voltages share a sign) first, then odd, as in "modes"
      modes.sort((a, b) => Number(b.voltages[0]! * b.voltages[1]! > 0) - Number(a.voltages[0]! * a.voltages[1]! > 0));
    }
    const C0m = result.capacitance.vacuum;
    alphaDbPerM = modes.map((m) => {
      const v = m.voltages;
      const I = C0m.map((row) => row.reduce((acc, c, j) => acc + c * v[j]!, 0) * C_LIGHT * Math.sqrt(m.epsEff));
      let p0 = 0, pr = 0, pg = 0;
      for (let i = 0; i < S; i++) {
        p0 += v[i]! * I[i]!;
        for (let j = 0; j < S; j++) {
          pr += I[i]! * Rd[i]![j]! * I[j]!;
          pg += v[i]! * Gd[i]![j]! * v[j]!;
        }
      }
      return ((0.5 * (pr + pg)) / p0) * NP_TO_DB;
    });
  }
  return {
    frequencyHz: f,
    gPerM,
    rPerM,
    alphaDbPerM,
    rDcPerM,
    skinDepthM,
    surfaceResistanceOhm,
    warnings,
    method:
      "G' from each material's loss tangent by its share of the stored energy; R' by Wheeler's incremental-inductance rule (surface-current form, Rs = √(πfμ0/σ), current from the vacuum surface charge, return on the reference); α = R/(2Z0) + G·Z0/2 (per mode for several lines). " +
      (S === 1 && factor !== 1 ? 'Values are for the whole mirrored structure. ' : S > 1 && factor !== 1 ? 'Matrices are those of the drawn part (as the capacitance matrix). ' : '') +
      'Quasi-TEM, small losses; conductors are assumed much thicker than the skin depth.',
  };
}

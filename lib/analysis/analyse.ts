/**
 * Multi-conductor line values added to every result with signal nets: the inductance matrix
 * L = μ0 ε0 C0⁻¹, the even/odd modes of a pair, the modal analysis of three or more nets, and
 * weak-coupling crosstalk between neighbouring nets (formulas and sources in lines.ts).
 * With a mirror boundary the matrices are scaled to the whole structure first, as the
 * single-line values are (lib/engine/solve-section.ts).
 */
import type { CrosstalkEntry, SectionResult } from '../engine/types';
import { coupledPair, crosstalk, inductanceMatrix, modalAnalysis } from './lines';

export interface LineAnalysisOptions {
  /** Coupled length for the far-end crosstalk figure, m. */
  lengthM?: number;
  /** Rise time for the crosstalk figures, s. */
  riseTimeS?: number;
}

export type LineAnalysis = Pick<SectionResult, 'inductancePerM' | 'modes' | 'modal' | 'crosstalk'>;

export function lineAnalysis(result: SectionResult, opts: LineAnalysisOptions = {}): LineAnalysis {
  const n = result.nets.length;
  const out: LineAnalysis = {};
  if (n === 0) return out;
  const f = result.symmetry?.factor ?? 1;
  const C = result.capacitance.maxwell.map((r) => r.map((v) => v * f));
  const C0 = result.capacitance.vacuum.map((r) => r.map((v) => v * f));
  try {
    out.inductancePerM = inductanceMatrix(C0);
  } catch {
    return out; // singular vacuum matrix: leave the line values out rather than print nonsense
  }
  if (n === 2) {
    const p = coupledPair(C, C0);
    out.modes = { even: p.even, odd: p.odd, differentialOhm: p.differentialOhm, commonOhm: p.commonOhm, symmetric: p.symmetric };
  } else if (n > 2) {
    out.modal = modalAnalysis(C, C0).map((m) => ({ z0Ohm: m.z0Ohm, epsEff: m.epsEff, voltages: m.voltages }));
  }
  if (n >= 2) {
    const entries: CrosstalkEntry[] = [];
    for (let a = 0; a < n; a++) {
      for (let b = 0; b < n; b++) {
        if (a === b) continue;
        // neighbours only for large sets: the strongest-coupled victim of each aggressor
        if (n > 2) {
          let best = -1;
          let bestC = -Infinity;
          for (let k = 0; k < n; k++) if (k !== a && -C[a]![k]! > bestC) { bestC = -C[a]![k]!; best = k; }
          if (b !== best) continue;
        }
        const x = crosstalk(C, C0, a, b, opts);
        entries.push({
          aggressor: result.nets[a]!,
          victim: result.nets[b]!,
          nearEnd: x.nearEnd,
          farEndPerLength: x.farEndPerLength,
          ...(opts.lengthM !== undefined ? { lengthM: opts.lengthM } : {}),
          ...(opts.riseTimeS !== undefined ? { riseTimeS: opts.riseTimeS } : {}),
          ...(x.farEnd !== undefined ? { farEnd: x.farEnd } : {}),
          ...(x.saturationLengthM !== undefined ? { saturationLengthM: x.saturationLengthM } : {}),
        });
      }
    }
    out.crosstalk = entries;
  }
  return out;
}

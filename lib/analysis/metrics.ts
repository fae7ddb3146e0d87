/**
 * Result values that sweeps chart and goal seek aims at: one id, a label, a display unit with
 * its factor from SI, and a getter on the result JSON (undefined when the result lacks it).
 */
import type { SectionResult } from '../engine/types';

export interface Metric {
  id: string;
  label: string;
  /** Display unit and the SI value per display unit. */
  unit: string;
  factor: number;
  get(r: SectionResult): number | undefined;
}

const maxPeak = (r: SectionResult) => (r.peakField?.length ? Math.max(...r.peakField.map((p) => p.vPerM)) : undefined);

export const METRICS: readonly Metric[] = [
  { id: 'c11', label: 'C11 (Maxwell, first net)', unit: 'pF/m', factor: 1e-12, get: (r) => r.capacitance.maxwell[0]?.[0] },
  { id: 'z0', label: 'Z0', unit: 'Ω', factor: 1, get: (r) => r.line?.z0Ohm },
  { id: 'epsEff', label: 'εeff', unit: '', factor: 1, get: (r) => r.line?.epsEff },
  { id: 'lineC', label: "C' (line)", unit: 'pF/m', factor: 1e-12, get: (r) => r.line?.capacitancePerM },
  { id: 'lineL', label: "L' (line)", unit: 'nH/m', factor: 1e-9, get: (r) => r.line?.inductancePerM },
  { id: 'delay', label: 'delay', unit: 'ns/m', factor: 1e-9, get: (r) => r.line?.delaySPerM },
  { id: 'platesSolved', label: 'plates C (solved)', unit: 'pF/m', factor: 1e-12, get: (r) => r.plates?.solvedPerM },
  { id: 'solvedOverIdeal', label: 'solved / ideal', unit: '', factor: 1, get: (r) => r.plates?.solvedOverIdeal },
  { id: 'zDiff', label: 'Z differential', unit: 'Ω', factor: 1, get: (r) => r.modes?.differentialOhm },
  { id: 'zCommon', label: 'Z common mode', unit: 'Ω', factor: 1, get: (r) => r.modes?.commonOhm },
  { id: 'zEven', label: 'Z even', unit: 'Ω', factor: 1, get: (r) => r.modes?.even.z0Ohm },
  { id: 'zOdd', label: 'Z odd', unit: 'Ω', factor: 1, get: (r) => r.modes?.odd.z0Ohm },
  { id: 'alpha', label: 'attenuation', unit: 'dB/m', factor: 1, get: (r) => (typeof r.losses?.alphaDbPerM === 'number' ? r.losses.alphaDbPerM : undefined) },
  { id: 'peak', label: 'peak |E| (mesh-dependent at sharp corners)', unit: 'kV/mm', factor: 1e6, get: maxPeak },
  { id: 'error', label: 'estimated relative error', unit: '%', factor: 0.01, get: (r) => r.errorEstimate.relative },
];

export const metricById = (id: string): Metric => {
  const m = METRICS.find((x) => x.id === id);
  if (!m) throw new RangeError(`unknown result value "${id}"`);
  return m;
};

/** The metrics a result actually has. */
export const availableMetrics = (r: SectionResult): Metric[] => METRICS.filter((m) => m.get(r) !== undefined);

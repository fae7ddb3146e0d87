/**
 * Goal seek: the value of a named dimension (section variable) that gives a target result
 * (Z0, capacitance, differential impedance, peak field), by bracketed root finding
 * (root.ts, Brent 1973). Each evaluation is one full solve.
 */
import type { SectionResult } from '../engine/types';
import type { Section } from '../section/schema';
import { metricById } from './metrics';
import { findRoot, TargetNotReachableError } from './root';
import { applySweepValue } from './sweep';

export const GOAL_METRICS = ['z0', 'c11', 'zDiff', 'peak'] as const;
export type GoalMetric = (typeof GOAL_METRICS)[number];

export interface GoalSeekRequest {
  section: Section;
  variable: string;
  lo: number;
  hi: number;
  metric: GoalMetric;
  /** Target in SI units (Ω, F/m, V/m). */
  target: number;
  /** Relative tolerance on the result. @default 1e-4 */
  relTolerance?: number;
  /** @default 30 */
  maxEvaluations?: number;
}

export interface GoalSeekEvaluation {
  value: number;
  metric: number;
}

export type GoalSeekOutcome =
  | { ok: true; value: number; achieved: number; evaluations: GoalSeekEvaluation[]; converged: boolean; result: SectionResult }
  | { ok: false; message: string; evaluations: GoalSeekEvaluation[] };

export async function goalSeek(
  req: GoalSeekRequest,
  solve: (s: Section) => SectionResult | Promise<SectionResult>,
  onEvaluation?: (e: GoalSeekEvaluation, n: number) => void,
): Promise<GoalSeekOutcome> {
  const metric = metricById(req.metric);
  const evaluations: GoalSeekEvaluation[] = [];
  const { relTolerance = 1e-4, maxEvaluations = 30 } = req;
  if (!(req.target > 0) || !Number.isFinite(req.target)) return { ok: false, message: 'the target must be a positive number', evaluations };
  if (!req.section.variables || !(req.variable in req.section.variables))
    return { ok: false, message: `the section has no variable "${req.variable}": name the dimension first (Variables panel)`, evaluations };
  const results = new Map<number, SectionResult>();
  const f = async (x: number) => {
    const r = await solve(applySweepValue(req.section, { kind: 'variable', name: req.variable }, x));
    const v = metric.get(r);
    if (v === undefined) throw new RangeError(`this section has no ${metric.label} (for example Z0 needs exactly one signal net, differential impedance two)`);
    results.set(x, r);
    evaluations.push({ value: x, metric: v });
    onEvaluation?.({ value: x, metric: v }, evaluations.length);
    return v - req.target;
  };
  const show = (v: number) => `${(v / metric.factor).toPrecision(4)}${metric.unit ? ` ${metric.unit}` : ''}`;
  try {
    const root = await findRoot(f, req.lo, req.hi, {
      fTolerance: relTolerance * req.target,
      xTolerance: 1e-7 * Math.abs(req.hi - req.lo),
      maxEvaluations,
    });
    const r = results.get(root.x)!;
    return { ok: true, value: root.x, achieved: metric.get(r)!, evaluations, converged: root.converged, result: r };
  } catch (e) {
    if (e instanceof TargetNotReachableError) {
      return {
        ok: false,
        message: `${metric.label} runs from ${show(e.lo.fx + req.target)} at ${req.variable} = ${e.lo.x} to ${show(e.hi.fx + req.target)} at ${req.variable} = ${e.hi.x}: the target ${show(req.target)} is not reachable in this range. Widen the range or change the target.`,
        evaluations,
      };
    }
    return { ok: false, message: e instanceof Error ? e.message : String(e), evaluations };
  }
}

/**
 * Messages between the page and the analysis worker (workers/analysis.worker.ts): sweeps,
 * the fringing study, goal seek and a solve with losses and peak field. Plain data only.
 * Cancel = the page terminates the worker; points already reported stay with the page.
 */
import type { Section } from '@/lib/section/schema';
import type { SectionResult } from '@/lib/engine/types';
import type { SweepPoint, SweepTarget } from '@/lib/analysis/sweep';
import type { GoalSeekEvaluation, GoalSeekOutcome, GoalSeekRequest } from '@/lib/analysis/goal-seek';

export interface AnalysisSettings {
  preset: 'quick' | 'standard' | 'precise';
  tolerance?: number;
  frequencyHz?: number;
  volts?: number;
}

export interface PointProgress {
  /** Points (or evaluations) finished, and in all. */
  done: number;
  total: number;
  /** Fraction of the running point's solve. */
  fraction?: number;
}

export type AnalyseOutcome = { ok: true; result: SectionResult } | { ok: false; message: string };

export interface AnalysisWorkerApi {
  ping(): Promise<'pong'>;
  /** One solve with the analysis options (losses, peak field). */
  analyse(section: Section, settings: AnalysisSettings): Promise<AnalyseOutcome>;
  sweep(
    req: { section: Section; target: SweepTarget; values: number[]; settings: AnalysisSettings },
    onPoint: (p: SweepPoint, index: number, total: number) => void,
    onProgress: (p: PointProgress) => void,
  ): Promise<{ points: number }>;
  fringing(
    req: { section: Section; ratios: number[]; settings: AnalysisSettings },
    onPoint: (p: SweepPoint, index: number, total: number) => void,
    onProgress: (p: PointProgress) => void,
  ): Promise<{ points: number }>;
  goalSeek(
    req: GoalSeekRequest & { settings: AnalysisSettings },
    onEvaluation: (e: GoalSeekEvaluation, n: number) => void,
  ): Promise<GoalSeekOutcome>;
}

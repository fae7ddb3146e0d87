/**
 * Messages between the results summary (components/results/line-summary.tsx, through
 * lib/client/summary-client.ts) and the summary worker (workers/summary.worker.ts). Plain data
 * only. The page loads one solve (resolved section, result, finest-mesh fields: copied once)
 * and then asks for the losses at a frequency or the peak field at a voltage of that solve;
 * every answer names the solve it is for, so an answer for an older solve can be told apart.
 */
import type { ResolvedSection } from '@/lib/section/schema';
import type { LossValues, PeakFieldEntry, SectionFields, SectionResult } from '@/lib/engine/types';

export type SummaryOutcome<T> = { ok: true; solveId: number; value: T } | { ok: false; solveId: number; message: string };

export interface SummaryWorkerApi {
  ping(): Promise<'pong'>;
  /** Keep this solve for the requests that follow (replaces the one kept before). */
  load(solveId: number, section: ResolvedSection, result: SectionResult, fields: SectionFields): Promise<SummaryOutcome<null>>;
  /** computeLosses (lib/analysis/losses.ts) of the kept solve. */
  losses(solveId: number, frequencyHz: number): Promise<SummaryOutcome<LossValues>>;
  /** computePeakField (lib/analysis/peak-field.ts) of the kept solve: its entries. */
  peakField(solveId: number, volts: number): Promise<SummaryOutcome<PeakFieldEntry[]>>;
}

/// <reference lib="webworker" />
/**
 * The summary worker: the losses and the peak field of the results summary, worked out off
 * the main thread with the same functions the page used before (lib/analysis/losses.ts,
 * lib/analysis/peak-field.ts). It keeps the last loaded solve, so a new frequency or voltage
 * sends only a number. Every failure comes back as an outcome naming what went wrong.
 */
import '@/lib/client/zod-no-eval'; // first: no eval probe under the CSP
import * as Comlink from 'comlink';
import { computeLosses } from '@/lib/analysis/losses';
import { computePeakField } from '@/lib/analysis/peak-field';
import type { ResolvedSection } from '@/lib/section/schema';
import type { SectionFields, SectionResult } from '@/lib/engine/types';
import type { SummaryOutcome, SummaryWorkerApi } from './summary-protocol';

let kept: { solveId: number; section: ResolvedSection; result: SectionResult; fields: SectionFields } | null = null;

function withKept<T>(solveId: number, what: string, work: (k: NonNullable<typeof kept>) => T): SummaryOutcome<T> {
  if (!kept || kept.solveId !== solveId) {
    return { ok: false, solveId, message: `${what}: solve ${solveId} is not loaded in the summary worker` };
  }
  try {
    return { ok: true, solveId, value: work(kept) };
  } catch (e) {
    return { ok: false, solveId, message: `${what}: ${e instanceof Error ? e.message : String(e)}` };
  }
}

const api: SummaryWorkerApi = {
  async ping() {
    return 'pong';
  },
  async load(solveId, section, result, fields) {
    if (!Number.isSafeInteger(solveId)) return { ok: false, solveId, message: 'Summary: the solve has no id' };
    if (!section || !result || !fields || !Array.isArray(fields.potentials)) {
      kept = null;
      return { ok: false, solveId, message: 'Summary: the solve to load has no section, result or fields' };
    }
    kept = { solveId, section, result, fields };
    return { ok: true, solveId, value: null };
  },
  async losses(solveId, frequencyHz) {
    return withKept(solveId, 'Losses', (k) => computeLosses(k.section, k.result, k.fields, { frequencyHz }));
  },
  async peakField(solveId, volts) {
    return withKept(solveId, 'Peak field', (k) => computePeakField(k.section, k.result, k.fields, { volts }).entries);
  },
};

Comlink.expose(api);

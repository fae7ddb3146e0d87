'use client';
/**
 * Page side of the summary worker (workers/summary.worker.ts): the results summary's losses
 * and peak field off the main thread. One worker per client, started on first use. A solve's
 * fields are copied to the worker once; later requests for it send only a frequency or a
 * voltage. The latest request of each kind wins: an answer to an older one (or to an older
 * solve) comes back as `stale` and is to be dropped. If the worker fails or dies, every open
 * request ends with a message naming it, and the next request starts a fresh worker (which is
 * loaded again).
 */
import * as Comlink from 'comlink';
import type { ResolvedSection } from '@/lib/section/schema';
import type { LossValues, PeakFieldEntry, SectionFields, SectionResult } from '@/lib/engine/types';
import type { SummaryOutcome, SummaryWorkerApi } from '@/workers/summary-protocol';

/** A started worker: where comlink talks to it, how to stop it, how it reports a failure. */
export interface SummaryWorkerHandle {
  endpoint: Comlink.Endpoint;
  terminate(): void;
  onFailure(report: (message: string) => void): void;
}

export interface SummarySolve {
  section: ResolvedSection;
  result: SectionResult;
  fields: SectionFields;
}

export type SummaryAnswer<T> = { stale: true } | { stale: false; ok: true; value: T } | { stale: false; ok: false; message: string };

type Kind = 'losses' | 'peak';

function browserWorker(): SummaryWorkerHandle {
  const worker = new Worker(new URL('../../workers/summary.worker.ts', import.meta.url), { type: 'module', name: 'edgefield-summary' });
  return {
    endpoint: worker,
    terminate: () => worker.terminate(),
    onFailure: (report) => {
      worker.addEventListener('error', (e) => report(e.message || 'the worker stopped with an error'));
      worker.addEventListener('messageerror', () => report('a message from the worker could not be read'));
    },
  };
}

export class SummaryClient {
  private handle: SummaryWorkerHandle | null = null;
  private remote: Comlink.Remote<SummaryWorkerApi> | null = null;
  private solve: (SummarySolve & { solveId: number }) | null = null;
  /** The load of the current solve into the current worker (null: not sent yet). */
  private loading: Promise<SummaryOutcome<null>> | null = null;
  private nextSolveId = 1;
  private tickets: Record<Kind, number> = { losses: 0, peak: 0 };
  private open = new Set<(e: Error) => void>();

  constructor(private readonly spawn: () => SummaryWorkerHandle = browserWorker) {}

  losses(solve: SummarySolve, frequencyHz: number): Promise<SummaryAnswer<LossValues>> {
    return this.ask('losses', solve, (r, id) => r.losses(id, frequencyHz));
  }

  peakField(solve: SummarySolve, volts: number): Promise<SummaryAnswer<PeakFieldEntry[]>> {
    return this.ask('peak', solve, (r, id) => r.peakField(id, volts));
  }

  /** Stop the worker; open requests come back stale. The next request starts a fresh one. */
  dispose(): void {
    this.tickets.losses++;
    this.tickets.peak++;
    this.stop('the summary worker was stopped');
  }

  private async ask<T>(kind: Kind, solve: SummarySolve, call: (r: Comlink.Remote<SummaryWorkerApi>, solveId: number) => Promise<SummaryOutcome<T>>): Promise<SummaryAnswer<T>> {
    const ticket = ++this.tickets[kind];
    const kept = this.keep(solve);
    const isStale = () => ticket !== this.tickets[kind] || this.solve !== kept;
    try {
      const remote = this.ensure();
      if (!this.loading) this.loading = this.guard<SummaryOutcome<null>>(remote.load(kept.solveId, kept.section, kept.result, kept.fields));
      const loaded = await this.loading;
      if (isStale()) return { stale: true };
      if (!loaded.ok) return { stale: false, ok: false, message: loaded.message };
      const out = await this.guard<SummaryOutcome<T>>(call(remote, kept.solveId));
      if (isStale()) return { stale: true };
      return out.ok ? { stale: false, ok: true, value: out.value } : { stale: false, ok: false, message: out.message };
    } catch (e) {
      if (isStale()) return { stale: true };
      return { stale: false, ok: false, message: `Summary worker: ${e instanceof Error ? e.message : String(e)}` };
    }
  }

  /** The kept solve for these values (a new id, and a new load, when they differ from the last). */
  private keep(solve: SummarySolve): SummarySolve & { solveId: number } {
    const s = this.solve;
    if (s && s.section === solve.section && s.result === solve.result && s.fields === solve.fields) return s;
    this.solve = { ...solve, solveId: this.nextSolveId++ };
    this.loading = null;
    return this.solve;
  }

  private ensure(): Comlink.Remote<SummaryWorkerApi> {
    if (!this.remote) {
      const handle = this.spawn();
      handle.onFailure((message) => {
        if (this.handle === handle) this.stop(message);
      });
      this.handle = handle;
      this.remote = Comlink.wrap<SummaryWorkerApi>(handle.endpoint);
      this.loading = null;
    }
    return this.remote;
  }

  /** A call that also ends (with the failure's message) when the worker fails or is stopped. */
  private guard<T>(p: Promise<T>): Promise<T> {
    return new Promise<T>((resolve, reject) => {
      this.open.add(reject);
      p.then(resolve, reject).finally(() => this.open.delete(reject));
    });
  }

  private stop(message: string): void {
    const handle = this.handle;
    this.handle = null;
    this.remote = null;
    this.loading = null;
    handle?.terminate();
    const open = [...this.open];
    this.open.clear();
    for (const reject of open) reject(new Error(message));
  }
}

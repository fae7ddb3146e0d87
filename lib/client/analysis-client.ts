'use client';
/**
 * Page side of the analysis worker. One job at a time; cancel terminates the worker (the
 * points already reported stay with the caller) and the next job starts a fresh one.
 */
import * as Comlink from 'comlink';
import type { AnalysisWorkerApi } from '@/workers/analysis-protocol';

export class AnalysisClient {
  private worker: Worker | null = null;
  private remote: Comlink.Remote<AnalysisWorkerApi> | null = null;
  private cancelJob: (() => void) | null = null;

  api(): Comlink.Remote<AnalysisWorkerApi> {
    if (!this.remote) {
      this.worker = new Worker(new URL('../../workers/analysis.worker.ts', import.meta.url), { type: 'module', name: 'edgefield-analysis' });
      this.remote = Comlink.wrap<AnalysisWorkerApi>(this.worker);
    }
    return this.remote;
  }

  /** Run one job; resolves with its value, or with `cancelled` when cancel() stopped it. */
  run<T>(job: (api: Comlink.Remote<AnalysisWorkerApi>) => Promise<T>): Promise<{ cancelled: false; value: T } | { cancelled: true }> {
    this.cancel();
    const api = this.api();
    return new Promise((resolve, reject) => {
      let settled = false;
      this.cancelJob = () => {
        if (settled) return;
        settled = true;
        resolve({ cancelled: true });
      };
      job(api).then(
        (value) => {
          if (settled) return;
          settled = true;
          this.cancelJob = null;
          resolve({ cancelled: false, value });
        },
        (e: unknown) => {
          if (settled) return;
          settled = true;
          this.cancelJob = null;
          reject(e instanceof Error ? e : new Error(String(e)));
        },
      );
    });
  }

  cancel(): void {
    if (!this.cancelJob) return;
    const c = this.cancelJob;
    this.cancelJob = null;
    this.worker?.terminate();
    this.worker = null;
    this.remote = null;
    c();
  }

  dispose(): void {
    this.cancel();
    this.worker?.terminate();
    this.worker = null;
    this.remote = null;
  }
}

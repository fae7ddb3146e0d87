'use client';
/**
 * Page side of the solver worker: one worker at a time, job ids so a new solve replaces a
 * stale one, and cancellation that works with or without cross-origin isolation
 * (SharedArrayBuffer flag when available, else terminate the worker and start a fresh one).
 */
import * as Comlink from 'comlink';
import type { Section } from '@/lib/section/schema';
import type { SolveOutcome, SolveSettings, SolverWorkerApi, WorkerProgress } from '@/workers/protocol';

/** Quiet time after the page opened before the worker solves its warm-up section. */
const WARM_UP_DELAY_MS = 1500;

export type SolveEnd = SolveOutcome | { ok: false; jobId: number; cancelled: true; message: string; superseded: true };

export class SolverClient {
  private worker: Worker | null = null;
  private remote: Comlink.Remote<SolverWorkerApi> | null = null;
  private static nextJob = 1;
  private current: { jobId: number; flag: Int32Array | null; settle: (e: SolveEnd) => void } | null = null;

  /** True when cancellation goes through a shared flag (cross-origin isolated page). */
  get sharedCancel(): boolean {
    return typeof SharedArrayBuffer !== 'undefined' && globalThis.crossOriginIsolated === true;
  }

  private ensure(): Comlink.Remote<SolverWorkerApi> {
    if (!this.remote) {
      this.worker = new Worker(new URL('../../workers/solver.worker.ts', import.meta.url), { type: 'module', name: 'edgefield-solver' });
      this.remote = Comlink.wrap<SolverWorkerApi>(this.worker);
    }
    return this.remote;
  }

  private warmTimer: ReturnType<typeof setTimeout> | null = null;
  private solvedOnce = false;

  /**
   * Start the worker ahead of the first solve (it loads the solver code), and after
   * WARM_UP_DELAY_MS without a solve let it solve a small built-in section once
   * (workers/warm-up.ts), so the kernels are compiled while the user is still drawing. The
   * delay keeps a Solve pressed right after the page opened from waiting behind the warm-up;
   * a Solve pressed during the warm-up (about half a second) waits for it to end.
   */
  warm(): void {
    void this.ensure().ping().catch(() => {});
    if (this.warmTimer !== null) clearTimeout(this.warmTimer);
    this.warmTimer = setTimeout(() => {
      this.warmTimer = null;
      if (!this.solvedOnce && this.remote) void this.remote.warmUp().catch(() => {});
    }, WARM_UP_DELAY_MS);
  }

  /**
   * Solve; resolves with the outcome. A solve started while another runs cancels the older
   * one, which then resolves as cancelled and superseded.
   */
  solve(section: Section, settings: SolveSettings, onProgress: (p: WorkerProgress) => void): { jobId: number; done: Promise<SolveEnd> } {
    if (this.current) this.cancel(true);
    this.solvedOnce = true;
    const jobId = SolverClient.nextJob++;
    const shared = this.sharedCancel;
    const sab = shared ? new SharedArrayBuffer(4) : undefined;
    const flag = sab ? new Int32Array(sab) : null;
    const remote = this.ensure();
    const done = new Promise<SolveEnd>((resolve) => {
      let settled = false;
      const settle = (e: SolveEnd) => {
        if (settled) return;
        settled = true;
        if (this.current?.jobId === jobId) this.current = null;
        resolve(e);
      };
      this.current = { jobId, flag, settle };
      const progress = Comlink.proxy((p: WorkerProgress) => {
        if (!settled && this.current?.jobId === jobId) onProgress(p);
      });
      remote
        .solve({ jobId, section, settings, cancelFlag: sab }, progress)
        .then((out) => settle(out))
        .catch((e: unknown) => settle({ ok: false, jobId, cancelled: false, message: e instanceof Error ? e.message : String(e) }));
    });
    return { jobId, done };
  }

  /** Cancel the running solve, if any. */
  cancel(superseded = false): void {
    const cur = this.current;
    if (!cur) return;
    this.current = null;
    if (cur.flag) {
      Atomics.store(cur.flag, 0, 1);
    } else {
      // no shared memory: stop the worker outright; the next solve starts a fresh one
      this.worker?.terminate();
      this.worker = null;
      this.remote = null;
    }
    cur.settle(
      superseded
        ? { ok: false, jobId: cur.jobId, cancelled: true, message: 'Replaced by a newer solve.', superseded: true }
        : { ok: false, jobId: cur.jobId, cancelled: true, message: 'Solve cancelled.' },
    );
  }

  get running(): boolean {
    return this.current !== null;
  }

  dispose(): void {
    if (this.warmTimer !== null) clearTimeout(this.warmTimer);
    this.warmTimer = null;
    this.cancel();
    this.worker?.terminate();
    this.worker = null;
    this.remote = null;
  }
}

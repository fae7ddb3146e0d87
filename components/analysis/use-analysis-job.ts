'use client';
/**
 * One analysis job at a time in the analysis worker, with progress and cancel: the state the
 * analysis card shows (busy, progress, message) and the run/cancel pattern every job shares.
 *
 * Point and progress callbacks travel on their own comlink channels and may arrive after the
 * job has ended (cancelled, or replaced by the next one); `live(fn)` wraps a callback so only
 * the running job's callbacks reach the state. Cancel terminates the worker; the caller keeps
 * whatever its callbacks stored so far.
 */
import { useCallback, useEffect, useRef, useState } from 'react';
import { proxy, type ProxyMarked, type Remote } from 'comlink';
import { AnalysisClient } from '@/lib/client/analysis-client';
import type { AnalysisWorkerApi, PointProgress } from '@/workers/analysis-protocol';

export type AnalysisJobKind = 'analyse' | 'sweep' | 'fringing' | 'goal' | 'confirm' | 'report';

export interface AnalysisJobContext {
  /** A comlink-proxied callback that runs only while this job is the live one. */
  live<A extends unknown[]>(fn: (...args: A) => void): ((...args: A) => void) & ProxyMarked;
  /** The worker's progress callback (live and proxied), for jobs that report points. */
  onProgress: ((p: PointProgress) => void) & ProxyMarked;
}

export type JobOutcome<T> = { cancelled: false; value: T } | { cancelled: true } | { failed: true };

export const CANCELLED_MESSAGE = 'Cancelled; the points finished so far are kept.';

export function useAnalysisJob() {
  const clientRef = useRef<AnalysisClient | null>(null);
  useEffect(() => {
    const c = new AnalysisClient();
    clientRef.current = c;
    return () => c.dispose();
  }, []);

  const [busy, setBusy] = useState<AnalysisJobKind | null>(null);
  const [progress, setProgress] = useState<PointProgress | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const jobRef = useRef(0);

  /**
   * Run one job in the worker: marks `kind` busy, clears the message, shows 0 of `total`
   * points when a total is given, reports a thrown error as the message, and clears busy and
   * progress when it ends, unless it was cancelled or replaced meanwhile.
   */
  const run = useCallback(async <T>(kind: AnalysisJobKind, opts: { total?: number }, work: (api: Remote<AnalysisWorkerApi>, ctx: AnalysisJobContext) => Promise<T>): Promise<JobOutcome<T>> => {
    const client = (clientRef.current ??= new AnalysisClient());
    const job = ++jobRef.current;
    const isLive = () => job === jobRef.current;
    const ctx: AnalysisJobContext = {
      live: <A extends unknown[]>(fn: (...args: A) => void) =>
        proxy((...args: A) => {
          if (isLive()) fn(...args);
        }),
      onProgress: proxy((p: PointProgress) => {
        if (isLive()) setProgress(p);
      }),
    };
    setBusy(kind);
    setMessage(null);
    if (opts.total !== undefined) setProgress({ done: 0, total: opts.total });
    try {
      return await client.run((api) => work(api, ctx));
    } catch (e) {
      if (isLive()) setMessage(e instanceof Error ? e.message : String(e));
      return { failed: true };
    } finally {
      if (isLive()) {
        jobRef.current++;
        setBusy(null);
        setProgress(null);
      }
    }
  }, []);

  /** Busy while a task outside the worker runs (the PDF report request). */
  const withBusy = useCallback(async (kind: AnalysisJobKind, task: () => Promise<void>): Promise<void> => {
    setBusy(kind);
    setMessage(null);
    try {
      await task();
    } catch (e) {
      setMessage(e instanceof Error ? e.message : String(e));
    } finally {
      setBusy(null);
    }
  }, []);

  /** Stop the running job; points already reported stay with the caller. */
  const cancel = useCallback(() => {
    jobRef.current++;
    clientRef.current?.cancel();
    setBusy(null);
    setProgress(null);
    setMessage(CANCELLED_MESSAGE);
  }, []);

  const running = busy === 'sweep' || busy === 'fringing' || busy === 'goal' || busy === 'analyse' || busy === 'confirm';
  return { busy, running, progress, message, setMessage, run, withBusy, cancel };
}

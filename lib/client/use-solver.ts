'use client';
/**
 * React state around SolverClient: status, streaming progress, the last result and fields.
 * A new solve replaces a running one; results of stale jobs never reach the state.
 */
import { useCallback, useEffect, useRef, useState } from 'react';
import type { Section } from '@/lib/section/schema';
import type { SectionFields, SectionResult } from '@/lib/engine/types';
import type { SolveSettings, WorkerProgress } from '@/workers/protocol';
import { SolverClient } from './solver-client';

export type SolverStatus = 'idle' | 'running' | 'done' | 'cancelled' | 'error';

export interface SolverState {
  status: SolverStatus;
  jobId: number;
  progress: WorkerProgress | null;
  result: SectionResult | null;
  fields: SectionFields | null;
  /** The section and settings the shown result belongs to. */
  solvedSection: Section | null;
  solvedSettings: SolveSettings | null;
  error: string | null;
  issues: { message: string; path?: string }[] | null;
  /** Wall time from pressing solve to the result in the page, ms. */
  wallMs: number | null;
}

const initial: SolverState = {
  status: 'idle',
  jobId: 0,
  progress: null,
  result: null,
  fields: null,
  solvedSection: null,
  solvedSettings: null,
  error: null,
  issues: null,
  wallMs: null,
};

export function useSolver() {
  const clientRef = useRef<SolverClient | null>(null);
  const [state, setState] = useState<SolverState>(initial);
  const latest = useRef(0);

  useEffect(() => {
    const c = new SolverClient();
    clientRef.current = c;
    c.warm();
    return () => {
      c.dispose();
      clientRef.current = null;
    };
  }, []);

  const solve = useCallback(async (section: Section, settings: SolveSettings) => {
    const c = clientRef.current ?? (clientRef.current = new SolverClient());
    const t0 = performance.now();
    if (typeof performance.mark === 'function') performance.mark('edgefield:solve-start');
    const { jobId, done } = c.solve(section, settings, (p) => {
      if (p.jobId !== latest.current) return;
      setState((s) => (s.jobId === p.jobId && s.status === 'running' ? { ...s, progress: p } : s));
    });
    latest.current = jobId;
    setState((s) => ({ ...s, status: 'running', jobId, progress: null, error: null, issues: null }));
    const end = await done;
    // a stale job (replaced by a newer solve) never reaches the state
    if (end.jobId !== latest.current || 'superseded' in end) return;
    if (end.ok) {
      setState((s) => ({
        ...s,
        status: 'done',
        result: end.result,
        fields: end.fields,
        solvedSection: section,
        solvedSettings: settings,
        progress: null,
        wallMs: performance.now() - t0,
      }));
    } else if (end.cancelled) {
      setState((s) => ({ ...s, status: 'cancelled', progress: null, error: null }));
    } else {
      setState((s) => ({ ...s, status: 'error', progress: null, error: end.message, issues: end.issues ?? null }));
    }
  }, []);

  const cancel = useCallback(() => clientRef.current?.cancel(), []);

  /** Show a result that did not come from this page's worker (for example a saved solve). */
  const show = useCallback((result: SectionResult, fields: SectionFields | null, section: Section, settings: SolveSettings | null) => {
    setState((s) => ({ ...s, status: 'done', result, fields, solvedSection: section, solvedSettings: settings, error: null, issues: null }));
  }, []);

  return { state, solve, cancel, show };
}

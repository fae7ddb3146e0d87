/**
 * Messages between the page and the solver worker (workers/solver.worker.ts), called through
 * comlink. Plain data only; the field arrays come back transferred, not copied.
 */
import type { Section } from '@/lib/section/schema';
import type { SolveProgress } from '@/lib/fdm/types';
import type { SectionFields, SectionResult } from '@/lib/engine/types';

export type SolvePreset = 'quick' | 'standard' | 'precise';

/** The settings that, with the section revision, decide a solve (hashed for dedupe). */
export interface SolveSettings {
  /** Mesh preset; the section's own preset (or "standard") when the user did not choose one. */
  preset: SolvePreset;
  /** Relative residual target of the iterative solver. */
  tolerance: number;
}

export const DEFAULT_TOLERANCE = 1e-10;

export interface SolveRequest {
  /** Increasing per page; a result whose jobId is not the latest is dropped. */
  jobId: number;
  section: Section;
  settings: SolveSettings;
  /**
   * Int32Array(1) over a SharedArrayBuffer, set to 1 to cancel (only when the page is
   * cross-origin isolated). Without it, the page cancels by terminating the worker.
   */
  cancelFlag?: SharedArrayBuffer;
}

export interface WorkerProgress extends SolveProgress {
  jobId: number;
  /** Milliseconds since the worker started this job. */
  elapsedMs: number;
}

export type SolveOutcome =
  | { ok: true; jobId: number; result: SectionResult; fields: SectionFields; workerMs: number }
  | { ok: false; jobId: number; cancelled: boolean; message: string; issues?: { message: string; path?: string }[] };

export interface SolverWorkerApi {
  solve(req: SolveRequest, onProgress: (p: WorkerProgress) => void): Promise<SolveOutcome>;
  ping(): Promise<'pong'>;
  /**
   * Solve a small built-in section once (workers/warm-up.ts) so that the kernels are compiled
   * before the first real solve; later calls return at once. Never fails: resolves with the
   * time it took in ms (0 when already done) or null when the warm-up solve failed.
   */
  warmUp(): Promise<number | null>;
}

/** Every distinct buffer behind the field arrays (for Comlink.transfer). */
export function fieldBuffers(f: SectionFields): ArrayBuffer[] {
  const set = new Set<ArrayBuffer>();
  const add = (a: ArrayBufferView) => {
    if (a.buffer instanceof ArrayBuffer) set.add(a.buffer);
  };
  add(f.xs);
  add(f.ys);
  for (const p of f.potentials) add(p);
  add(f.cellEpsR);
  add(f.nodeNet);
  return [...set];
}

/// <reference lib="webworker" />
/**
 * The solver worker: a thin adapter that runs solveSection (lib/engine) off the main thread.
 * It checks the request's envelope (job id, settings, cancel flag); solveSection checks the
 * section and the tolerance. Every failure comes back as an outcome, never as a dead worker.
 * Progress streams back through a Comlink.proxy callback (throttled, stage changes always
 * sent); the field arrays are transferred, not copied. Cancellation: a SharedArrayBuffer flag
 * when the page is cross-origin isolated, otherwise the page terminates this worker.
 */
import '@/lib/client/zod-no-eval'; // first: no eval probe under the CSP
import * as Comlink from 'comlink';
import { solveSection } from '@/lib/engine/solve-section';
import { SolveCancelledError } from '@/lib/fdm/types';
import { MESH_PRESETS } from '@/lib/section/schema';
import { fieldBuffers, type SolveOutcome, type SolveRequest, type SolverWorkerApi, type WorkerProgress } from './protocol';
import { WARM_UP_SECTION } from './warm-up';

const PROGRESS_INTERVAL_MS = 60;
const PRESETS: readonly string[] = MESH_PRESETS;

/** What is wrong with a request's envelope (the section itself is checked by solveSection), or null. */
function requestProblem(req: unknown): string | null {
  if (!req || typeof req !== 'object') return 'the request is not an object';
  const r = req as Partial<SolveRequest>;
  if (!Number.isSafeInteger(r.jobId)) return 'the request has no job id';
  const s = r.settings as Partial<SolveRequest['settings']> | undefined;
  if (!s || typeof s !== 'object') return 'the request has no settings';
  if (!PRESETS.includes(s.preset as string)) return `settings.preset must be one of ${PRESETS.join(', ')} (got ${JSON.stringify(s.preset)})`;
  if (typeof s.tolerance !== 'number') return `settings.tolerance must be a number (got ${JSON.stringify(s.tolerance)})`;
  const shared = typeof SharedArrayBuffer !== 'undefined' && r.cancelFlag instanceof SharedArrayBuffer;
  if (r.cancelFlag !== undefined && !(shared && r.cancelFlag.byteLength >= 4)) return 'cancelFlag must be a SharedArrayBuffer of at least 4 bytes';
  return null;
}

let warmedUp = false;

const api: SolverWorkerApi = {
  async ping() {
    return 'pong';
  },
  async warmUp() {
    // once per worker, and not after a real solve (which has compiled the kernels already)
    if (warmedUp) return 0;
    warmedUp = true;
    const t0 = performance.now();
    try {
      solveSection(WARM_UP_SECTION, { keepFields: true, preset: 'quick' });
      return performance.now() - t0;
    } catch {
      return null;
    }
  },
  async solve(req: SolveRequest, onProgress: (p: WorkerProgress) => void): Promise<SolveOutcome> {
    const t0 = performance.now();
    const bad = requestProblem(req);
    if (bad !== null) {
      const jobId = req && typeof req === 'object' && Number.isSafeInteger(req.jobId) ? req.jobId : -1;
      return { ok: false, jobId, cancelled: false, message: `bad solve request: ${bad}` };
    }
    warmedUp = true;
    const flag = req.cancelFlag ? new Int32Array(req.cancelFlag) : null;
    let lastSent = 0;
    let lastStage = '';
    try {
      const { result, fields } = solveSection(req.section, {
        keepFields: true,
        tolerance: req.settings.tolerance,
        preset: req.settings.preset,
        isCancelled: () => (flag ? Atomics.load(flag, 0) !== 0 : false),
        onProgress: (p) => {
          const now = performance.now();
          if (p.stage !== lastStage || now - lastSent >= PROGRESS_INTERVAL_MS) {
            lastStage = p.stage;
            lastSent = now;
            // fire and forget: the page's callback returns nothing we wait for
            void onProgress({ ...p, jobId: req.jobId, elapsedMs: now - t0 });
          }
        },
      });
      if (!fields) throw new Error('the engine returned no field arrays');
      const out: SolveOutcome = { ok: true, jobId: req.jobId, result, fields, workerMs: performance.now() - t0 };
      return Comlink.transfer(out, fieldBuffers(fields));
    } catch (e) {
      if (e instanceof SolveCancelledError) return { ok: false, jobId: req.jobId, cancelled: true, message: 'Solve cancelled.' };
      const issues = (e as { issues?: unknown }).issues;
      return {
        ok: false,
        jobId: req.jobId,
        cancelled: false,
        message: e instanceof Error ? e.message : String(e),
        issues: Array.isArray(issues)
          ? issues.map((i: { message?: unknown; path?: unknown }) => ({
              message: String(i.message ?? i),
              path: typeof i.path === 'string' ? i.path : Array.isArray(i.path) ? i.path.join('.') : undefined,
            }))
          : undefined,
      };
    }
  },
};

Comlink.expose(api);

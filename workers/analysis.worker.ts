/// <reference lib="webworker" />
/**
 * The analysis worker: sweeps, the fringing study, goal seek and analysis solves, each a
 * series of solveSection calls (lib/engine) off the main thread. A thin adapter over
 * lib/analysis; points stream back through Comlink.proxy callbacks.
 */
import '@/lib/client/zod-no-eval'; // first: no eval probe under the CSP
import * as Comlink from 'comlink';
import { solveSection } from '@/lib/engine/solve-section';
import { runSweep } from '@/lib/analysis/sweep';
import { goalSeek } from '@/lib/analysis/goal-seek';
import { withGapToWidth } from '@/lib/analysis/fringing-study';
import type { Section } from '@/lib/section/schema';
import type { AnalysisSettings, AnalysisWorkerApi, PointProgress } from './analysis-protocol';

const solver = (settings: AnalysisSettings, progress?: (fraction: number) => void) => (s: Section) => {
  let last = 0;
  return solveSection(s, {
    preset: settings.preset,
    ...(settings.tolerance !== undefined ? { tolerance: settings.tolerance } : {}),
    ...(settings.frequencyHz !== undefined ? { frequencyHz: settings.frequencyHz } : {}),
    ...(settings.volts !== undefined ? { volts: settings.volts } : {}),
    onProgress: (p) => {
      const now = performance.now();
      if (progress && p.fraction !== undefined && now - last > 100) {
        last = now;
        progress(p.fraction);
      }
    },
  }).result;
};

/**
 * Calls back to the page travel on their own message channels: keep their promises and wait
 * for all of them before a job returns, so every point reaches the page before the result.
 */
function tracker() {
  const pending: Promise<unknown>[] = [];
  return {
    call(p: unknown) {
      if (p && typeof (p as Promise<unknown>).then === 'function') pending.push(p as Promise<unknown>);
    },
    flush: () => Promise.allSettled(pending),
  };
}

const api: AnalysisWorkerApi = {
  async ping() {
    return 'pong';
  },
  async analyse(section, settings) {
    try {
      return { ok: true, result: solver(settings)(section) };
    } catch (e) {
      return { ok: false, message: e instanceof Error ? e.message : String(e) };
    }
  },
  async sweep(req, onPoint, onProgress) {
    const total = req.values.length;
    let done = 0;
    const t = tracker();
    const report = (fraction?: number) => t.call(onProgress({ done, total, ...(fraction !== undefined ? { fraction } : {}) } satisfies PointProgress));
    const out = await runSweep(req.section, req.target, req.values, solver(req.settings, report), {
      onPoint: (p, i, n) => {
        done = i + 1;
        t.call(onPoint(p, i, n));
        report();
      },
    });
    await t.flush();
    return { points: out.points.length };
  },
  async fringing(req, onPoint, onProgress) {
    const total = req.ratios.length;
    let done = 0;
    const t = tracker();
    const solve = solver(req.settings, (fraction) => t.call(onProgress({ done, total, fraction })));
    for (let i = 0; i < total; i++) {
      const ratio = req.ratios[i]!;
      try {
        t.call(onPoint({ value: ratio, result: solve(withGapToWidth(req.section, ratio)) }, i, total));
      } catch (e) {
        t.call(onPoint({ value: ratio, error: e instanceof Error ? e.message : String(e) }, i, total));
      }
      done = i + 1;
      t.call(onProgress({ done, total }));
    }
    await t.flush();
    return { points: total };
  },
  async goalSeek(req, onEvaluation) {
    const { settings, ...rest } = req;
    const t = tracker();
    const out = await goalSeek(rest, solver(settings), (e, n) => t.call(onEvaluation(e, n)));
    await t.flush();
    return out;
  },
};

Comlink.expose(api);

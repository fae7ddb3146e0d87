/// <reference lib="webworker" />
/**
 * The analysis worker: sweeps, the fringing study, goal seek and analysis solves, each a
 * series of solveSection calls (lib/engine) off the main thread. A thin adapter over
 * lib/analysis; points stream back through Comlink.proxy callbacks.
 */
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
    const report = (fraction?: number) => void onProgress({ done, total, ...(fraction !== undefined ? { fraction } : {}) } satisfies PointProgress);
    const out = await runSweep(req.section, req.target, req.values, solver(req.settings, report), {
      onPoint: (p, i, n) => {
        done = i + 1;
        void onPoint(p, i, n);
        report();
      },
    });
    return { points: out.points.length };
  },
  async fringing(req, onPoint, onProgress) {
    const total = req.ratios.length;
    let done = 0;
    const solve = solver(req.settings, (fraction) => void onProgress({ done, total, fraction }));
    for (let i = 0; i < total; i++) {
      const ratio = req.ratios[i]!;
      try {
        void onPoint({ value: ratio, result: solve(withGapToWidth(req.section, ratio)) }, i, total);
      } catch (e) {
        void onPoint({ value: ratio, error: e instanceof Error ? e.message : String(e) }, i, total);
      }
      done = i + 1;
      void onProgress({ done, total });
    }
    return { points: total };
  },
  async goalSeek(req, onEvaluation) {
    const { settings, ...rest } = req;
    return goalSeek(rest, solver(settings), (e, n) => void onEvaluation(e, n));
  },
};

Comlink.expose(api);

/**
 * Bench case "editor-drag-200-shapes": drags one shape among 200 in the real section editor
 * (a static harness page bundled with Vite, served on loopback) in headless Chromium, and
 * reports the frames per second the page rendered during the drag (target ≥ 45; reported,
 * never asserted). Frames are counted with requestAnimationFrame inside the page, so a main
 * thread busy with React renders or canvas redraws shows up as dropped frames.
 */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildHarness, launchChromium, repoRoot, serveStatic } from '../browser-harness';

export const name = 'editor-drag-200-shapes';


export interface EditorDragResult {
  fps: number;
  frames: number;
  durationMs: number;
  moves: number;
  shapes: number;
  /** 95th percentile of the time between frames during the drag. */
  p95FrameMs: number;
  /** True when the drop committed a move of the dragged shape (the drag really happened). */
  moved: boolean;
  /** Redraws of each canvas layer during the drag (the static shapes layer should stay at 0). */
  layerRedraws: { grid: number; shapes: number; drag: number; overlay: number; guides: number };
  /** Main-thread time of one pointer-move handler during the drag (load-dependent). */
  handlerMsPerMove: number;
}

export async function run(): Promise<EditorDragResult> {
  const outDir = await buildHarness({ dir: 'scripts/bench/editor-harness', css: true, aliases: [{ find: 'next/dynamic', replacement: path.join(repoRoot, 'scripts/bench/editor-harness/next-dynamic-shim.tsx') }] });
  const srv = await serveStatic(outDir);
  const browser = await launchChromium();
  try {
    const page = await browser.newPage({ viewport: { width: 1440, height: 900 } });
    const shapes = 200;
    await page.goto(`${srv.url}?shapes=${shapes}`);
    await page.waitForSelector('[data-testid="editor-canvas"] canvas', { timeout: 60_000 });
    await page.waitForTimeout(500);
    const state = page.getByTestId('editor-state');
    const view = JSON.parse((await state.getAttribute('data-view')) ?? 'null') as { scale: number; ox: number; oy: number };
    const before = JSON.parse((await state.getAttribute('data-shapes')) ?? '[]') as { id: string; x?: number; y?: number; width?: number; height?: number }[];
    const target = before.find((s) => s.id === 'r102') ?? before.find((s) => s.id.startsWith('r'))!;
    const box = (await page.getByTestId('editor-canvas').boundingBox())!;
    const sx = box.x + view.ox + (target.x! + target.width! / 2) * view.scale;
    const sy = box.y + view.oy - (target.y! + target.height! / 2) * view.scale;

    await page.mouse.move(sx, sy);
    await page.mouse.down();
    await page.mouse.move(sx + 4, sy + 4);
    // Drive the drag from inside the page, one pointer move per animation frame (what a
    // mouse does at display rate), so the figure measures the page and not the speed of
    // the remote-control channel. Plain script text: the TypeScript loader's helpers do not
    // exist inside the page.
    // Count redraws per layer (0 grid, 1 shapes, 2 drag, 3 overlay, 4 guides and rulers):
    // a count, unlike time, does not depend on how busy the machine is.
    await page.evaluate(`(() => {
      const K = window.Konva;
      window.__draws = {};
      const orig = K.Layer.prototype.drawScene;
      K.Layer.prototype.drawScene = function (...a) { window.__draws[this.index] = (window.__draws[this.index] || 0) + 1; return orig.apply(this, a); };
    })()`);
    const moves = 240;
    const frames = (await page.evaluate(`new Promise((resolve) => {
      const el = document.querySelector('[data-testid="editor-canvas"] .konvajs-content') || document.querySelector('[data-testid="editor-canvas"] canvas');
      const frames = [];
      let i = 0;
      const tick = (t) => {
        frames.push(t);
        if (i >= ${moves}) { resolve(frames); return; }
        const a = (i / ${moves}) * Math.PI * 4;
        const x = ${sx} + 160 * Math.sin(a);
        const y = ${sy} + 90 * Math.sin(a / 2);
        el.dispatchEvent(new PointerEvent('pointermove', { clientX: x, clientY: y, bubbles: true, cancelable: true, pointerId: 1, pointerType: 'mouse', isPrimary: true, buttons: 1 }));
        i++;
        requestAnimationFrame(tick);
      };
      requestAnimationFrame(tick);
    })`)) as number[];
    const draws = (await page.evaluate('window.__draws')) as Record<string, number>;
    const handlerMs = (await page.evaluate(`(() => {
      const el = document.querySelector('[data-testid="editor-canvas"] .konvajs-content');
      const t0 = performance.now();
      for (let i = 0; i < 50; i++) el.dispatchEvent(new PointerEvent('pointermove', { clientX: ${sx} + i, clientY: ${sy}, bubbles: true, pointerId: 1, pointerType: 'mouse', buttons: 1 }));
      return (performance.now() - t0) / 50;
    })()`)) as number;
    await page.mouse.up();
    await page.waitForTimeout(300);
    const after = JSON.parse((await state.getAttribute('data-shapes')) ?? '[]') as { id: string; x?: number }[];
    const moved = after.find((s) => s.id === target.id)?.x !== target.x;
    const durationMs = frames.length > 1 ? frames[frames.length - 1]! - frames[0]! : 0;
    const gaps = frames.slice(1).map((t, i) => t - frames[i]!).sort((a, b) => a - b);
    const p95 = gaps.length ? gaps[Math.min(gaps.length - 1, Math.floor(gaps.length * 0.95))]! : 0;
    return {
      fps: durationMs > 0 ? Number((((frames.length - 1) * 1000) / durationMs).toFixed(1)) : 0,
      frames: frames.length,
      durationMs: Math.round(durationMs),
      moves,
      shapes,
      p95FrameMs: Number(p95.toFixed(1)),
      moved,
      layerRedraws: { grid: draws['0'] ?? 0, shapes: draws['1'] ?? 0, drag: draws['2'] ?? 0, overlay: draws['3'] ?? 0, guides: draws['4'] ?? 0 },
      handlerMsPerMove: Number(handlerMs.toFixed(2)),
    };
  } finally {
    await browser.close();
    await srv.close();
  }
}

export default { name, run };

// Run on its own: npx tsx scripts/bench/cases/editor-drag.ts
if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  run().then(
    (r) => console.log(JSON.stringify({ name, ...r })),
    (e) => {
      console.error(e);
      process.exit(1);
    },
  );
}

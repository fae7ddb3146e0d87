/**
 * The solver worker in the browser survives a failed solve (Chromium, the production build):
 * a section that passes every check but whose mesh at the precise preset would exceed the node
 * limit is refused by the worker with the limit in the message; the same page, with the same
 * worker, then solves it at the quick preset. The worker is the bundled
 * workers/solver.worker.ts that the page starts through lib/client/solver-client.ts.
 * (Cancel and solve again in the browser: tests/e2e/solve.spec.ts; the worker module under
 * cancellation, supersession and bad requests: tests/unit/worker/solver-worker.test.ts.)
 * Screenshots at 1440 and 1024 px under /tmp/edgefield-shots/worker-robustness.
 */
import fs from 'node:fs';
import path from 'node:path';
import { expect, test, type Page } from '@playwright/test';
import { signInAs } from './support/session';
import { unique } from './support/accounts';
import { EditorPage } from './editor-page';

const SHOTS = '/tmp/edgefield-shots/worker-robustness';

/**
 * A 16-point star (mm) over a ground plate. At the precise preset each corner carries its own
 * run of graded cells and the mesh passes 4,000,000 nodes; at the quick preset it has about
 * 86,000 (measured with solveSection).
 */
const N = 16;
const star = {
  format: 'edgefield.section/1',
  title: 'Star electrode over a plate',
  units: 'mm',
  nets: [
    { name: 'star', role: 'signal' },
    { name: 'plate', role: 'ground' },
  ],
  shapes: [
    { id: 'plate', type: 'rect', x: -3, y: 0, width: 6, height: 0.3, conductor: 'plate' },
    {
      id: 'star',
      type: 'polygon',
      points: Array.from({ length: N }, (_, i) => {
        const a = (2 * Math.PI * i) / N;
        const r = i % 2 ? 0.6 : 1;
        return [Math.round(r * Math.cos(a) * 1e4) / 1e4, Math.round((2 + r * Math.sin(a)) * 1e4) / 1e4];
      }),
      conductor: 'star',
    },
  ],
};

async function shoot(page: Page, name: string): Promise<void> {
  fs.mkdirSync(SHOTS, { recursive: true });
  for (const width of [1440, 1024]) {
    await page.setViewportSize({ width, height: 900 });
    await page.screenshot({ path: path.join(SHOTS, `${name}-${width}.png`), fullPage: false });
  }
  await page.setViewportSize({ width: 1440, height: 900 });
}

test('the browser worker refuses a solve beyond the node limit, then solves on the same page', async ({ page }) => {
  test.setTimeout(600_000);
  const workspaceId = await signInAs(page, 'editor');
  const res = await page.request.post(`/api/workspaces/${workspaceId}/sections`, { data: { name: unique('Star electrode'), content: star } });
  expect(res.status(), await res.text()).toBe(201);
  const body = (await res.json()) as { section?: { id: string }; id?: string };
  const id = body.section?.id ?? body.id;
  await page.goto(`/w/${workspaceId}/sections/${id}`);
  const editor = new EditorPage(page);
  await editor.expectReady();
  await expect(editor.gate).toHaveText('ready to solve');

  const preset = page.getByTestId('solve-preset');
  const solve = page.getByTestId('solve-button');
  const error = page.getByTestId('solve-error');
  const status = page.getByTestId('solve-status');

  // 1. Precise: refused by the worker while meshing, with the limit and what to change.
  await preset.selectOption('precise');
  await solve.click();
  await expect(error).toContainText('the mesh would need more than the limit of 4,000,000 nodes', { timeout: 120_000 });
  await expect(error).toContainText('use a coarser preset or a larger finest spacing');
  await expect(page.getByTestId('solve-progress')).toHaveCount(0);
  await error.scrollIntoViewIfNeeded();
  await shoot(page, 'node-limit');

  // 2. Quick, same page and worker: solved, the matrix shows a positive C11.
  await preset.selectOption('quick');
  await solve.click();
  await expect(status).toContainText('Solved in', { timeout: 180_000 });
  await expect(error).toHaveCount(0);
  const c11 = page.getByTestId('results-side').getByTestId('results-maxwell').getByTestId('cell-0-0');
  await expect(c11).toContainText(/^\s*\d/);
  await shoot(page, 'solved-after');
});

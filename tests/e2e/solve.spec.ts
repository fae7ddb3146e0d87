/**
 * Solve in the browser, read the field, save and share (issue 5), in Chromium:
 * the demo editor opens a starting section, solves in the worker, sees the matrix and the
 * field, cancels a long solve, solves again and saves; a viewer opens the saved solve from
 * its link and sees the same numbers and field with no solve running, comments, and cannot
 * change it.
 */
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { expect, test, type Page } from '@playwright/test';
import { signInAs } from './support/session';
import { unique } from './support/accounts';
import { WorkspacePage } from './pages/workspace-page';
import { SectionPage } from './pages/section-page';
import { EditorPage } from './editor-page';

/** The solve controls and output on the section page (components/results, components/field). */
class SolvePanel {
  constructor(readonly page: Page) {}
  get solve() {
    return this.page.getByTestId('solve-button');
  }
  get cancel() {
    return this.page.getByTestId('solve-cancel');
  }
  get progress() {
    return this.page.getByTestId('solve-progress');
  }
  get status() {
    return this.page.getByTestId('solve-status');
  }
  get results() {
    return this.page.getByTestId('results-panel');
  }
  get fieldCanvas() {
    return this.page.getByTestId('field-canvas');
  }
  async preset(p: 'section' | 'quick' | 'standard' | 'precise') {
    await this.page.getByTestId('solve-preset').selectOption(p);
  }
  async solved() {
    await expect(this.results.first()).toBeVisible({ timeout: 180_000 });
    await expect(this.progress).toHaveCount(0);
  }
}

test.describe('solve, view and share', () => {
  test('editor solves, cancels, saves; viewer opens the link, sees the same, comments', async ({ page, browser }) => {
    test.setTimeout(600_000);
    const workspaceId = await signInAs(page, 'editor');
    const ws = new WorkspacePage(page);
    await ws.goto(workspaceId);
    const name = unique('Solve microstrip');
    await ws.createSection(name, 'microstrip');
    await new SectionPage(page).expectLoaded(name);
    const sectionId = page.url().split('/sections/')[1]!.split(/[?#]/)[0]!;
    const editor = new EditorPage(page);
    await editor.expectReady();
    await expect(editor.gate).toHaveText('ready to solve');

    const s = new SolvePanel(page);
    // 1. Solve (quick mesh, to keep the test short on a busy machine): the matrix and the field appear.
    await s.preset('quick');
    await s.solve.click();
    await s.solved();
    const side = page.getByTestId('results-side');
    const c11 = side.getByTestId('results-maxwell').getByTestId('cell-0-0');
    await expect(c11).toContainText(/\d/);
    await expect(side.getByTestId('results-maxwell')).toContainText('pF/m');
    await expect(side.getByTestId('line-z0')).toContainText('Ω');
    await expect(s.fieldCanvas).toHaveAttribute('data-field-ready', 'true');
    // the field views: |E| with its colour bar and the caution beside it
    await page.getByTestId('field-mode-field').click();
    await expect(page.getByTestId('field-colorbar')).toContainText('V/m');
    await expect(page.getByTestId('field-peak')).toContainText('V/m');
    await expect(page.getByTestId('field-caution')).toContainText('IEC 60664-1');

    // 2. A long solve (precise mesh) is cancelled; the page stays usable.
    await s.preset('precise');
    await s.solve.click();
    await expect(s.progress).toBeVisible();
    await expect(s.progress).toContainText(/Building the mesh|Setting up|Solving|Computing|Refining|Starting/);
    await s.cancel.click();
    await expect(s.status).toHaveText('Solve cancelled.');
    await expect(s.progress).toHaveCount(0);

    // 3. Solve again and save.
    await s.preset('quick');
    await s.solve.click();
    await expect(s.status).toContainText('Solved in', { timeout: 180_000 });
    const maxwellText = (await c11.textContent())!.trim();
    const z0Text = (await side.getByTestId("line-z0").textContent())!.trim();
    await side.getByTestId('solve-save').click();
    await expect(side.getByTestId('solve-saved')).toContainText('Saved', { timeout: 30_000 });
    const href = await side.getByTestId('solve-saved-link').getAttribute('href');
    expect(href).toMatch(new RegExp(`^/w/${workspaceId}/solves/[^/]+$`));
    const solveId = href!.split('/').pop()!;

    // Saving the same revision and settings again is recognised, not stored twice.
    const again = await page.request.get(`/api/workspaces/${workspaceId}/solves/${solveId}`);
    const stored = (await again.json()) as { solve: { settings: unknown; settingsHash: string; result: unknown; revisionId: string; hasField: boolean } };
    expect(stored.solve.hasField).toBe(true);
    const dup = await page.request.post(`/api/workspaces/${workspaceId}/solves`, {
      data: {
        sectionId,
        revisionId: stored.solve.revisionId,
        settings: stored.solve.settings,
        settingsHash: stored.solve.settingsHash,
        result: stored.solve.result,
        status: 'done',
      },
    });
    expect(dup.status()).toBe(200);
    expect(((await dup.json()) as { solve: { id: string } }).solve.id).toBe(solveId);

    // The browser's worker gave exactly what the CLI gives for the same revision and settings
    // (the same solveSection, same preset and tolerance; the solver is deterministic).
    const rev = (await (await page.request.get(`/api/workspaces/${workspaceId}/sections/${sectionId}/revisions/${stored.solve.revisionId}`)).json()) as {
      revision: { content: unknown };
    };
    const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'edgefield-solve-e2e-')), 'section.json');
    fs.writeFileSync(file, JSON.stringify(rev.revision.content));
    const settings = stored.solve.settings as { preset: string; tolerance: number };
    const cli = JSON.parse(
      execFileSync(process.execPath, [path.join('node_modules', 'tsx', 'dist', 'cli.mjs'), 'scripts/solve.ts', file, '--json', '--preset', settings.preset, '--tolerance', String(settings.tolerance)], {
        encoding: 'utf8',
        timeout: 240_000,
      }),
    ) as { capacitance: { maxwell: number[][] }; line: { z0Ohm: number }; mesh: { nodes: number } };
    const browserResult = stored.solve.result as typeof cli;
    expect(browserResult.mesh.nodes).toBe(cli.mesh.nodes);
    expect(browserResult.capacitance.maxwell).toEqual(cli.capacitance.maxwell);
    expect(browserResult.line.z0Ohm).toBe(cli.line.z0Ohm);

    // 4. A viewer opens the link in a fresh browser context.
    const ctx = await browser.newContext();
    const viewer = await ctx.newPage();
    await signInAs(viewer, 'viewer');
    await viewer.goto(href!);
    await expect(viewer.getByTestId('solve-page')).toBeVisible();
    await expect(viewer.getByTestId('solve-title')).toHaveText(name);
    await expect(viewer.getByTestId('results-maxwell').getByTestId('cell-0-0')).toHaveText(maxwellText);
    await expect(viewer.getByTestId('line-z0')).toHaveText(z0Text);
    await expect(viewer.getByTestId('field-canvas')).toHaveAttribute('data-field-ready', 'true', { timeout: 30_000 });
    // nothing is solving: no solve controls, no solve ever started on this page
    await expect(viewer.getByTestId('solve-button')).toHaveCount(0);
    await expect(viewer.getByTestId('solve-progress')).toHaveCount(0);
    expect(await viewer.evaluate(() => performance.getEntriesByName('edgefield:solve-start').length)).toBe(0);
    // same field: the probe at the same place reads the same potential as for the editor
    await viewer.getByTestId('field-mode-potential').click();
    const box = await viewer.getByTestId('field-canvas').boundingBox();
    await viewer.mouse.move(box!.x + box!.width / 2, box!.y + box!.height / 2);
    await expect(viewer.getByTestId('field-probe')).toContainText('φ =');

    // The viewer comments ...
    const text = `Checked the fringing on ${name}.`;
    await viewer.getByTestId('comment-input').fill(text);
    await viewer.getByTestId('comment-submit').click();
    await expect(viewer.getByTestId('comment').filter({ hasText: text })).toBeVisible();
    // ... but cannot change the solve: no upload, no new solve
    const put = await viewer.request.put(`/api/workspaces/${workspaceId}/solves/${solveId}/field`, {
      headers: { 'content-type': 'application/octet-stream' },
      data: Buffer.from('EFLD'),
    });
    expect(put.status()).toBe(403);
    const post = await viewer.request.post(`/api/workspaces/${workspaceId}/solves`, { data: { sectionId: 'x', revisionId: 'y', settings: {}, settingsHash: 'z', status: 'failed' } });
    expect(post.status()).toBe(403);

    // The solve is listed for the team and its comment is there after a reload.
    await viewer.goto(`/w/${workspaceId}/solves`);
    await expect(viewer.getByTestId('solves-row').filter({ hasText: name })).toHaveCount(1);
    await viewer.goto(href!);
    await expect(viewer.getByTestId('comment').filter({ hasText: text })).toBeVisible();
    await ctx.close();
  });
});

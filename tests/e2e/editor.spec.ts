/**
 * The section editor in Chromium: starting sections, typed dimensions and expressions,
 * variables that redraw, undo/redo, save and reload, a deliberate short circuit that blocks
 * solving, drafts kept in the browser, and a viewer who cannot edit.
 */
import { expect, test } from '@playwright/test';
import { TEMPLATES, templateSection } from '../../lib/section/templates';
import { signInAs } from './support/session';
import { unique } from './support/accounts';
import { WorkspacePage } from './pages/workspace-page';
import { SectionPage } from './pages/section-page';
import { EditorPage } from './editor-page';

test.describe('section editor', () => {
  test('creates a section from each starting section, drawn and ready to solve', async ({ page }) => {
    test.setTimeout(900_000);
    const workspaceId = await signInAs(page, 'editor');
    const ws = new WorkspacePage(page);
    const editor = new EditorPage(page);
    for (const t of TEMPLATES) {
      await ws.goto(workspaceId);
      const name = unique(`Start ${t.name}`);
      await ws.createSection(name, t.id);
      await new SectionPage(page).expectLoaded(name);
      await editor.expectReady();
      const shapes = await editor.shapes();
      expect(shapes.map((s) => s.id)).toEqual(templateSection(t.id).shapes.map((s) => s.id));
      // Every value resolved to a finite number.
      for (const s of shapes) for (const v of Object.values(s)) if (typeof v === 'number') expect(Number.isFinite(v)).toBe(true);
      await expect(editor.gate).toHaveText('ready to solve');
    }
  });

  test('types a dimension, follows a variable, undoes and redoes, saves and reloads', async ({ page }) => {
    const workspaceId = await signInAs(page, 'editor');
    const ws = new WorkspacePage(page);
    await ws.goto(workspaceId);
    const name = unique('Editor microstrip');
    await ws.createSection(name, 'microstrip');
    const section = new SectionPage(page);
    await section.expectLoaded(name);
    const editor = new EditorPage(page);
    await editor.expectReady();

    // Microstrip template: w = 1.9 mm, trace x = -w/2, width = w.
    await editor.selectFromList('trace');
    await editor.typeField('prop-width', '2*w');
    await expect(page.getByTestId('prop-width-value')).toHaveText(/= 3\.8/);
    await expect.poll(async () => (await editor.shape('trace')).width).toBeCloseTo(3.8, 9);

    // An unknown name is refused with a clear message and not committed.
    await page.getByTestId('prop-height').fill('t + q');
    await expect(page.getByTestId('prop-height-error')).toContainText("'q'");
    await page.getByTestId('prop-height').press('Escape');

    // Change the variable: the trace follows (x = -w/2, width = 2*w).
    await editor.setVariable('w', '1');
    await expect.poll(async () => (await editor.shape('trace')).width).toBeCloseTo(2, 9);
    expect((await editor.shape('trace')).x).toBeCloseTo(-0.5, 9);

    // Undo the variable change, then redo it.
    await editor.undo.click();
    await expect.poll(async () => (await editor.shape('trace')).width).toBeCloseTo(3.8, 9);
    await editor.redo.click();
    await expect.poll(async () => (await editor.shape('trace')).width).toBeCloseTo(2, 9);

    // A cycle in the variables is reported by name.
    await editor.tab('variables');
    await page.getByTestId('new-var-name').fill('p');
    await page.getByTestId('new-var-value').fill('h + 1');
    await page.getByTestId('add-var').click();
    await editor.setVariable('h', 'p - 1');
    await expect(page.getByTestId('var-row-h')).toContainText('cycle');
    await expect(editor.gate).toHaveText('solving blocked');
    await editor.undo.click();
    await expect(editor.gate).toHaveText('ready to solve');

    // Save a new revision, reload, and find the same drawing.
    await editor.save.click();
    await expect(page.getByTestId('save-status')).toHaveText('Saved as a new revision');
    await page.reload();
    await editor.expectReady();
    await expect(section.revision).toContainText('2');
    await expect.poll(async () => (await editor.shape('trace')).width).toBeCloseTo(2, 9);
    await expect(page.getByTestId('draft-offer')).toHaveCount(0);
    await editor.tab('variables');
    await expect(page.getByTestId('var-w')).toHaveValue('1');
    await expect(page.getByTestId('var-p')).toHaveValue('h + 1');
  });

  test('keeps unsaved changes in the browser and offers them back after a reload', async ({ page }) => {
    const workspaceId = await signInAs(page, 'editor');
    const ws = new WorkspacePage(page);
    await ws.goto(workspaceId);
    const name = unique('Editor draft');
    await ws.createSection(name, 'coax');
    await new SectionPage(page).expectLoaded(name);
    const editor = new EditorPage(page);
    await editor.expectReady();
    await editor.setVariable('a', '0.3');
    await expect.poll(async () => (await editor.shape('core')).r).toBeCloseTo(0.3, 9);
    await page.waitForTimeout(800); // drafts are written 300 ms after the last change
    await page.reload();
    await editor.expectReady();
    expect((await editor.shape('core')).r).toBeCloseTo(0.45, 9);
    await page.getByTestId('draft-restore').click();
    await expect.poll(async () => (await editor.shape('core')).r).toBeCloseTo(0.3, 9);
  });

  test('draws a short circuit on purpose: flagged on the shape, solving blocked', async ({ page }) => {
    const workspaceId = await signInAs(page, 'editor');
    const ws = new WorkspacePage(page);
    await ws.goto(workspaceId);
    const name = unique('Editor short');
    await ws.createSection(name, 'edge-coupled-pair');
    await new SectionPage(page).expectLoaded(name);
    const editor = new EditorPage(page);
    await editor.expectReady();
    await expect(editor.gate).toHaveText('ready to solve');

    // Draw a rectangle on net "p" across both traces (traces at y 4 … 5.4 mil, x -8 … 8).
    await page.getByTestId('new-kind').selectOption('net:p');
    await page.getByTestId('tool-rect').click();
    await editor.dragWorld({ x: -9, y: 4.2 }, { x: 9, y: 5.3 }); // snaps to the traces' bottom (4) and top (5.4)
    await expect.poll(async () => (await editor.shapes()).length).toBe(4);
    await expect(editor.gate).toHaveText('solving blocked');
    await expect(editor.state).toHaveAttribute('data-can-solve', 'no');
    await editor.tab('checks');
    await expect(page.getByTestId('can-solve')).toHaveAttribute('data-can-solve', 'no');
    await expect(page.getByTestId('issue-error').first()).toContainText(/rect_1/);

    // Undo removes the short and solving is allowed again.
    await editor.undo.click();
    await expect(editor.gate).toHaveText('ready to solve');
  });

  test('a viewer sees the drawing read-only, with no edit controls', async ({ page }) => {
    const workspaceId = await signInAs(page, 'viewer');
    const ws = new WorkspacePage(page);
    await ws.goto(workspaceId);
    await ws.rows.first().getByTestId('section-link').click();
    const editor = new EditorPage(page);
    await editor.expectReady();
    await expect(page.getByTestId('read-only-banner')).toBeVisible();
    await expect(page.getByTestId('tool-rect')).toHaveCount(0);
    await expect(editor.save).toHaveCount(0);
    await expect(editor.undo).toHaveCount(0);
    const before = await editor.shapes();
    expect(before.length).toBeGreaterThan(0);
    // Selecting and pressing Delete or dragging changes nothing.
    await editor.selectFromList(String(before[0]!.id));
    await page.keyboard.press('Delete');
    const s = before[0]!;
    const cx = typeof s.cx === 'number' ? s.cx : typeof s.x === 'number' ? Number(s.x) + Number(s.width ?? 0) / 2 : Number(s.x1 ?? 0);
    const cy = typeof s.cy === 'number' ? s.cy : typeof s.y === 'number' ? Number(s.y) + Number(s.height ?? 0) / 2 : Number(s.y1 ?? 0);
    await editor.dragWorld({ x: cx, y: cy }, { x: cx + 5, y: cy + 5 });
    expect(await editor.shapes()).toEqual(before);
    await expect(page.getByTestId('prop-' + (s.type === 'circle' || s.type === 'ring' ? 'cx' : s.type === 'strip' ? 'x1' : 'x'))).toHaveAttribute('readonly', '');
  });

  test('screenshots at 1440 and 1024 px (looked at by people, not compared)', async ({ page }) => {
    const workspaceId = await signInAs(page, 'editor');
    const ws = new WorkspacePage(page);
    await ws.goto(workspaceId);
    const name = unique('Editor look');
    await ws.createSection(name, 'coplanar-grounded');
    await new SectionPage(page).expectLoaded(name);
    const editor = new EditorPage(page);
    await editor.expectReady();
    await editor.selectFromList('centre');
    for (const width of [1440, 1024]) {
      await page.setViewportSize({ width, height: width === 1440 ? 900 : 768 });
      await page.getByTestId('fit').click();
      await page.waitForTimeout(300);
      await page.screenshot({ path: `screenshots/editor-${width}.png` });
    }
    await editor.tab('materials');
    await page.getByTestId('open-library').click();
    await page.screenshot({ path: 'screenshots/editor-1024-materials.png' });
    await page.getByTestId('help').click();
    await expect(page.getByTestId('help-overlay')).toBeVisible();
    await page.screenshot({ path: 'screenshots/editor-1024-help.png' });
  });
});

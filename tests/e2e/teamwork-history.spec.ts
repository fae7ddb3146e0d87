/**
 * Team work (issue 7), uploads and history: importing the sample SVG through the dialog
 * gives a section with its original file kept; a malformed file gets a clear error and
 * creates nothing; comparing two revisions shows what changed; restoring creates a new
 * revision and loses none.
 */
import path from 'node:path';
import { expect, test } from '@playwright/test';
import { unique } from './support/accounts';
import { signInAs } from './support/session';

const SAMPLE_SVG = path.resolve('tests/fixtures/import/microstrip-and-wire.svg');

test('import the sample SVG: layers mapped, section created, original file kept', async ({ page }) => {
  test.slow();
  const workspaceId = await signInAs(page, 'editor');
  await page.getByTestId('import-drawing').click();
  const dialog = page.getByTestId('import-dialog');
  await expect(dialog).toBeVisible();
  await page.getByTestId('import-file').setInputFiles(SAMPLE_SVG);
  await expect(page.getByTestId('import-preview')).toBeVisible();
  await expect(page.getByTestId('import-layer')).toHaveCount(4);
  await expect(page.getByTestId('import-units')).toHaveValue('mm');
  // First guesses from the layer names; the wire is made a ground conductor here.
  const layer = (n: string) => page.locator(`[data-testid="import-layer"][data-layer="${n}"]`);
  await expect(layer('FR4').getByTestId('import-layer-as')).toHaveValue('dielectric');
  await expect(layer('GND').getByTestId('import-layer-as')).toHaveValue('ground');
  await expect(layer('TRACE').getByTestId('import-layer-as')).toHaveValue('signal');
  await layer('wire').getByTestId('import-layer-as').selectOption('ground');
  const name = unique('Imported feed');
  await page.getByTestId('import-name').fill(name);
  await page.getByTestId('import-submit').click();
  await expect(page).toHaveURL(/\/sections\/[^/]+$/, { timeout: 60_000 });
  await expect(page.getByTestId('section-name')).toHaveText(name);

  await page.getByTestId('section-history-link').click();
  await expect(page.getByTestId('revisions')).toBeVisible();
  const file = page.locator('[data-testid="section-file"][data-kind="drawing-svg"]');
  await expect(file).toContainText('microstrip-and-wire.svg');

  // The stored revision holds the four imported shapes.
  const sectionId = /\/sections\/([^/]+)\/history/.exec(page.url())![1];
  const revs = await (await page.request.get(`/api/workspaces/${workspaceId}/sections/${sectionId}/revisions`)).json();
  const rev = await (await page.request.get(`/api/workspaces/${workspaceId}/sections/${sectionId}/revisions/${revs.revisions[0].id}`)).json();
  expect(rev.revision.content.shapes.map((s: { id: string }) => s.id)).toEqual(['fr4-1', 'gnd-1', 'trace-1', 'wire-1']);
});

test('a malformed drawing gets a clear error and creates nothing', async ({ page }) => {
  const workspaceId = await signInAs(page, 'editor');
  const before = (await (await page.request.get(`/api/workspaces/${workspaceId}/sections`)).json()).sections.length;
  await page.getByTestId('import-drawing').click();
  await page.getByTestId('import-file').setInputFiles({ name: 'broken.svg', mimeType: 'image/svg+xml', buffer: Buffer.from('<svg><rect width="1"></svg>') });
  await expect(page.getByTestId('import-read-error')).toContainText('not well-formed XML');
  await expect(page.getByTestId('import-submit')).toBeDisabled();
  // The server refuses it the same way when sent directly.
  const res = await page.request.post(`/api/workspaces/${workspaceId}/imports`, {
    multipart: {
      file: { name: 'broken.svg', mimeType: 'image/svg+xml', buffer: Buffer.from('<svg><rect width="1"></svg>') },
      options: JSON.stringify({ name: 'x', units: 'mm', layers: {} }),
    },
  });
  expect(res.status()).toBe(422);
  expect((await res.json()).error.message).toMatch(/not well-formed XML/);
  const after = (await (await page.request.get(`/api/workspaces/${workspaceId}/sections`)).json()).sections.length;
  expect(after).toBe(before);
});

test('compare two revisions, then restore the old one as a new revision', async ({ page }) => {
  test.slow();
  const workspaceId = await signInAs(page, 'editor');
  const content = (w: number) => ({
    format: 'edgefield.section/1',
    units: 'mm',
    materials: [{ id: 'fr4', name: 'FR-4', epsR: 4.3 }],
    nets: [
      { name: 'sig', role: 'signal' },
      { name: 'gnd', role: 'ground' },
    ],
    shapes: [
      { id: 'sub', type: 'rect', x: -5, y: 0, width: 10, height: 1.6, dielectric: 'fr4' },
      { id: 'trace', type: 'rect', x: -w / 2, y: 1.6, width: w, height: 0.035, conductor: 'sig' },
      { id: 'plane', type: 'rect', x: -5, y: -0.035, width: 10, height: 0.035, conductor: 'gnd' },
    ],
  });
  const created = await (await page.request.post(`/api/workspaces/${workspaceId}/sections`, { data: { name: unique('History check'), content: content(2) } })).json();
  const sectionId = created.section.id as string;
  const r2 = await page.request.post(`/api/workspaces/${workspaceId}/sections/${sectionId}/revisions`, {
    data: { content: content(3), baseRevisionId: created.revision.id, message: 'Wider trace' },
  });
  expect(r2.status()).toBe(201);

  await page.goto(`/w/${workspaceId}/sections/${sectionId}/history`);
  await expect(page.getByTestId('revision-row')).toHaveCount(2);
  await expect(page.getByTestId('compare-summary')).toContainText('0 added, 1 changed, 0 removed, 2 unchanged');
  await expect(page.locator('[data-testid="compare-changes"] [data-shape="trace"]')).toContainText('width');
  await expect(page.locator('[data-testid="sketch-b"] [data-shape="trace"]')).toHaveAttribute('data-change', 'changed');

  page.once('dialog', (d) => void d.accept());
  await page.locator('[data-testid="revision-row"][data-number="1"]').getByTestId('revision-restore').click();
  await expect(page.getByTestId('revision-row')).toHaveCount(3);
  await expect(page.locator('[data-testid="revision-row"][data-number="3"]')).toContainText('Restored from r1');
  // r3 equals r1: comparing them shows no change.
  await expect(page.getByTestId('compare-summary')).toContainText('0 added, 0 changed, 0 removed, 3 unchanged');
  const list = await (await page.request.get(`/api/workspaces/${workspaceId}/sections/${sectionId}/revisions`)).json();
  expect(list.revisions.map((r: { number: number }) => r.number)).toEqual([3, 2, 1]);
});

test('the activity feed lists recent work', async ({ page }) => {
  const workspaceId = await signInAs(page, 'viewer');
  await page.getByTestId('nav-activity').click();
  await expect(page).toHaveURL(new RegExp(`/w/${workspaceId}/activity$`));
  await expect(page.getByTestId('activity-item').first()).toBeVisible();
});

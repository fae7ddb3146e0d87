/**
 * The results panel and each field view at 1440 and 1024 px: nothing overflows the page,
 * the colour bar and numbers with units are there, and screenshots are written to
 * screenshots/results/ for people to look at.
 */
import { expect, test, type Page } from '@playwright/test';
import { signInAs } from './support/session';
import { unique } from './support/accounts';
import { WorkspacePage } from './pages/workspace-page';
import { SectionPage } from './pages/section-page';
import { EditorPage } from './editor-page';

const OUT = 'screenshots/results';

async function newSolvedSection(page: Page, template: string, label: string) {
  const workspaceId = await signInAs(page, 'editor');
  const ws = new WorkspacePage(page);
  await ws.goto(workspaceId);
  const name = unique(label);
  await ws.createSection(name, template);
  await new SectionPage(page).expectLoaded(name);
  await new EditorPage(page).expectReady();
  await page.getByTestId('solve-preset').selectOption('quick');
  await page.getByTestId('solve-button').click();
  await expect(page.getByTestId('results-side').getByTestId('results-panel')).toBeVisible({ timeout: 180_000 });
  await expect(page.getByTestId('field-canvas')).toHaveAttribute('data-field-ready', 'true');
  return workspaceId;
}

async function noHorizontalOverflow(page: Page) {
  const o = await page.evaluate(() => ({ sw: document.documentElement.scrollWidth, cw: document.documentElement.clientWidth }));
  expect(o.sw).toBeLessThanOrEqual(o.cw + 1);
}

for (const width of [1440, 1024]) {
  test(`results and field views at ${width} px`, async ({ page }) => {
    test.setTimeout(600_000);
    await page.setViewportSize({ width, height: 900 });
    const workspaceId = await newSolvedSection(page, 'microstrip', `Screens microstrip ${width}`);
    await noHorizontalOverflow(page);
    await page.screenshot({ path: `${OUT}/${width}-section-solved.png` });
    await page.getByRole('complementary', { name: 'Section properties' }).screenshot({ path: `${OUT}/${width}-results-side.png` });

    // the summary at the top of the results panel: line values, loss, peak field with the caution
    const summary = page.getByTestId('results-side').getByTestId('results-summary');
    await expect(summary.getByTestId('summary-z0')).toContainText('Ω');
    await expect(summary.getByTestId('summary-delay')).toContainText('ps/mm');
    await expect(summary.getByTestId('summary-alpha')).toContainText('dB/m', { timeout: 60_000 });
    await expect(summary.getByTestId('summary-peak-value')).toContainText('kV/mm');
    await expect(summary.getByTestId('summary-peak-where')).toContainText('mm');
    await expect(summary.getByTestId('summary-margin')).toContainText('×');
    await expect(summary.getByTestId('summary-margin-where')).toContainText('kV/mm');
    await expect(summary.getByTestId('summary-caution')).toContainText('IEC 60664-1');
    // bad input names the field and keeps the last values
    const alpha = await summary.getByTestId('summary-alpha').innerText();
    await summary.getByTestId('summary-frequency').fill('abc');
    await expect(summary.getByTestId('summary-input-error')).toContainText('Frequency');
    await expect(summary.getByTestId('summary-alpha')).toHaveText(alpha);
    // a higher frequency gives a higher loss
    await summary.getByTestId('summary-frequency').fill('10');
    await expect(summary.getByTestId('summary-input-error')).toHaveCount(0);
    await expect(summary.getByTestId('summary-alpha')).not.toHaveText(alpha, { timeout: 60_000 });
    const dbPerM = (t: string) => Number(/([\d.]+) dB\/m/.exec(t)?.[1] ?? NaN);
    expect(dbPerM(await summary.getByTestId('summary-alpha').innerText())).toBeGreaterThan(dbPerM(alpha));
    await noHorizontalOverflow(page);
    await summary.screenshot({ path: `${OUT}/${width}-results-summary.png` });
    // the |E| picture over the drawing
    await page.getByTestId('overlay-kind').selectOption('field');
    await expect(page.getByTestId('overlay-kind')).toHaveValue('field');
    await noHorizontalOverflow(page);
    await page.screenshot({ path: `${OUT}/${width}-section-overlay-field.png` });
    // the link to the detailed card
    await summary.getByTestId('results-summary-details').click();
    await expect(page.getByTestId('analysis-card')).toBeInViewport();

    const card = page.getByTestId('field-card');
    await card.scrollIntoViewIfNeeded();
    for (const mode of ['potential', 'field', 'lines', 'mesh'] as const) {
      await page.getByTestId(`field-mode-${mode}`).click();
      await expect(page.getByTestId('field-canvas')).toHaveAttribute('data-mode', mode);
      if (mode === 'field') {
        await expect(page.getByTestId('field-colorbar')).toContainText('V/m');
        await expect(page.getByTestId('field-caution')).toBeVisible();
      }
      await page.getByTestId('field-canvas').scrollIntoViewIfNeeded();
      const box = (await page.getByTestId('field-canvas').boundingBox())!;
      await page.mouse.move(box.x + box.width * 0.5, box.y + box.height * 0.45);
      await expect(page.getByTestId('field-probe')).toContainText('φ =');
      await noHorizontalOverflow(page);
      await card.screenshot({ path: `${OUT}/${width}-field-${mode}.png` });
    }
    // a cut line across the trace, and its plot
    await page.getByTestId('field-mode-field').click();
    await page.getByTestId('field-tool-cut').click();
    await page.getByTestId('field-canvas').scrollIntoViewIfNeeded();
    const box = (await page.getByTestId('field-canvas').boundingBox())!;
    await page.mouse.move(box.x + box.width * 0.5, box.y + box.height * 0.15);
    await page.mouse.down();
    await page.mouse.move(box.x + box.width * 0.5, box.y + box.height * 0.85, { steps: 8 });
    await page.mouse.up();
    await expect(page.getByTestId('cut-plot')).toContainText('potential');
    await card.screenshot({ path: `${OUT}/${width}-field-cut.png` });

    // the saved solve's own page
    await page.getByTestId('solve-save').click();
    const link = page.getByTestId('solve-saved-link');
    await expect(link).toBeVisible({ timeout: 30_000 });
    await page.goto((await link.getAttribute('href'))!);
    await expect(page.getByTestId('field-canvas')).toHaveAttribute('data-field-ready', 'true', { timeout: 30_000 });
    await noHorizontalOverflow(page);
    await page.screenshot({ path: `${OUT}/${width}-solve-page.png`, fullPage: true });
    await page.goto(`/w/${workspaceId}/solves`);
    await expect(page.getByTestId('solves-table')).toBeVisible();
    await noHorizontalOverflow(page);
    await page.screenshot({ path: `${OUT}/${width}-solves-list.png` });
  });
}

test('plate pair card at 1024 px', async ({ page }) => {
  test.setTimeout(300_000);
  await page.setViewportSize({ width: 1024, height: 900 });
  await newSolvedSection(page, 'plate-pair', 'Screens plates');
  const card = page.getByTestId('results-side').getByTestId('results-plates');
  await expect(card).toContainText('εw/d');
  await expect(page.getByTestId('plates-excess')).toContainText('%');
  await card.scrollIntoViewIfNeeded();
  await card.screenshot({ path: `${OUT}/1024-plates-card.png` });
});

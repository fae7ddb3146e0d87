import { expect, type Locator, type Page } from '@playwright/test';

interface ViewState {
  scale: number;
  ox: number;
  oy: number;
}

/** The section editor (components/canvas) on the section page. */
export class EditorPage {
  readonly root: Locator;
  readonly canvas: Locator;
  readonly state: Locator;
  readonly save: Locator;
  readonly undo: Locator;
  readonly redo: Locator;
  readonly gate: Locator;

  constructor(readonly page: Page) {
    this.root = page.getByTestId('section-editor');
    this.canvas = page.getByTestId('editor-canvas');
    this.state = page.getByTestId('editor-state');
    this.save = page.getByTestId('save');
    this.undo = page.getByTestId('undo');
    this.redo = page.getByTestId('redo');
    this.gate = page.getByTestId('solve-gate');
  }

  async expectReady() {
    await expect(this.root).toBeVisible({ timeout: 30_000 });
    await expect(this.canvas.locator('canvas').first()).toBeVisible({ timeout: 30_000 });
  }

  async shapes(): Promise<Record<string, number | string>[]> {
    const raw = await this.state.getAttribute('data-shapes');
    return JSON.parse(raw ?? '[]') as Record<string, number | string>[];
  }

  async shape(id: string): Promise<Record<string, number | string>> {
    const s = (await this.shapes()).find((x) => x.id === id);
    if (!s) throw new Error(`no shape ${id}`);
    return s;
  }

  async view(): Promise<ViewState> {
    return JSON.parse((await this.state.getAttribute('data-view')) ?? 'null') as ViewState;
  }

  /** Screen position (page coordinates) of a world point. */
  async toPage(x: number, y: number): Promise<{ x: number; y: number }> {
    const v = await this.view();
    const box = await this.canvas.boundingBox();
    if (!box) throw new Error('canvas not laid out');
    return { x: box.x + v.ox + x * v.scale, y: box.y + v.oy - y * v.scale };
  }

  async tab(name: 'shape' | 'variables' | 'nets' | 'materials' | 'boundary' | 'checks') {
    await this.page.getByTestId(`tab-${name}`).click();
  }

  /** Select a shape from the list shown when nothing is selected. */
  async selectFromList(id: string) {
    await this.page.keyboard.press('Shift+Escape');
    await this.tab('shape');
    await this.page.getByTestId('shape-list').getByRole('button').filter({ hasText: id }).first().click();
    await expect(this.page.getByTestId('shape-id')).toHaveValue(id);
  }

  async typeField(testId: string, text: string) {
    const f = this.page.getByTestId(testId);
    await f.fill(text);
    await f.press('Enter');
  }

  async setVariable(name: string, value: string) {
    await this.tab('variables');
    await this.typeField(`var-${name}`, value);
  }

  /** Drag on the canvas between two world points. */
  async dragWorld(a: { x: number; y: number }, b: { x: number; y: number }) {
    const p = await this.toPage(a.x, a.y);
    const q = await this.toPage(b.x, b.y);
    await this.page.mouse.move(p.x, p.y);
    await this.page.mouse.down();
    await this.page.mouse.move((p.x + q.x) / 2, (p.y + q.y) / 2, { steps: 4 });
    await this.page.mouse.move(q.x, q.y, { steps: 4 });
    await this.page.mouse.up();
  }
}

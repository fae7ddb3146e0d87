import { expect, type Locator, type Page } from '@playwright/test';

/** /w/[workspaceId]/sections/[sectionId]: header and the editor slot. */
export class SectionPage {
  readonly name: Locator;
  readonly revision: Locator;
  readonly rename: Locator;
  readonly remove: Locator;
  readonly nameInput: Locator;
  readonly nameSave: Locator;
  readonly editorSlot: Locator;

  constructor(readonly page: Page) {
    this.name = page.getByTestId('section-name');
    this.revision = page.getByTestId('section-revision');
    this.rename = page.getByTestId('section-rename');
    this.remove = page.getByTestId('section-delete');
    this.nameInput = page.getByTestId('section-name-input');
    this.nameSave = page.getByTestId('section-name-save');
    this.editorSlot = page.getByTestId('section-editor-slot');
  }

  async expectLoaded(name?: string) {
    await expect(this.page).toHaveURL(/\/w\/[^/]+\/sections\/[^/]+$/);
    if (name) await expect(this.name).toHaveText(name);
    else await expect(this.name).toBeVisible();
  }

  async renameTo(name: string) {
    await this.rename.click();
    await this.nameInput.fill(name);
    await this.nameSave.click();
  }

  async deleteSection() {
    await this.remove.click();
    await this.page.getByTestId('delete-section-confirm').click();
  }
}

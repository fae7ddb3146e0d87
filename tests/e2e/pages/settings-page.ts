import { expect, type Locator, type Page } from '@playwright/test';

export class SettingsPage {
  readonly nameInput: Locator;
  readonly nameSave: Locator;
  readonly nameReadonly: Locator;
  readonly members: Locator;

  constructor(readonly page: Page) {
    this.nameInput = page.getByTestId('workspace-name-input');
    this.nameSave = page.getByTestId('workspace-name-save');
    this.nameReadonly = page.getByTestId('workspace-name-readonly');
    this.members = page.getByTestId('member-row');
  }

  async goto(workspaceId: string) {
    await this.page.goto(`/w/${workspaceId}/settings`);
    await expect(this.page.getByTestId('members')).toBeVisible();
  }

  async renameWorkspace(name: string) {
    await this.nameInput.fill(name);
    await this.nameSave.click();
  }
}

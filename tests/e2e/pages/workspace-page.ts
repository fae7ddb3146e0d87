import { expect, type Locator, type Page } from '@playwright/test';

/** /w/[workspaceId]: the sections panel, recent solves, header. */
export class WorkspacePage {
  readonly title: Locator;
  readonly newSection: Locator;
  readonly search: Locator;
  readonly sort: Locator;
  readonly rows: Locator;
  readonly dialog: Locator;
  readonly currentWorkspaceName: Locator;

  constructor(readonly page: Page) {
    this.title = page.getByTestId('workspace-title');
    this.newSection = page.getByTestId('new-section');
    this.search = page.getByTestId('sections-search');
    this.sort = page.getByTestId('sections-sort');
    this.rows = page.getByTestId('section-row');
    this.dialog = page.getByTestId('create-section-dialog');
    this.currentWorkspaceName = page.getByTestId('current-workspace-name');
  }

  async goto(workspaceId: string) {
    await this.page.goto(`/w/${workspaceId}`);
    await expect(this.title).toBeVisible();
  }

  row(name: string) {
    return this.rows.filter({ has: this.page.getByTestId('section-link').getByText(name, { exact: true }) });
  }

  async createSection(name: string, template = 'microstrip') {
    await this.newSection.click();
    await expect(this.dialog).toBeVisible();
    await this.page.getByTestId('create-section-name').fill(name);
    await this.page.getByTestId('create-section-template').selectOption(template);
    await this.page.getByTestId('create-section-submit').click();
  }

  async signOut() {
    await this.page.getByTestId('account-menu').click();
    await this.page.getByTestId('sign-out').click();
    await expect(this.page).toHaveURL(/\/login/);
  }
}

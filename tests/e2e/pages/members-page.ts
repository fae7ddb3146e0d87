import { expect, type Locator, type Page } from '@playwright/test';

/** The members and invitations part of /w/[workspaceId]/settings (issue 7). */
export class MembersPage {
  readonly members: Locator;
  readonly invitations: Locator;
  readonly inviteEmail: Locator;
  readonly inviteRole: Locator;
  readonly inviteSubmit: Locator;
  readonly notice: Locator;

  constructor(readonly page: Page) {
    this.members = page.getByTestId('member-row');
    this.invitations = page.getByTestId('invitation-row');
    this.inviteEmail = page.getByTestId('invite-email');
    this.inviteRole = page.getByTestId('invite-role');
    this.inviteSubmit = page.getByTestId('invite-submit');
    this.notice = page.getByTestId('members-notice');
  }

  async goto(workspaceId: string) {
    await this.page.goto(`/w/${workspaceId}/settings`);
    await expect(this.page.getByTestId('members')).toBeVisible();
  }

  member(email: string) {
    return this.page.locator(`[data-testid="member-row"][data-email="${email}"]`);
  }

  invitation(email: string) {
    return this.page.locator(`[data-testid="invitation-row"][data-email="${email}"]`);
  }

  async invite(email: string, role: 'owner' | 'editor' | 'viewer') {
    await this.inviteEmail.fill(email);
    await this.inviteRole.selectOption(role);
    await this.inviteSubmit.click();
    await expect(this.notice).toContainText(`Invitation sent to ${email}`);
    await expect(this.invitation(email)).toBeVisible();
  }

  async setRole(email: string, role: 'owner' | 'editor' | 'viewer') {
    await this.member(email).getByTestId('member-role').selectOption(role);
    await expect(this.member(email)).toHaveAttribute('data-role', role);
  }
}

/** /invite/[token]: the page an invitation mail links to. */
export class InvitePage {
  readonly root: Locator;
  readonly name: Locator;
  readonly password: Locator;
  readonly submit: Locator;
  readonly error: Locator;

  constructor(readonly page: Page) {
    this.root = page.getByTestId('invite-page');
    this.name = page.getByTestId('invite-name');
    this.password = page.getByTestId('invite-password');
    this.submit = page.getByTestId('invite-signup-submit');
    this.error = page.getByTestId('invite-error');
  }

  async signUp(name: string, password: string) {
    await this.name.fill(name);
    await this.password.fill(password);
    await this.submit.click();
  }
}

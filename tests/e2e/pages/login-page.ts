import { expect, type Locator, type Page } from '@playwright/test';

export class LoginPage {
  readonly email: Locator;
  readonly password: Locator;
  readonly submit: Locator;
  readonly sendLink: Locator;
  readonly error: Locator;
  readonly linkSent: Locator;
  readonly demoAccounts: Locator;

  constructor(readonly page: Page) {
    this.email = page.getByTestId('login-email');
    this.password = page.getByTestId('login-password');
    this.submit = page.getByTestId('login-submit');
    this.sendLink = page.getByTestId('login-send-link');
    this.error = page.getByTestId('login-error');
    this.linkSent = page.getByTestId('link-sent');
    this.demoAccounts = page.getByTestId('demo-accounts');
  }

  async goto() {
    await this.page.goto('/login');
    await expect(this.submit).toBeVisible();
  }

  async signIn(email: string, password: string) {
    await this.email.fill(email);
    await this.password.fill(password);
    await this.submit.click();
  }

  async requestLink(email: string) {
    await this.email.fill(email);
    await this.sendLink.click();
    await expect(this.linkSent).toBeVisible({ timeout: 20_000 });
  }
}

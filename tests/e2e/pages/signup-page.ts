import { expect, type Locator, type Page } from '@playwright/test';

export class SignupPage {
  readonly name: Locator;
  readonly email: Locator;
  readonly password: Locator;
  readonly submit: Locator;
  readonly form: Locator;

  constructor(readonly page: Page) {
    this.form = page.getByTestId('signup-form');
    this.name = page.getByTestId('signup-name');
    this.email = page.getByTestId('signup-email');
    this.password = page.getByTestId('signup-password');
    this.submit = page.getByTestId('signup-submit');
  }

  async goto() {
    await this.page.goto('/signup');
    await expect(this.submit).toBeVisible();
  }

  async signUp(name: string, email: string, password: string) {
    await this.name.fill(name);
    await this.email.fill(email);
    await this.password.fill(password);
    await this.submit.click();
  }

  fieldError(field: 'name' | 'email' | 'password') {
    return this.page.getByTestId(`signup-${field}-error`);
  }
}

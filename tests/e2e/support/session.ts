import { expect, type Page } from '@playwright/test';
import { LoginPage } from '../pages/login-page';
import { demoAccount, type DemoRole } from './accounts';

/** Sign in through the sign-in page and wait for the workspace home. Returns the workspace id. */
export async function signInAs(page: Page, role: DemoRole): Promise<string> {
  const a = demoAccount(role);
  return signInWith(page, a.email, a.password);
}

export async function signInWith(page: Page, email: string, password: string): Promise<string> {
  const login = new LoginPage(page);
  await login.goto();
  await login.signIn(email, password);
  await expect(page).toHaveURL(/\/w\/[^/]+$/, { timeout: 30_000 });
  return workspaceIdFromUrl(page.url());
}

export function workspaceIdFromUrl(url: string): string {
  const m = /\/w\/([^/?#]+)/.exec(url);
  if (!m?.[1]) throw new Error(`not a workspace URL: ${url}`);
  return m[1];
}

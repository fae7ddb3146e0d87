/**
 * Foundation end-to-end tests (issue 2): each demo role signs in and does what it may,
 * the magic-link sign-in through the demo mailbox, sign-up, and signed-out redirects.
 * Runs against the production build in demo mode (scripts/serve-e2e.mjs).
 */
import { expect, test } from '@playwright/test';
import { LoginPage } from './pages/login-page';
import { MailboxPage } from './pages/mailbox-page';
import { SectionPage } from './pages/section-page';
import { SettingsPage } from './pages/settings-page';
import { SignupPage } from './pages/signup-page';
import { WorkspacePage } from './pages/workspace-page';
import { DEMO_WORKSPACE_NAME, OTHER_DEMO_ACCOUNT, demoAccount, unique } from './support/accounts';
import { signInAs, signInWith } from './support/session';

test.describe('signed out', () => {
  test('pages redirect to the sign-in page and the API answers 401', async ({ page, request }) => {
    await page.goto('/');
    await expect(page).toHaveURL(/\/login/);
    await page.goto('/w/some-workspace/settings');
    await expect(page).toHaveURL(/\/login/);
    await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible();

    const res = await request.get('/api/workspaces');
    expect(res.status()).toBe(401);
    const body = (await res.json()) as { error?: { code?: string; message?: string } };
    expect(body.error?.code).toBeTruthy();
    expect(body.error?.message).toBeTruthy();
  });

  test('the sign-in page lists the demo accounts and refuses a wrong password', async ({ page }) => {
    const login = new LoginPage(page);
    await login.goto();
    await expect(login.demoAccounts).toContainText(demoAccount('owner').email);
    await expect(login.demoAccounts).toContainText(demoAccount('viewer').email);
    await login.signIn(demoAccount('owner').email, 'not-the-password');
    await expect(login.error).toBeVisible();
    await expect(page).toHaveURL(/\/login/);
  });
});

test('owner signs in, sees the demo workspace and renames it', async ({ page }) => {
  const workspaceId = await signInAs(page, 'owner');
  const home = new WorkspacePage(page);
  await expect(home.title).toHaveText(DEMO_WORKSPACE_NAME);
  await expect(home.rows.first()).toBeVisible();
  await expect(home.newSection).toBeVisible();

  const settings = new SettingsPage(page);
  await settings.goto(workspaceId);
  for (const role of ['owner', 'editor', 'viewer'] as const) {
    await expect(settings.members.filter({ hasText: demoAccount(role).email })).toHaveAttribute('data-role', role);
  }
  const renamed = unique('Sensor Lab');
  await settings.renameWorkspace(renamed);
  await expect(home.currentWorkspaceName).toHaveText(renamed);
  await page.reload();
  await expect(settings.nameInput).toHaveValue(renamed);
  await expect(home.currentWorkspaceName).toHaveText(renamed);

  // Put the name back for the other tests.
  await settings.renameWorkspace(DEMO_WORKSPACE_NAME);
  await expect(home.currentWorkspaceName).toHaveText(DEMO_WORKSPACE_NAME);

  await home.signOut();
  await page.goto(`/w/${workspaceId}`);
  await expect(page).toHaveURL(/\/login/);
});

test('editor creates a section, finds it by search, renames and deletes it', async ({ page }) => {
  const workspaceId = await signInAs(page, 'editor');
  const home = new WorkspacePage(page);
  const name = unique('Probe feed');
  await home.createSection(name, 'microstrip');

  const section = new SectionPage(page);
  await section.expectLoaded(name);
  await expect(section.revision).toHaveText('r1');
  await expect(section.editorSlot).toBeVisible();

  await home.goto(workspaceId);
  await home.search.fill(name);
  await expect(home.rows).toHaveCount(1);
  await expect(home.row(name)).toBeVisible();
  await home.search.fill('no section is called this');
  await expect(page.getByTestId('sections-empty')).toBeVisible();

  await home.search.fill(name);
  await home.row(name).getByTestId('section-link').click();
  const renamed = `${name} (rev B)`;
  await section.renameTo(renamed);
  await expect(section.name).toHaveText(renamed);
  await page.reload();
  await expect(section.name).toHaveText(renamed);

  await section.deleteSection();
  await expect(page).toHaveURL(new RegExp(`/w/${workspaceId}$`));
  await expect(home.title).toBeVisible();
  await expect(home.row(renamed)).toHaveCount(0);
  await home.search.fill(renamed);
  await expect(page.getByTestId('sections-empty')).toBeVisible();
});

test('viewer sees no create or change controls and the API answers 403 to writes', async ({ page }) => {
  const workspaceId = await signInAs(page, 'viewer');
  const home = new WorkspacePage(page);
  await expect(home.title).toBeVisible();
  await expect(home.rows.first()).toBeVisible();
  await expect(home.newSection).toHaveCount(0);
  await expect(page.getByTestId('sections-show-deleted')).toHaveCount(0);

  await home.rows.first().getByTestId('section-link').click();
  const section = new SectionPage(page);
  await section.expectLoaded();
  await expect(section.rename).toHaveCount(0);
  await expect(section.remove).toHaveCount(0);
  const sectionId = /\/sections\/([^/?#]+)/.exec(page.url())?.[1];
  expect(sectionId).toBeTruthy();

  const settings = new SettingsPage(page);
  await settings.goto(workspaceId);
  await expect(settings.nameReadonly).toBeVisible();
  await expect(settings.nameInput).toHaveCount(0);

  // The server refuses too (the browser's session cookie comes along with page.request).
  const create = await page.request.post(`/api/workspaces/${workspaceId}/sections`, {
    data: { name: 'Viewer attempt', content: {} },
  });
  expect(create.status()).toBe(403);
  const rename = await page.request.patch(`/api/workspaces/${workspaceId}`, { data: { name: 'Viewer attempt' } });
  expect(rename.status()).toBe(403);
  const del = await page.request.delete(`/api/workspaces/${workspaceId}/sections/${sectionId}`);
  expect(del.status()).toBe(403);
  // Reading is allowed.
  const list = await page.request.get(`/api/workspaces/${workspaceId}/sections`);
  expect(list.status()).toBe(200);
});

test("a member of another workspace gets not-found for this workspace's pages and 404 from its API", async ({ page }) => {
  const demoWorkspaceId = await signInAs(page, 'owner');
  await new WorkspacePage(page).signOut();

  await signInWith(page, OTHER_DEMO_ACCOUNT.email, OTHER_DEMO_ACCOUNT.password);
  await page.goto(`/w/${demoWorkspaceId}`);
  await expect(page.getByTestId('not-found')).toBeVisible();
  const res = await page.request.get(`/api/workspaces/${demoWorkspaceId}/sections`);
  expect(res.status()).toBe(404);
});

test('magic link: the mail arrives in the demo mailbox and its link signs in', async ({ page, context }) => {
  const editor = demoAccount('editor');
  const mailbox = new MailboxPage(page);
  await mailbox.goto();
  const before = await mailbox.mails.filter({ has: page.getByTestId('mail-to').getByText(editor.email) }).count();

  const login = new LoginPage(page);
  await login.goto();
  await login.requestLink(editor.email);
  await page.getByTestId('open-mailbox').click();
  await expect(page).toHaveURL(/\/demo\/mailbox/);

  const toEditor = mailbox.mails.filter({ has: page.getByTestId('mail-to').getByText(editor.email) });
  await expect(async () => {
    await page.reload();
    expect(await toEditor.count()).toBeGreaterThan(before);
  }).toPass({ timeout: 30_000 });

  const link = toEditor.first().getByTestId('mail-link').first();
  const href = await link.getAttribute('href');
  expect(href).toMatch(/\/api\/auth\/callback\/email\?/);
  await link.click();
  await expect(page).toHaveURL(/\/w\/[^/]+$/, { timeout: 30_000 });
  await expect(new WorkspacePage(page).title).toBeVisible();
  await page.getByTestId('account-menu').click();
  await expect(page.getByTestId('account-email')).toHaveText(editor.email);

  // The link works once.
  await context.clearCookies();
  await page.goto(href!);
  await expect(page).toHaveURL(/\/login/);
});

test('sign-up creates an account that can sign in', async ({ page }) => {
  const signup = new SignupPage(page);
  await signup.goto();

  // Field errors are shown and announced before anything is sent.
  await signup.signUp('', 'not-an-email', 'short');
  await expect(signup.fieldError('name')).not.toBeEmpty();
  await expect(signup.fieldError('email')).not.toBeEmpty();
  await expect(signup.fieldError('password')).not.toBeEmpty();

  const email = `${unique('new').replace(/\s+/g, '.').toLowerCase()}@example.org`;
  const password = 'a long enough password';
  await signup.signUp('Ada Newcomer', email, password);
  await expect(page).not.toHaveURL(/\/signup/, { timeout: 30_000 });
  await page.getByTestId('account-menu').click();
  await expect(page.getByTestId('account-email')).toHaveText(email);
  await page.getByTestId('sign-out').click();
  await expect(page).toHaveURL(/\/login/);

  // The same e-mail cannot sign up twice.
  await signup.goto();
  await signup.signUp('Ada Again', email, password);
  await expect(signup.fieldError('email')).not.toBeEmpty();

  // And the new password works on the sign-in page.
  await new LoginPage(page).goto();
  await new LoginPage(page).signIn(email, password);
  await expect(page).not.toHaveURL(/\/login/, { timeout: 30_000 });
  await page.getByTestId('account-menu').click();
  await expect(page.getByTestId('account-email')).toHaveText(email);
});

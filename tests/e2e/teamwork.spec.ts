/**
 * Team work (issue 7), members: the owner invites an address, the mail reaches the demo
 * mailbox, the invitee follows the link, signs up and joins as editor; the owner makes them a
 * viewer and both the UI and the API follow; a revoked invitation no longer works.
 */
import { expect, test, type Page } from '@playwright/test';
import { MailboxPage } from './pages/mailbox-page';
import { InvitePage, MembersPage } from './pages/members-page';
import { WorkspacePage } from './pages/workspace-page';
import { DEMO_WORKSPACE_NAME, unique } from './support/accounts';
import { signInAs } from './support/session';

function address(prefix: string) {
  return `${unique(prefix).replace(/\s+/g, '-').toLowerCase()}@harrowlane.example`;
}

async function invitationLink(page: Page, email: string): Promise<string> {
  const mailbox = new MailboxPage(page);
  await mailbox.goto();
  const mail = await mailbox.latestMailTo(email);
  await expect(mail.getByTestId('mail-subject')).toContainText('invited you to');
  const href = await mail.getByTestId('mail-link').first().getAttribute('href');
  expect(href).toMatch(/\/invite\/[A-Za-z0-9_-]{43}$/);
  return new URL(href!).pathname;
}

test('invite by e-mail → join as editor → owner makes them a viewer; UI and API follow', async ({ page, browser }) => {
  test.slow(); // two browsers, the mailbox and several page loads
  const workspaceId = await signInAs(page, 'owner');
  const members = new MembersPage(page);
  await members.goto(workspaceId);
  const email = address('pia-lund');
  await members.invite(email, 'editor');

  const link = await invitationLink(page, email);

  // The invitee, in a browser of their own, signs up through the link.
  const ctx = await browser.newContext();
  const guest = await ctx.newPage();
  await guest.goto(link);
  const invite = new InvitePage(guest);
  await expect(invite.root).toHaveAttribute('data-state', 'sign_up');
  await expect(guest.getByTestId('invite-workspace')).toHaveText(DEMO_WORKSPACE_NAME);
  await invite.signUp('Pia Lund', 'pia-lund-password');
  await expect(guest).toHaveURL(new RegExp(`/w/${workspaceId}$`), { timeout: 90_000 }); // bcrypt twice: slow on a loaded machine
  const home = new WorkspacePage(guest);
  await expect(home.title).toHaveText(DEMO_WORKSPACE_NAME);
  await expect(home.newSection).toBeVisible(); // editors may create sections

  // The owner sees them as an editor, with the invitation gone from the pending list.
  await members.goto(workspaceId);
  await expect(members.member(email)).toHaveAttribute('data-role', 'editor');
  await expect(members.invitation(email)).toHaveCount(0);

  // The owner makes them a viewer.
  await members.setRole(email, 'viewer');
  await expect(members.notice).toContainText('Pia Lund is now a viewer');

  // UI: no create control any more. API: a write is refused with 403.
  await home.goto(workspaceId);
  await expect(home.newSection).toHaveCount(0);
  const res = await guest.request.post(`/api/workspaces/${workspaceId}/sections`, {
    data: { name: 'Should not exist', content: {} },
  });
  expect(res.status()).toBe(403);
  // Reading still works.
  expect((await guest.request.get(`/api/workspaces/${workspaceId}/sections`)).status()).toBe(200);

  // The link does not work a second time.
  await guest.goto(link);
  await expect(invite.root).toHaveAttribute('data-state', 'accepted');
  await ctx.close();

  // Tidy up for other tests: remove the new member.
  await members.goto(workspaceId);
  page.once('dialog', (d) => void d.accept());
  await members.member(email).getByTestId('member-remove').click();
  await expect(members.member(email)).toHaveCount(0);
});

test('a revoked invitation no longer works', async ({ page, browser }) => {
  const workspaceId = await signInAs(page, 'owner');
  const members = new MembersPage(page);
  await members.goto(workspaceId);
  const email = address('jonas-brae');
  await members.invite(email, 'viewer');
  const link = await invitationLink(page, email);

  await members.goto(workspaceId);
  await members.invitation(email).getByTestId('invitation-revoke').click();
  await expect(members.notice).toContainText('revoked');
  await expect(members.invitation(email)).toHaveCount(0);

  const ctx = await browser.newContext();
  const guest = await ctx.newPage();
  await guest.goto(link);
  const invite = new InvitePage(guest);
  await expect(invite.root).toHaveAttribute('data-state', 'revoked');
  await expect(invite.error).toContainText('withdrawn');
  await expect(invite.submit).toHaveCount(0);
  await ctx.close();
});

test('the last owner cannot be demoted, with a clear message', async ({ page }) => {
  const workspaceId = await signInAs(page, 'owner');
  const members = new MembersPage(page);
  await members.goto(workspaceId);
  const owner = members.members.filter({ has: page.getByText('(you)') });
  await owner.getByTestId('member-role').selectOption('viewer');
  await expect(members.notice).toContainText('at least one owner');
  await page.reload();
  await expect(owner).toHaveAttribute('data-role', 'owner');
});

test('plans: a forged webhook is refused; upgrading through the test checkout makes the workspace Team', async ({ page }) => {
  test.slow();
  const workspaceId = await signInAs(page, 'owner');
  await page.goto(`/w/${workspaceId}/settings`);
  const card = page.getByTestId('plan-card');
  await expect(card).toHaveAttribute('data-plan', 'free');

  // A webhook that claims the checkout completed, with a signature made with the wrong secret.
  const payload = JSON.stringify({ id: 'evt_forged_e2e', object: 'event', type: 'checkout.session.completed', data: { object: { metadata: { workspaceId }, customer: 'cus_forged' } } });
  const t = Math.floor(Date.now() / 1000);
  const bad = await page.request.post('/api/billing/webhook', {
    data: payload,
    headers: { 'content-type': 'application/json', 'stripe-signature': `t=${t},v1=${'0'.repeat(64)}` },
  });
  expect(bad.status()).toBe(400);
  await page.reload();
  await expect(card).toHaveAttribute('data-plan', 'free');

  // Upgrade: the test checkout page of the bundled payment service, then back to settings.
  await page.getByTestId('plan-upgrade').click();
  await expect(page.getByTestId('fake-pay')).toBeVisible({ timeout: 30_000 });
  await expect(page.getByText('Team plan')).toBeVisible();
  await page.getByTestId('fake-pay').click();
  await expect(page).toHaveURL(new RegExp(`/w/${workspaceId}/settings\\?billing=success`), { timeout: 30_000 });
  await expect(card).toHaveAttribute('data-plan', 'team');
  await expect(page.getByTestId('invoice')).toHaveCount(1);
  await expect(page.getByTestId('plan-usage')).toContainText('of 10000');

  // The invoices list: a header row, the amount as money; the test portal lists the same invoice and day.
  await expect(page.getByTestId('invoices').locator('thead')).toContainText('Amount');
  const invoice = page.getByTestId('invoice').first();
  await expect(invoice).toContainText(/€\d+\.\d\d/);
  const day = (await invoice.locator('td').nth(1).innerText()).trim();
  expect(day).toMatch(/^\d{4}-\d{2}-\d{2}$/);
  await page.getByTestId('plan-portal').click();
  const portal = page.getByTestId('fake-portal-invoices');
  await expect(portal).toBeVisible({ timeout: 30_000 });
  await expect(portal.locator('thead')).toContainText('Date');
  await expect(portal.locator('tbody tr')).toHaveCount(1);
  await expect(portal.locator('tbody tr')).toContainText(day);
});

test('a public read-only link to a section opens signed out, with the drawing and its key', async ({ page, browser }) => {
  const workspaceId = await signInAs(page, 'owner');
  const content = {
    format: 'edgefield.section/1',
    title: 'Shared pad pair',
    units: 'mm',
    variables: { w: 1.5, d: 0.4 },
    materials: [{ id: 'film', name: 'Polyimide film', epsR: 3.4 }],
    nets: [
      { name: 'pad', role: 'signal' },
      { name: 'shield', role: 'ground' },
    ],
    shapes: [
      { id: 'gap', type: 'rect', x: '-w/2', y: 0, width: 'w', height: 'd', dielectric: 'film' },
      { id: 'lower', type: 'strip', x1: '-w/2', y1: 0, x2: 'w/2', y2: 0, conductor: 'shield' },
      { id: 'upper', type: 'strip', x1: '-w/2', y1: 'd', x2: 'w/2', y2: 'd', conductor: 'pad' },
    ],
  };
  const name = unique('Shared pad pair');
  const made = await page.request.post(`/api/workspaces/${workspaceId}/sections`, { data: { name, description: 'Pads over a shield, for review.', content } });
  expect(made.status(), await made.text()).toBe(201);
  const mj = (await made.json()) as { section?: { id: string }; id?: string };
  const sectionId = mj.section?.id ?? mj.id;
  expect((await page.request.put(`/api/workspaces/${workspaceId}/public-links`, { data: { allow: true } })).status()).toBe(200);
  try {
    const link = await page.request.post(`/api/workspaces/${workspaceId}/share-links`, { data: { targetType: 'section', targetId: sectionId, expiresInDays: 7 } });
    expect(link.status(), await link.text()).toBe(201);
    const url = ((await link.json()) as { link: { url: string } }).link.url;
    const anon = await browser.newContext();
    const p = await anon.newPage();
    await p.goto(new URL(url).pathname);
    await expect(p.getByTestId('shared-page')).toHaveAttribute('data-status', 'ok');
    await expect(p.getByTestId('shared-title')).toHaveText(name);
    await expect(p.getByTestId('shared-sketch')).toBeVisible();
    const key = p.getByTestId('shared-key');
    await expect(key).toContainText('pad');
    await expect(key).toContainText('shield');
    await expect(key).toContainText('Polyimide film');
    await expect(key).toContainText('εr 3.4');
    await expect(key).toContainText('w = 1.5 mm');
    await expect(p.getByText('Pads over a shield, for review.')).toBeVisible();
    await anon.close();
  } finally {
    await page.request.put(`/api/workspaces/${workspaceId}/public-links`, { data: { allow: false } });
  }
});

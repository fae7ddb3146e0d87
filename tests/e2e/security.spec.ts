/**
 * Web security in the browser against the production build: security headers on pages,
 * no content-security-policy violations while the app runs, user text containing markup is
 * shown as text and never executed, and a cross-site write is refused with 403 cross_site.
 * Common practice (OWASP), no published source.
 */
import { expect, test } from '@playwright/test';
import { templateSection } from '../../lib/section/templates';
import { signInAs } from './support/session';

const XSS_NAME = `<img src=x onerror="window.__edgefieldXss=1"><script>window.__edgefieldXss=2</script> Probe`;

test('headers, no CSP violations, markup in a section name stays text, cross-site writes refused', async ({ page }) => {
  await page.addInitScript(() => {
    (window as unknown as { __cspViolations: string[] }).__cspViolations = [];
    document.addEventListener('securitypolicyviolation', (e) => {
      (window as unknown as { __cspViolations: string[] }).__cspViolations.push(`${e.violatedDirective} ${e.blockedURI}`);
    });
  });

  const login = await page.goto('/login');
  const h = login!.headers();
  expect(h['content-security-policy']).toContain("frame-ancestors 'none'");
  expect(h['content-security-policy']).toContain("worker-src 'self' blob:");
  expect(h['x-content-type-options']).toBe('nosniff');
  expect(h['referrer-policy']).toBe('strict-origin-when-cross-origin');
  expect(h['x-frame-options']).toBe('DENY');

  const workspaceId = await signInAs(page, 'editor');
  const create = await page.request.post(`/api/workspaces/${workspaceId}/sections`, {
    data: { name: XSS_NAME, content: templateSection('coax') },
  });
  expect(create.status()).toBe(201);
  const { section } = (await create.json()) as { section: { id: string } };

  await page.goto(`/w/${workspaceId}`);
  await expect(page.getByText(XSS_NAME).first()).toBeVisible();
  await page.goto(`/w/${workspaceId}/sections/${section.id}`);
  await expect(page.getByText(XSS_NAME).first()).toBeVisible();
  expect(await page.evaluate(() => (window as unknown as { __edgefieldXss?: number }).__edgefieldXss)).toBeUndefined();
  expect(await page.evaluate(() => (window as unknown as { __cspViolations: string[] }).__cspViolations)).toEqual([]);

  // A write that claims to come from another site is refused before anything happens.
  const forged = await page.request.patch(`/api/workspaces/${workspaceId}/sections/${section.id}`, {
    data: { name: 'forged' },
    headers: { origin: 'https://attacker.example', 'sec-fetch-site': 'cross-site' },
  });
  expect(forged.status()).toBe(403);
  expect(((await forged.json()) as { error: { code: string } }).error.code).toBe('cross_site');
  const after = await page.request.get(`/api/workspaces/${workspaceId}/sections/${section.id}`);
  expect(((await after.json()) as { section: { name: string } }).section.name).toBe(XSS_NAME);
});

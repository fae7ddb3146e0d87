import { listDemoMails } from '@/db/queries/demo-mails';
import { apiHandler, json, notFound } from '@/lib/server/http';
import { isDemoMode } from '@/lib/server/secret';

export const dynamic = 'force-dynamic';

/**
 * The mails caught by the demo's fake SMTP server, newest first. Demo mode only (404
 * otherwise). Open on purpose: the demo mailbox is where a signed-out visitor finds a
 * sign-in link. Every address in the demo is fictional (.example).
 */
export const GET = apiHandler(async () => {
  if (!isDemoMode()) throw notFound('The page');
  return json({ mails: await listDemoMails() });
});

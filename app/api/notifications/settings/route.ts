import { z } from 'zod';
import { setNotifyByEmail } from '@/db/queries/notifications';
import { apiHandler, json, parseJsonBody, unauthorized } from '@/lib/server/http';
import { getSessionUser } from '@/lib/server/session';

export const dynamic = 'force-dynamic';

const schema = z.strictObject({ emailEnabled: z.boolean() });

/** Turn e-mails about comments and mentions on or off (the in-app list stays). */
export const PUT = apiHandler(async (req: Request) => {
  const user = await getSessionUser();
  if (!user) throw unauthorized();
  const { emailEnabled } = await parseJsonBody(req, schema, { maxBytes: 1024 });
  await setNotifyByEmail(user.id, emailEnabled);
  return json({ emailEnabled });
});

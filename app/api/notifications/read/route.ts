import { markAllNotificationsRead } from '@/db/queries/notifications';
import { apiHandler, json, unauthorized } from '@/lib/server/http';
import { getSessionUser } from '@/lib/server/session';

export const dynamic = 'force-dynamic';

/** Mark all of the signed-in person's notifications read. */
export const POST = apiHandler(async () => {
  const user = await getSessionUser();
  if (!user) throw unauthorized();
  return json({ marked: await markAllNotificationsRead(user.id) });
});

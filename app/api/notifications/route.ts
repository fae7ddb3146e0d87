import { countUnreadNotifications, getNotifyByEmail, listNotifications } from '@/db/queries/notifications';
import { apiHandler, json, unauthorized } from '@/lib/server/http';
import { getSessionUser } from '@/lib/server/session';

export const dynamic = 'force-dynamic';

/** The signed-in person's notifications (newest first), the unread count and the e-mail setting. */
export const GET = apiHandler(async () => {
  const user = await getSessionUser();
  if (!user) throw unauthorized();
  const [items, unread, email] = await Promise.all([listNotifications(user.id, 50), countUnreadNotifications(user.id), getNotifyByEmail(user.id)]);
  return json({ notifications: items, unread, emailEnabled: email });
});

import { listWorkspacesForUser } from '@/db/queries/workspaces';
import { apiHandler, json, unauthorized } from '@/lib/server/http';
import { getSessionUser } from '@/lib/server/session';

export const dynamic = 'force-dynamic';

/** The signed-in user's workspaces with their role. */
export const GET = apiHandler(async () => {
  const user = await getSessionUser();
  if (!user) throw unauthorized();
  return json({ workspaces: await listWorkspacesForUser(user.id) });
});

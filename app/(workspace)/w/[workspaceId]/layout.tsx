import type { ReactNode } from 'react';
import { AppHeader } from '@/components/app-shell/app-header';
import { listWorkspacesForUser } from '@/db/queries/workspaces';
import { requireWorkspaceMember } from '@/lib/server/access';

/** The shell of a workspace: header with switcher, tabs and account menu. Non-members get the not-found page. */
export default async function WorkspaceLayout({
  children,
  params,
}: {
  children: ReactNode;
  params: Promise<{ workspaceId: string }>;
}) {
  const { workspaceId } = await params;
  const { user, role, workspace } = await requireWorkspaceMember(workspaceId);
  const all = await listWorkspacesForUser(user.id);
  return (
    <div className="flex min-h-screen flex-col" data-role={role}>
      <AppHeader
        user={user}
        current={{ id: workspace.id, name: workspace.name, role }}
        workspaces={all.map((w) => ({ id: w.id, name: w.name, role: w.role }))}
      />
      <main id="main" className="flex min-h-0 flex-1 flex-col">
        {children}
      </main>
    </div>
  );
}

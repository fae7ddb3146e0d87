import { Users } from 'lucide-react';
import { redirect } from 'next/navigation';
import { AppHeader } from '@/components/app-shell/app-header';
import { EmptyState } from '@/components/ui/empty-state';
import { listWorkspacesForUser } from '@/db/queries/workspaces';
import { requireUser } from '@/lib/server/session';

export const dynamic = 'force-dynamic';

/** "/": the first workspace of the signed-in user, or /login. */
export default async function Home() {
  const user = await requireUser();
  const workspaces = await listWorkspacesForUser(user.id);
  const first = workspaces[0];
  if (first) redirect(`/w/${first.id}`);
  return (
    <div className="flex min-h-screen flex-col">
      <AppHeader user={user} />
      <main id="main" className="mx-auto w-full max-w-page px-6 py-16">
        <EmptyState icon={Users} title="You are not in a workspace yet" data-testid="no-workspace">
          Sections and solves live in a team&apos;s workspace. Ask an owner of your team&apos;s workspace to invite {user.email}
          ; the invitation link brings you straight in.
        </EmptyState>
      </main>
    </div>
  );
}

import type { Metadata } from 'next';
import { PageHeader } from '@/components/ui/page-header';
import { NotificationsList } from '@/components/teamwork/notifications-list';
import { requireWorkspaceMember } from '@/lib/server/access';

export const metadata: Metadata = { title: 'Notifications' };

/** Your notifications (from every workspace you belong to) and the e-mail setting. */
export default async function NotificationsPage({ params }: { params: Promise<{ workspaceId: string }> }) {
  const { workspaceId } = await params;
  await requireWorkspaceMember(workspaceId);
  return (
    <div className="mx-auto w-full max-w-3xl space-y-5 px-6 py-6">
      <PageHeader title="Notifications" />
      <NotificationsList />
    </div>
  );
}

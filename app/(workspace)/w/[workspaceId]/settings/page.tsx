import type { Metadata } from 'next';
import { Card, CardHeader } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { listMembers } from '@/db/queries/workspaces';
import { requireWorkspaceMember } from '@/lib/server/access';
import { WorkspaceNameForm } from '../_components/workspace-name-form';
import { MembersPanel } from '@/components/teamwork/members-panel';
import { PublicLinksSetting } from '@/components/teamwork/public-links-setting';
import { PlanCard } from '@/components/teamwork/plan-card';
import { listPendingInvitations } from '@/db/queries/invitations';
import { planOf } from '@/lib/server/plans';

export const metadata: Metadata = { title: 'Workspace settings' };


/** Workspace settings: the name (owners edit it), the members and invitations (owners manage them). */
export default async function SettingsPage({
  params,
  searchParams,
}: {
  params: Promise<{ workspaceId: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { workspaceId } = await params;
  const billing = (await searchParams).billing;
  const { user, role, workspace } = await requireWorkspaceMember(workspaceId);
  const members = await listMembers(workspaceId);
  const invitations = role === 'owner' ? await listPendingInvitations(workspaceId) : null;
  const plan = planOf(workspace.plan);
  return (
    <div className="mx-auto w-full max-w-page space-y-5 px-6 py-6">
      <PageHeader title="Workspace settings" eyebrow={workspace.name} />
      <Card aria-labelledby="ws-general">
        <CardHeader id="ws-general" title="General" />
        <div className="px-5 py-4">
          <WorkspaceNameForm workspaceId={workspaceId} name={workspace.name} canEdit={role === 'owner'} />
        </div>
      </Card>
      {role === 'owner' ? (
        <PlanCard workspaceId={workspaceId} notice={billing === 'success' || billing === 'cancelled' ? billing : undefined} />
      ) : null}
      <PublicLinksSetting workspaceId={workspaceId} allow={workspace.allowPublicLinks} canEdit={role === 'owner'} />
      <MembersPanel
        workspaceId={workspaceId}
        currentUserId={user.id}
        role={role}
        members={members.map((m) => ({ ...m, joinedAt: m.joinedAt.toISOString() }))}
        invitations={
          invitations?.map((i) => ({ ...i, expiresAt: i.expiresAt.toISOString(), createdAt: i.createdAt.toISOString() })) ?? null
        }
        memberLimit={{ used: members.length + (invitations?.length ?? 0), max: plan.maxMembers, plan: plan.name }}
      />
    </div>
  );
}

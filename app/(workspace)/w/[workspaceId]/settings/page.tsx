import type { Metadata } from 'next';
import { Card, CardHeader } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { RoleBadge } from '@/components/ui/badge';
import { Time } from '@/components/ui/time';
import { listMembers } from '@/db/queries/workspaces';
import { requireWorkspaceMember } from '@/lib/server/access';
import { WorkspaceNameForm } from '../_components/workspace-name-form';

export const metadata: Metadata = { title: 'Workspace settings' };

const ROLE_TEXT = {
  owner: 'Owners manage the workspace and its members, and edit everything.',
  editor: 'Editors draw and change sections and save solves.',
  viewer: 'Viewers open sections and solves and comment on solves, but change nothing.',
} as const;

/** Workspace settings: the name (owners edit it) and the members with their roles (read-only for now). */
export default async function SettingsPage({ params }: { params: Promise<{ workspaceId: string }> }) {
  const { workspaceId } = await params;
  const { user, role, workspace } = await requireWorkspaceMember(workspaceId);
  const members = await listMembers(workspaceId);
  return (
    <div className="mx-auto w-full max-w-page space-y-5 px-6 py-6">
      <PageHeader title="Workspace settings" eyebrow={workspace.name} />
      <Card aria-labelledby="ws-general">
        <CardHeader id="ws-general" title="General" />
        <div className="px-5 py-4">
          <WorkspaceNameForm workspaceId={workspaceId} name={workspace.name} canEdit={role === 'owner'} />
        </div>
      </Card>
      <Card aria-labelledby="ws-members" data-testid="members">
        <CardHeader
          id="ws-members"
          title="Members"
          description={`${members.length} ${members.length === 1 ? 'person' : 'people'}. Inviting and changing roles come in a later release.`}
        />
        <table className="w-full table-fixed text-left">
          <thead className="border-b border-line bg-surface-muted text-xs text-ink-muted">
            <tr>
              <th scope="col" className="px-5 py-2 font-medium">
                Name
              </th>
              <th scope="col" className="px-3 py-2 font-medium">
                E-mail
              </th>
              <th scope="col" className="w-28 px-3 py-2 font-medium">
                Role
              </th>
              <th scope="col" className="w-36 px-5 py-2 text-right font-medium">
                Member since
              </th>
            </tr>
          </thead>
          <tbody className="divide-y divide-line">
            {members.map((m) => (
              <tr key={m.userId} data-testid="member-row" data-role={m.role}>
                <td className="truncate px-5 py-2.5 font-medium text-ink">
                  {m.name}
                  {m.userId === user.id ? <span className="ml-1.5 text-xs font-normal text-ink-muted">(you)</span> : null}
                </td>
                <td className="truncate px-3 py-2.5 text-sm text-ink-soft">{m.email}</td>
                <td className="px-3 py-2.5">
                  <RoleBadge role={m.role} />
                </td>
                <td className="px-5 py-2.5 text-right text-sm text-ink-muted">
                  <Time value={m.joinedAt} />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
        <dl className="grid grid-cols-3 gap-4 border-t border-line bg-grey-25 px-5 py-3 text-xs text-ink-muted">
          {(Object.keys(ROLE_TEXT) as (keyof typeof ROLE_TEXT)[]).map((r) => (
            <div key={r}>
              <dt className="mb-0.5">
                <RoleBadge role={r} />
              </dt>
              <dd>{ROLE_TEXT[r]}</dd>
            </div>
          ))}
        </dl>
      </Card>
    </div>
  );
}

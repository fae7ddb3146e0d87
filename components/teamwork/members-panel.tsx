'use client';

import { useMutation } from '@tanstack/react-query';
import { MailPlus, UserMinus, X } from 'lucide-react';
import { useRouter } from 'next/navigation';
import { useId, useState, type FormEvent } from 'react';
import { Alert } from '@/components/ui/alert';
import { ApiClientError, apiFetch, errorMessage } from '@/components/ui/api';
import { RoleBadge, type RoleName } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Card, CardHeader } from '@/components/ui/card';
import { Field, Input, Select, fieldDescribedBy } from '@/components/ui/field';
import { Time } from '@/components/ui/time';
import { inviteSchema } from '@/lib/validations/members';

export interface MemberView {
  userId: string;
  name: string;
  email: string;
  role: RoleName;
  joinedAt: string;
}

export interface InvitationRowView {
  id: string;
  email: string;
  role: RoleName;
  invitedByName: string | null;
  expiresAt: string;
  createdAt: string;
}

const ROLE_TEXT: Record<RoleName, string> = {
  owner: 'Owners manage the workspace and its members, and edit everything.',
  editor: 'Editors draw and change sections and save solves.',
  viewer: 'Viewers open sections and solves and comment on solves, but change nothing.',
};

/**
 * Members of a workspace. Owners invite by e-mail, change roles, remove members and revoke
 * pending invitations; everyone can leave (except the last owner). Every change goes
 * through the API, and the page is refreshed from the server afterwards.
 */
export function MembersPanel({
  workspaceId,
  currentUserId,
  role,
  members,
  invitations,
  memberLimit,
}: {
  workspaceId: string;
  currentUserId: string;
  role: RoleName;
  members: MemberView[];
  invitations: InvitationRowView[] | null;
  memberLimit: { used: number; max: number; plan: string };
}) {
  const router = useRouter();
  const isOwner = role === 'owner';
  const [notice, setNotice] = useState<{ tone: 'success' | 'danger'; text: string } | null>(null);

  const change = useMutation({
    mutationFn: (v: { userId: string; role: RoleName }) =>
      apiFetch(`/api/workspaces/${workspaceId}/members/${v.userId}`, { method: 'PATCH', json: { role: v.role } }),
    onSuccess: (_d, v) => {
      const m = members.find((x) => x.userId === v.userId);
      setNotice({ tone: 'success', text: `${m?.name ?? 'The member'} is now ${v.role === 'viewer' ? 'a viewer' : `an ${v.role}`}.` });
      router.refresh();
    },
    onError: (e) => setNotice({ tone: 'danger', text: errorMessage(e) }),
  });
  const remove = useMutation({
    mutationFn: (userId: string) => apiFetch(`/api/workspaces/${workspaceId}/members/${userId}`, { method: 'DELETE' }),
    onSuccess: (_d, userId) => {
      if (userId === currentUserId) {
        router.replace('/');
        router.refresh();
        return;
      }
      const m = members.find((x) => x.userId === userId);
      setNotice({ tone: 'success', text: `${m?.name ?? 'The member'} was removed from the workspace.` });
      router.refresh();
    },
    onError: (e) => setNotice({ tone: 'danger', text: errorMessage(e) }),
  });
  const revoke = useMutation({
    mutationFn: (id: string) => apiFetch(`/api/workspaces/${workspaceId}/invitations/${id}`, { method: 'DELETE' }),
    onSuccess: (_d, id) => {
      const inv = invitations?.find((x) => x.id === id);
      setNotice({ tone: 'success', text: `The invitation to ${inv?.email ?? 'that address'} was revoked; its link no longer works.` });
      router.refresh();
    },
    onError: (e) => setNotice({ tone: 'danger', text: errorMessage(e) }),
  });

  const owners = members.filter((m) => m.role === 'owner').length;

  return (
    <div className="space-y-5">
      <Card aria-labelledby="ws-members" data-testid="members">
        <CardHeader
          id="ws-members"
          title="Members"
          description={
            <>
              {members.length} {members.length === 1 ? 'person' : 'people'}
              {invitations && invitations.length ? `, ${invitations.length} invited` : ''}. The {memberLimit.plan} plan allows{' '}
              {memberLimit.max} including pending invitations.
            </>
          }
        />
        <div aria-live="polite" className="empty:hidden px-5 pt-3">
          {notice ? (
            <Alert tone={notice.tone} data-testid="members-notice">
              {notice.text}
            </Alert>
          ) : null}
        </div>
        <table className="w-full table-fixed text-left">
          <thead className="border-b border-line bg-surface-muted text-xs text-ink-muted">
            <tr>
              <th scope="col" className="px-5 py-2 font-medium">
                Name
              </th>
              <th scope="col" className="px-3 py-2 font-medium">
                E-mail
              </th>
              <th scope="col" className="w-36 px-3 py-2 font-medium">
                Role
              </th>
              <th scope="col" className="w-32 px-3 py-2 font-medium">
                Member since
              </th>
              <th scope="col" className="w-28 px-5 py-2 text-right font-medium">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody className="divide-y divide-line">
            {members.map((m) => {
              const self = m.userId === currentUserId;
              const lastOwner = m.role === 'owner' && owners <= 1;
              return (
                <tr key={m.userId} data-testid="member-row" data-role={m.role} data-email={m.email}>
                  <td className="truncate px-5 py-2.5 font-medium text-ink">
                    {m.name}
                    {self ? <span className="ml-1.5 text-xs font-normal text-ink-muted">(you)</span> : null}
                  </td>
                  <td className="truncate px-3 py-2.5 text-sm text-ink-soft">{m.email}</td>
                  <td className="px-3 py-2">
                    {isOwner ? (
                      <Select
                        aria-label={`Role of ${m.name}`}
                        value={m.role}
                        disabled={change.isPending}
                        title={lastOwner ? 'The last owner cannot be demoted.' : undefined}
                        onChange={(e) => change.mutate({ userId: m.userId, role: e.target.value as RoleName })}
                        className="h-8 text-sm"
                        data-testid="member-role"
                      >
                        <option value="owner">Owner</option>
                        <option value="editor">Editor</option>
                        <option value="viewer">Viewer</option>
                      </Select>
                    ) : (
                      <RoleBadge role={m.role} />
                    )}
                  </td>
                  <td className="px-3 py-2.5 text-sm text-ink-muted">
                    <Time value={m.joinedAt} />
                  </td>
                  <td className="px-5 py-2 text-right">
                    {self ? (
                      <Button
                        size="sm"
                        variant="ghost"
                        onClick={() => {
                          if (window.confirm('Leave this workspace? You lose access until someone invites you again.')) remove.mutate(m.userId);
                        }}
                        data-testid="member-leave"
                      >
                        Leave
                      </Button>
                    ) : isOwner ? (
                      <Button
                        size="sm"
                        variant="ghost"
                        aria-label={`Remove ${m.name}`}
                        onClick={() => {
                          if (window.confirm(`Remove ${m.name} from this workspace?`)) remove.mutate(m.userId);
                        }}
                        data-testid="member-remove"
                      >
                        <UserMinus className="size-4" aria-hidden />
                        Remove
                      </Button>
                    ) : null}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
        <dl className="grid grid-cols-3 gap-4 border-t border-line bg-grey-25 px-5 py-3 text-xs text-ink-muted">
          {(Object.keys(ROLE_TEXT) as RoleName[]).map((r) => (
            <div key={r}>
              <dt className="mb-0.5">
                <RoleBadge role={r} />
              </dt>
              <dd>{ROLE_TEXT[r]}</dd>
            </div>
          ))}
        </dl>
      </Card>

      {isOwner && invitations ? (
        <Card aria-labelledby="ws-invite" data-testid="invitations">
          <CardHeader
            id="ws-invite"
            title="Invite people"
            description="We e-mail a link that works once, for 7 days. The person creates an account or signs in with that address to join."
          />
          <InviteForm workspaceId={workspaceId} onInvited={(email) => setNotice({ tone: 'success', text: `Invitation sent to ${email}.` })} />
          {invitations.length ? (
            <table className="w-full table-fixed border-t border-line text-left">
              <caption className="px-5 pt-3 text-left text-sm font-medium text-ink-soft">Pending invitations</caption>
              <thead className="border-b border-line text-xs text-ink-muted">
                <tr>
                  <th scope="col" className="px-5 py-2 font-medium">
                    E-mail
                  </th>
                  <th scope="col" className="w-28 px-3 py-2 font-medium">
                    Role
                  </th>
                  <th scope="col" className="w-40 px-3 py-2 font-medium">
                    Invited by
                  </th>
                  <th scope="col" className="w-32 px-3 py-2 font-medium">
                    Expires
                  </th>
                  <th scope="col" className="w-28 px-5 py-2">
                    <span className="sr-only">Actions</span>
                  </th>
                </tr>
              </thead>
              <tbody className="divide-y divide-line">
                {invitations.map((inv) => (
                  <tr key={inv.id} data-testid="invitation-row" data-email={inv.email}>
                    <td className="truncate px-5 py-2.5 text-sm text-ink">{inv.email}</td>
                    <td className="px-3 py-2.5">
                      <RoleBadge role={inv.role} />
                    </td>
                    <td className="truncate px-3 py-2.5 text-sm text-ink-soft">{inv.invitedByName ?? '—'}</td>
                    <td className="px-3 py-2.5 text-sm text-ink-muted">
                      <Time value={inv.expiresAt} />
                    </td>
                    <td className="px-5 py-2 text-right">
                      <Button
                        size="sm"
                        variant="ghost"
                        pending={revoke.isPending && revoke.variables === inv.id}
                        onClick={() => revoke.mutate(inv.id)}
                        aria-label={`Revoke the invitation to ${inv.email}`}
                        data-testid="invitation-revoke"
                      >
                        <X className="size-4" aria-hidden />
                        Revoke
                      </Button>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          ) : (
            <p className="border-t border-line px-5 py-3 text-sm text-ink-muted">No pending invitations.</p>
          )}
        </Card>
      ) : null}
    </div>
  );
}

function InviteForm({ workspaceId, onInvited }: { workspaceId: string; onInvited: (email: string) => void }) {
  const router = useRouter();
  const id = useId();
  const [email, setEmail] = useState('');
  const [role, setRole] = useState<RoleName>('editor');
  const [error, setError] = useState<string>();
  const invite = useMutation({
    mutationFn: (v: { email: string; role: RoleName }) =>
      apiFetch(`/api/workspaces/${workspaceId}/invitations`, { method: 'POST', json: v }),
    onSuccess: (_d, v) => {
      setEmail('');
      setError(undefined);
      onInvited(v.email);
      router.refresh();
    },
    onError: (e) => {
      if (e instanceof ApiClientError && e.field === 'email') setError(e.message);
    },
  });

  function onSubmit(ev: FormEvent) {
    ev.preventDefault();
    const parsed = inviteSchema.safeParse({ email, role });
    if (!parsed.success) {
      setError(parsed.error.issues[0]?.message);
      return;
    }
    setError(undefined);
    invite.mutate(parsed.data);
  }

  const emailId = `${id}-email`;
  const roleId = `${id}-role`;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3 px-5 py-4" data-testid="invite-form">
      <div className="flex flex-wrap items-start gap-3">
        <Field id={emailId} label="E-mail address" error={error} className="min-w-64 flex-1">
          <Input
            id={emailId}
            type="email"
            value={email}
            placeholder="colleague@example.com"
            onChange={(e) => setEmail(e.target.value)}
            aria-invalid={error ? true : undefined}
            aria-describedby={fieldDescribedBy(emailId)}
            data-testid="invite-email"
          />
        </Field>
        <Field id={roleId} label="Role" className="w-40">
          <Select id={roleId} value={role} onChange={(e) => setRole(e.target.value as RoleName)} data-testid="invite-role">
            <option value="editor">Editor</option>
            <option value="viewer">Viewer</option>
            <option value="owner">Owner</option>
          </Select>
        </Field>
        <div className="pt-6">
          <Button type="submit" variant="primary" pending={invite.isPending} data-testid="invite-submit">
            <MailPlus className="size-4" aria-hidden />
            Send invitation
          </Button>
        </div>
      </div>
      {invite.isError && !(invite.error instanceof ApiClientError && invite.error.field === 'email') ? (
        <Alert tone="danger" data-testid="invite-form-error">
          {errorMessage(invite.error)}
        </Alert>
      ) : null}
    </form>
  );
}

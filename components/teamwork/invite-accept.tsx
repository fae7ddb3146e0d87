'use client';

import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { signIn, signOut } from 'next-auth/react';
import { useId, useState, useTransition, type FormEvent } from 'react';
import { Alert } from '@/components/ui/alert';
import { RoleBadge, type RoleName } from '@/components/ui/badge';
import { Button, ButtonLink } from '@/components/ui/button';
import { Field, Input, fieldDescribedBy } from '@/components/ui/field';
import { acceptInvitation, signUpWithInvitation } from '@/lib/server/actions/invitations';

export interface InvitationView {
  workspaceName: string;
  email: string;
  role: RoleName;
  invitedByName: string | null;
  expiresAt: string;
}

export type InviteState =
  | { kind: 'invalid' }
  | { kind: 'expired' | 'revoked' | 'accepted'; invitation: InvitationView; memberWorkspaceId: string | null }
  | { kind: 'join' | 'wrong_account'; invitation: InvitationView; signedInAs: string }
  | { kind: 'sign_in' | 'sign_up'; invitation: InvitationView };

const DEAD: Record<'expired' | 'revoked' | 'accepted', { title: string; text: string }> = {
  expired: { title: 'This invitation has expired', text: 'Invitations work for 7 days. Ask the workspace owner to send a new one.' },
  revoked: { title: 'This invitation was withdrawn', text: 'The workspace owner revoked it. Ask them for a new one if you still need access.' },
  accepted: { title: 'This invitation has already been used', text: 'Each invitation link works once.' },
};

/** The invitation page's body: who invited whom to what, and the one action that fits. */
export function InviteAccept({ token, state }: { token: string; state: InviteState }) {
  if (state.kind === 'invalid') {
    return (
      <div data-testid="invite-page" data-state="invalid">
        <h1 className="text-2xl font-semibold text-ink">Invitation not found</h1>
        <Alert tone="danger" className="mt-5" data-testid="invite-error">
          This invitation link is not valid. Check that you copied the whole link, or ask the workspace owner for a new one.
        </Alert>
        <p className="mt-5 text-sm">
          <Link href="/login" className="font-medium text-accent hover:underline">
            Go to sign in
          </Link>
        </p>
      </div>
    );
  }
  const inv = state.invitation;
  return (
    <div data-testid="invite-page" data-state={state.kind}>
      <p className="text-sm font-medium text-ink-muted">Invitation</p>
      <h1 className="mt-1 text-2xl font-semibold text-ink" data-testid="invite-workspace">
        {inv.workspaceName}
      </h1>
      <p className="mt-2 text-sm text-ink-soft">
        {inv.invitedByName ? <>{inv.invitedByName} invited </> : <>You were invited as </>}
        <strong className="font-medium text-ink">{inv.email}</strong> to join as <RoleBadge role={inv.role} />.
      </p>
      <div className="mt-6">
        {state.kind === 'expired' || state.kind === 'revoked' || state.kind === 'accepted' ? (
          <div className="space-y-4">
            <Alert tone={state.kind === 'accepted' ? 'info' : 'danger'} title={DEAD[state.kind].title} data-testid="invite-error">
              {DEAD[state.kind].text}
            </Alert>
            {state.memberWorkspaceId ? (
              <ButtonLink href={`/w/${state.memberWorkspaceId}`} variant="primary">
                Open the workspace
              </ButtonLink>
            ) : (
              <ButtonLink href="/login" variant="secondary">
                Go to sign in
              </ButtonLink>
            )}
          </div>
        ) : state.kind === 'join' ? (
          <JoinButton token={token} />
        ) : state.kind === 'wrong_account' ? (
          <div className="space-y-4">
            <Alert tone="warning" title="Signed in with another address" data-testid="invite-error">
              You are signed in as {state.signedInAs}, but this invitation is for {inv.email}. Sign out, then open the link again
              and sign in or create an account with {inv.email}.
            </Alert>
            <Button variant="secondary" onClick={() => void signOut({ callbackUrl: `/invite/${token}` })} data-testid="invite-sign-out">
              Sign out
            </Button>
          </div>
        ) : state.kind === 'sign_in' ? (
          <div className="space-y-3">
            <p className="text-sm text-ink-soft">You already have an Edgefield account for {inv.email}. Sign in to join.</p>
            <ButtonLink
              href={`/login?callbackUrl=${encodeURIComponent(`/invite/${token}`)}`}
              variant="primary"
              data-testid="invite-sign-in"
            >
              Sign in to accept
            </ButtonLink>
          </div>
        ) : (
          <SignUpForm token={token} email={inv.email} />
        )}
      </div>
    </div>
  );
}

function JoinButton({ token }: { token: string }) {
  const router = useRouter();
  const [error, setError] = useState<string>();
  const [pending, start] = useTransition();
  return (
    <div className="space-y-3">
      {error ? (
        <Alert tone="danger" data-testid="invite-error">
          {error}
        </Alert>
      ) : null}
      <Button
        variant="primary"
        pending={pending}
        data-testid="invite-join"
        onClick={() =>
          start(async () => {
            const r = await acceptInvitation(token);
            if (r.status === 'ok') {
              router.replace(`/w/${r.workspaceId}`);
              router.refresh();
            } else setError(r.message);
          })
        }
      >
        Join the workspace
      </Button>
    </div>
  );
}

function SignUpForm({ token, email }: { token: string; email: string }) {
  const router = useRouter();
  const id = useId();
  const [name, setName] = useState('');
  const [password, setPassword] = useState('');
  const [errors, setErrors] = useState<{ name?: string; password?: string }>({});
  const [formError, setFormError] = useState<string>();
  const [pending, setPending] = useState(false);

  async function onSubmit(ev: FormEvent) {
    ev.preventDefault();
    const errs = {
      name: name.trim() ? undefined : 'Enter your name.',
      password: password.length >= 10 ? undefined : 'Use at least 10 characters.',
    };
    setErrors(errs);
    if (errs.name || errs.password) return;
    setPending(true);
    setFormError(undefined);
    try {
      const r = await signUpWithInvitation(token, { name, password });
      if (r.status !== 'ok') {
        setErrors(r.fieldErrors ?? {});
        setFormError(r.message);
        setPending(false);
        return;
      }
      const res = await signIn('credentials', { email, password, redirect: false });
      if (!res || res.error) {
        setFormError('Your account was created and you joined, but signing in failed. Sign in with your new password.');
        setPending(false);
        return;
      }
      router.replace(`/w/${r.workspaceId}`);
      router.refresh();
    } catch {
      setFormError('Could not reach the server. Check your connection and try again.');
      setPending(false);
    }
  }

  const nameId = `${id}-name`;
  const emailId = `${id}-email`;
  const passwordId = `${id}-password`;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" data-testid="invite-signup-form">
      <p className="text-sm text-ink-soft">Create your Edgefield account to join. You will be signed in right away.</p>
      {formError ? (
        <Alert tone="danger" data-testid="invite-error">
          {formError}
        </Alert>
      ) : null}
      <Field id={emailId} label="E-mail" hint="The invited address; the invitation works only for it.">
        <Input id={emailId} value={email} readOnly disabled aria-describedby={fieldDescribedBy(emailId, true)} />
      </Field>
      <Field id={nameId} label="Your name" error={errors.name}>
        <Input
          id={nameId}
          value={name}
          autoComplete="name"
          maxLength={120}
          onChange={(e) => setName(e.target.value)}
          aria-invalid={errors.name ? true : undefined}
          aria-describedby={fieldDescribedBy(nameId)}
          data-testid="invite-name"
        />
      </Field>
      <Field id={passwordId} label="Password" error={errors.password} hint="At least 10 characters.">
        <Input
          id={passwordId}
          type="password"
          value={password}
          autoComplete="new-password"
          onChange={(e) => setPassword(e.target.value)}
          aria-invalid={errors.password ? true : undefined}
          aria-describedby={fieldDescribedBy(passwordId, true)}
          data-testid="invite-password"
        />
      </Field>
      <Button type="submit" variant="primary" className="w-full" pending={pending} data-testid="invite-signup-submit">
        Create account and join
      </Button>
    </form>
  );
}

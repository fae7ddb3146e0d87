'use client';

import { Mail } from 'lucide-react';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { signIn } from 'next-auth/react';
import { useId, useState, type FormEvent } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Field, Input, fieldDescribedBy } from '@/components/ui/field';
import { RoleBadge, type RoleName } from '@/components/ui/badge';

interface DemoAccountView {
  email: string;
  password: string;
  name: string;
  role: RoleName;
}

/** next-auth error codes → sentences. */
const ERRORS: Record<string, string> = {
  CredentialsSignin: 'That e-mail and password do not match an account.',
  Verification: 'That sign-in link has expired or was already used. Ask for a new one.',
  EmailSignin: 'The sign-in link could not be sent. Try again in a moment.',
  AccessDenied: 'That account may not sign in here.',
  SessionRequired: 'Sign in to continue.',
  OAuthAccountNotLinked: 'Sign in with the method you used before.',
  TooManyRequests: 'Too many attempts. Wait a minute and try again.',
};

function describe(code: string | undefined) {
  if (!code) return undefined;
  return ERRORS[code] ?? 'Sign-in did not work. Try again.';
}

const EMAIL_RE = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

export function LoginForm({
  callbackUrl,
  initialError,
  linkSent,
  demoAccounts,
  demo,
}: {
  callbackUrl: string;
  initialError?: string;
  linkSent?: boolean;
  demoAccounts: DemoAccountView[];
  demo: boolean;
}) {
  const router = useRouter();
  const id = useId();
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [fieldErrors, setFieldErrors] = useState<{ email?: string; password?: string }>({});
  const [formError, setFormError] = useState<string | undefined>(describe(initialError));
  const [sentTo, setSentTo] = useState<string | null>(linkSent ? '' : null);
  const [pending, setPending] = useState<'password' | 'link' | null>(null);

  const checkEmail = () => {
    const e = email.trim();
    if (!e) return 'Enter your e-mail address.';
    if (!EMAIL_RE.test(e)) return 'Enter a valid e-mail address.';
    return undefined;
  };

  async function onPassword(ev: FormEvent) {
    ev.preventDefault();
    const errs = { email: checkEmail(), password: password ? undefined : 'Enter your password.' };
    setFieldErrors(errs);
    setSentTo(null);
    if (errs.email || errs.password) return;
    setPending('password');
    setFormError(undefined);
    try {
      const res = await signIn('credentials', { email: email.trim(), password, redirect: false, callbackUrl });
      if (!res || res.error) {
        setFormError(describe(res?.error ?? 'CredentialsSignin'));
        setPending(null);
        return;
      }
      router.replace(callbackUrl);
      router.refresh();
    } catch {
      setFormError('Could not reach the server. Check your connection and try again.');
      setPending(null);
    }
  }

  async function onLink() {
    const err = checkEmail();
    setFieldErrors({ email: err });
    if (err) return;
    setPending('link');
    setFormError(undefined);
    try {
      const res = await signIn('email', { email: email.trim(), redirect: false, callbackUrl });
      if (!res || res.error) {
        setFormError(describe(res?.error ?? 'EmailSignin'));
      } else {
        setSentTo(email.trim());
      }
    } catch {
      setFormError('Could not reach the server. Check your connection and try again.');
    } finally {
      setPending(null);
    }
  }

  const emailId = `${id}-email`;
  const passwordId = `${id}-password`;

  return (
    <div>
      <h1 className="text-2xl font-semibold text-ink">Sign in</h1>
      <p className="mt-1 text-sm text-ink-muted">
        New to Edgefield?{' '}
        <Link href="/signup" className="font-medium text-accent underline-offset-2 hover:underline">
          Create an account
        </Link>
      </p>

      <div aria-live="assertive" className="mt-5 space-y-3 empty:hidden">
        {formError ? (
          <Alert tone="danger" data-testid="login-error">
            {formError}
          </Alert>
        ) : null}
        {sentTo !== null && !formError ? (
          <Alert tone="success" title="Check your e-mail" data-testid="link-sent">
            {sentTo ? <>We sent a sign-in link to {sentTo}. </> : <>We sent you a sign-in link. </>}
            It works once and expires in a day.
            {demo ? (
              <>
                {' '}
                In this demo it lands in the{' '}
                <Link href="/demo/mailbox" className="font-medium underline" data-testid="open-mailbox">
                  demo mailbox
                </Link>
                .
              </>
            ) : null}
          </Alert>
        ) : null}
      </div>

      <form onSubmit={onPassword} noValidate className="mt-5 space-y-4" data-testid="login-form">
        <Field id={emailId} label="E-mail" error={fieldErrors.email}>
          <Input
            id={emailId}
            name="email"
            type="email"
            autoComplete="email"
            value={email}
            onChange={(e) => setEmail(e.target.value)}
            aria-invalid={fieldErrors.email ? true : undefined}
            aria-describedby={fieldDescribedBy(emailId)}
            data-testid="login-email"
          />
        </Field>
        <Field id={passwordId} label="Password" error={fieldErrors.password}>
          <Input
            id={passwordId}
            name="password"
            type="password"
            autoComplete="current-password"
            value={password}
            onChange={(e) => setPassword(e.target.value)}
            aria-invalid={fieldErrors.password ? true : undefined}
            aria-describedby={fieldDescribedBy(passwordId)}
            data-testid="login-password"
          />
        </Field>
        <Button type="submit" variant="primary" className="w-full" pending={pending === 'password'} data-testid="login-submit">
          Sign in
        </Button>
      </form>

      <div className="my-5 flex items-center gap-3 text-xs text-ink-muted">
        <span className="h-px flex-1 bg-line" />
        or, without a password
        <span className="h-px flex-1 bg-line" />
      </div>

      <Button
        variant="secondary"
        className="w-full"
        onClick={() => void onLink()}
        pending={pending === 'link'}
        disabled={pending === 'password'}
        data-testid="login-send-link"
      >
        <Mail className="size-4" aria-hidden />
        E-mail me a sign-in link
      </Button>
      <p className="mt-2 text-xs text-ink-muted">Uses the e-mail address above. No password needed.</p>

      {demo && demoAccounts.length > 0 ? (
        <section aria-labelledby={`${id}-demo`} className="mt-8 rounded-lg border border-line bg-surface p-4" data-testid="demo-accounts">
          <h2 id={`${id}-demo`} className="text-sm font-semibold text-ink">
            Demo accounts
          </h2>
          <p className="mt-0.5 text-xs text-ink-muted">
            A fictional team, Harrow Lane Instruments. Pick one to fill in the form. Mails go to the{' '}
            <Link href="/demo/mailbox" className="font-medium text-accent hover:underline">
              demo mailbox
            </Link>
            .
          </p>
          <ul className="mt-3 divide-y divide-line">
            {demoAccounts.map((a) => (
              <li key={a.email} className="flex items-center gap-3 py-2">
                <div className="min-w-0 flex-1">
                  <p className="flex items-center gap-2 text-sm font-medium text-ink">
                    {a.name} <RoleBadge role={a.role} />
                  </p>
                  <p className="num truncate text-xs text-ink-muted">{a.email}</p>
                  <p className="num text-xs text-ink-muted">
                    <span className="font-sans">password</span> {a.password}
                  </p>
                </div>
                <Button
                  size="sm"
                  variant="ghost"
                  onClick={() => {
                    setEmail(a.email);
                    setPassword(a.password);
                    setFieldErrors({});
                  }}
                  data-testid={`demo-fill-${a.role}`}
                  aria-label={`Fill in ${a.name} (${a.role})`}
                >
                  Use
                </Button>
              </li>
            ))}
          </ul>
        </section>
      ) : null}
    </div>
  );
}

'use client';

import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { signIn } from 'next-auth/react';
import { startTransition, useActionState, useEffect, useId, useState, type FormEvent } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Field, Input, fieldDescribedBy } from '@/components/ui/field';
import { signUp, type SignUpState } from '@/lib/server/actions/auth';
import { signUpSchema } from '@/lib/validations/auth';

type Key = 'name' | 'email' | 'password';

/** Create an account (the server action validates again and refuses a known e-mail), then sign in. */
export function SignupForm() {
  const id = useId();
  const router = useRouter();
  const [state, action, pending] = useActionState<SignUpState, FormData>(signUp, { status: 'idle' });
  const [values, setValues] = useState<Record<Key, string>>({ name: '', email: '', password: '' });
  const [clientErrors, setClientErrors] = useState<Partial<Record<Key, string>>>({});
  const [signingIn, setSigningIn] = useState(false);
  const [signInError, setSignInError] = useState<string>();

  const serverErrors = state.status === 'error' ? state.fieldErrors : {};
  const errors: Partial<Record<Key, string>> = { ...serverErrors, ...clientErrors };

  useEffect(() => {
    if (state.status !== 'ok') return;
    setSigningIn(true);
    void signIn('credentials', { email: state.email, password: values.password, redirect: false })
      .then((res) => {
        if (!res || res.error) {
          setSignInError('Your account was created, but signing in failed. Sign in on the sign-in page.');
          setSigningIn(false);
          return;
        }
        router.replace('/');
        router.refresh();
      })
      .catch(() => {
        setSignInError('Your account was created, but the server could not be reached to sign in.');
        setSigningIn(false);
      });
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [state]);

  function onSubmit(ev: FormEvent<HTMLFormElement>) {
    ev.preventDefault();
    const parsed = signUpSchema.safeParse(values);
    if (!parsed.success) {
      const next: Partial<Record<Key, string>> = {};
      for (const issue of parsed.error.issues) {
        const k = issue.path[0] as Key;
        if (!next[k]) next[k] = issue.message;
      }
      setClientErrors(next);
      return;
    }
    setClientErrors({});
    const fd = new FormData(ev.currentTarget);
    startTransition(() => action(fd));
  }

  const set = (k: Key) => (e: React.ChangeEvent<HTMLInputElement>) => {
    setValues((v) => ({ ...v, [k]: e.target.value }));
    if (clientErrors[k]) setClientErrors((c) => ({ ...c, [k]: undefined }));
  };

  const fields: { key: Key; label: string; type: string; autoComplete: string; hint?: string }[] = [
    { key: 'name', label: 'Your name', type: 'text', autoComplete: 'name' },
    { key: 'email', label: 'Work e-mail', type: 'email', autoComplete: 'email' },
    { key: 'password', label: 'Password', type: 'password', autoComplete: 'new-password', hint: 'At least 10 characters.' },
  ];

  const formError = state.status === 'error' && Object.keys(state.fieldErrors).length === 0 ? state.message : signInError;

  return (
    <div>
      <h1 className="text-2xl font-semibold text-ink">Create an account</h1>
      <p className="mt-1 text-sm text-ink-muted">
        Already have one?{' '}
        <Link href="/login" className="font-medium text-accent hover:underline">
          Sign in
        </Link>
      </p>
      <div aria-live="assertive" className="mt-5 empty:hidden">
        {formError ? (
          <Alert tone="danger" data-testid="signup-error">
            {formError}
          </Alert>
        ) : null}
      </div>
      <form onSubmit={onSubmit} noValidate className="mt-5 space-y-4" data-testid="signup-form">
        {fields.map((f) => {
          const fid = `${id}-${f.key}`;
          return (
            <Field key={f.key} id={fid} label={f.label} hint={f.hint} error={errors[f.key]} errorTestId={`signup-${f.key}-error`}>
              <Input
                id={fid}
                name={f.key}
                type={f.type}
                autoComplete={f.autoComplete}
                value={values[f.key]}
                onChange={set(f.key)}
                aria-invalid={errors[f.key] ? true : undefined}
                aria-describedby={fieldDescribedBy(fid, Boolean(f.hint))}
                data-testid={`signup-${f.key}`}
              />
            </Field>
          );
        })}
        <Button type="submit" variant="primary" className="w-full" pending={pending || signingIn} data-testid="signup-submit">
          {signingIn ? 'Signing in…' : 'Create account'}
        </Button>
        <p className="text-xs text-ink-muted">
          You get a workspace of your own. Your password is stored only as a slow one-way hash.
        </p>
      </form>
    </div>
  );
}

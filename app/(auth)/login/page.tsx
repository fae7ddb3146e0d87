import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { DEMO_ACCOUNTS } from '@/lib/demo/accounts';
import { isDemoMode } from '@/lib/server/secret';
import { getSessionUser } from '@/lib/server/session';
import { LoginForm } from './login-form';

export const metadata: Metadata = { title: 'Sign in' };
export const dynamic = 'force-dynamic';

/**
 * Only a path of this site may be a callback (next-auth may pass a full URL of this site;
 * only its path is kept, so no open redirect). Sign-in pages themselves fall back to "/".
 */
function safeCallback(v: string | string[] | undefined): string {
  const s = Array.isArray(v) ? v[0] : v;
  if (!s) return '/';
  try {
    const u = new URL(s, 'http://edgefield.local');
    const p = u.pathname + u.search;
    if (!p.startsWith('/') || p.startsWith('//') || /^\/(login|signup)\b/.test(p)) return '/';
    return p;
  } catch {
    return '/';
  }
}

export default async function LoginPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const sp = await searchParams;
  const callbackUrl = safeCallback(sp.callbackUrl);
  const user = await getSessionUser();
  if (user) redirect(callbackUrl);
  const demo = isDemoMode();
  const error = typeof sp.error === 'string' ? sp.error : undefined;
  const sent = typeof sp.check === 'string' && sp.check !== '';
  return (
    <LoginForm
      callbackUrl={callbackUrl}
      initialError={error}
      linkSent={sent}
      demoAccounts={demo ? DEMO_ACCOUNTS.map(({ email, password, name, role }) => ({ email, password, name, role })) : []}
      demo={demo}
    />
  );
}

import NextAuth from 'next-auth';
import { getAuthOptions } from '@/lib/server/auth-options';
import { clientAddress, rateLimitedResponse, take, type LimitName } from '@/lib/server/rate-limit';

export const dynamic = 'force-dynamic';

type Ctx = { params: Promise<{ nextauth: string[] }> };

async function handler(req: Request, ctx: Ctx) {
  const params = await ctx.params;
  if (req.method === 'POST') {
    const limited = await rateLimit(req, params.nextauth ?? []);
    if (limited) return limited;
  }
  // next-auth 4 reads params synchronously; Next 16 passes them as a promise.
  return NextAuth(req as never, { params } as never, getAuthOptions()) as Promise<Response>;
}

/**
 * Credentials sign-in (POST /api/auth/callback/credentials) and e-mail sign-in links
 * (POST /api/auth/signin/email) are rate limited per address and per (address, account)
 * (lib/server/rate-limit.ts). The 429 carries the JSON error shape and, for next-auth's
 * client, a `url` whose `error=TooManyRequests` the sign-in form turns into a sentence.
 */
async function rateLimit(req: Request, parts: string[]): Promise<Response | null> {
  const route = parts.join('/');
  const kind: 'sign-in' | 'magic-link' | null =
    route === 'callback/credentials' ? 'sign-in' : route === 'signin/email' ? 'magic-link' : null;
  if (!kind) return null;
  let email = '';
  try {
    const text = await req.clone().text();
    email = (new URLSearchParams(text).get('email') ?? '').trim().toLowerCase().slice(0, 320);
  } catch {
    /* unreadable body: next-auth refuses it itself */
  }
  const ip = clientAddress(req.headers);
  const r = take([
    { name: `${kind}:ip` as LimitName, key: ip },
    // Sign-in: guesses at one account from one address. Links: mails to one inbox from anywhere.
    { name: `${kind}:account` as LimitName, key: kind === 'sign-in' ? `${ip}|${email}` : email },
  ]);
  if (r.ok) return null;
  const url = new URL('/login?error=TooManyRequests', process.env.NEXTAUTH_URL || req.url).toString();
  return rateLimitedResponse(r.retryAfter, { url });
}

export { handler as GET, handler as POST };

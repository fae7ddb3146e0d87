import 'server-only';
/**
 * The signed-in user's id from next-auth's session cookie, without running next-auth's whole
 * session handler on every request.
 *
 * `getServerSession` (next-auth 4) in a route handler or page runs the session endpoint: it
 * builds its options and a CSRF token, derives the encryption key from the secret (HKDF),
 * decrypts the JWT, then derives the key again and encrypts a renewed token whose cookie a
 * server component or route handler cannot set anyway (it is dropped). Under the read load that
 * was ~8% of the server's CPU. Here the cookie is read the way next-auth reads it (same name,
 * chunks `name.0`, `name.1`… joined in order) and decrypted with next-auth's own `decode`
 * (same key derivation, algorithm and 15 s clock tolerance on expiry); a decrypted token is
 * remembered per process by its exact text until it expires, so a session's later requests
 * skip the key derivation and the decryption. The cache holds only verified tokens (never a
 * failure), is bounded, and forgets an entry once its `exp` (plus the same tolerance) passes.
 * The user is still checked against the database on every request (lib/server/session.ts).
 */
import { decode } from 'next-auth/jwt';

/** next-auth's jwtDecrypt clock tolerance, seconds. */
const CLOCK_TOLERANCE_S = 15;
const MAX_CACHED = 2000;

interface Entry {
  sub: string;
  /** Expiry (s since epoch), or Infinity when the token has none. */
  exp: number;
}
const verified = new Map<string, Entry>();
let cachedSecret: string | undefined;

/** The session cookie's name as next-auth 4 chooses it (secure prefix on https origins). */
export function sessionCookieName(headers: Headers): string {
  const url = process.env.NEXTAUTH_URL;
  let secure: boolean;
  if (url) secure = url.startsWith('https://');
  else if (process.env.VERCEL ?? process.env.AUTH_TRUST_HOST) secure = headers.get('x-forwarded-proto') !== 'http';
  else secure = false; // next-auth falls back to http://localhost:3000
  return secure ? '__Secure-next-auth.session-token' : 'next-auth.session-token';
}

/** The session token from the cookies (chunks joined as next-auth's SessionStore does), or ''. */
export function readSessionToken(cookies: Iterable<{ name: string; value: string }>, cookieName: string): string {
  const chunks: { name: string; value: string }[] = [];
  for (const c of cookies) if (c.name.startsWith(cookieName)) chunks.push(c);
  if (chunks.length <= 1) return chunks[0]?.value ?? '';
  const suffix = (n: string) => parseInt(n.split('.').pop() ?? '0');
  return chunks
    .sort((a, b) => suffix(a.name) - suffix(b.name))
    .map((c) => c.value)
    .join('');
}

/** The user id (`sub`) of a valid session token, or null (missing, expired, forged, other secret). */
export async function sessionUserId(token: string, secret: string): Promise<string | null> {
  if (!token) return null;
  if (secret !== cachedSecret) {
    verified.clear();
    cachedSecret = secret;
  }
  const now = Date.now() / 1000;
  const hit = verified.get(token);
  if (hit) {
    if (now <= hit.exp + CLOCK_TOLERANCE_S) return hit.sub;
    verified.delete(token);
  }
  let payload: Awaited<ReturnType<typeof decode>>;
  try {
    payload = await decode({ token, secret });
  } catch {
    return null; // as next-auth: a token that does not decrypt or has expired is no session
  }
  const sub = typeof payload?.sub === 'string' && payload.sub ? payload.sub : null;
  if (!sub) return null;
  const exp = typeof payload?.exp === 'number' ? payload.exp : Infinity;
  if (verified.size >= MAX_CACHED) {
    // drop the oldest entries (Map keeps insertion order)
    let n = verified.size - MAX_CACHED + 1;
    for (const k of verified.keys()) {
      if (n-- <= 0) break;
      verified.delete(k);
    }
  }
  verified.set(token, { sub, exp });
  return sub;
}

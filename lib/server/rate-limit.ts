/**
 * In-process token buckets for the endpoints that attackers hammer: credentials sign-in,
 * e-mail sign-in links, sign-up and invitations. Each attempt takes one token from a bucket
 * per client address and one per (address, account); an empty bucket means 429
 * `{"error":{"code":"rate_limited",...}}` (or the form's "too many attempts" message).
 *
 * Per instance: with several app instances behind a balancer every instance keeps its own
 * buckets (docs: the limits then multiply by the number of instances; put a shared limiter in
 * the proxy if that matters).
 * EDGEFIELD_RATE_LIMIT=off disables them (never in production; for load benches only).
 */

export interface BucketSpec {
  /** Tokens when full (the burst). */
  capacity: number;
  /** Tokens added per minute. */
  perMinute: number;
}

/** The limits. Generous enough for people who mistype, far too slow for guessing passwords. */
export const RATE_LIMITS = {
  'sign-in:ip': { capacity: 60, perMinute: 30 },
  'sign-in:account': { capacity: 10, perMinute: 6 },
  'magic-link:ip': { capacity: 20, perMinute: 10 },
  'magic-link:account': { capacity: 3, perMinute: 1 },
  'sign-up:ip': { capacity: 10, perMinute: 5 },
  'invite:user': { capacity: 30, perMinute: 10 },
  'invite:address': { capacity: 3, perMinute: 1 },
} satisfies Record<string, BucketSpec>;

export type LimitName = keyof typeof RATE_LIMITS;

interface Bucket {
  tokens: number;
  at: number;
}

const MAX_KEYS = 50_000;
// On globalThis: route handlers and server actions may be bundled into separate chunks, and
// every copy of this module must share one set of buckets per process.
const store: Map<string, Bucket> = ((globalThis as { __edgefieldRateBuckets?: Map<string, Bucket> }).__edgefieldRateBuckets ??=
  new Map());

let now: () => number = () => Date.now();

/** Tests: replace the clock (returns a function that restores it). */
export function setClockForTesting(clock: () => number): () => void {
  const prev = now;
  now = clock;
  return () => {
    now = prev;
  };
}

/** Tests: empty every bucket. */
export function resetRateLimits(): void {
  store.clear();
}

export interface TakeResult {
  ok: boolean;
  /** Seconds until one token is back (0 when ok). */
  retryAfter: number;
}

/**
 * Take one token from each named bucket (all or nothing). Keys are free text (an address, an
 * e-mail in lower case, a user id).
 */
export function take(parts: { name: LimitName; key: string }[]): TakeResult {
  if (process.env.EDGEFIELD_RATE_LIMIT === 'off') return { ok: true, retryAfter: 0 };
  const t = now();
  const buckets = parts.map(({ name, key }) => {
    const spec: BucketSpec = RATE_LIMITS[name];
    const id = `${name}\u0000${key}`;
    let b = store.get(id);
    if (!b) {
      if (store.size >= MAX_KEYS) prune(t);
      b = { tokens: spec.capacity, at: t };
      store.set(id, b);
    } else {
      b.tokens = Math.min(spec.capacity, b.tokens + ((t - b.at) / 60_000) * spec.perMinute);
      b.at = t;
    }
    return { b, spec };
  });
  let retryAfter = 0;
  for (const { b, spec } of buckets) {
    if (b.tokens < 1) retryAfter = Math.max(retryAfter, Math.ceil(((1 - b.tokens) * 60) / spec.perMinute));
  }
  if (retryAfter > 0) return { ok: false, retryAfter };
  for (const { b } of buckets) b.tokens -= 1;
  return { ok: true, retryAfter: 0 };
}

/** Drop buckets that are full again (they carry no information). */
function prune(t: number) {
  for (const [id, b] of store) {
    const name = id.slice(0, id.indexOf('\u0000')) as LimitName;
    const spec: BucketSpec | undefined = RATE_LIMITS[name];
    if (!spec || b.tokens + ((t - b.at) / 60_000) * spec.perMinute >= spec.capacity) store.delete(id);
  }
  if (store.size >= MAX_KEYS) store.clear();
}

/** The client's address as the proxy in front reports it (first X-Forwarded-For hop), else "local". */
export function clientAddress(headers: Headers): string {
  const fwd = headers.get('x-forwarded-for')?.split(',')[0]?.trim();
  return (fwd || headers.get('x-real-ip')?.trim() || 'local').slice(0, 100);
}

export const RATE_LIMIT_MESSAGE = 'Too many attempts. Wait a minute and try again.';

/** The 429 JSON error response (with Retry-After). `extra` fields are added beside `error`. */
export function rateLimitedResponse(retryAfter: number, extra: Record<string, unknown> = {}): Response {
  return Response.json(
    { error: { code: 'rate_limited', message: RATE_LIMIT_MESSAGE }, ...extra },
    { status: 429, headers: { 'retry-after': String(retryAfter), 'cache-control': 'no-store' } },
  );
}

/**
 * For server actions: take a token for the current request's address. Outside a request
 * (unit tests calling the action directly) the address is "local".
 */
export async function takeForAction(name: LimitName): Promise<TakeResult> {
  let addr = 'local';
  try {
    const { headers } = await import('next/headers');
    addr = clientAddress(await headers());
  } catch {
    /* not inside a request */
  }
  return take([{ name, key: addr }]);
}

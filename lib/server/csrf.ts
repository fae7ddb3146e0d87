/**
 * Cross-site request forgery check for our own route handlers (next-auth guards its own
 * routes; Next guards server actions by comparing Origin with Host).
 *
 * A state-changing request (anything but GET/HEAD/OPTIONS) is refused with 403
 * `{"error":{"code":"cross_site",...}}` when a browser tells us it comes from another site:
 *   - `Sec-Fetch-Site: cross-site` (or `same-site`: a sibling subdomain is another app), or
 *   - an `Origin` header whose origin is neither the request's own (Host / X-Forwarded-Host
 *     and protocol), nor NEXTAUTH_URL's, nor one listed in EDGEFIELD_ALLOWED_ORIGINS
 *     (comma separated). `Origin: null` (sandboxed frames, some redirects) is refused too.
 * Requests without either header (curl, scripts, server-to-server calls, tests) pass: browsers
 * always send Origin on cross-origin POST/PUT/PATCH/DELETE, so forgery needs a browser and is
 * caught above. Authentication is still required by each route on top of this.
 */
const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

function originOf(url: string | undefined | null): string | null {
  if (!url) return null;
  try {
    const u = new URL(url);
    return `${u.protocol}//${u.host}`.toLowerCase();
  } catch {
    return null;
  }
}

/** Origins that count as "us" for this request. */
export function allowedOrigins(req: Request): Set<string> {
  const out = new Set<string>();
  const h = req.headers;
  const fwdHost = h.get('x-forwarded-host')?.split(',')[0]?.trim();
  const host = fwdHost || h.get('host') || (originOf(req.url) ? new URL(req.url).host : null);
  const fwdProto = h.get('x-forwarded-proto')?.split(',')[0]?.trim();
  const proto = fwdProto ? `${fwdProto}:` : (originOf(req.url) ? new URL(req.url).protocol : 'http:');
  if (host) {
    out.add(`${proto}//${host}`.toLowerCase());
    // Behind a TLS-terminating proxy that does not set X-Forwarded-Proto, the page is https
    // while the request reaches us over http; the host must still match exactly.
    if (!fwdProto) out.add(`https://${host}`.toLowerCase());
  }
  const own = originOf(req.url);
  if (own) out.add(own);
  const nextAuth = originOf(process.env.NEXTAUTH_URL);
  if (nextAuth) out.add(nextAuth);
  for (const o of (process.env.EDGEFIELD_ALLOWED_ORIGINS ?? '').split(',')) {
    const x = originOf(o.trim());
    if (x) out.add(x);
  }
  return out;
}

/** True when a state-changing request comes from another site (the caller answers 403). */
export function isCrossSiteRequest(req: Request): boolean {
  if (SAFE_METHODS.has(req.method.toUpperCase())) return false;
  const site = req.headers.get('sec-fetch-site')?.toLowerCase();
  if (site === 'cross-site' || site === 'same-site') return true;
  const origin = req.headers.get('origin');
  if (origin === null) return false;
  const o = origin.trim().toLowerCase() === 'null' ? null : originOf(origin);
  return !o || !allowedOrigins(req).has(o);
}

export const CROSS_SITE_MESSAGE =
  'This request came from another site and was refused. Reload Edgefield and try again from its own pages.';

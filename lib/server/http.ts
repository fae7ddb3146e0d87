/**
 * One error shape for every API route: `{ "error": { "code", "message", "field"? } }`.
 *
 * Route handlers are wrapped in `apiHandler(fn)`, which turns an ApiError, a ZodError, an
 * oversized or malformed body and any unexpected error into that shape. A 500 never leaks
 * internals (the details go to the server log).
 */
import { ZodError, type ZodType, type z } from 'zod';
import { CROSS_SITE_MESSAGE, isCrossSiteRequest } from './csrf';

export interface ApiErrorBody {
  error: { code: string; message: string; field?: string };
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly field?: string,
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

export const unauthorized = () => new ApiError(401, 'unauthorized', 'Sign in to continue.');
export const forbidden = (message = 'Your role in this workspace does not allow this.') =>
  new ApiError(403, 'forbidden', message);
export const notFound = (what = 'The item') => new ApiError(404, 'not_found', `${what} was not found.`);

export function jsonError(status: number, code: string, message: string, field?: string): Response {
  const body: ApiErrorBody = { error: field ? { code, message, field } : { code, message } };
  return Response.json(body, { status, headers: { 'cache-control': 'no-store' } });
}

export function json(data: unknown, status = 200): Response {
  return Response.json(data, { status, headers: { 'cache-control': 'no-store' } });
}

/** Dotted path of a zod issue ("shapes.3.width"); undefined at the root. */
export function issuePath(path: readonly PropertyKey[]): string | undefined {
  return path.length ? path.map(String).join('.') : undefined;
}

export function zodErrorResponse(err: ZodError, prefix?: string): Response {
  const issue = err.issues[0];
  const local = issue ? issuePath(issue.path) : undefined;
  const field = prefix ? (local ? `${prefix}.${local}` : prefix) : local;
  const message = issue ? (field ? `${field}: ${issue.message}` : issue.message) : 'Invalid input.';
  return jsonError(422, 'invalid', message, field);
}

type Handler<C> = (req: Request, ctx: C) => Promise<Response> | Response;

/**
 * Wrap a route handler so every failure becomes the JSON error shape. State-changing requests
 * from another site are refused first (403 `cross_site`, see lib/server/csrf.ts); pass
 * `{ csrf: false }` only for endpoints called by other services with their own verification
 * (the signed payment webhook).
 */
export function apiHandler<C = unknown>(
  fn: Handler<C>,
  opts: { csrf?: boolean } = {},
): (req: Request, ctx: C) => Promise<Response> {
  return async (req, ctx) => {
    try {
      if (opts.csrf !== false && isCrossSiteRequest(req)) throw new ApiError(403, 'cross_site', CROSS_SITE_MESSAGE);
      return await fn(req, ctx);
    } catch (e) {
      return errorToResponse(e);
    }
  };
}

export function errorToResponse(e: unknown): Response {
  if (e instanceof ApiError) return jsonError(e.status, e.code, e.message, e.field);
  if (e instanceof ZodError) return zodErrorResponse(e);
  // next/navigation redirect()/notFound() throw special errors that must propagate.
  if (e && typeof e === 'object' && 'digest' in e && typeof (e as { digest: unknown }).digest === 'string') {
    const digest = (e as { digest: string }).digest;
    if (digest.startsWith('NEXT_')) throw e;
  }
  console.error('Edgefield API error:', e);
  return jsonError(500, 'internal', 'Something went wrong on the server. Please try again.');
}

/** Read the body as text, refusing more than maxBytes (413) without reading it all. */
export async function readBodyText(req: Request, maxBytes: number): Promise<string> {
  const declared = Number(req.headers.get('content-length'));
  if (Number.isFinite(declared) && declared > maxBytes) throw tooLarge(maxBytes);
  const bytes = await readBodyBytes(req, maxBytes);
  return new TextDecoder('utf-8', { fatal: false }).decode(bytes);
}

/** Read the body as bytes, refusing more than maxBytes (413). */
export async function readBodyBytes(req: Request, maxBytes: number): Promise<Uint8Array> {
  const declared = Number(req.headers.get('content-length'));
  if (Number.isFinite(declared) && declared > maxBytes) throw tooLarge(maxBytes);
  if (!req.body) return new Uint8Array(0);
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > maxBytes) {
      await reader.cancel().catch(() => {});
      throw tooLarge(maxBytes);
    }
    chunks.push(value);
  }
  const out = new Uint8Array(total);
  let o = 0;
  for (const c of chunks) {
    out.set(c, o);
    o += c.byteLength;
  }
  return out;
}

function tooLarge(maxBytes: number) {
  const mb = maxBytes >= 1 << 20 ? `${(maxBytes / (1 << 20)).toFixed(maxBytes % (1 << 20) ? 1 : 0)} MB` : `${Math.round(maxBytes / 1024)} KB`;
  return new ApiError(413, 'too_large', `The request body is larger than the limit of ${mb}.`);
}

/** Default body limit for JSON requests. */
export const DEFAULT_MAX_JSON_BYTES = 1 << 20;

/**
 * Parse a JSON body and validate it with `schema`. 413 when larger than maxBytes, 400 for
 * malformed JSON, 422 (with `field`) when the schema refuses it.
 */
export async function parseJsonBody<S extends ZodType>(
  req: Request,
  schema: S,
  opts: { maxBytes?: number } = {},
): Promise<z.output<S>> {
  const text = await readBodyText(req, opts.maxBytes ?? DEFAULT_MAX_JSON_BYTES);
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch {
    throw new ApiError(400, 'bad_json', 'The request body is not valid JSON.');
  }
  const nul = findNul(data, []);
  if (nul) {
    const field = issuePath(nul);
    throw new ApiError(422, 'invalid', `${field ?? 'body'}: text must not contain NUL characters.`, field);
  }
  const parsed = schema.safeParse(data);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const field = issue ? issuePath(issue.path) : undefined;
    throw new ApiError(422, 'invalid', issue ? (field ? `${field}: ${issue.message}` : issue.message) : 'Invalid input.', field);
  }
  return parsed.data;
}

/** Path of the first string or key holding a NUL character (PostgreSQL text cannot store it). */
function findNul(v: unknown, path: (string | number)[], depth = 0): (string | number)[] | null {
  if (typeof v === 'string') return v.includes('\0') ? path : null;
  if (depth > 200 || v === null || typeof v !== 'object') return null;
  if (Array.isArray(v)) {
    for (let i = 0; i < v.length; i++) {
      const r = findNul(v[i], [...path, i], depth + 1);
      if (r) return r;
    }
    return null;
  }
  for (const [k, x] of Object.entries(v)) {
    if (k.includes('\0')) return [...path, k];
    const r = findNul(x, [...path, k], depth + 1);
    if (r) return r;
  }
  return null;
}

/** Validate URL search parameters with `schema` (422 with the parameter name on failure). */
export function parseSearchParams<S extends ZodType>(req: Request, schema: S): z.output<S> {
  const url = new URL(req.url);
  const obj: Record<string, string> = {};
  for (const [k, v] of url.searchParams) {
    if (k.includes('\0') || v.includes('\0')) throw new ApiError(422, 'invalid', `${k}: must not contain NUL characters.`, k);
    obj[k] = v;
  }
  const parsed = schema.safeParse(obj);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const field = issue ? issuePath(issue.path) : undefined;
    throw new ApiError(422, 'invalid', issue ? (field ? `${field}: ${issue.message}` : issue.message) : 'Invalid query.', field);
  }
  return parsed.data;
}

const ID_RE = /^[A-Za-z0-9_-]{1,64}$/;

/** True for strings shaped like our ids (UUIDs and similar). */
export function isId(v: unknown): v is string {
  return typeof v === 'string' && ID_RE.test(v);
}

/**
 * Await a dynamic route's params and check that each id looks like one of ours; anything
 * else cannot exist, so it is a 404 (and never reaches the database).
 */
export async function readParams<P extends Record<string, string>>(ctx: RouteCtx<P>): Promise<P> {
  const p = await ctx.params;
  for (const v of Object.values(p)) {
    if (typeof v !== 'string' || !ID_RE.test(v)) throw new ApiError(404, 'not_found', 'The item was not found.');
  }
  return p;
}

/** The second argument Next passes to a dynamic route handler. */
export interface RouteCtx<P extends Record<string, string | string[]>> {
  params: Promise<P>;
}

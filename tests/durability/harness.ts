/**
 * Helpers of the durability tests: start the production build (`next start`) on a data folder,
 * plain HTTP requests (one connection each, so a killed server never leaves a pooled socket
 * behind), and next-auth's credentials sign-in as a browser does it.
 *
 * Build first: `NEXT_DIST_DIR=.next-e2e npx next build` (scripts/test.sh does it).
 * Environment: DURABILITY_PORT (3240), DURABILITY_SMTP_PORT (2740), NEXT_DIST_DIR (.next-e2e).
 */
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import http from 'node:http';
import path from 'node:path';

export const root = path.resolve(import.meta.dirname, '..', '..');
export const distDir = process.env.NEXT_DIST_DIR || '.next-e2e';
export const port = Number(process.env.DURABILITY_PORT || 3240);
export const smtpPort = Number(process.env.DURABILITY_SMTP_PORT || 2740);
export const origin = `http://127.0.0.1:${port}`;

export function requireBuild(): void {
  if (!fs.existsSync(path.join(root, distDir, 'BUILD_ID'))) {
    throw new Error(`No production build in ${distDir}. Build it first: NEXT_DIST_DIR=${distDir} npx next build`);
  }
}

export interface Server {
  proc: ChildProcess;
  /** Everything the server printed (stdout and stderr). */
  output(): string;
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
}

/** Start `next start` in demo mode on `dataDir` and wait until it answers (or fail with its output). */
export async function startServer(dataDir: string, timeoutMs = 180_000): Promise<Server> {
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    NODE_ENV: 'production',
    NEXT_TELEMETRY_DISABLED: '1',
    NEXT_DIST_DIR: distDir,
    EDGEFIELD_DEMO: '1',
    EDGEFIELD_DATA_DIR: dataDir,
    EDGEFIELD_SMTP_PORT: String(smtpPort),
    EDGEFIELD_PAYMENTS_PORT: '0',
    NEXTAUTH_URL: origin,
    PORT: String(port),
  };
  delete env.DATABASE_URL;
  delete env.SMTP_HOST;
  delete env.NEXT_MANUAL_SIG_HANDLE;
  const nextBin = path.join(root, 'node_modules', 'next', 'dist', 'bin', 'next');
  const proc = spawn(process.execPath, [nextBin, 'start', '-p', String(port), '-H', '127.0.0.1'], {
    cwd: root,
    env,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  proc.stdout!.on('data', (c: Buffer) => (out += c.toString()));
  proc.stderr!.on('data', (c: Buffer) => (out += c.toString()));
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
    proc.on('exit', (code, signal) => resolve({ code, signal })),
  );
  let gone = false;
  void exited.then(() => (gone = true));
  const server: Server = { proc, output: () => out, exited };
  const t0 = Date.now();
  for (;;) {
    if (gone) throw new Error(`the server stopped before it was ready:\n${out}`);
    try {
      const r = await request('GET', '/api/auth/csrf');
      if (r.status === 200) return server;
    } catch {
      /* not listening yet */
    }
    if (Date.now() - t0 > timeoutMs) {
      proc.kill('SIGKILL');
      throw new Error(`the server did not answer within ${timeoutMs / 1000} s:\n${out}`);
    }
    await new Promise((r) => setTimeout(r, 150));
  }
}

export interface Reply {
  status: number;
  headers: http.IncomingHttpHeaders;
  body: Buffer;
  json<T = unknown>(): T;
}

/**
 * One HTTP request on its own connection. Rejects on a network error (refused, reset: the
 * server died), resolves with the complete response otherwise.
 */
export function request(
  method: string,
  urlPath: string,
  opts: { cookie?: string; json?: unknown; body?: Uint8Array | string; type?: string } = {},
): Promise<Reply> {
  return new Promise((resolve, reject) => {
    const headers: Record<string, string> = { connection: 'close' };
    let payload: Uint8Array | string | undefined;
    if (opts.json !== undefined) {
      payload = JSON.stringify(opts.json);
      headers['content-type'] = 'application/json';
    } else if (opts.body !== undefined) {
      payload = opts.body;
      headers['content-type'] = opts.type ?? 'application/octet-stream';
    }
    if (payload !== undefined) headers['content-length'] = String(Buffer.byteLength(payload));
    // Same-origin, as a browser sends it on state-changing requests (the CSRF check).
    if (method !== 'GET') headers.origin = origin;
    if (opts.cookie) headers.cookie = opts.cookie;
    const req = http.request(`${origin}${urlPath}`, { method, headers, agent: false }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('error', reject);
      res.on('aborted', () => reject(new Error('response aborted')));
      res.on('end', () => {
        if (!res.complete) return reject(new Error('incomplete response'));
        const body = Buffer.concat(chunks);
        resolve({
          status: res.statusCode ?? 0,
          headers: res.headers,
          body,
          json: <T>() => JSON.parse(body.toString('utf8')) as T,
        });
      });
    });
    req.on('error', reject);
    if (payload !== undefined) req.write(payload);
    req.end();
  });
}

/** GET with a few retries on network errors (only for reads, after a restart). */
export async function getJson<T>(urlPath: string, cookie: string): Promise<T> {
  for (let i = 0; ; i++) {
    try {
      const r = await request('GET', urlPath, { cookie });
      if (r.status !== 200) throw new Error(`GET ${urlPath}: HTTP ${r.status} ${r.body.toString('utf8').slice(0, 300)}`);
      return r.json<T>();
    } catch (e) {
      if (i >= 3 || (e as Error).message.startsWith('GET ')) throw e;
      await new Promise((r) => setTimeout(r, 200));
    }
  }
}

function cookiesOf(headers: http.IncomingHttpHeaders, jar: Map<string, string>) {
  for (const c of headers['set-cookie'] ?? []) {
    const pair = c.split(';')[0]!;
    const i = pair.indexOf('=');
    jar.set(pair.slice(0, i), pair.slice(i + 1));
  }
}

/** Sign in through next-auth's credentials provider; returns the Cookie header of the session. */
export async function signIn(email: string, password: string): Promise<string> {
  const jar = new Map<string, string>();
  const csrf = await request('GET', '/api/auth/csrf');
  cookiesOf(csrf.headers, jar);
  const { csrfToken } = csrf.json<{ csrfToken: string }>();
  const res = await request('POST', '/api/auth/callback/credentials', {
    cookie: [...jar].map(([k, v]) => `${k}=${v}`).join('; '),
    body: new URLSearchParams({ csrfToken, email, password, json: 'true' }).toString(),
    type: 'application/x-www-form-urlencoded',
  });
  cookiesOf(res.headers, jar);
  const session = [...jar].find(([k]) => k.endsWith('next-auth.session-token'));
  if (!session) throw new Error(`sign-in as ${email} failed (HTTP ${res.status})`);
  const cookie = `${session[0]}=${session[1]}`;
  const who = await getJson<{ user?: { email?: string } }>('/api/auth/session', cookie);
  if (who.user?.email !== email) throw new Error(`the session does not show ${email}`);
  return cookie;
}

/**
 * A request whose body is sent in two parts: the first now, the rest when `finish()` is
 * called, so the request is in flight (headers and part of the body received) for as long
 * as the caller likes.
 */
export function splitRequest(method: string, urlPath: string, body: Uint8Array, cookie: string, type = 'application/octet-stream') {
  let req!: http.ClientRequest;
  const reply = new Promise<Reply>((resolve, reject) => {
    req = http.request(
      `${origin}${urlPath}`,
      {
        method,
        agent: false,
        headers: { connection: 'close', origin, cookie, 'content-type': type, 'content-length': String(body.byteLength) },
      },
      (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('error', reject);
        res.on('end', () => {
          const b = Buffer.concat(chunks);
          resolve({ status: res.statusCode ?? 0, headers: res.headers, body: b, json: <T>() => JSON.parse(b.toString('utf8')) as T });
        });
      },
    );
    req.on('error', reject);
  });
  const half = Math.floor(body.byteLength / 2);
  req.write(body.subarray(0, half));
  return {
    reply,
    finish: () => req.end(body.subarray(half)),
  };
}

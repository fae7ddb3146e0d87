/**
 * The server side of the load bench cases (scripts/bench/cases/load-*.ts):
 *
 * - a production build in its own folder (BENCH_LOAD_DIST_DIR, default `.next-bench`), built with
 *   `next build` only when it is missing or older than the sources (the rule of scripts/demo.mjs;
 *   BENCH_LOAD_BUILD=reuse keeps an existing older build, for quick checks while editing);
 * - a fresh temporary embedded (PGlite) data folder per case, copied from a template prepared
 *   once per bench process by scripts/bench/load-setup.ts (demo team, demo solves, 47 extra
 *   bench editors, Team plan);
 * - `next start` on 127.0.0.1 in demo mode on a free port (or BENCH_LOAD_PORT; the demo mail
 *   catcher on BENCH_LOAD_SMTP_PORT or a free port), stopped with SIGTERM afterwards, also when
 *   the bench is interrupted (Ctrl-C) or exits; the temporary folders are removed;
 * - sign-in through next-auth's credentials endpoint, as a browser does (CSRF token cookie, form
 *   post, session cookie).
 *
 * Traffic goes to 127.0.0.1 only.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { newestSourceMtime } from '../app-sources.mjs';
import { repoRoot } from './browser-harness';

const NEXT_BIN = path.join(repoRoot, 'node_modules', 'next', 'dist', 'bin', 'next');

const log = (s: string) => process.stderr.write(`load: ${s}\n`);

export function distDir(): string {
  return process.env.BENCH_LOAD_DIST_DIR || '.next-bench';
}

/**
 * Build into distDir() when there is no build or a source is newer than it (checked at the
 * first case of a bench run). `next build`
 * rewrites tsconfig.json (it adds the build folder's types); the file is put back as it was.
 */
let buildChecked = false;

export function ensureBuild(): void {
  // Once per bench process: the cases of one run measure the same build even when other work
  // in the tree changes sources meanwhile.
  if (buildChecked) return;
  buildChecked = true;
  const dir = distDir();
  let builtAt = 0;
  try {
    builtAt = fs.statSync(path.join(repoRoot, dir, 'BUILD_ID')).mtimeMs;
  } catch {
    /* no build yet */
  }
  const sourcesAt = newestSourceMtime(repoRoot);
  if (builtAt && sourcesAt <= builtAt) {
    log(`using the production build in ${dir}`);
    return;
  }
  if (builtAt && process.env.BENCH_LOAD_BUILD === 'reuse') {
    log(`BENCH_LOAD_BUILD=reuse: using the build in ${dir} although sources changed since it was made`);
    return;
  }
  log(builtAt ? `sources changed since the build in ${dir}; building (several minutes)` : `no build in ${dir}; building (several minutes)`);
  const tsconfig = path.join(repoRoot, 'tsconfig.json');
  const before = fs.readFileSync(tsconfig);
  try {
    const r = spawnSync(process.execPath, [NEXT_BIN, 'build'], {
      cwd: repoRoot,
      env: { ...process.env, NEXT_DIST_DIR: dir, NEXT_TELEMETRY_DISABLED: '1' },
      stdio: ['ignore', process.stderr, process.stderr],
    });
    if (r.status !== 0) throw new Error(`next build into ${dir} failed (exit ${r.status ?? r.signal})`);
  } finally {
    if (!fs.readFileSync(tsconfig).equals(before)) fs.writeFileSync(tsconfig, before);
  }
}

export interface BenchUser {
  email: string;
  password: string;
  role: 'owner' | 'editor' | 'viewer';
}

export interface Template {
  dir: string;
  workspaceId: string;
  users: BenchUser[];
}

// ---- clean-up on every way out ----------------------------------------------------------

const children = new Set<ChildProcess>();
const tempDirs = new Set<string>();
let hooked = false;

function cleanupSync(): void {
  for (const c of children) {
    if (c.exitCode === null && c.signalCode === null) c.kill('SIGKILL');
  }
  children.clear();
  for (const d of tempDirs) {
    try {
      fs.rmSync(d, { recursive: true, force: true });
    } catch {
      /* best effort */
    }
  }
  tempDirs.clear();
}

function hookExit(): void {
  if (hooked) return;
  hooked = true;
  process.on('exit', cleanupSync);
  for (const sig of ['SIGINT', 'SIGTERM', 'SIGHUP'] as const) {
    process.once(sig, () => {
      log(`${sig}: stopping the bench server`);
      cleanupSync();
      process.exit(sig === 'SIGINT' ? 130 : 143);
    });
  }
}

function tempDir(prefix: string): string {
  hookExit();
  const d = fs.mkdtempSync(path.join(os.tmpdir(), prefix));
  tempDirs.add(d);
  return d;
}

function removeTemp(d: string): void {
  tempDirs.delete(d);
  fs.rmSync(d, { recursive: true, force: true });
}

// ---- data ---------------------------------------------------------------------------------

let template: Promise<Template> | undefined;

/** The seeded template data folder (made once per bench process). */
export function dataTemplate(): Promise<Template> {
  return (template ??= makeTemplate());
}

async function makeTemplate(): Promise<Template> {
  const dir = tempDir('edgefield-load-template-');
  log('seeding the demo data and bench users (solves the demo sections once)');
  const child = spawn(process.execPath, ['--import', 'tsx', '--conditions=react-server', 'scripts/bench/load-setup.ts'], {
    cwd: repoRoot,
    env: { ...clientlessEnv(), EDGEFIELD_DATA_DIR: dir, EDGEFIELD_DEMO: '1' },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  children.add(child);
  let out = '';
  child.stdout!.on('data', (b: Buffer) => (out += b.toString()));
  const code: number | null = await new Promise((r) => child.on('exit', (c) => r(c)));
  children.delete(child);
  if (code !== 0) throw new Error(`scripts/bench/load-setup.ts failed (exit ${code})`);
  const info = JSON.parse(out.trim().split('\n').pop() ?? '{}') as { workspaceId: string; users: BenchUser[] };
  return { dir, workspaceId: info.workspaceId, users: info.users };
}

/** The environment without a PostgreSQL URL or real SMTP: the bench runs on its own embedded folder. */
function clientlessEnv(): NodeJS.ProcessEnv {
  const env: NodeJS.ProcessEnv = { ...process.env, NEXT_TELEMETRY_DISABLED: '1' };
  delete env.DATABASE_URL;
  delete env.SMTP_HOST;
  delete env.NEXTAUTH_SECRET;
  delete env.EDGEFIELD_RATE_LIMIT;
  return env;
}

// ---- server -------------------------------------------------------------------------------

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const a = s.address();
      const port = typeof a === 'object' && a ? a.port : 0;
      s.close(() => resolve(port));
    });
  });
}

export interface BenchServer {
  origin: string;
  port: number;
  workspaceId: string;
  users: BenchUser[];
  /** The server's output so far (for error messages). */
  logTail(): string;
  /** CPU time (user + system) the server process has used so far, ms; NaN where /proc is missing. */
  cpuMs(): number;
  stop(): Promise<void>;
}

/** Start `next start` on a fresh copy of the template data folder and wait until it answers. */
export async function startServer(): Promise<BenchServer> {
  ensureBuild();
  const tpl = await dataTemplate();
  const dataDir = tempDir('edgefield-load-data-');
  fs.cpSync(tpl.dir, dataDir, { recursive: true });
  const port = Number(process.env.BENCH_LOAD_PORT) || (await freePort());
  const smtpPort = Number(process.env.BENCH_LOAD_SMTP_PORT) || (await freePort());
  const origin = `http://127.0.0.1:${port}`;
  const env = {
    ...clientlessEnv(),
    NODE_ENV: 'production' as const,
    NEXT_DIST_DIR: distDir(),
    EDGEFIELD_DEMO: '1',
    EDGEFIELD_DATA_DIR: dataDir,
    EDGEFIELD_SMTP_PORT: String(smtpPort),
    EDGEFIELD_PAYMENTS_PORT: process.env.BENCH_LOAD_PAYMENTS_PORT || '0',
    NEXTAUTH_URL: origin,
    PORT: String(port),
  };
  // Profiling the server under load: BENCH_LOAD_NODE_ARGS="--cpu-prof --cpu-prof-dir=/tmp/prof".
  const nodeArgs = (process.env.BENCH_LOAD_NODE_ARGS ?? '').split(/\s+/).filter(Boolean);
  const child: ChildProcess = spawn(process.execPath, [...nodeArgs, NEXT_BIN, 'start', '-p', String(port), '-H', '127.0.0.1'], {
    cwd: repoRoot,
    env,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  children.add(child);
  let output = '';
  const keep = (b: Buffer) => {
    output = (output + b.toString()).slice(-20_000);
  };
  child.stdout!.on('data', keep);
  child.stderr!.on('data', keep);
  const exited = new Promise<void>((r) => child.on('exit', () => r()));
  const logTail = () => output.split('\n').slice(-30).join('\n');

  const stop = async () => {
    if (child.exitCode === null && child.signalCode === null) {
      child.kill('SIGTERM');
      const t = setTimeout(() => child.kill('SIGKILL'), 15_000);
      await exited;
      clearTimeout(t);
    }
    children.delete(child);
    removeTemp(dataDir);
  };

  // Ready when the sign-in endpoint answers (start-up opens and migrates the database first).
  const deadline = Date.now() + 180_000;
  for (;;) {
    if (child.exitCode !== null || child.signalCode !== null) {
      await stop();
      throw new Error(`next start exited during start-up:\n${logTail()}`);
    }
    try {
      const r = await fetch(`${origin}/api/auth/csrf`);
      if (r.ok) break;
    } catch {
      /* not listening yet */
    }
    if (Date.now() > deadline) {
      await stop();
      throw new Error(`next start did not answer within 180 s:\n${logTail()}`);
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  log(`server ready at ${origin} (build ${distDir()}, data ${dataDir})`);
  const cpuMs = () => processCpuMs(child.pid);
  return { origin, port, workspaceId: tpl.workspaceId, users: tpl.users, logTail, cpuMs, stop };
}

/** utime + stime of a process from /proc/<pid>/stat, ms (Linux clock ticks of 10 ms). */
function processCpuMs(pid: number | undefined): number {
  try {
    const stat = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
    const f = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    return (Number(f[11]) + Number(f[12])) * 10;
  } catch {
    return NaN;
  }
}

/** The cookies of a response as "name=value" pairs. */
function cookiesOf(res: Response): Map<string, string> {
  const out = new Map<string, string>();
  for (const c of res.headers.getSetCookie()) {
    const pair = c.split(';')[0]!;
    const i = pair.indexOf('=');
    out.set(pair.slice(0, i), pair.slice(i + 1));
  }
  return out;
}

/**
 * Sign in through next-auth's credentials provider as a browser does and return the Cookie
 * header of the session. Throws with the status when the sign-in is refused.
 */
export async function signIn(origin: string, user: BenchUser): Promise<string> {
  const csrfRes = await fetch(`${origin}/api/auth/csrf`);
  const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
  const jar = cookiesOf(csrfRes);
  const res = await fetch(`${origin}/api/auth/callback/credentials`, {
    method: 'POST',
    redirect: 'manual',
    headers: {
      'content-type': 'application/x-www-form-urlencoded',
      origin,
      cookie: [...jar].map(([k, v]) => `${k}=${v}`).join('; '),
    },
    body: new URLSearchParams({ csrfToken, email: user.email, password: user.password, json: 'true' }).toString(),
  });
  for (const [k, v] of cookiesOf(res)) jar.set(k, v);
  const session = [...jar].find(([k]) => k.endsWith('next-auth.session-token'));
  if (!session) throw new Error(`sign-in as ${user.email} failed (HTTP ${res.status})`);
  const cookie = `${session[0]}=${session[1]}`;
  const check = (await (await fetch(`${origin}/api/auth/session`, { headers: { cookie } })).json()) as { user?: { email?: string } };
  if (check.user?.email !== user.email) throw new Error(`the session of ${user.email} does not show that user`);
  return cookie;
}

/** Sign in every user, `parallel` at a time (bcrypt makes each sign-in take a fraction of a second). */
export async function signInAll(origin: string, users: BenchUser[], parallel = 4): Promise<string[]> {
  const out: string[] = new Array(users.length);
  let next = 0;
  await Promise.all(
    Array.from({ length: Math.min(parallel, users.length) }, async () => {
      while (next < users.length) {
        const i = next++;
        out[i] = await signIn(origin, users[i]!);
      }
    }),
  );
  return out;
}

/**
 * The single database of this process.
 *
 * `getDb()` opens it lazily on first use (never at import, so `next build` never touches the
 * data folder) and caches the promise on globalThis (hot reload and every route module share
 * it). Migrations are applied when it opens.
 *
 * - Default: embedded PGlite under `${EDGEFIELD_DATA_DIR:-./data}/pglite`, guarded by a pid
 *   lock file (lib/server/data-dir.ts) so a second process on the same folder refuses to start.
 * - DATABASE_URL set: a PostgreSQL server through node-postgres, same schema and migrations.
 *
 * Tests install their own instance with `setDbForTesting` (see tests/integration/helpers/db.ts).
 */
import path from 'node:path';
import type { PgDatabase, PgQueryResultHKT } from 'drizzle-orm/pg-core';
import { byteaHexParser, setPassthroughParsers, withoutDrizzleParsers } from './pglite-parsers';
import * as schema from './schema';
import { acquireDataDirLock, getDataDir, type DataDirLock } from '@/lib/server/data-dir';

export type Db = PgDatabase<PgQueryResultHKT, typeof schema>;
/** A transaction handle, accepted wherever a Db is. */
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
export type DbOrTx = Db | Tx;

export interface DbHandle {
  db: Db;
  kind: 'pglite' | 'postgres';
  /** Where the data lives (folder, "memory://" or the server URL without password). */
  location: string;
  close(): Promise<void>;
  /** PGlite only: a tarball of the data folder (used to clone migrated test databases). */
  dump?(): Promise<Blob>;
}

export function migrationsFolder(): string {
  return path.join(process.cwd(), 'db', 'migrations');
}

type GlobalWithDb = typeof globalThis & {
  __edgefieldDb?: Promise<DbHandle>;
  __edgefieldDbSignals?: boolean;
  /** Set once a shutdown closes the database: nothing may open it again in this process. */
  __edgefieldDbClosing?: boolean;
};
const g = globalThis as GlobalWithDb;

/** The Drizzle instance of this process (opened and migrated on first call). */
export async function getDb(): Promise<Db> {
  return (await getDbHandle()).db;
}

export function getDbHandle(): Promise<DbHandle> {
  if (!g.__edgefieldDb) {
    if (g.__edgefieldDbClosing) return Promise.reject(new Error('Edgefield is shutting down; the database is closed.'));
    const p = openFromEnv();
    g.__edgefieldDb = p;
    // A failed open must not stay cached: the next call tries again.
    p.catch(() => {
      if (g.__edgefieldDb === p) g.__edgefieldDb = undefined;
    });
    installSignalHandlers();
  }
  return g.__edgefieldDb;
}

/** Close the process's database (and release the data-folder lock). */
export async function closeDb(): Promise<void> {
  const p = g.__edgefieldDb;
  g.__edgefieldDb = undefined;
  if (!p) return;
  const handle = await p.catch(() => null);
  await handle?.close();
}

/** Tests: make `getDb()` return this handle (pass undefined to forget it). */
export function setDbForTesting(handle: DbHandle | Promise<DbHandle> | undefined): void {
  g.__edgefieldDb = handle === undefined ? undefined : Promise.resolve(handle);
}

async function openFromEnv(): Promise<DbHandle> {
  const url = process.env.DATABASE_URL;
  if (url) return openPostgres(url);
  return openPglite(path.join(getDataDir(), 'pglite'), { lockDir: getDataDir() });
}

export interface OpenPgliteOptions {
  /** Take the pid lock in this folder (on-disk databases). Default: none. */
  lockDir?: string;
  /** Start from a dump made by `dump()` instead of an empty database. */
  loadDataDir?: Blob;
  /** Apply migrations after opening. Default true. */
  migrate?: boolean;
}

/** Open an embedded PGlite database (a folder, or "memory://"). */
export async function openPglite(dataDir: string, opts: OpenPgliteOptions = {}): Promise<DbHandle> {
  let lock: DataDirLock | undefined;
  if (opts.lockDir) lock = acquireDataDirLock(opts.lockDir);
  try {
    const { PGlite, types } = await import('@electric-sql/pglite');
    const { drizzle } = await import('drizzle-orm/pglite');
    // PGlite's own bytea parser costs ~1 µs per byte on the server's only thread (db/pglite-parsers.ts).
    // Drizzle passes its own parsers (dates and intervals kept as text) with every query, and
    // PGlite then copies its whole parser table (hundreds of array types) per query: ~6% of the
    // server's CPU under the read load. The same parsers are set once here, and drizzle's
    // per-query copies are dropped while the client's match (db/pglite-parsers.ts); results are the same.
    const parsers = { [types.BYTEA]: byteaHexParser(types.parsers[types.BYTEA]!) };
    const client = new PGlite(dataDir, { ...(opts.loadDataDir ? { loadDataDir: opts.loadDataDir } : {}), parsers });
    await client.waitReady;
    setPassthroughParsers(client);
    const db = drizzle({ client: withoutDrizzleParsers(client), schema }) as unknown as Db;
    if (opts.migrate !== false) {
      const { migrate } = await import('drizzle-orm/pglite/migrator');
      await migrate(db as never, { migrationsFolder: migrationsFolder() });
    }
    let closed = false;
    return {
      db,
      kind: 'pglite',
      location: dataDir,
      async close() {
        if (closed) return;
        closed = true;
        try {
          await client.close();
        } finally {
          lock?.release();
        }
      },
      dump: () => client.dumpDataDir('gzip'),
    };
  } catch (e) {
    lock?.release();
    throw e;
  }
}

/** Open a PostgreSQL server database through node-postgres and apply the migrations. */
export async function openPostgres(url: string, opts: { migrate?: boolean } = {}): Promise<DbHandle> {
  const pg = await import('pg');
  const { drizzle } = await import('drizzle-orm/node-postgres');
  const pool = new pg.default.Pool({ connectionString: url, max: Number(process.env.DATABASE_POOL_MAX || 10) });
  // An idle pooled connection that the server ends (a restart, an administrator's terminate, a
  // dropped database) is emitted here; without a listener node-postgres would crash the process.
  // The pool discards that connection and opens a new one on the next query.
  pool.on('error', (err) => console.error(`Edgefield: an idle PostgreSQL connection was closed by the server (${err.message}); it will be replaced`));
  const db = drizzle({ client: pool, schema }) as unknown as Db;
  if (opts.migrate !== false) {
    const { migrate } = await import('drizzle-orm/node-postgres/migrator');
    // Several app instances may start together: one migrates at a time.
    const conn = await pool.connect();
    try {
      await conn.query('select pg_advisory_lock(7216348151)');
      await migrate(drizzle({ client: conn }) as never, { migrationsFolder: migrationsFolder() });
    } finally {
      await conn.query('select pg_advisory_unlock(7216348151)').catch(() => {});
      conn.release();
    }
  }
  let closed = false;
  return {
    db,
    kind: 'postgres',
    location: url.replace(/\/\/([^:/@]+):[^@]*@/, '//$1:***@'),
    async close() {
      if (closed) return;
      closed = true;
      await pool.end();
    },
  };
}

/** How long a shutdown waits for the HTTP server to finish the requests in flight (below `docker stop`'s 10 s). */
const SHUTDOWN_GRACE_MS = Number(process.env.EDGEFIELD_SHUTDOWN_GRACE_MS || 5_000);

/**
 * Clean shutdown on SIGTERM / SIGINT: stop accepting, let the requests in flight finish, close
 * the database (PGlite writes a shutdown checkpoint), release the data-folder lock, exit 0.
 *
 * `next start` handles the same signals: it closes its HTTP server (no new connections, the
 * requests in flight run to their end) and then calls `process.exit(143)` (130 for SIGINT).
 * While shutting down we take that call as "drained": the database is closed first and the
 * process then exits with 0. Without such a listener (scripts, NEXT_MANUAL_SIG_HANDLE) the
 * database closes at once. Either way, after SHUTDOWN_GRACE_MS (idle keep-alive connections,
 * a stuck request) the database is closed regardless; PGlite's close waits for the
 * transaction in progress, and a request that reaches the database after it is closed fails
 * with an error instead of reopening it.
 */
function installSignalHandlers() {
  if (g.__edgefieldDbSignals) return;
  g.__edgefieldDbSignals = true;
  for (const sig of ['SIGTERM', 'SIGINT'] as const) {
    process.once(sig, () => shutdownOnSignal(sig));
  }
}

function shutdownOnSignal(sig: 'SIGTERM' | 'SIGINT') {
  const realExit = process.exit.bind(process);
  let finishing = false;
  const finish = async () => {
    if (finishing) return;
    finishing = true;
    clearTimeout(grace);
    let code = 0;
    try {
      g.__edgefieldDbClosing = true;
      await closeDb();
      console.log('Edgefield: database closed');
    } catch (e) {
      code = 1;
      console.error('Edgefield: error while closing the database', e);
    }
    realExit(code);
  };
  // Another listener for this signal (Next's server) drains the HTTP server and then exits.
  const otherListeners = process.listenerCount(sig) > 0;
  console.log(
    `Edgefield: ${sig} received; ${otherListeners ? 'finishing the requests in flight, then ' : ''}closing the database`,
  );
  const grace = setTimeout(() => void finish(), otherListeners ? SHUTDOWN_GRACE_MS : 0);
  if (otherListeners) {
    process.exit = ((_code?: number) => {
      void finish();
    }) as typeof process.exit;
  }
}

/**
 * The data directory (EDGEFIELD_DATA_DIR, default ./data) and its process lock.
 *
 * PGlite has no lock across processes: two processes on one folder lose writes silently.
 * Every process that opens the embedded database first takes `<dataDir>/edgefield.lock`
 * (created exclusively, holding the pid, the host and, on Linux, the process start time).
 * A second opener finds a live holder and refuses with a clear message.
 *
 * A lock whose process is gone (crash, SIGKILL, power cut) is stale and is taken over, with a
 * message on stderr. "Gone" means: same host, and the pid is not running, or it runs but
 * started at another time than the holder did (the pid was reused, e.g. a container that
 * restarted with the same pid). The take-over itself is serialised by an exclusive
 * `edgefield.lock.takeover` folder, so two processes that find the same stale lock at once
 * never both believe they hold it.
 *
 * Node-only module (fs, process); never imported by client code.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

export function getDataDir(): string {
  return path.resolve(/*turbopackIgnore: true*/ process.env.EDGEFIELD_DATA_DIR || './data');
}

export class DataDirLockedError extends Error {
  readonly pid: number;
  constructor(dataDir: string, pid: number, host: string, otherHost = false) {
    super(
      `Edgefield: the data directory ${dataDir} is in use by another Edgefield process (pid ${pid} on ${host}). ` +
        `The embedded database cannot be shared between processes. Stop that process first, ` +
        `or start this one with its own EDGEFIELD_DATA_DIR (or use a PostgreSQL server through DATABASE_URL).` +
        (otherHost
          ? ` The lock was taken on another host, so this one cannot tell whether that process still runs; ` +
            `if you are sure it does not, delete ${path.join(dataDir, 'edgefield.lock')}.`
          : ''),
    );
    this.name = 'DataDirLockedError';
    this.pid = pid;
  }
}

/** Contents of the lock file. */
interface LockBody {
  pid?: number;
  host?: string;
  startedAt?: string;
  /** Start time of the process in clock ticks since boot (/proc/<pid>/stat field 22), Linux only. */
  procStart?: string;
}

/** The start time of a process (clock ticks since boot), or null where /proc is not available. */
export function processStartTime(pid: number): string | null {
  try {
    const stat = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
    // The command name (field 2) is in parentheses and may hold spaces: count after the last ')'.
    const rest = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    return rest[19] ?? null; // field 22 overall = index 19 after "pid (comm)"
  } catch {
    return null;
  }
}

function pidAlive(pid: number): boolean {
  if (!Number.isInteger(pid) || pid <= 0) return false;
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    // EPERM: the process exists but belongs to someone else.
    return (e as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** True when the process that wrote `held` (on this host) is still running. */
function holderRunning(held: LockBody): boolean {
  const pid = Number(held.pid);
  if (!pidAlive(pid)) return false;
  if (held.procStart) {
    const now = processStartTime(pid);
    if (now !== null && now !== held.procStart) return false; // the pid belongs to a newer process
  } else if (pid === process.pid) {
    // An old-style lock naming our own pid cannot be ours (we have not written one): a reused pid.
    return false;
  }
  return true;
}

function readLock(lockPath: string): { raw: string; body: LockBody } | null {
  let raw: string;
  try {
    raw = fs.readFileSync(lockPath, 'utf8');
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'ENOENT') return null;
    throw e;
  }
  try {
    return { raw, body: JSON.parse(raw) as LockBody };
  } catch {
    return { raw, body: {} }; // unreadable or half-written (killed while writing): stale
  }
}

export interface DataDirLock {
  path: string;
  release(): void;
}

export interface AcquireOptions {
  /** Where the take-over message goes (default: console.warn). */
  log?: (message: string) => void;
}

/** A take-over folder older than this was left by a process killed while taking over. */
const TAKEOVER_STALE_MS = 30_000;

/** Take the lock on `dataDir` for this process, or throw DataDirLockedError. */
export function acquireDataDirLock(dataDir: string, opts: AcquireOptions = {}): DataDirLock {
  const log = opts.log ?? ((m: string) => console.warn(m));
  fs.mkdirSync(dataDir, { recursive: true });
  const lockPath = path.join(dataDir, 'edgefield.lock');
  const takeoverPath = `${lockPath}.takeover`;
  const mine: LockBody = {
    pid: process.pid,
    host: os.hostname(),
    startedAt: new Date().toISOString(),
    procStart: processStartTime(process.pid) ?? undefined,
  };
  const body = JSON.stringify(mine);

  const tryCreate = (): boolean => {
    let fd: number;
    try {
      fd = fs.openSync(lockPath, 'wx');
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code === 'EEXIST') return false;
      throw e;
    }
    try {
      fs.writeSync(fd, body);
      fs.fsyncSync(fd);
    } finally {
      fs.closeSync(fd);
    }
    return true;
  };

  for (let attempt = 0; attempt < 50; attempt++) {
    if (tryCreate()) return makeLock(lockPath);
    const held = readLock(lockPath);
    if (!held) continue; // removed in between: try again
    const pid = Number(held.body.pid);
    const host = held.body.host;
    if (host && host !== os.hostname()) throw new DataDirLockedError(dataDir, pid, host, true);
    if (holderRunning(held.body)) throw new DataDirLockedError(dataDir, pid, host ?? os.hostname());

    // Stale. Serialise the take-over: only the process that creates the take-over folder may
    // remove the stale lock, and only if it still holds exactly what we judged stale.
    try {
      fs.mkdirSync(takeoverPath);
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== 'EEXIST') throw e;
      try {
        if (Date.now() - fs.statSync(takeoverPath).mtimeMs > TAKEOVER_STALE_MS) fs.rmdirSync(takeoverPath);
      } catch {
        /* gone meanwhile */
      }
      sleepSync(20 + Math.floor(Math.random() * 40)); // another process is taking over: look again
      continue;
    }
    try {
      const again = readLock(lockPath);
      if (again && again.raw === held.raw) {
        fs.unlinkSync(lockPath);
        log(
          `Edgefield: taking over the lock of ${dataDir} left by pid ${Number.isFinite(pid) ? pid : '?'}` +
            `${held.body.startedAt ? ` (started ${held.body.startedAt})` : ''}, which is no longer running. ` +
            `The embedded database recovers from its write-ahead log as it opens.`,
        );
      }
      if (tryCreate()) return makeLock(lockPath);
    } finally {
      try {
        fs.rmdirSync(takeoverPath);
      } catch {
        /* already gone */
      }
    }
  }
  throw new Error(
    `Edgefield: could not take the lock ${lockPath}: another process kept taking it over. If no Edgefield ` +
      `process uses ${dataDir}, remove ${takeoverPath} (left by a process killed while taking over) and start again.`,
  );
}

function makeLock(lockPath: string): DataDirLock {
  let released = false;
  const release = () => {
    if (released) return;
    released = true;
    process.removeListener('exit', release);
    try {
      const held = JSON.parse(fs.readFileSync(lockPath, 'utf8')) as LockBody;
      if (held.pid === process.pid) fs.unlinkSync(lockPath);
    } catch {
      /* already gone */
    }
  };
  process.once('exit', release);
  return { path: lockPath, release };
}

function sleepSync(ms: number) {
  Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);
}

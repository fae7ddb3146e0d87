/**
 * The data directory (EDGEFIELD_DATA_DIR, default ./data) and its process lock.
 *
 * PGlite has no lock across processes: two processes on one folder lose writes silently.
 * Every process that opens the embedded database first takes `<dataDir>/edgefield.lock`
 * (created exclusively, holding the pid). A second opener finds a live pid and refuses with
 * a clear message; a lock whose pid is dead (crash, SIGKILL) is taken over.
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
  constructor(dataDir: string, pid: number, host: string) {
    super(
      `Edgefield: the data directory ${dataDir} is in use by another Edgefield process (pid ${pid} on ${host}). ` +
        `The embedded database cannot be shared between processes. Stop that process first, ` +
        `or start this one with its own EDGEFIELD_DATA_DIR (or use a PostgreSQL server through DATABASE_URL).`,
    );
    this.name = 'DataDirLockedError';
    this.pid = pid;
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

export interface DataDirLock {
  path: string;
  release(): void;
}

/** Take the lock on `dataDir` for this process, or throw DataDirLockedError. */
export function acquireDataDirLock(dataDir: string): DataDirLock {
  fs.mkdirSync(dataDir, { recursive: true });
  const lockPath = path.join(dataDir, 'edgefield.lock');
  const body = JSON.stringify({ pid: process.pid, host: os.hostname(), startedAt: new Date().toISOString() });
  for (let attempt = 0; attempt < 3; attempt++) {
    try {
      const fd = fs.openSync(lockPath, 'wx');
      fs.writeSync(fd, body);
      fs.closeSync(fd);
      let released = false;
      const release = () => {
        if (released) return;
        released = true;
        try {
          const held = JSON.parse(fs.readFileSync(lockPath, 'utf8')) as { pid?: number };
          if (held.pid === process.pid) fs.unlinkSync(lockPath);
        } catch {
          /* already gone */
        }
      };
      process.once('exit', release);
      return { path: lockPath, release };
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== 'EEXIST') throw e;
      let held: { pid?: number; host?: string } = {};
      try {
        held = JSON.parse(fs.readFileSync(lockPath, 'utf8')) as typeof held;
      } catch {
        // Unreadable or half-written lock: treat as stale.
      }
      const pid = Number(held.pid);
      const sameHost = !held.host || held.host === os.hostname();
      if (pid === process.pid) {
        throw new DataDirLockedError(dataDir, pid, held.host ?? os.hostname());
      }
      if (sameHost && pidAlive(pid)) {
        throw new DataDirLockedError(dataDir, pid, held.host ?? os.hostname());
      }
      if (!sameHost) {
        throw new DataDirLockedError(dataDir, pid, held.host ?? 'another host');
      }
      // Stale lock (its process is gone): take it over.
      try {
        fs.unlinkSync(lockPath);
      } catch {
        /* someone else removed it; retry */
      }
    }
  }
  throw new Error(`Edgefield: could not take the lock ${lockPath}`);
}

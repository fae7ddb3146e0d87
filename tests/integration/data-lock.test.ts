/**
 * The data-folder lock (lib/server/data-dir.ts) beyond the basics in persistence.test.ts: a
 * stale lock is recognised by a dead pid, by a reused pid (same number, other start time,
 * e.g. a restarted container) and by a half-written file, and is taken over with a message;
 * a live holder and a lock from another host are refused; several processes finding one
 * stale lock at once end with exactly one holder.
 */
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { acquireDataDirLock, DataDirLockedError, processStartTime } from '@/lib/server/data-dir';

const dirs: string[] = [];
function freshDir() {
  const d = fs.mkdtempSync(path.join(os.tmpdir(), 'edgefield-lock-'));
  dirs.push(d);
  return d;
}
afterEach(() => {
  for (const d of dirs.splice(0)) fs.rmSync(d, { recursive: true, force: true });
});
const lockOf = (d: string) => path.join(d, 'edgefield.lock');
const writeLock = (d: string, body: unknown) => fs.writeFileSync(lockOf(d), typeof body === 'string' ? body : JSON.stringify(body));

describe('data-folder lock', () => {
  it('reads the start time of a process from /proc (Linux)', () => {
    expect(processStartTime(process.pid)).toMatch(/^\d+$/);
    expect(processStartTime(process.pid)).toBe(processStartTime(process.pid));
    expect(processStartTime(process.ppid)).not.toBe(null);
  });

  it('refuses while a live process holds it, naming its pid', () => {
    const d = freshDir();
    writeLock(d, { pid: process.ppid, host: os.hostname(), procStart: processStartTime(process.ppid) });
    const logs: string[] = [];
    expect(() => acquireDataDirLock(d, { log: (m) => logs.push(m) })).toThrow(new RegExp(`in use by another Edgefield process \\(pid ${process.ppid} `));
    expect(logs).toEqual([]);
    expect(JSON.parse(fs.readFileSync(lockOf(d), 'utf8')).pid).toBe(process.ppid);
  });

  it('takes over a lock whose pid now belongs to another process (reused pid), with a message', () => {
    const d = freshDir();
    writeLock(d, { pid: process.ppid, host: os.hostname(), procStart: '1', startedAt: '2026-01-01T00:00:00.000Z' });
    const logs: string[] = [];
    const lock = acquireDataDirLock(d, { log: (m) => logs.push(m) });
    expect(logs.join('\n')).toMatch(new RegExp(`taking over the lock of .* left by pid ${process.ppid} \\(started 2026-01-01`));
    expect(JSON.parse(fs.readFileSync(lockOf(d), 'utf8')).pid).toBe(process.pid);
    lock.release();
    expect(fs.existsSync(lockOf(d))).toBe(false);
  });

  it('takes over an old-style lock naming our own pid (the previous process of a restarted container)', () => {
    const d = freshDir();
    writeLock(d, { pid: process.pid, host: os.hostname() });
    const logs: string[] = [];
    const lock = acquireDataDirLock(d, { log: (m) => logs.push(m) });
    expect(logs).toHaveLength(1);
    // Now it is really ours: a second taker in this process is refused.
    expect(() => acquireDataDirLock(d, { log: () => {} })).toThrow(DataDirLockedError);
    lock.release();
  });

  it('takes over a half-written lock file', () => {
    const d = freshDir();
    writeLock(d, '{"pid": 12');
    const logs: string[] = [];
    acquireDataDirLock(d, { log: (m) => logs.push(m) }).release();
    expect(logs.join('\n')).toMatch(/left by pid \?/);
  });

  it('refuses a lock taken on another host and says how to clear it', () => {
    const d = freshDir();
    writeLock(d, { pid: 4242, host: 'build-runner-elsewhere' });
    expect(() => acquireDataDirLock(d, { log: () => {} })).toThrow(/pid 4242 on build-runner-elsewhere.*delete .*edgefield\.lock/s);
    expect(fs.existsSync(lockOf(d))).toBe(true);
  });

  it('gives a stale lock to exactly one of several processes that find it at the same moment', async () => {
    const d = freshDir();
    writeLock(d, { pid: 9_999_999, host: os.hostname(), procStart: '1' });
    const at = Date.now() + 4000; // after every child has started
    const runs = Array.from(
      { length: 4 },
      () =>
        new Promise<string>((resolve, reject) => {
          const c = spawn(process.execPath, ['--import', 'tsx', path.resolve('tests/integration/helpers/take-lock.ts'), d, String(at)], {
            stdio: ['ignore', 'pipe', 'inherit'],
          });
          let out = '';
          c.stdout.on('data', (b: Buffer) => (out += b.toString()));
          c.on('error', reject);
          c.on('exit', (code) => (code === 0 ? resolve(out.trim()) : reject(new Error(`child exit ${code}`))));
        }),
    );
    const outcomes = await Promise.all(runs);
    expect(outcomes.filter((o) => o === 'held')).toHaveLength(1);
    expect(outcomes.filter((o) => o === 'refused')).toHaveLength(3);
    expect(fs.existsSync(lockOf(d))).toBe(false); // released by the holder
    expect(fs.existsSync(`${lockOf(d)}.takeover`)).toBe(false);
  }, 120_000);
});

/**
 * The embedded database on disk: records survive closing and reopening, and a second
 * process on the same data folder is refused with a clear message (PGlite has no lock across
 * processes; STACK.md pitfall 1). A stale lock left by a dead process is taken over.
 */
import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { openPglite } from '@/db/client';
import { users, workspaces } from '@/db/schema';
import { acquireDataDirLock, DataDirLockedError } from '@/lib/server/data-dir';
import { templateBlob } from './helpers/db';

/** PGlite start-up is slow on a loaded 2-core machine (minutes when several builds run). */
const SLOW = 600_000;

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'edgefield-persist-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

function runChild(dataDir: string) {
  return new Promise<{ code: number | null; stderr: string }>((resolve) => {
    const child = spawn(
      process.execPath,
      ['--import', 'tsx', '--conditions=react-server', path.resolve('tests/integration/helpers/open-data-dir.ts'), dataDir],
      { stdio: ['ignore', 'ignore', 'pipe'] },
    );
    let stderr = '';
    child.stderr.on('data', (c: Buffer) => (stderr += c.toString()));
    child.on('exit', (code) => resolve({ code, stderr }));
  });
}

describe('embedded database on disk', () => {
  it('keeps every record across close and reopen, and refuses a second process meanwhile', async () => {
    // Start the folder from the migrated template (initdb on disk is the slow part), then
    // open it as the app does: lock, open, apply migrations (none pending).
    const first = await openPglite(path.join(dir, 'pglite'), { lockDir: dir, loadDataDir: await templateBlob() });
    const [u] = await first.db.insert(users).values({ email: 'persist@test.example', name: 'Persist' }).returning();
    await first.db.insert(workspaces).values({ name: 'Kept workspace' });
    expect(fs.existsSync(path.join(dir, 'edgefield.lock'))).toBe(true);

    // A second process on the same folder while this one holds it.
    const refused = await runChild(dir);
    expect(refused.code).toBe(3);
    expect(refused.stderr).toMatch(/in use by another Edgefield process \(pid \d+/);
    expect(refused.stderr).toContain(String(process.pid));

    await first.close();
    expect(fs.existsSync(path.join(dir, 'edgefield.lock'))).toBe(false);

    const again = await openPglite(path.join(dir, 'pglite'), { lockDir: dir });
    try {
      const [back] = await again.db.select().from(users).where(eq(users.id, u!.id));
      expect(back?.email).toBe('persist@test.example');
      const ws = await again.db.select().from(workspaces);
      expect(ws.map((x) => x.name)).toEqual(['Kept workspace']);
    } finally {
      await again.close();
    }

    // With the folder free, another process may open it.
    const allowed = await runChild(dir);
    expect(allowed.code).toBe(0);
  }, SLOW);

  it('takes over a lock left by a process that is gone', () => {
    const d = fs.mkdtempSync(path.join(os.tmpdir(), 'edgefield-stale-'));
    try {
      const dead = spawnSync(process.execPath, ['-e', 'process.pid'], { encoding: 'utf8' });
      expect(dead.status).toBe(0);
      const deadPid = dead.pid!;
      fs.writeFileSync(path.join(d, 'edgefield.lock'), JSON.stringify({ pid: deadPid, host: os.hostname() }));
      const lock = acquireDataDirLock(d);
      expect(JSON.parse(fs.readFileSync(lock.path, 'utf8')).pid).toBe(process.pid);
      // Held now: a second taker in this process is refused too.
      expect(() => acquireDataDirLock(d)).toThrow(DataDirLockedError);
      lock.release();
      expect(fs.existsSync(lock.path)).toBe(false);
    } finally {
      fs.rmSync(d, { recursive: true, force: true });
    }
  });
});

/**
 * `npm run backup` / `npm run restore` as an operator runs them: a backup of the embedded
 * database on disk is taken, the data folder deleted, the backup restored, and every row of
 * every table is back (sections, revisions, solves with fields, comments, …). The restore
 * target is what the test suite runs on: a new embedded data folder, or, under `npm run
 * test:pg` (DATABASE_URL set), a new database on the PostgreSQL server. Both commands refuse
 * while another process holds the data folder; restore refuses a database that is not empty.
 */
import { spawn } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { openPglite, openPostgres, type DbHandle } from '@/db/client';
import { allRows, fillEveryTable } from './helpers/backup-data';
import { templateBlob } from './helpers/db';

const SLOW = 600_000;
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'edgefield-backup-cli-'));
const serverUrl = process.env.DATABASE_URL;
let dropDb: (() => Promise<void>) | undefined;
afterAll(async () => {
  fs.rmSync(tmp, { recursive: true, force: true });
  await dropDb?.();
});

function npmRun(script: 'backup' | 'restore', file: string, target: { dataDir: string } | { url: string }) {
  return new Promise<{ code: number | null; stdout: string; stderr: string }>((resolve) => {
    const env = { ...process.env };
    delete env.DATABASE_URL;
    if ('url' in target) env.DATABASE_URL = target.url;
    else env.EDGEFIELD_DATA_DIR = target.dataDir;
    const c = spawn('npm', ['run', '--silent', script, '--', file], { env, stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    c.stdout.on('data', (b: Buffer) => (stdout += b.toString()));
    c.stderr.on('data', (b: Buffer) => (stderr += b.toString()));
    c.on('exit', (code) => resolve({ code, stdout, stderr }));
  });
}

/** The restore target: a new PostgreSQL database under test:pg, else the (deleted) embedded folder. */
async function target(dataDir: string): Promise<{ where: { dataDir: string } | { url: string }; open: () => Promise<DbHandle>; kind: RegExp }> {
  if (!serverUrl) {
    return {
      where: { dataDir },
      open: () => openPglite(path.join(dataDir, 'pglite'), { lockDir: dataDir, migrate: false }),
      kind: /embedded database/,
    };
  }
  const pg = (await import('pg')).default;
  const name = `edgefield_r_${crypto.randomBytes(6).toString('hex')}`;
  const admin = new pg.Client({ connectionString: serverUrl });
  await admin.connect();
  await admin.query(`create database ${name}`);
  await admin.end();
  dropDb = async () => {
    const a = new pg.Client({ connectionString: serverUrl });
    await a.connect();
    await a.query(`drop database if exists ${name} with (force)`);
    await a.end();
  };
  const u = new URL(serverUrl);
  u.pathname = `/${name}`;
  return { where: { url: u.toString() }, open: () => openPostgres(u.toString(), { migrate: false }), kind: /PostgreSQL database/ };
}

describe('npm run backup / restore', () => {
  it('backup of the embedded database, folder deleted, restore: every row of every table is back', async () => {
    const dataDir = path.join(tmp, 'data');
    const file = path.join(tmp, 'edgefield.backup.gz');
    const h = await openPglite(path.join(dataDir, 'pglite'), { lockDir: dataDir, loadDataDir: await templateBlob() });
    let before: Record<string, string[]>;
    try {
      await fillEveryTable(h);
      before = await allRows(h);
      // While a process holds the folder, both commands refuse and say why; no file is written.
      const busyBackup = await npmRun('backup', file, { dataDir });
      expect(busyBackup.code, busyBackup.stderr).toBe(3);
      expect(busyBackup.stderr).toMatch(/in use by another Edgefield process \(pid \d+/);
      expect(fs.existsSync(file)).toBe(false);
      const busyRestore = await npmRun('restore', path.join(tmp, 'none.gz'), { dataDir });
      expect(busyRestore.code).toBe(2); // the file is checked first: it does not exist
      expect(busyRestore.stderr).toMatch(/does not exist/);
    } finally {
      await h.close();
    }

    const made = await npmRun('backup', file, { dataDir });
    expect(made.code, made.stderr).toBe(0);
    expect(made.stdout).toMatch(/backup: \d+ rows from 18 tables of the embedded database/);
    expect(made.stdout).toMatch(/section_revisions: \d+/);

    // Restore while the app holds the data folder: refused by the lock, nothing changes.
    const held = await openPglite(path.join(dataDir, 'pglite'), { lockDir: dataDir, migrate: false });
    try {
      const busy = await npmRun('restore', file, { dataDir });
      expect(busy.code).toBe(3);
      expect(busy.stderr).toMatch(/in use by another Edgefield process/);
    } finally {
      await held.close();
    }

    fs.rmSync(dataDir, { recursive: true, force: true });
    const t = await target(dataDir);
    const restored = await npmRun('restore', file, t.where);
    expect(restored.code, restored.stderr).toBe(0);
    expect(restored.stdout).toMatch(/restore: \d+ rows into 18 tables of the /);
    expect(restored.stdout).toMatch(t.kind);

    const back = await t.open();
    try {
      const after = await allRows(back);
      expect(after).toEqual(before!);
      for (const name of ['sections', 'section_revisions', 'solves', 'comments', 'files', 'audit_events']) {
        expect(after[name]!.length, name).toBeGreaterThan(0);
      }
    } finally {
      await back.close();
    }

    // Restore again into the now filled database: refused with the reason, nothing changes.
    const again = await npmRun('restore', file, t.where);
    expect(again.code).toBe(4);
    expect(again.stderr).toMatch(/The target database is not empty: .*users \(\d+ rows\)/);
    const check = await t.open();
    try {
      expect(await allRows(check)).toEqual(before!);
    } finally {
      await check.close();
    }

    // A data folder without a database: backup says so and creates nothing.
    const nowhere = await npmRun('backup', path.join(tmp, 'x.gz'), { dataDir: path.join(tmp, 'typo') });
    expect(nowhere.code).toBe(2);
    expect(nowhere.stderr).toMatch(/There is no embedded database at .*typo/);
    expect(fs.existsSync(path.join(tmp, 'typo'))).toBe(false);

    // Usage: exit 2 with the reason, and a missing file creates no data folder.
    expect((await npmRun('restore', '', { dataDir })).code).toBe(2);
    const missing = await npmRun('restore', path.join(tmp, 'nothing-here.gz'), { dataDir: path.join(tmp, 'other') });
    expect(missing.code).toBe(2);
    expect(fs.existsSync(path.join(tmp, 'other'))).toBe(false);
  }, SLOW);
});

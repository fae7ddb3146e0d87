/**
 * Backup and restore (scripts/backup-format.ts): a backup of the embedded database, with a
 * row in every table, restores into a fresh database with every row of every table equal
 * (the target is in-memory PGlite here and a PostgreSQL server under `npm run test:pg`,
 * where DATABASE_URL is set); refusals change nothing: a non-empty target, other migrations,
 * a damaged or cut-off file, and a row that fails half-way through the load.
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import zlib from 'node:zlib';
import { getTableName, is } from 'drizzle-orm';
import { PgTable } from 'drizzle-orm/pg-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as schema from '@/db/schema';
import { openPglite, type DbHandle } from '@/db/client';
import { auditEvents, demoMails, users } from '@/db/schema';
import { BackupError, restoreBackup, writeBackup } from '@/scripts/backup-format';
import { allRows, exec, fillEveryTable } from './helpers/backup-data';
import { createTestDb, templateBlob } from './helpers/db';
import type { World } from './helpers/fixtures';

const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'edgefield-backup-'));
let source: DbHandle;
let world: World;
const file = path.join(tmp, 'all.backup.gz');

beforeAll(async () => {
  source = await openPglite('memory://', { loadDataDir: await templateBlob(), migrate: false });
  world = await fillEveryTable(source);
  await writeBackup(source, file);
});
afterAll(async () => {
  await source?.close();
  fs.rmSync(tmp, { recursive: true, force: true });
});

/** Rewrite a backup file line by line (to damage it on purpose). */
function rewrite(from: string, to: string, edit: (lines: string[]) => string[]) {
  const lines = zlib.gunzipSync(fs.readFileSync(from)).toString('utf8').split('\n').filter(Boolean);
  fs.writeFileSync(to, zlib.gzipSync(edit(lines).join('\n') + '\n'));
}

async function isEmpty(h: DbHandle) {
  const rows = await allRows(h);
  return Object.values(rows).every((r) => r.length === 0);
}

describe('backup and restore', () => {
  it('the example data has a row in every table (so the backup is shown to cover them all)', async () => {
    const rows = await allRows(source);
    const empty = Object.entries(rows).filter(([, r]) => r.length === 0).map(([t]) => t);
    expect(empty).toEqual([]);
    // …and those are all the tables of the schema.
    const declared = Object.values(schema).filter((v) => is(v, PgTable)).map((t) => getTableName(t as PgTable));
    expect(Object.keys(rows).sort()).toEqual(declared.sort());
  });

  it('restores every row of every table into a fresh database, field blobs and sequences included', async () => {
    const target = await createTestDb();
    try {
      expect(await isEmpty(target)).toBe(true);
      const { rows } = await restoreBackup(target, file);
      expect(rows.section_revisions).toBeGreaterThan(0);
      expect(await allRows(target)).toEqual(await allRows(source));
      // The field blob is back byte for byte.
      const [a] = (await exec(source, `select encode(field, 'hex') as h from solves where id = '${world.solveA}'`)).rows;
      const [b] = (await exec(target, `select encode(field, 'hex') as h from solves where id = '${world.solveA}'`)).rows;
      expect(b!.h).toBe(a!.h);
      expect(String(b!.h).length).toBeGreaterThan(64);
      // Sequences continue after the restored ids.
      const [max] = (await exec(target, 'select max(id)::int as m from audit_events')).rows;
      const [row] = await target.db.insert(auditEvents).values({ action: 'x.y', targetType: 'x' }).returning({ id: auditEvents.id });
      expect(row!.id).toBeGreaterThan(Number(max!.m));
      await target.db.insert(demoMails).values({ subject: 'after restore' });
    } finally {
      await target.close();
    }
  });

  it('a backup of the restored database (PostgreSQL under test:pg) restores into a fresh embedded one, every row equal', async () => {
    const middle = await createTestDb();
    const again = path.join(tmp, 'round-trip.backup.gz');
    try {
      await restoreBackup(middle, file);
      await writeBackup(middle, again);
    } finally {
      await middle.close();
    }
    const fresh = await openPglite('memory://', { loadDataDir: await templateBlob(), migrate: false });
    try {
      await restoreBackup(fresh, again);
      expect(await allRows(fresh)).toEqual(await allRows(source));
    } finally {
      await fresh.close();
    }
  });

  it('refuses a target that is not empty, naming the tables, and changes nothing', async () => {
    const target = await createTestDb();
    try {
      await target.db.insert(users).values({ email: 'early@test.example' });
      const before = await allRows(target);
      const err = await restoreBackup(target, file).catch((e: unknown) => e);
      expect(err).toBeInstanceOf(BackupError);
      expect((err as BackupError).exitCode).toBe(4);
      expect((err as Error).message).toMatch(/not empty: users \(1 rows\)/);
      expect(await allRows(target)).toEqual(before);
    } finally {
      await target.close();
    }
  });

  it('refuses damaged, cut-off and foreign files before writing anything', async () => {
    const target = await createTestDb();
    try {
      const cut = path.join(tmp, 'cut.gz');
      rewrite(file, cut, (l) => l.slice(0, -1)); // no end marker
      await expect(restoreBackup(target, cut)).rejects.toThrow(/ends before its end marker/);

      const counted = path.join(tmp, 'counted.gz');
      rewrite(file, counted, (l) => l.filter((x, i) => i === 0 || !x.startsWith('{"t":"comments"')));
      await expect(restoreBackup(target, counted)).rejects.toThrow(/table "comments" has 0 rows but the end marker says 1/);

      const truncated = path.join(tmp, 'truncated.gz');
      const bytes = fs.readFileSync(file);
      fs.writeFileSync(truncated, bytes.subarray(0, Math.floor(bytes.length / 2)));
      await expect(restoreBackup(target, truncated)).rejects.toBeInstanceOf(BackupError);

      const foreign = path.join(tmp, 'foreign.gz');
      fs.writeFileSync(foreign, zlib.gzipSync('{"hello":"world"}\n'));
      await expect(restoreBackup(target, foreign)).rejects.toThrow(/not an Edgefield backup/);

      const other = path.join(tmp, 'other-migrations.gz');
      rewrite(file, other, (l) => {
        const h = JSON.parse(l[0]!);
        h.migrations = [...h.migrations, crypto.randomBytes(8).toString('hex')];
        return [JSON.stringify(h), ...l.slice(1)];
      });
      const err = await restoreBackup(target, other).catch((e: unknown) => e);
      expect((err as BackupError).exitCode).toBe(4);
      expect((err as Error).message).toMatch(/migrations/);

      await expect(restoreBackup(target, path.join(tmp, 'missing.gz'))).rejects.toThrow(/does not exist/);
      expect(await isEmpty(target)).toBe(true);
    } finally {
      await target.close();
    }
  });

  it('writes nothing when a row fails half-way through the load (one transaction)', async () => {
    const target = await createTestDb();
    try {
      const dup = path.join(tmp, 'dup.gz');
      // A second copy of the last comment row (a primary-key clash, late in the load), with a
      // trailer that counts it, so the file itself passes the checks.
      rewrite(file, dup, (l) => {
        const i = l.map((x) => x.startsWith('{"t":"comments"')).lastIndexOf(true);
        const out = [...l.slice(0, i + 1), l[i]!, ...l.slice(i + 1)];
        const tr = JSON.parse(out[out.length - 1]!);
        tr.rows.comments += 1;
        out[out.length - 1] = JSON.stringify(tr);
        return out;
      });
      await expect(restoreBackup(target, dup)).rejects.toThrow();
      expect(await isEmpty(target)).toBe(true);
      // …and the same target then takes the good file.
      await restoreBackup(target, file);
      expect(await allRows(target)).toEqual(await allRows(source));
    } finally {
      await target.close();
    }
  });

  it('refuses to overwrite an existing file and leaves no partial file on failure', async () => {
    await expect(writeBackup(source, file)).rejects.toThrow(/already exists/);
    await expect(writeBackup(source, path.join(tmp, 'no-such-folder', 'x.gz'))).rejects.toThrow(/does not exist/);
    expect(fs.readdirSync(tmp).filter((f) => f.endsWith('.partial'))).toEqual([]);
  });
});

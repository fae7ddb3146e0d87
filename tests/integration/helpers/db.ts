/**
 * Test databases with the real migrations.
 *
 * - Default: in-memory PGlite. Creating and migrating one takes ~10 s here, so the first
 *   suite migrates once and dumps it (dumpDataDir) to a file in the OS temp folder, keyed by
 *   a hash of the migrations; every suite then clones it with loadDataDir (STACK.md pitfall 2).
 * - DATABASE_URL set (scripts/test-pg.sh): a fresh database per suite on that PostgreSQL
 *   server, migrated through node-postgres, dropped afterwards.
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { migrationsFolder, openPglite, openPostgres, type DbHandle } from '@/db/client';

function migrationsHash(): string {
  const h = crypto.createHash('sha256');
  const dir = migrationsFolder();
  const walk = (d: string) => {
    for (const e of fs.readdirSync(d, { withFileTypes: true }).sort((a, b) => a.name.localeCompare(b.name))) {
      const p = path.join(d, e.name);
      if (e.isDirectory()) walk(p);
      else h.update(e.name).update(fs.readFileSync(p));
    }
  };
  walk(dir);
  return h.digest('hex').slice(0, 16);
}

export async function templateBlob(): Promise<Blob> {
  const file = path.join(os.tmpdir(), `edgefield-test-db-${migrationsHash()}.tar.gz`);
  if (!fs.existsSync(file)) {
    const h = await openPglite('memory://');
    const dump = await h.dump!();
    await h.close();
    const tmp = `${file}.${process.pid}.${Date.now()}.tmp`;
    fs.writeFileSync(tmp, Buffer.from(await dump.arrayBuffer()));
    fs.renameSync(tmp, file); // atomic: parallel workers never read a half-written file
  }
  return new Blob([fs.readFileSync(file)], { type: 'application/x-gzip' });
}

/** A fresh, migrated, empty database for one test suite. */
export async function createTestDb(): Promise<DbHandle> {
  const url = process.env.DATABASE_URL;
  if (url) return createPostgresTestDb(url);
  return openPglite('memory://', { loadDataDir: await templateBlob(), migrate: false });
}

async function createPostgresTestDb(url: string): Promise<DbHandle> {
  const pg = (await import('pg')).default;
  const name = `edgefield_t_${crypto.randomBytes(6).toString('hex')}`;
  const admin = new pg.Client({ connectionString: url });
  await admin.connect();
  await admin.query(`create database ${name}`);
  await admin.end();
  const u = new URL(url);
  u.pathname = `/${name}`;
  const handle = await openPostgres(u.toString());
  return {
    ...handle,
    async close() {
      await handle.close();
      const a = new pg.Client({ connectionString: url });
      await a.connect();
      await a.query(`drop database if exists ${name} with (force)`);
      await a.end();
    },
  };
}

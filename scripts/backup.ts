/**
 * `npm run backup -- <file>`: write a backup of Edgefield's database to <file> (a gzip file of
 * JSON lines, format in scripts/backup-format.ts). The database is the app's: DATABASE_URL
 * when set, otherwise the embedded one under EDGEFIELD_DATA_DIR (default ./data).
 *
 * The embedded database belongs to one process at a time: stop the app first (a running app
 * holds <dir>/edgefield.lock and the backup stops with a message). A PostgreSQL server may be
 * backed up while the app runs: the rows are read in one repeatable-read snapshot.
 *
 * Exit codes: 0 written, 2 bad arguments or file, 3 the data folder is in use, 1 other errors.
 */
import fs from 'node:fs';
import path from 'node:path';
import { openPglite, openPostgres, type DbHandle } from '@/db/client';
import { DataDirLockedError, getDataDir } from '@/lib/server/data-dir';
import { BackupError, writeBackup } from './backup-format';

const args = process.argv.slice(2).filter((a) => a !== '--');
if (args.length !== 1 || !args[0] || args[0].startsWith('-')) {
  console.error('Usage: npm run backup -- <file>   (e.g. npm run backup -- edgefield-2026-05-01.backup.gz)');
  process.exit(2);
}
const file = path.resolve(args[0]!);

let handle: DbHandle | undefined;
try {
  const url = process.env.DATABASE_URL;
  const folder = path.join(getDataDir(), 'pglite');
  if (!url && !fs.existsSync(path.join(folder, 'PG_VERSION'))) {
    throw new BackupError(
      `There is no embedded database at ${folder}. Set EDGEFIELD_DATA_DIR to the app's data folder (or DATABASE_URL for a PostgreSQL server).`,
    );
  }
  handle = url
    ? await openPostgres(url, { migrate: false })
    : await openPglite(folder, { lockDir: getDataDir(), migrate: false });
  const t = Date.now();
  const { rows, bytes } = await writeBackup(handle, file);
  const total = Object.values(rows).reduce((a, b) => a + b, 0);
  console.log(
    `backup: ${total} rows from ${Object.keys(rows).length} tables of the ${handle.kind === 'pglite' ? 'embedded database' : 'PostgreSQL database'} ` +
      `(${handle.location}) written to ${file} (${(bytes / 1024).toFixed(1)} KiB, ${((Date.now() - t) / 1000).toFixed(1)} s)`,
  );
  for (const [t2, n] of Object.entries(rows)) if (n) console.log(`  ${t2}: ${n}`);
  await handle.close();
  process.exit(0);
} catch (e) {
  await handle?.close().catch(() => {});
  if (e instanceof DataDirLockedError) {
    console.error(`backup: ${e.message}`);
    process.exit(3);
  }
  if (e instanceof BackupError) {
    console.error(`backup: ${e.message}`);
    process.exit(e.exitCode);
  }
  console.error('backup: failed:', e);
  process.exit(1);
}

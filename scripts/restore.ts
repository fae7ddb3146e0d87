/**
 * `npm run restore -- <file>`: load a backup made by `npm run backup` into Edgefield's
 * database: DATABASE_URL when set, otherwise the embedded one under EDGEFIELD_DATA_DIR
 * (created when missing). A dump of the embedded database restores into a PostgreSQL server
 * and the other way round.
 *
 * The file is read through once and checked first. The target gets the app's migrations,
 * must be at the same migrations as the backup and hold no rows at all; then every row goes in
 * within one transaction, so a failure writes nothing. The embedded data folder must not be in
 * use (stop the app; its lock refuses the restore otherwise).
 *
 * Exit codes: 0 restored, 2 bad arguments or a damaged file, 3 the data folder is in use,
 * 4 the target was refused (not empty, other migrations), 1 other errors.
 */
import path from 'node:path';
import { openPglite, openPostgres, type DbHandle } from '@/db/client';
import { DataDirLockedError, getDataDir } from '@/lib/server/data-dir';
import { BackupError, checkBackup, restoreBackup } from './backup-format';

const args = process.argv.slice(2).filter((a) => a !== '--');
if (args.length !== 1 || !args[0] || args[0].startsWith('-')) {
  console.error('Usage: npm run restore -- <file>   (into an empty database: a new EDGEFIELD_DATA_DIR or DATABASE_URL)');
  process.exit(2);
}
const file = path.resolve(args[0]!);

let handle: DbHandle | undefined;
try {
  // Check the file before creating or migrating anything.
  const { header } = await checkBackup(file);
  const url = process.env.DATABASE_URL;
  handle = url ? await openPostgres(url) : await openPglite(path.join(getDataDir(), 'pglite'), { lockDir: getDataDir() });
  const t = Date.now();
  const { rows } = await restoreBackup(handle, file);
  const total = Object.values(rows).reduce((a, b) => a + b, 0);
  console.log(
    `restore: ${total} rows into ${Object.keys(rows).length} tables of the ${handle.kind === 'pglite' ? 'embedded database' : 'PostgreSQL database'} ` +
      `(${handle.location}) from ${file}, a backup of ${header.createdAt} (${((Date.now() - t) / 1000).toFixed(1)} s)`,
  );
  await handle.close();
  process.exit(0);
} catch (e) {
  await handle?.close().catch(() => {});
  if (e instanceof DataDirLockedError) {
    console.error(`restore: ${e.message}`);
    process.exit(3);
  }
  if (e instanceof BackupError) {
    console.error(`restore: ${e.message}`);
    process.exit(e.exitCode);
  }
  console.error('restore: failed, nothing was written:', e);
  process.exit(1);
}

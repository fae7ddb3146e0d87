/**
 * Child process for the lock test: tries to open the embedded database in the data folder
 * given as argv[2]. Exit 0 when it opened (and closed) it, 3 with the message on stderr when
 * the folder is locked by another process.
 */
import path from 'node:path';
import { openPglite } from '@/db/client';
import { DataDirLockedError } from '@/lib/server/data-dir';

const dir = process.argv[2]!;
try {
  const h = await openPglite(path.join(dir, 'pglite'), { lockDir: dir, migrate: false });
  await h.close();
  process.exit(0);
} catch (e) {
  if (e instanceof DataDirLockedError) {
    process.stderr.write(e.message);
    process.exit(3);
  }
  console.error(e);
  process.exit(1);
}

/**
 * Child process of the lock race test: waits until the time given in argv[3] (ms since the
 * epoch), tries to take the data-folder lock of argv[2], prints "held" or "refused", and
 * keeps a lock it got for a second before releasing it.
 */
import { acquireDataDirLock, DataDirLockedError } from '@/lib/server/data-dir';

const dir = process.argv[2]!;
const at = Number(process.argv[3]);
while (Date.now() < at) Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 1);
try {
  const lock = acquireDataDirLock(dir, { log: () => {} });
  process.stdout.write('held\n');
  setTimeout(() => {
    lock.release();
    process.exit(0);
  }, 1000);
} catch (e) {
  if (!(e instanceof DataDirLockedError)) throw e;
  process.stdout.write('refused\n');
  process.exit(0);
}

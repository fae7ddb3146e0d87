/**
 * Run by `npm run demo` before the server starts: open the configured database (migrations
 * apply), seed the fictional demo team when it is empty, and solve a few demo sections so the
 * demo has stored solves to open. Closes the database (releasing the data-folder lock) before
 * the server starts. Run with: tsx --conditions=react-server scripts/seed-demo.ts
 */
import { closeDb, getDbHandle } from '@/db/client';
import { seedDemo } from '@/lib/demo/seed';
import { seedDemoSolves } from '@/lib/demo/seed-solves';
import { DataDirLockedError } from '@/lib/server/data-dir';

try {
  const handle = await getDbHandle();
  console.log(`demo: database ready (${handle.kind}: ${handle.location})`);
  if (await seedDemo(handle.db)) console.log('demo: demo team seeded');
  const t = Date.now();
  const n = await seedDemoSolves(handle.db, (s) => console.log(s));
  if (n) console.log(`demo: ${n} demo solves stored (${Math.round((Date.now() - t) / 1000)} s)`);
  await closeDb();
} catch (e) {
  if (e instanceof DataDirLockedError) {
    console.error(`\n${e.message}\n`);
    process.exit(3);
  }
  throw e;
}

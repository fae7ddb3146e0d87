/**
 * `npm run db:migrate`: open the configured database (DATABASE_URL, or the embedded one under
 * EDGEFIELD_DATA_DIR), apply the committed migrations in db/migrations, close.
 * The app also migrates at start, so this is only needed to prepare a database ahead of time.
 */
import { closeDb, getDbHandle } from './client';

const handle = await getDbHandle();
console.log(`Edgefield: migrations applied (${handle.kind}: ${handle.location})`);
await closeDb();

/**
 * Prepares the data folder of the load bench (scripts/bench/load-server.ts), before the server
 * starts and never while it runs: the demo team and its stored solves exactly as `npm run demo`
 * seeds them (lib/demo/seed.ts, lib/demo/seed-solves.ts), the demo workspace on the Team plan,
 * and LOAD_USERS extra fictional editors ("Bench user 01" … at harrowlane.example) so that 50
 * concurrent connections can be 50 different signed-in people. The Team plan allows 50 members,
 * so 3 demo accounts + 47 bench users fill it exactly. The extra accounts share one bcrypt hash
 * (cost 12, as the app's own) of LOAD_PASSWORD: signing in still runs the full bcrypt check.
 *
 * Run with: EDGEFIELD_DATA_DIR=<folder> node --import tsx --conditions=react-server scripts/bench/load-setup.ts
 * Prints one JSON line on stdout: { "workspaceId", "users": [{ "email", "password", "role" }], "solves" }.
 */
import bcrypt from 'bcryptjs';
import { eq } from 'drizzle-orm';
import { closeDb, getDbHandle } from '@/db/client';
import { memberships, users, workspaces } from '@/db/schema';
import { DEMO_ACCOUNTS, DEMO_WORKSPACE_NAME } from '@/lib/demo/accounts';
import { seedDemo } from '@/lib/demo/seed';
import { seedDemoSolves } from '@/lib/demo/seed-solves';

/** Bench users added to the demo workspace (3 demo members + 47 = the Team plan's 50). */
const LOAD_USERS = 47;
const LOAD_PASSWORD = 'edgefield-bench';

const log = (s: string) => process.stderr.write(`load-setup: ${s}\n`);

const handle = await getDbHandle();
const db = handle.db;
await seedDemo(db);
const t = Date.now();
const n = await seedDemoSolves(db, log);
log(`${n} demo solves stored (${Math.round((Date.now() - t) / 1000)} s)`);

const [ws] = await db.select({ id: workspaces.id }).from(workspaces).where(eq(workspaces.name, DEMO_WORKSPACE_NAME)).limit(1);
if (!ws) throw new Error('the demo workspace was not seeded');
await db.update(workspaces).set({ plan: 'team' }).where(eq(workspaces.id, ws.id));

const hash = await bcrypt.hash(LOAD_PASSWORD, 12);
const bench: { email: string; password: string; role: 'editor' }[] = [];
await db.transaction(async (tx) => {
  for (let i = 1; i <= LOAD_USERS; i++) {
    const nn = String(i).padStart(2, '0');
    const email = `bench.user${nn}@harrowlane.example`;
    const [u] = await tx
      .insert(users)
      .values({ email, name: `Bench user ${nn}`, passwordHash: hash, emailVerified: new Date(), notifyByEmail: false })
      .returning({ id: users.id });
    await tx.insert(memberships).values({ workspaceId: ws.id, userId: u!.id, role: 'editor' });
    bench.push({ email, password: LOAD_PASSWORD, role: 'editor' });
  }
});
await closeDb();

const all = [...DEMO_ACCOUNTS.filter((a) => a.workspace === 'main').map((a) => ({ email: a.email, password: a.password, role: a.role })), ...bench];
process.stdout.write(JSON.stringify({ workspaceId: ws.id, users: all, solves: n }) + '\n');

/**
 * Demo solves: run by `npm run demo` before the app starts (scripts/seed-demo.ts), never
 * inside the server process (solving blocks for seconds). Solves a few demo sections at the
 * standard preset with the same settings and settings hash the browser uses, stores each
 * result with its compressed field, and adds a short comment thread, so the demo's "recent
 * solves" and a shared solve are there to open. Skipped when solves exist already.
 */
import { and, eq, sql } from 'drizzle-orm';
import type { Db } from '@/db/client';
import { comments, memberships, sections, solves, users, workspaces } from '@/db/schema';
import { solveSection } from '@/lib/engine/solve-section';
import { encodeFieldBlob } from '@/lib/field/codec';
import { settingsHash } from '@/lib/client/settings-hash';
import { DEMO_ACCOUNTS, DEMO_WORKSPACE_NAME } from './accounts';

/** Demo sections to solve (by name) and who solved them. */
const TO_SOLVE: { section: string; by: string; comments: { by: string; body: string }[] }[] = [
  {
    section: 'Front-end microstrip feed',
    by: 'tobias.quill@harrowlane.example',
    comments: [
      { by: 'ines.varga@harrowlane.example', body: 'Z0 looks close to target. Is the solder mask left out on purpose?' },
      { by: 'tobias.quill@harrowlane.example', body: 'Yes, bare trace for now; I will add the mask layer in the next revision.' },
    ],
  },
  {
    section: 'Humidity sensor plate pair',
    by: 'tobias.quill@harrowlane.example',
    comments: [{ by: 'maren.holt@harrowlane.example', body: 'Worth noting the fringing excess in the design review.' }],
  },
  { section: 'Probe lead coax', by: 'maren.holt@harrowlane.example', comments: [] },
];

export async function seedDemoSolves(db: Db, log: (s: string) => void = () => {}): Promise<number> {
  const [main] = await db.select().from(workspaces).where(eq(workspaces.name, DEMO_WORKSPACE_NAME)).limit(1);
  if (!main) return 0;
  const [existing] = await db.select({ n: sql<number>`count(*)::int` }).from(solves).where(eq(solves.workspaceId, main.id));
  if (Number(existing?.n ?? 0) > 0) return 0;
  const people = new Map<string, string>();
  for (const a of DEMO_ACCOUNTS) {
    const [u] = await db
      .select({ id: users.id })
      .from(users)
      .innerJoin(memberships, and(eq(memberships.userId, users.id), eq(memberships.workspaceId, main.id)))
      .where(eq(users.email, a.email));
    if (u) people.set(a.email, u.id);
  }
  let stored = 0;
  let minutesAgo = 180;
  for (const item of TO_SOLVE) {
    const [sec] = await db
      .select()
      .from(sections)
      .where(and(eq(sections.workspaceId, main.id), eq(sections.name, item.section)))
      .limit(1);
    if (!sec?.latestRevisionId) continue;
    const [rev] = await db.query.sectionRevisions.findMany({ where: (r, { eq: e }) => e(r.id, sec.latestRevisionId!), limit: 1 });
    if (!rev) continue;
    const settings = { preset: 'standard' as const, tolerance: 1e-10 };
    const t0 = Date.now();
    const out = solveSection(rev.content as never, { keepFields: true, tolerance: settings.tolerance, preset: settings.preset });
    const field = encodeFieldBlob(out.fields!);
    log(`  solved "${item.section}" in ${Date.now() - t0} ms (${out.result.mesh.nodes} nodes)`);
    const at = new Date(Date.now() - minutesAgo * 60_000);
    minutesAgo -= 50;
    await db.transaction(async (tx) => {
      const [row] = await tx
        .insert(solves)
        .values({
          workspaceId: main.id,
          sectionId: sec.id,
          revisionId: rev.id,
          settings,
          settingsHash: await settingsHash(settings),
          result: out.result,
          field,
          fieldBytes: field.byteLength,
          status: 'done',
          authorId: people.get(item.by) ?? null,
          createdAt: at,
          updatedAt: at,
        })
        .onConflictDoNothing()
        .returning({ id: solves.id });
      if (!row) return;
      let k = 0;
      for (const c of item.comments) {
        await tx.insert(comments).values({
          solveId: row.id,
          authorId: people.get(c.by) ?? null,
          body: c.body,
          createdAt: new Date(at.getTime() + ++k * 7 * 60_000),
        });
      }
      stored++;
    });
  }
  return stored;
}

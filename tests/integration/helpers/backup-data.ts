/**
 * Example data with a row in every table, and a comparison of whole databases, for the backup
 * and restore tests.
 */
import { sql } from 'drizzle-orm';
import type { DbHandle } from '@/db/client';
import {
  accounts,
  auditEvents,
  billingEvents,
  comments,
  demoMails,
  files,
  notifications,
  sessions,
  solves,
  users,
  verificationTokens,
  workspaceMaterials,
} from '@/db/schema';
import { encodeFieldBlob } from '@/lib/field/codec';
import { buildWorld, type World } from './fixtures';

type Rows = { rows: Record<string, unknown>[] };
export const exec = (h: DbHandle, q: string) => (h.db as unknown as { execute(x: unknown): Promise<Rows> }).execute(sql.raw(q));

/** Every row of every public table as text (UTC), sorted: equal databases give equal maps. */
export async function allRows(h: DbHandle): Promise<Record<string, string[]>> {
  const out: Record<string, string[]> = {};
  await h.db.transaction(async (tx) => {
    const t = tx as unknown as { execute(x: unknown): Promise<Rows> };
    await t.execute(sql`set local time zone 'UTC'`);
    const tables = await t.execute(
      sql`select table_name as n from information_schema.tables where table_schema = 'public' and table_type = 'BASE TABLE' order by 1`,
    );
    for (const r of tables.rows) {
      const name = String(r.n);
      const rows = await t.execute(sql.raw(`select to_jsonb(x)::text as j from "${name}" x order by 1`));
      out[name] = rows.rows.map((x) => String(x.j));
    }
  });
  return out;
}

/** The example data: the test world plus a row in each table it does not fill. */
export async function fillEveryTable(h: DbHandle): Promise<World> {
  const w = await buildWorld(h.db);
  const db = h.db;
  const blob = encodeFieldBlob({
    xs: new Float64Array([0, 1e-4, 2e-4]),
    ys: new Float64Array([0, 1e-4]),
    potentials: [new Float64Array([0, 0.5, 1, 0, 0.5, 1])],
    cellEpsR: new Float32Array([2.1, 2.1]),
    nodeNet: new Int16Array(6).fill(-1),
  });
  await db.update(solves).set({ field: blob, fieldBytes: blob.byteLength }).where(sql`${solves.id} = ${w.solveA}`);
  await db.insert(comments).values({ solveId: w.solveA, authorId: w.users.editor.id, body: 'Matches the bench figure — 71.2 pF/m ✓' });
  await db.insert(auditEvents).values([
    { workspaceId: w.wsA, actorId: w.users.owner.id, action: 'section.create', targetType: 'section', targetId: w.sectionA, data: { note: 'ü' } },
    { workspaceId: w.wsB, actorId: null, action: 'solve.create', targetType: 'solve', targetId: w.solveB },
  ]);
  // More rows than one read page holds (200; 4 for tables with blobs), so paging is exercised.
  await db.insert(auditEvents).values(
    Array.from({ length: 230 }, (_, i) => ({ workspaceId: w.wsA, actorId: w.users.editor.id, action: 'section.view', targetType: 'section', targetId: w.sectionA, data: { i } })),
  );
  await db.insert(files).values(
    Array.from({ length: 9 }, (_, i) => ({
      workspaceId: w.wsA,
      sectionId: w.sectionA,
      kind: 'measured-csv',
      name: `sweep-${i}.csv`,
      mediaType: 'text/csv',
      bytes: 3 + i,
      data: new Uint8Array(3 + i).map((_, j) => (i * 31 + j * 7) % 256),
      uploadedBy: w.users.editor.id,
    })),
  );
  await db.insert(demoMails).values({ from: 'no-reply@edgefield.example', to: 'viewer@test.example', subject: 'Sign in', text: 'x' });
  await db.insert(notifications).values({ userId: w.users.viewer.id, workspaceId: w.wsA, kind: 'comment', data: { solveId: w.solveA } });
  await db.insert(workspaceMaterials).values({ workspaceId: w.wsA, content: { id: 'fr4x', name: 'Board laminate', epsR: 4.3 } });
  await db.insert(billingEvents).values({ eventId: 'evt_test_1', type: 'checkout.session.completed', workspaceId: w.wsA });
  await db.insert(accounts).values({ userId: w.users.owner.id, type: 'email', provider: 'email', providerAccountId: 'owner@test.example' });
  await db.insert(sessions).values({ sessionToken: 'tok-1', userId: w.users.owner.id, expires: new Date('2030-01-01T00:00:00Z') });
  await db.insert(verificationTokens).values({ identifier: 'viewer@test.example', token: 'vt-1', expires: new Date('2030-01-01T00:00:00.123Z') });
  await db.update(users).set({ emailVerified: new Date('2026-03-04T05:06:07.089Z') }).where(sql`${users.id} = ${w.users.owner.id}`);
  return w;
}


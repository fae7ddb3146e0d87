/**
 * What must hold after a restart, checked two ways:
 * - `verifyRound` through the restarted server's API: every acknowledged write is there and
 *   intact; an unacknowledged one is either wholly there (exactly what was sent) or absent;
 *   revision numbers 1..n without gaps or duplicates; nothing there that was never sent.
 * - `sqlIntegrity` on the database itself (after a clean shutdown): no gaps, every section
 *   points at its newest revision, no solve with half a field, every row written with its
 *   audit event in the same transaction and every such event with its row, no orphans.
 */
import { sql } from 'drizzle-orm';
import { expect } from 'vitest';
import type { DbHandle } from '@/db/client';
import { getJson, request } from './harness';
import type { Ledger } from './workload';

interface SectionItem {
  id: string;
  name: string;
  latestRevisionId: string | null;
  latestRevisionNumber: number | null;
}
interface RevisionItem {
  id: string;
  sectionId: string;
  number: number;
  message: string;
}
interface SolveItem {
  id: string;
  sectionId: string;
  revisionId: string;
  settingsHash: string;
  result: unknown;
  hasField: boolean;
  fieldBytes: number | null;
}

export interface RoundSummary {
  sections: number;
  revisions: number;
  solves: number;
  fields: number;
  comments: number;
  /** Unacknowledged writes found committed (the server died between commit and reply). */
  unackedPresent: number;
}

export async function verifyRound(l: Ledger, ws: string, cookie: string): Promise<RoundSummary> {
  const sum: RoundSummary = { sections: 0, revisions: 0, solves: 0, fields: 0, comments: 0, unackedPresent: 0 };
  const where = `round ${l.round}`;

  // Sections: ours by name prefix; each one sent, the acknowledged ones all there.
  const { sections } = await getJson<{ sections: SectionItem[] }>(`/api/workspaces/${ws}/sections`, cookie);
  const present = sections.filter((s) => s.name.startsWith(l.prefix));
  const byName = new Map(present.map((s) => [s.name, s]));
  expect(byName.size, `${where}: duplicate section names`).toBe(present.length);
  for (const s of present) expect(l.sections.has(s.name), `${where}: unknown section ${s.name}`).toBe(true);
  for (const sent of l.sections.values()) {
    const got = byName.get(sent.name);
    if (sent.state === 'acked') {
      expect(got, `${where}: acknowledged section ${sent.name} is missing`).toBeDefined();
      expect(got!.id).toBe(sent.id);
    } else if (got) sum.unackedPresent++;
  }
  sum.sections = present.length;

  // Revisions of each present section: numbers 1..n, each one sent for this section, content intact.
  const seenRevisionIds = new Set<string>();
  for (const s of present) {
    const { revisions } = await getJson<{ revisions: RevisionItem[] }>(`/api/workspaces/${ws}/sections/${s.id}/revisions`, cookie);
    const numbers = revisions.map((r) => r.number).sort((a, b) => a - b);
    expect(numbers, `${where}: revision numbers of ${s.name}`).toEqual(numbers.map((_, i) => i + 1));
    const newest = revisions.find((r) => r.number === numbers.length);
    expect(s.latestRevisionNumber, `${where}: latest revision number of ${s.name}`).toBe(numbers.length);
    expect(s.latestRevisionId, `${where}: latest revision of ${s.name}`).toBe(newest?.id);
    for (const r of revisions) {
      const sent = l.revisions.get(r.message);
      expect(sent, `${where}: unknown revision "${r.message}" in ${s.name}`).toBeDefined();
      expect(sent!.sectionName, `${where}: revision "${r.message}" in the wrong section`).toBe(s.name);
      if (sent!.state === 'acked') {
        expect(r.id).toBe(sent!.id);
        expect(r.number).toBe(sent!.number);
      } else sum.unackedPresent++;
      seenRevisionIds.add(r.id);
      const full = await getJson<{ revision: { content: unknown } }>(
        `/api/workspaces/${ws}/sections/${s.id}/revisions/${r.id}`,
        cookie,
      );
      expect(full.revision.content, `${where}: content of revision "${r.message}"`).toEqual(sent!.content);
    }
    sum.revisions += revisions.length;
  }
  for (const sent of l.revisions.values()) {
    if (sent.state === 'acked') expect(seenRevisionIds.has(sent.id!), `${where}: acknowledged revision "${sent.message}" is missing`).toBe(true);
  }

  // Solves: result intact, field whole or absent, acknowledged fields and comments there.
  const { solves } = await getJson<{ solves: SolveItem[] }>(`/api/workspaces/${ws}/solves?limit=500`, cookie);
  const ours = solves.filter((s) => s.settingsHash.startsWith(l.prefix));
  const seenSolves = new Set(ours.map((s) => s.settingsHash));
  expect(seenSolves.size, `${where}: duplicate solves`).toBe(ours.length);
  for (const s of ours) {
    const sent = l.solves.get(s.settingsHash);
    expect(sent, `${where}: unknown solve ${s.settingsHash}`).toBeDefined();
    if (sent!.state === 'acked') expect(s.id).toBe(sent!.id);
    else sum.unackedPresent++;
    expect(s.sectionId).toBe(sent!.sectionId);
    expect(s.revisionId).toBe(sent!.revisionId);
    expect(s.result, `${where}: result of ${s.settingsHash}`).toEqual(sent!.result);
    if (sent!.fieldState === 'acked') expect(s.hasField, `${where}: acknowledged field of ${s.settingsHash} is missing`).toBe(true);
    if (s.hasField) {
      expect(s.fieldBytes).toBe(sent!.field.byteLength);
      const f = await request('GET', `/api/workspaces/${ws}/solves/${s.id}/field`, { cookie });
      expect(f.status).toBe(200);
      expect(new Uint8Array(f.body).every((b, i) => b === sent!.field[i]) && f.body.length === sent!.field.length, `${where}: field bytes of ${s.settingsHash}`).toBe(true);
      if (sent!.fieldState !== 'acked') sum.unackedPresent++;
      sum.fields++;
    } else expect(s.fieldBytes, `${where}: field size without a field (${s.settingsHash})`).toBeNull();
    const { comments } = await getJson<{ comments: { id: string; body: string }[] }>(
      `/api/workspaces/${ws}/solves/${s.id}/comments`,
      cookie,
    );
    for (const c of comments) {
      const cs = sent!.comments.find((x) => x.body === c.body);
      expect(cs, `${where}: unknown comment "${c.body}"`).toBeDefined();
      if (cs!.state === 'acked') expect(c.id).toBe(cs!.id);
      else sum.unackedPresent++;
    }
    for (const cs of sent!.comments) {
      if (cs.state === 'acked') expect(comments.some((c) => c.id === cs.id), `${where}: acknowledged comment "${cs.body}" is missing`).toBe(true);
    }
    sum.comments += comments.length;
  }
  for (const sent of l.solves.values()) {
    if (sent.state === 'acked') expect(seenSolves.has(sent.settingsHash), `${where}: acknowledged solve ${sent.settingsHash} is missing`).toBe(true);
  }
  sum.solves = ours.length;
  return sum;
}

type Rows = { rows: Record<string, unknown>[] };

/** Rows returned by a query that must return none (each a violation). */
async function none(handle: DbHandle, what: string, query: string) {
  const db = handle.db as unknown as { execute(q: unknown): Promise<Rows> };
  const r = await db.execute(sql.raw(query));
  expect(r.rows, what).toEqual([]);
}

/** Integrity of the whole database (all rounds), on the closed-and-reopened folder. */
export async function sqlIntegrity(handle: DbHandle, prefix: string): Promise<void> {
  const like = `'${prefix}%'`;
  await none(
    handle,
    'revision numbers 1..n without gaps or duplicates',
    `select section_id from section_revisions group by section_id
      having min(number) <> 1 or max(number) <> count(*) or count(distinct number) <> count(*)`,
  );
  await none(
    handle,
    'every section points at its newest revision',
    `select s.id from sections s
       left join lateral (select r.id from section_revisions r where r.section_id = s.id order by r.number desc limit 1) n on true
      where s.latest_revision_id is distinct from n.id`,
  );
  await none(
    handle,
    'no solve with half a field',
    `select id from solves where (field is null) <> (field_bytes is null) or octet_length(field) <> field_bytes`,
  );
  await none(
    handle,
    'no orphans',
    `select 'revision' as t, r.id from section_revisions r left join sections s on s.id = r.section_id where s.id is null
     union all select 'solve', v.id from solves v left join section_revisions r on r.id = v.revision_id where r.id is null
     union all select 'comment', c.id from comments c left join solves v on v.id = c.solve_id where v.id is null`,
  );
  // The rows of the test and their audit events were written in one transaction each.
  await none(
    handle,
    'every revision of the test has its audit event',
    `select r.id from section_revisions r join sections s on s.id = r.section_id
      where s.name like ${like} and not exists (select 1 from audit_events a
        where a.action in ('section.create', 'section.revision') and a.data->>'revisionId' = r.id)`,
  );
  await none(
    handle,
    'every revision audit event has its revision',
    `select a.id from audit_events a where a.action in ('section.create', 'section.revision') and a.data ? 'revisionId'
        and not exists (select 1 from section_revisions r where r.id = a.data->>'revisionId')`,
  );
  await none(
    handle,
    'every solve of the test has its audit event, and every solve audit event its solve',
    `select v.id from solves v where v.settings_hash like ${like}
        and not exists (select 1 from audit_events a where a.action = 'solve.create' and a.target_id = v.id)
     union all select a.target_id from audit_events a where a.action = 'solve.create'
        and not exists (select 1 from solves v where v.id = a.target_id)`,
  );
  await none(
    handle,
    'a field is stored with its audit event and an audit event has its field',
    `select v.id from solves v where v.settings_hash like ${like} and (v.field is not null) <>
        exists (select 1 from audit_events a where a.action = 'solve.field' and a.target_id = v.id)`,
  );
  await none(
    handle,
    'every comment of the test has its audit event, and every comment audit event its comment',
    `select c.id from comments c where c.body like ${like}
        and not exists (select 1 from audit_events a where a.action = 'comment.create' and a.data->>'commentId' = c.id)
     union all select a.id::text from audit_events a where a.action = 'comment.create'
        and not exists (select 1 from comments c where c.id = a.data->>'commentId')`,
  );
}

/**
 * PostgreSQL's own consistency checks (the amcheck extension) on every table and B-tree index
 * of the folder: heap pages and tuples are sound, and every row is in every index. Opens the
 * folder with PGlite directly (the extension is loaded per instance); the caller holds no
 * other handle on it.
 */
export async function amcheckAll(pgliteDir: string): Promise<{ tables: number; indexes: number }> {
  const { PGlite } = await import('@electric-sql/pglite');
  const { amcheck } = await import('@electric-sql/pglite/contrib/amcheck');
  const pg = new PGlite(pgliteDir, { extensions: { amcheck } });
  try {
    await pg.exec('create extension if not exists amcheck');
    const heap = await pg.query<{ relname: string; blkno: number; msg: string }>(
      `select c.relname, v.blkno, v.msg from pg_class c, lateral verify_heapam(c.oid) v
        where c.relnamespace = 'public'::regnamespace and c.relkind = 'r'`,
    );
    expect(heap.rows, 'heap corruption found by verify_heapam').toEqual([]);
    const idx = await pg.query<{ relname: string }>(
      `select c.relname, bt_index_check(c.oid, true) from pg_index i
         join pg_class c on c.oid = i.indexrelid join pg_am a on a.oid = c.relam
        where a.amname = 'btree' and c.relnamespace = 'public'::regnamespace`,
    );
    const tables = await pg.query<{ n: number }>(
      `select count(*)::int as n from pg_class where relnamespace = 'public'::regnamespace and relkind = 'r'`,
    );
    return { tables: tables.rows[0]!.n, indexes: idx.rows.length };
  } finally {
    await pg.close();
  }
}

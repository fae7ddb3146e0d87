/**
 * A fingerprint of every table in the public schema (row count + md5 of the rows as text), to
 * show that a refused request changed nothing stored.
 */
import { sql } from 'drizzle-orm';
import type { DbHandle } from '@/db/client';

type Rows = { rows: Record<string, unknown>[] };

export async function snapshotTables(handle: DbHandle): Promise<Record<string, string>> {
  const db = handle.db as unknown as { execute(q: unknown): Promise<Rows> };
  const tables = await db.execute(
    sql`select table_name from information_schema.tables where table_schema = 'public' and table_type = 'BASE TABLE' order by table_name`,
  );
  const out: Record<string, string> = {};
  for (const r of tables.rows) {
    const t = String(r.table_name);
    const q = await db.execute(
      sql.raw(`select count(*)::text as n, coalesce(md5(string_agg(x::text, '|' order by x::text)), '') as h from "${t.replace(/"/g, '""')}" x`),
    );
    out[t] = `${q.rows[0]!.n}:${q.rows[0]!.h}`;
  }
  return out;
}

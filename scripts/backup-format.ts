/**
 * Edgefield's backup format and the code shared by `npm run backup` and `npm run restore`.
 *
 * A backup is a logical dump of every table of the public schema (users, workspaces, members,
 * invitations, sections, revisions, solves with their field blobs, comments, files and measured
 * data, audit events, share links, notifications, materials, billing, demo mail …): one gzip
 * file of JSON lines. Line 1 is the header (format, when, from which kind of database, the
 * migrations the schema was at, the tables in load order), then one line per row
 * `{"t": table, "r": row}` with the row as PostgreSQL's `to_jsonb` gives it (timestamps in
 * UTC with microseconds, bytea as "\x…" hex, jsonb as JSON), and last a trailer with the row
 * count of every table, so a cut-off file is recognised.
 *
 * The same file restores into the embedded database and into a PostgreSQL server: the target
 * is migrated by the app's own migrations, must be at the same migrations and empty, and the
 * rows go in with `jsonb_populate_recordset` (each value converted by its column's type) in one
 * transaction; on any error nothing is written. Foreign keys decide the load order; a cycle
 * (sections ↔ their latest revision) is broken at a nullable column, which is filled in after
 * the rows it points to. Sequences (audit and mail ids) are set past the restored ids.
 *
 * Why not pg_dump: @electric-sql/pglite-tools' WASM pg_dump (0.4.8, the newest) requires
 * exactly @electric-sql/pglite 0.5.8 while Edgefield runs 0.5.16, and its SQL script carries
 * the schema too, where a restore must go into a database made by our migrations, refuse a
 * non-empty one and load in one transaction on both drivers.
 */
import fs from 'node:fs';
import path from 'node:path';
import readline from 'node:readline';
import zlib from 'node:zlib';
import { sql, type SQL } from 'drizzle-orm';
import type { DbHandle, DbOrTx } from '@/db/client';

export const BACKUP_FORMAT = 'edgefield.backup/1';

export interface BackupHeader {
  format: typeof BACKUP_FORMAT;
  createdAt: string;
  source: 'pglite' | 'postgres';
  /** Hashes of the applied migrations (drizzle's journal), oldest first. */
  migrations: string[];
  /** Tables in load order. */
  tables: string[];
}
export interface BackupTrailer {
  end: true;
  rows: Record<string, number>;
}

export class BackupError extends Error {
  constructor(
    message: string,
    /** Exit code of the command: 2 bad input, 3 data folder in use, 4 target refused. */
    readonly exitCode = 2,
  ) {
    super(message);
    this.name = 'BackupError';
  }
}

type Rows = { rows: Record<string, unknown>[] };
async function q(db: DbOrTx, query: SQL): Promise<Record<string, unknown>[]> {
  return ((await (db as unknown as { execute(x: SQL): Promise<Rows> }).execute(query)) as Rows).rows;
}
const ident = (name: string) => sql.identifier(name);

export interface TableMeta {
  name: string;
  primaryKey: string[];
  /** Columns filled by a sequence (bigserial). */
  serial: string[];
  nullable: Set<string>;
  /** Has a bytea column (field blobs, files): read a few rows at a time. */
  binary: boolean;
}
export interface ForeignKey {
  table: string;
  columns: string[];
  references: string;
}

/** Tables, keys and foreign keys of the public schema. */
export async function readSchema(db: DbOrTx): Promise<{ tables: TableMeta[]; fks: ForeignKey[] }> {
  const names = (
    await q(db, sql`select table_name as t from information_schema.tables
                    where table_schema = 'public' and table_type = 'BASE TABLE' order by table_name`)
  ).map((r) => String(r.t));
  const cols = await q(
    db,
    sql`select table_name as t, column_name as c, is_nullable as n, column_default as d, data_type as ty
          from information_schema.columns where table_schema = 'public' order by table_name, ordinal_position`,
  );
  const keys = await q(
    db,
    sql`select cl.relname as t, con.contype as kind, ref.relname as ref,
               array_to_string(array(select a.attname from unnest(con.conkey) with ordinality k(n, i)
                 join pg_attribute a on a.attrelid = con.conrelid and a.attnum = k.n order by k.i), ',') as cols
          from pg_constraint con
          join pg_class cl on cl.oid = con.conrelid
          join pg_namespace ns on ns.oid = cl.relnamespace
          left join pg_class ref on ref.oid = con.confrelid
         where ns.nspname = 'public' and con.contype in ('p', 'f')`,
  );
  const tables = names.map<TableMeta>((name) => ({
    name,
    primaryKey: String(keys.find((k) => k.t === name && k.kind === 'p')?.cols ?? '')
      .split(',')
      .filter(Boolean),
    serial: cols.filter((c) => c.t === name && String(c.d ?? '').startsWith('nextval(')).map((c) => String(c.c)),
    nullable: new Set(cols.filter((c) => c.t === name && c.n === 'YES').map((c) => String(c.c))),
    binary: cols.some((c) => c.t === name && c.ty === 'bytea'),
  }));
  const fks = keys
    .filter((k) => k.kind === 'f')
    .map<ForeignKey>((k) => ({ table: String(k.t), columns: String(k.cols).split(','), references: String(k.ref) }));
  return { tables, fks };
}

/**
 * Load order (parents before children) and the columns to fill in afterwards: where foreign
 * keys form a cycle, a nullable referencing column is loaded as null and set at the end.
 */
export function loadOrder(tables: TableMeta[], fks: ForeignKey[]): { order: string[]; deferred: ForeignKey[] } {
  const byName = new Map(tables.map((t) => [t.name, t]));
  let edges = fks.filter((f) => f.table !== f.references || !f.columns.every((c) => byName.get(f.table)?.nullable.has(c)));
  const deferred: ForeignKey[] = fks.filter((f) => !edges.includes(f)); // nullable self-references
  const order: string[] = [];
  const left = new Set(tables.map((t) => t.name));
  while (left.size) {
    const ready = [...left].filter((t) => !edges.some((e) => e.table === t && e.references !== t && left.has(e.references)));
    if (ready.length) {
      for (const t of ready.sort()) {
        order.push(t);
        left.delete(t);
      }
      continue;
    }
    // A cycle: defer one nullable foreign key among the tables left.
    const breakable = edges.find(
      (e) => left.has(e.table) && left.has(e.references) && e.columns.every((c) => byName.get(e.table)!.nullable.has(c)),
    );
    if (!breakable) throw new Error(`Foreign keys form a cycle without a nullable column among: ${[...left].join(', ')}`);
    deferred.push(breakable);
    edges = edges.filter((e) => e !== breakable);
  }
  return { order, deferred };
}

async function appliedMigrations(db: DbOrTx): Promise<string[]> {
  const exists = await q(db, sql`select to_regclass('drizzle.__drizzle_migrations') is not null as ok`);
  if (!exists[0]?.ok) return [];
  return (await q(db, sql`select hash from drizzle.__drizzle_migrations order by created_at, id`)).map((r) => String(r.hash));
}

/** Rows per read; tables with blobs (up to tens of MB each) are read a few rows at a time. */
const PAGE = 200;
const BINARY_PAGE = 4;

/**
 * Write a backup of `handle` to `file` (through a temporary file renamed at the end, so a
 * failed backup never leaves a half file under the name). Reads in one repeatable-read
 * transaction: a consistent snapshot even while a PostgreSQL server is being written to.
 */
export async function writeBackup(handle: DbHandle, file: string): Promise<{ rows: Record<string, number>; bytes: number }> {
  if (fs.existsSync(file)) throw new BackupError(`${file} already exists; choose a new file name for the backup.`);
  const dir = path.dirname(path.resolve(file));
  if (!fs.existsSync(dir)) throw new BackupError(`The folder ${dir} does not exist.`);
  const tmp = `${file}.${process.pid}.partial`;
  const gz = zlib.createGzip({ level: 6 });
  const out = fs.createWriteStream(tmp);
  const done = new Promise<void>((resolve, reject) => {
    out.on('finish', resolve);
    out.on('error', reject);
    gz.on('error', reject);
  });
  gz.pipe(out);
  const write = (line: unknown) =>
    new Promise<void>((resolve) => {
      if (gz.write(`${JSON.stringify(line)}\n`)) resolve();
      else gz.once('drain', resolve);
    });
  try {
    const counts: Record<string, number> = {};
    await handle.db.transaction(
      async (tx) => {
        await q(tx, sql`set local time zone 'UTC'`);
        const { tables, fks } = await readSchema(tx);
        const { order } = loadOrder(tables, fks);
        const header: BackupHeader = {
          format: BACKUP_FORMAT,
          createdAt: new Date().toISOString(),
          source: handle.kind,
          migrations: await appliedMigrations(tx),
          tables: order,
        };
        await write(header);
        for (const name of order) {
          const t = tables.find((x) => x.name === name)!;
          const by = sql.join((t.primaryKey.length ? t.primaryKey : ['ctid']).map((c) => (c === 'ctid' ? sql.raw('ctid') : ident(c))), sql`, `);
          counts[name] = 0;
          const page = t.binary ? BINARY_PAGE : PAGE;
          for (let offset = 0; ; offset += page) {
            const rows = await q(tx, sql`select to_jsonb(x) as r from ${ident(name)} x order by ${by} limit ${page} offset ${offset}`);
            for (const r of rows) {
              const row = typeof r.r === 'string' ? JSON.parse(r.r) : r.r;
              await write({ t: name, r: row });
              counts[name]++;
            }
            if (rows.length < page) break;
          }
        }
        const trailer: BackupTrailer = { end: true, rows: counts };
        await write(trailer);
      },
      { isolationLevel: 'repeatable read', accessMode: 'read only' },
    );
    gz.end();
    await done;
    fs.renameSync(tmp, file);
    return { rows: counts, bytes: fs.statSync(file).size };
  } catch (e) {
    gz.destroy();
    out.destroy();
    fs.rmSync(tmp, { force: true });
    throw e;
  }
}

type Line = { header: BackupHeader } | { row: { t: string; r: Record<string, unknown> } } | { trailer: BackupTrailer };

async function* readLines(file: string): AsyncGenerator<Line> {
  if (!fs.existsSync(file)) throw new BackupError(`${file} does not exist.`);
  const input = fs.createReadStream(file).pipe(zlib.createGunzip());
  const lines = readline.createInterface({ input, crlfDelay: Infinity });
  let n = 0;
  let trailer = false;
  try {
    for await (const text of lines) {
      n++;
      if (!text) continue;
      let v: Record<string, unknown>;
      try {
        v = JSON.parse(text) as Record<string, unknown>;
      } catch {
        throw new BackupError(`${file}, line ${n}: not valid JSON; the backup is damaged.`);
      }
      if (trailer) throw new BackupError(`${file}, line ${n}: data after the end marker; the backup is damaged.`);
      if (n === 1) {
        if (v.format !== BACKUP_FORMAT) {
          throw new BackupError(`${file} is not an Edgefield backup (format ${JSON.stringify(v.format ?? null)}, expected ${BACKUP_FORMAT}).`);
        }
        yield { header: v as unknown as BackupHeader };
      } else if (v.end === true) {
        trailer = true;
        yield { trailer: v as unknown as BackupTrailer };
      } else if (typeof v.t === 'string' && v.r && typeof v.r === 'object') {
        yield { row: v as { t: string; r: Record<string, unknown> } };
      } else throw new BackupError(`${file}, line ${n}: not a row of a table; the backup is damaged.`);
    }
  } catch (e) {
    if (e instanceof BackupError) throw e;
    throw new BackupError(`${file} could not be read (${(e as Error).message}); is it a backup made by npm run backup?`);
  }
  if (n === 0) throw new BackupError(`${file} is empty.`);
  if (!trailer) throw new BackupError(`${file} ends before its end marker: the backup is incomplete.`);
}

/** Read the whole file once without loading it: header, row counts, trailer, all consistent. */
export async function checkBackup(file: string): Promise<{ header: BackupHeader; rows: Record<string, number> }> {
  let header: BackupHeader | undefined;
  const counts: Record<string, number> = {};
  let trailer: BackupTrailer | undefined;
  let last = -1;
  for await (const line of readLines(file)) {
    if ('header' in line) {
      header = line.header;
      for (const t of header.tables) counts[t] = 0;
    } else if ('row' in line) {
      const i = header!.tables.indexOf(line.row.t);
      if (i < 0) throw new BackupError(`${file}: rows of table "${line.row.t}", which the header does not list.`);
      if (i < last) throw new BackupError(`${file}: rows of "${line.row.t}" out of order; the backup is damaged.`);
      last = i;
      counts[line.row.t]!++;
    } else trailer = line.trailer;
  }
  for (const t of header!.tables) {
    if (trailer!.rows[t] !== counts[t]) {
      throw new BackupError(`${file}: table "${t}" has ${counts[t]} rows but the end marker says ${trailer!.rows[t]}; the backup is damaged.`);
    }
  }
  return { header: header!, rows: counts };
}

/**
 * Load a backup into `handle` (already migrated), in one transaction. Refuses a target at
 * other migrations or with any row in any table, saying which; on any error nothing is written.
 */
export async function restoreBackup(handle: DbHandle, file: string): Promise<{ rows: Record<string, number> }> {
  const { header, rows } = await checkBackup(file);
  await handle.db.transaction(async (tx) => {
    await q(tx, sql`set local time zone 'UTC'`);
    const have = await appliedMigrations(tx);
    if (have.join() !== header.migrations.join()) {
      throw new BackupError(
        `The backup was made at ${header.migrations.length} migrations, this Edgefield's database is at ${have.length}` +
          `${have.length === header.migrations.length ? ' different ones' : ''}. Restore it with the Edgefield version that made it, then upgrade.`,
        4,
      );
    }
    const { tables, fks } = await readSchema(tx);
    const names = new Set(tables.map((t) => t.name));
    const unknown = header.tables.filter((t) => !names.has(t));
    if (unknown.length) throw new BackupError(`This database has no table ${unknown.join(', ')} that the backup holds.`, 4);
    const nonEmpty: string[] = [];
    for (const t of tables) {
      const [c] = await q(tx, sql`select count(*)::int as n from ${ident(t.name)}`);
      if (Number(c?.n) > 0) nonEmpty.push(`${t.name} (${c!.n} rows)`);
    }
    if (nonEmpty.length) {
      throw new BackupError(
        `The target database is not empty: ${nonEmpty.join(', ')}. Restore only into a new, empty database ` +
          `(a new EDGEFIELD_DATA_DIR, or a new database for DATABASE_URL); nothing was written.`,
        4,
      );
    }
    const { order, deferred } = loadOrder(tables, fks);
    if (order.join() !== header.tables.join()) {
      throw new BackupError(`The backup's tables (${header.tables.join(', ')}) do not match this database's (${order.join(', ')}).`, 4);
    }
    const later = new Map<string, ForeignKey[]>();
    for (const d of deferred) later.set(d.table, [...(later.get(d.table) ?? []), d]);

    // Rows in the file's order (parents first in both orders; the file's was checked above).
    let batch: Record<string, unknown>[] = [];
    let batchTable = '';
    let batchBytes = 0;
    const pendingUpdates: { table: string; rows: Record<string, unknown>[] }[] = [];
    const flush = async () => {
      if (!batch.length) return;
      const t = tables.find((x) => x.name === batchTable)!;
      const defer = (later.get(t.name) ?? []).flatMap((f) => f.columns);
      let insertRows = batch;
      if (defer.length) {
        pendingUpdates.push({ table: t.name, rows: batch.map((r) => Object.fromEntries([...t.primaryKey, ...defer].map((c) => [c, r[c]]))) });
        insertRows = batch.map((r) => Object.fromEntries(Object.entries(r).filter(([c]) => !defer.includes(c))));
      }
      await q(
        tx,
        sql`insert into ${ident(t.name)} select * from jsonb_populate_recordset(null::${ident(t.name)}, ${JSON.stringify(insertRows)}::jsonb)`,
      );
      batch = [];
      batchBytes = 0;
    };
    for await (const line of readLines(file)) {
      if (!('row' in line)) continue;
      if (line.row.t !== batchTable) {
        await flush();
        batchTable = line.row.t;
      }
      batch.push(line.row.r);
      batchBytes += JSON.stringify(line.row.r).length;
      if (batch.length >= 500 || batchBytes > 8 * 1024 * 1024) await flush();
    }
    await flush();
    for (const u of pendingUpdates) {
      const t = tables.find((x) => x.name === u.table)!;
      const defer = (later.get(t.name) ?? []).flatMap((f) => f.columns);
      const set = sql.join(defer.map((c) => sql`${ident(c)} = x.${ident(c)}`), sql`, `);
      const on = sql.join(t.primaryKey.map((c) => sql`${ident(t.name)}.${ident(c)} = x.${ident(c)}`), sql` and `);
      await q(tx, sql`update ${ident(t.name)} set ${set} from jsonb_populate_recordset(null::${ident(t.name)}, ${JSON.stringify(u.rows)}::jsonb) x where ${on}`);
    }
    for (const t of tables) {
      for (const c of t.serial) {
        await q(
          tx,
          sql`select setval(pg_get_serial_sequence(${`"${t.name}"`}, ${c}), coalesce((select max(${ident(c)}) from ${ident(t.name)}), 0) + 1, false)`,
        );
      }
    }
  });
  return { rows };
}

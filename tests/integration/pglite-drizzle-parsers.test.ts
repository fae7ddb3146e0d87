/**
 * db/pglite-parsers.ts withoutDrizzleParsers: drizzle's per-query pass-through parsers are
 * dropped (PGlite would copy its whole parser table for them on every query) because the
 * client already applies the same ones; drizzle reads the same values either way, inside and
 * outside transactions. Common practice, no published source.
 */
import { PGlite, types } from '@electric-sql/pglite';
import { sql } from 'drizzle-orm';
import { drizzle } from 'drizzle-orm/pglite';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DRIZZLE_PASSTHROUGH_TYPES, dropPassthroughParsers, passthroughParser, setPassthroughParsers, withoutDrizzleParsers } from '@/db/pglite-parsers';

const passthrough = Object.fromEntries(DRIZZLE_PASSTHROUGH_TYPES.map((t) => [t, (v: string) => v]));
const clientPassthrough = Object.fromEntries(DRIZZLE_PASSTHROUGH_TYPES.map((t) => [t, passthroughParser]));
let plain: PGlite;
let tuned: PGlite;
const seen: (Record<string, unknown> | undefined)[] = [];

beforeAll(async () => {
  plain = new PGlite('memory://');
  tuned = new PGlite('memory://');
  await Promise.all([plain.waitReady, tuned.waitReady]);
  setPassthroughParsers(tuned);
  // record what reaches the client (also inside transactions)
  const orig = tuned.query.bind(tuned);
  tuned.query = ((q: string, p?: unknown[], o?: Record<string, unknown>) => {
    seen.push(o);
    return orig(q, p, o as never);
  }) as typeof tuned.query;
  const origTx = tuned.transaction.bind(tuned);
  tuned.transaction = ((fn: (tx: unknown) => Promise<unknown>) =>
    origTx((tx) => {
      const q = tx.query.bind(tx);
      tx.query = ((qs: string, p?: unknown[], o?: Record<string, unknown>) => {
        seen.push(o);
        return q(qs, p, o as never);
      }) as typeof tx.query;
      return fn(tx);
    })) as typeof tuned.transaction;
});
afterAll(async () => {
  await Promise.all([plain.close(), tuned.close()]);
});

const Q = sql`select now()::timestamp as ts, '2026-12-02 10:00:00+00'::timestamptz as tz, '3 days'::interval as iv, '2026-12-02'::date as d,
  array['1.5'::numeric] as nums, array['2026-12-02'::date] as ds, 42::int as n, '{"a":1}'::jsonb as j, array[1,2]::int[] as ints`;

describe('withoutDrizzleParsers', () => {
  it('reads the same values as drizzle on a plain client, inside and outside a transaction, with no parsers sent per query', async () => {
    const a = drizzle({ client: plain });
    const b = drizzle({ client: withoutDrizzleParsers(tuned) });
    const ra = (await a.execute(Q)).rows[0] as Record<string, unknown>;
    const rb = (await b.execute(Q)).rows[0] as Record<string, unknown>;
    delete ra.ts;
    delete rb.ts;
    expect(rb).toEqual(ra);
    expect(rb.iv).toBe('3 days');
    expect(rb.ints).toEqual([1, 2]);
    const inTx = await b.transaction(async (tx) => (await tx.execute(Q)).rows[0] as Record<string, unknown>);
    delete inTx.ts;
    expect(inTx).toEqual(ra);
    expect(seen.length).toBeGreaterThanOrEqual(2);
    for (const o of seen) expect(o?.parsers).toBeUndefined();
  });

  it('keeps parsers that are not exactly drizzle’s pass-through set, or when the client parses one of those types itself', () => {
    const own = { rowMode: 'array', parsers: { [types.BYTEA]: (v: string) => v } };
    expect(dropPassthroughParsers(own, clientPassthrough)).toBe(own);
    const more = { parsers: { ...passthrough, [types.INT4]: (v: string) => v } };
    expect(dropPassthroughParsers(more, clientPassthrough)).toBe(more);
    const drizzles = { rowMode: 'array', parsers: { ...passthrough } };
    expect(dropPassthroughParsers(drizzles, clientPassthrough)).toEqual({ rowMode: 'array' });
    expect(dropPassthroughParsers(drizzles, { ...clientPassthrough, 1182: (v: string) => v.split(',') })).toBe(drizzles);
    expect(dropPassthroughParsers(undefined, clientPassthrough)).toBeUndefined();
  });
});

/**
 * db/pglite-parsers.ts: the fast bytea parser gives exactly the bytes PGlite's own parser gives
 * (and the bytes stored), in a real in-memory PGlite, for empty, small and field-blob-sized
 * values; values in escape format still go through PGlite's parser; a malformed hex value is
 * refused instead of being cut short. Common practice, no published source.
 */
import { randomBytes } from 'node:crypto';
import { PGlite, types } from '@electric-sql/pglite';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { byteaHexParser } from '@/db/pglite-parsers';

const defaultParser = types.parsers[types.BYTEA]!;
const parse = byteaHexParser(defaultParser);

let pg: PGlite;
beforeAll(async () => {
  pg = new PGlite('memory://', { parsers: { [types.BYTEA]: parse } });
  await pg.waitReady;
  await pg.exec('create table blobs (id int primary key, data bytea not null)');
});
afterAll(async () => {
  await pg.close();
});

describe('bytea hex parser', () => {
  it.each([0, 1, 2, 255, 4096, 110_000])('round-trips %i random bytes through PGlite', async (n) => {
    const bytes = new Uint8Array(randomBytes(n));
    await pg.query('insert into blobs (id, data) values ($1, $2)', [n, bytes]);
    const { rows } = await pg.query<{ data: Uint8Array }>('select data from blobs where id = $1', [n]);
    const got = rows[0]!.data;
    expect(got).toBeInstanceOf(Uint8Array);
    expect(got.byteLength).toBe(n);
    expect(Buffer.from(got).equals(Buffer.from(bytes))).toBe(true);
    // the same value as PGlite's own parser makes of the text the database sent
    const { rows: text } = await pg.query<{ t: string }>('select data::text as t from blobs where id = $1', [n]);
    expect(Buffer.from(parse(text[0]!.t)).equals(Buffer.from(defaultParser(text[0]!.t) as Uint8Array))).toBe(true);
  });

  it('passes escape-format values to the fallback parser', async () => {
    const calls: string[] = [];
    const p = byteaHexParser((v) => {
      calls.push(v);
      return defaultParser(v);
    });
    expect(Array.from(p('abc'))).toEqual(Array.from(defaultParser('abc') as Uint8Array));
    expect(calls).toEqual(['abc']);
  });

  it('refuses malformed hex instead of returning a shorter value', () => {
    expect(() => parse('\\x0g')).toThrow(/malformed/);
    expect(() => parse('\\x0a1')).toThrow(/malformed/);
    expect(Array.from(parse('\\x'))).toEqual([]);
  });
});

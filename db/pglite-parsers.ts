/**
 * Result parsers that replace PGlite's own for the embedded database (db/client.ts).
 *
 * bytea: PGlite receives bytea as hex text ("\x0a1b…") and its default parser turns it into
 * bytes one `parseInt(substring)` at a time, about 0.3–1 µs per byte on this project's machine:
 * reading one stored field blob (~110 KB) held the server's only thread for 40–110 ms, and
 * under the load bench (50 viewers opening saved solves) those reads starved every other
 * request into multi-second latencies and timeouts. Node's hex decoder does the same in well
 * under a millisecond. Values in another form (bytea_output = escape) go to `fallback`
 * (PGlite's own parser). No import of PGlite here: db/client.ts loads it lazily.
 */

/** A bytea parser for PostgreSQL's hex output format ("\x…"), other forms to `fallback`. */
export function byteaHexParser(fallback: (value: string, typeId?: number) => unknown): (value: string, typeId?: number) => Uint8Array {
  return (value, typeId) => {
    if (value.length >= 2 && value.charCodeAt(0) === 0x5c /* \ */ && value.charCodeAt(1) === 0x78 /* x */) {
      // Buffer.from stops silently at the first bad digit pair: a short result means a malformed
      // value (the database never sends one, but say so if it does rather than cut it short).
      const buf = Buffer.from(value.slice(2), 'hex');
      if (value.length % 2 !== 0 || buf.byteLength !== (value.length - 2) / 2) throw new Error('bytea: the database sent a malformed hex value');
      return new Uint8Array(buf.buffer, buf.byteOffset, buf.byteLength);
    }
    return fallback(value, typeId) as Uint8Array;
  };
}

/**
 * The types drizzle-orm's PGlite driver (0.45) reads as text through a parser override sent
 * with every query: timestamp, timestamptz, interval, date and the arrays numeric[],
 * timestamp[], timestamptz[], interval[], date[]. db/client.ts sets the same pass-through
 * parser on the client once (setPassthroughParsers), so the per-query override can be dropped.
 */
export const DRIZZLE_PASSTHROUGH_TYPES: readonly number[] = [1114, 1184, 1186, 1082, 1231, 1115, 1185, 1187, 1182];
const PASSTHROUGH_KEY = [...DRIZZLE_PASSTHROUGH_TYPES].sort((a, b) => a - b).join(',');

/** The one pass-through parser set on the client (compared by identity before dropping drizzle's). */
export const passthroughParser = (value: string): string => value;

type Parsers = Record<number, unknown>;
interface QueryOptions {
  parsers?: Parsers;
  [k: string]: unknown;
}
interface Queryable {
  query(sql: string, params?: unknown[], options?: QueryOptions): Promise<unknown>;
}
interface TransactionCapable extends Queryable {
  parsers: Parsers;
  transaction<T>(fn: (tx: Queryable) => Promise<T>): Promise<T>;
}

/**
 * Set the pass-through parser for drizzle's types on a ready PGlite client. After
 * `waitReady`: PGlite sets its own parsers for every array type while it starts, over those
 * given to its constructor.
 */
export function setPassthroughParsers(client: { parsers: Parsers }): void {
  for (const t of DRIZZLE_PASSTHROUGH_TYPES) client.parsers[t] = passthroughParser;
}

/**
 * Options without drizzle's pass-through parsers when that is all they override and the
 * client applies the same pass-through for each of those types itself; else unchanged.
 */
export function dropPassthroughParsers<O extends QueryOptions | undefined>(options: O, clientParsers: Parsers): O {
  if (!options || !options.parsers) return options;
  const keys = Object.keys(options.parsers);
  if (keys.length !== DRIZZLE_PASSTHROUGH_TYPES.length || keys.map(Number).sort((a, b) => a - b).join(',') !== PASSTHROUGH_KEY) return options;
  for (const t of DRIZZLE_PASSTHROUGH_TYPES) if (clientParsers[t] !== passthroughParser) return options;
  const { parsers: _dropped, ...rest } = options;
  return rest as O;
}

function wrapQueryable<T extends Queryable>(target: T, clientParsers: () => Parsers, wrapTx: boolean): T {
  return new Proxy(target, {
    get(t, prop) {
      if (prop === 'query') {
        return async (sql: string, params?: unknown[], options?: QueryOptions) => {
          // PGlite runs each query synchronously inside a promise chain, so without a pause a
          // request's whole database work (and that of every request woken with it) runs in one
          // turn of the event loop, and Node accepts one new connection per turn: under the load
          // bench, 50 connections opened together waited up to ~12 s to be accepted. One
          // setImmediate before each query lets the loop poll (accept, read) between queries.
          await new Promise<void>((resolve) => setImmediate(resolve));
          return t.query(sql, params, dropPassthroughParsers(options, clientParsers()));
        };
      }
      if (wrapTx && prop === 'transaction') {
        return <R>(fn: (tx: Queryable) => Promise<R>) =>
          (t as unknown as TransactionCapable).transaction((tx) => fn(wrapQueryable(tx, clientParsers, false)));
      }
      const v = Reflect.get(t, prop, t) as unknown;
      return typeof v === 'function' ? (v as (...a: unknown[]) => unknown).bind(t) : v;
    },
  });
}

/**
 * The PGlite client as drizzle sees it: `query` (also inside transactions) without drizzle's
 * per-query pass-through parsers whenever the client already applies them (see
 * setPassthroughParsers). Everything else goes to the client unchanged.
 */
export function withoutDrizzleParsers<T extends object>(client: T): T {
  const c = client as unknown as TransactionCapable;
  return wrapQueryable(c, () => c.parsers, true) as unknown as T;
}

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

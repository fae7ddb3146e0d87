/**
 * The binary field blob "EFLD" v1: the mesh and the potential fields of a solve, compressed
 * with DEFLATE (fflate), behind a small uncompressed header that lets a reader check sizes
 * before it inflates anything and a CRC-32 that catches corruption.
 *
 * Header, 32 bytes, little-endian:
 *   0  "EFLD"            magic
 *   4  u16 version       (1)
 *   6  u16 flags         bit 0: a net-names segment follows nodeNet
 *   8  u32 nx            nodes along x
 *  12  u32 ny            nodes along y
 *  16  u32 fields        potential fields (one per signal net)
 *  20  u32 payloadBytes  length of the inflated payload
 *  24  u32 crc32         CRC-32 (IEEE 802.3) of the inflated payload
 *  28  u32 deflatedBytes length of the compressed payload that follows the header
 * Payload (inflated): xs f64[nx], ys f64[ny], potentials f64[fields][nx*ny],
 *   cellEpsR f32[(nx−1)*(ny−1)], nodeNet i16[nx*ny], then with flag bit 0: u32 n and n bytes
 *   of UTF-8 JSON, the list of net names that nodeNet indexes (at most 64 KiB).
 * Pure TypeScript (no DOM, no Node APIs): used by the browser, the route handler and tests.
 */
import { deflateSync, inflateSync } from 'fflate';

export const FIELD_BLOB_MAGIC = 'EFLD';
export const FIELD_BLOB_VERSION = 1;
export const FIELD_BLOB_HEADER_BYTES = 32;
/** Largest inflated payload accepted, bytes. */
export const FIELD_BLOB_MAX_PAYLOAD = 160 * 1024 * 1024;
/** Largest net-names segment, bytes. */
export const FIELD_BLOB_MAX_NAMES = 64 * 1024;
const FLAG_NAMES = 1;

export interface FieldData {
  xs: Float64Array;
  ys: Float64Array;
  potentials: Float64Array[];
  cellEpsR: Float32Array;
  /** Conductor net index per node (into netNames), −1 free, −2 on a ground-boundary plane. */
  nodeNet: Int16Array;
  /** Net name of each nodeNet index, when known. */
  netNames?: string[];
}

export type FieldBlobErrorCode =
  | 'too_short'
  | 'bad_magic'
  | 'bad_version'
  | 'bad_size'
  | 'too_large'
  | 'mismatch'
  | 'corrupt'
  | 'checksum'
  | 'bad_values';

export class FieldBlobError extends Error {
  constructor(
    readonly code: FieldBlobErrorCode,
    message: string,
  ) {
    super(message);
    this.name = 'FieldBlobError';
  }
}

export interface FieldBlobHeader {
  version: number;
  flags: number;
  nx: number;
  ny: number;
  fields: number;
  payloadBytes: number;
  crc32: number;
  deflatedBytes: number;
}

let crcTable: Uint32Array | null = null;
/** CRC-32 (IEEE 802.3, reflected, polynomial 0xEDB88320). */
export function crc32(bytes: Uint8Array): number {
  if (!crcTable) {
    crcTable = new Uint32Array(256);
    for (let n = 0; n < 256; n++) {
      let c = n;
      for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
      crcTable[n] = c >>> 0;
    }
  }
  let c = 0xffffffff;
  for (let q = 0; q < bytes.length; q++) c = crcTable[(c ^ bytes[q]!) & 0xff]! ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

/** Inflated payload length for the given sizes. */
export function payloadBytesFor(nx: number, ny: number, fields: number): number {
  return 8 * (nx + ny + fields * nx * ny) + 4 * (nx - 1) * (ny - 1) + 2 * nx * ny;
}

/** Pack and compress. Throws RangeError on inconsistent arrays. */
export function encodeFieldBlob(f: FieldData, level: 0 | 1 | 2 | 3 | 4 | 5 | 6 | 7 | 8 | 9 = 6): Uint8Array {
  const nx = f.xs.length;
  const ny = f.ys.length;
  const nodes = nx * ny;
  if (nx < 2 || ny < 2) throw new RangeError('a field needs at least 2 nodes along each axis');
  if (f.potentials.length < 1) throw new RangeError('a field blob needs at least one potential field');
  for (const p of f.potentials) if (p.length !== nodes) throw new RangeError(`a potential has ${p.length} values, the mesh ${nodes} nodes`);
  if (f.cellEpsR.length !== (nx - 1) * (ny - 1)) throw new RangeError('cellEpsR does not match the mesh');
  if (f.nodeNet.length !== nodes) throw new RangeError('nodeNet does not match the mesh');
  const names = f.netNames ? new TextEncoder().encode(JSON.stringify(f.netNames)) : null;
  if (names && names.length > FIELD_BLOB_MAX_NAMES) throw new RangeError('net names are too long for a field blob');
  const payloadBytes = payloadBytesFor(nx, ny, f.potentials.length) + (names ? 4 + names.length : 0);
  const payload = new Uint8Array(payloadBytes);
  let o = 0;
  const put = (a: ArrayBufferView) => {
    payload.set(new Uint8Array(a.buffer, a.byteOffset, a.byteLength), o);
    o += a.byteLength;
  };
  // typed arrays are little-endian on every platform we run on; checked below
  if (!littleEndian()) throw new Error('big-endian platforms are not supported');
  put(f.xs);
  put(f.ys);
  for (const p of f.potentials) put(p);
  put(f.cellEpsR);
  put(f.nodeNet);
  if (names) {
    new DataView(payload.buffer).setUint32(o, names.length, true);
    payload.set(names, o + 4);
    o += 4 + names.length;
  }
  const deflated = deflateSync(payload, { level });
  const out = new Uint8Array(FIELD_BLOB_HEADER_BYTES + deflated.length);
  const dv = new DataView(out.buffer);
  for (let q = 0; q < 4; q++) out[q] = FIELD_BLOB_MAGIC.charCodeAt(q);
  dv.setUint16(4, FIELD_BLOB_VERSION, true);
  dv.setUint16(6, names ? FLAG_NAMES : 0, true);
  dv.setUint32(8, nx, true);
  dv.setUint32(12, ny, true);
  dv.setUint32(16, f.potentials.length, true);
  dv.setUint32(20, payloadBytes, true);
  dv.setUint32(24, crc32(payload), true);
  dv.setUint32(28, deflated.length, true);
  out.set(deflated, FIELD_BLOB_HEADER_BYTES);
  return out;
}

/** Read and check the header only (cheap; no inflating). */
export function readFieldBlobHeader(blob: Uint8Array): FieldBlobHeader {
  if (blob.length < FIELD_BLOB_HEADER_BYTES) {
    throw new FieldBlobError('too_short', `field data is ${blob.length} bytes, shorter than its ${FIELD_BLOB_HEADER_BYTES}-byte header`);
  }
  for (let q = 0; q < 4; q++) {
    if (blob[q] !== FIELD_BLOB_MAGIC.charCodeAt(q)) throw new FieldBlobError('bad_magic', 'not Edgefield field data (the header does not start with "EFLD")');
  }
  const dv = new DataView(blob.buffer, blob.byteOffset, blob.byteLength);
  const version = dv.getUint16(4, true);
  if (version !== FIELD_BLOB_VERSION) throw new FieldBlobError('bad_version', `field data version ${version} is not supported (expected ${FIELD_BLOB_VERSION})`);
  const h: FieldBlobHeader = {
    version,
    flags: dv.getUint16(6, true),
    nx: dv.getUint32(8, true),
    ny: dv.getUint32(12, true),
    fields: dv.getUint32(16, true),
    payloadBytes: dv.getUint32(20, true),
    crc32: dv.getUint32(24, true),
    deflatedBytes: dv.getUint32(28, true),
  };
  if (h.nx < 2 || h.ny < 2 || h.fields < 1) throw new FieldBlobError('bad_size', `field data has impossible sizes (nx ${h.nx}, ny ${h.ny}, fields ${h.fields})`);
  const expected = payloadBytesFor(h.nx, h.ny, h.fields);
  if (expected > FIELD_BLOB_MAX_PAYLOAD) {
    throw new FieldBlobError('too_large', `field data would inflate to ${expected} bytes, more than the limit of ${FIELD_BLOB_MAX_PAYLOAD}`);
  }
  if (h.flags & ~FLAG_NAMES) throw new FieldBlobError('bad_version', `field data uses flags ${h.flags} that this version does not know`);
  const withNames = (h.flags & FLAG_NAMES) !== 0;
  if (withNames ? h.payloadBytes < expected + 4 || h.payloadBytes > expected + 4 + FIELD_BLOB_MAX_NAMES : h.payloadBytes !== expected) {
    throw new FieldBlobError('bad_size', `field data header says ${h.payloadBytes} payload bytes, but ${h.nx}×${h.ny} nodes and ${h.fields} fields need ${expected}`);
  }
  if (h.deflatedBytes !== blob.length - FIELD_BLOB_HEADER_BYTES) {
    throw new FieldBlobError('bad_size', `field data header says ${h.deflatedBytes} compressed bytes, but ${blob.length - FIELD_BLOB_HEADER_BYTES} follow it`);
  }
  return h;
}

export interface DecodeExpectation {
  nx?: number;
  ny?: number;
  fields?: number;
}

/**
 * Check and unpack. Throws FieldBlobError (never anything else for bad input) when the header,
 * sizes, expectation, compressed stream, checksum or values are wrong.
 */
export function decodeFieldBlob(blob: Uint8Array, expect: DecodeExpectation = {}): FieldData {
  const h = readFieldBlobHeader(blob);
  if (
    (expect.nx !== undefined && expect.nx !== h.nx) ||
    (expect.ny !== undefined && expect.ny !== h.ny) ||
    (expect.fields !== undefined && expect.fields !== h.fields)
  ) {
    throw new FieldBlobError(
      'mismatch',
      `field data is for a ${h.nx}×${h.ny} mesh with ${h.fields} field(s), but the solve has a ${expect.nx ?? '?'}×${expect.ny ?? '?'} mesh with ${expect.fields ?? '?'} signal net(s)`,
    );
  }
  // one spare byte: an inflated stream longer than announced fills it and is refused
  const out = new Uint8Array(h.payloadBytes + 1);
  let payload: Uint8Array;
  try {
    payload = inflateSync(blob.subarray(FIELD_BLOB_HEADER_BYTES), { out });
  } catch {
    throw new FieldBlobError('corrupt', 'field data is corrupted (the compressed stream cannot be read)');
  }
  if (payload.length !== h.payloadBytes) {
    throw new FieldBlobError('corrupt', `field data inflates to ${payload.length} bytes, not the ${h.payloadBytes} its header announces`);
  }
  if (crc32(payload) !== h.crc32) throw new FieldBlobError('checksum', 'field data is corrupted (checksum mismatch)');
  const buf = payload.buffer.slice(payload.byteOffset, payload.byteOffset + payload.length);
  const nodes = h.nx * h.ny;
  let o = 0;
  const f64 = (n: number) => {
    const a = new Float64Array(buf, o, n);
    o += 8 * n;
    return a;
  };
  const xs = f64(h.nx);
  const ys = f64(h.ny);
  const potentials: Float64Array[] = [];
  for (let k = 0; k < h.fields; k++) potentials.push(f64(nodes));
  const cellEpsR = new Float32Array(buf, o, (h.nx - 1) * (h.ny - 1));
  o += 4 * cellEpsR.length;
  const nodeNet = new Int16Array(buf, o, nodes);
  o += 2 * nodes;
  let netNames: string[] | undefined;
  if (h.flags & FLAG_NAMES) {
    const n = new DataView(buf).getUint32(o, true);
    if (o + 4 + n !== h.payloadBytes) throw new FieldBlobError('bad_size', 'field data has a net-names segment of the wrong length');
    let parsed: unknown;
    try {
      parsed = JSON.parse(new TextDecoder('utf-8', { fatal: true }).decode(new Uint8Array(buf, o + 4, n)));
    } catch {
      throw new FieldBlobError('bad_values', 'field data has unreadable net names');
    }
    if (!Array.isArray(parsed) || parsed.length > 64 || !parsed.every((x) => typeof x === 'string' && x.length <= 200)) {
      throw new FieldBlobError('bad_values', 'field data has invalid net names');
    }
    netNames = parsed as string[];
  }
  for (let q = 0; q < nodes; q++) {
    const v = nodeNet[q]!;
    if (v < -2 || (netNames ? v >= netNames.length : v >= 64)) throw new FieldBlobError('bad_values', `field data has a conductor index ${v} that names no net`);
  }
  for (let i = 0; i < h.nx; i++) {
    if (!Number.isFinite(xs[i]!) || (i > 0 && !(xs[i]! > xs[i - 1]!))) throw new FieldBlobError('bad_values', 'field data has mesh x coordinates that are not finite and increasing');
  }
  for (let j = 0; j < h.ny; j++) {
    if (!Number.isFinite(ys[j]!) || (j > 0 && !(ys[j]! > ys[j - 1]!))) throw new FieldBlobError('bad_values', 'field data has mesh y coordinates that are not finite and increasing');
  }
  for (const p of potentials) {
    for (let q = 0; q < nodes; q++) if (!Number.isFinite(p[q]!)) throw new FieldBlobError('bad_values', 'field data holds a potential that is not a finite number');
  }
  return netNames ? { xs, ys, potentials, cellEpsR, nodeNet, netNames } : { xs, ys, potentials, cellEpsR, nodeNet };
}

function littleEndian(): boolean {
  return new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;
}

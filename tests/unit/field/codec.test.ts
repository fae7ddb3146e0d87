import { describe, expect, it } from 'vitest';
import { deflateSync } from 'fflate';
import {
  crc32,
  decodeFieldBlob,
  encodeFieldBlob,
  FIELD_BLOB_HEADER_BYTES,
  FieldBlobError,
  type FieldData,
} from '@/lib/field/codec';

function sample(nx = 13, ny = 9, fields = 2): FieldData {
  const xs = new Float64Array(nx).map((_, i) => i * 1e-4 + (i * i) * 1e-6);
  const ys = new Float64Array(ny).map((_, j) => -2e-4 + j * 5e-5);
  const potentials = Array.from({ length: fields }, (_, k) => new Float64Array(nx * ny).map((_, q) => Math.sin(q * 0.37 + k) * 0.5 + 0.5));
  const cellEpsR = new Float32Array((nx - 1) * (ny - 1)).map((_, q) => (q % 3 === 0 ? 4.4 : 1));
  const nodeNet = new Int16Array(nx * ny).map((_, q) => (q % 7 === 0 ? 1 : -1));
  return { xs, ys, potentials, cellEpsR, nodeNet };
}

function codeOf(f: () => unknown): string {
  try {
    f();
  } catch (e) {
    if (e instanceof FieldBlobError) return e.code;
    throw e;
  }
  return 'none';
}

describe('field blob codec', () => {
  // Check value of the CRC-32 (IEEE) of "123456789" is 0xCBF43926 (Williams 1993,
  // "A Painless Guide to CRC Error Detection Algorithms", catalogue check value).
  it('computes the standard CRC-32', () => {
    expect(crc32(new TextEncoder().encode('123456789'))).toBe(0xcbf43926);
  });

  it('round-trips every array bit for bit', () => {
    const f = sample();
    const blob = encodeFieldBlob(f);
    const g = decodeFieldBlob(blob, { nx: 13, ny: 9, fields: 2 });
    expect(Array.from(g.xs)).toEqual(Array.from(f.xs));
    expect(Array.from(g.ys)).toEqual(Array.from(f.ys));
    expect(g.potentials).toHaveLength(2);
    expect(Array.from(g.potentials[1]!)).toEqual(Array.from(f.potentials[1]!));
    expect(Array.from(g.cellEpsR)).toEqual(Array.from(f.cellEpsR));
    expect(Array.from(g.nodeNet)).toEqual(Array.from(f.nodeNet));
  });

  it('round-trips the net names that nodeNet indexes', () => {
    const f = { ...sample(6, 5, 1), netNames: ['trace', 'gnd', 'Ω-net'] };
    f.nodeNet[3] = 2;
    f.nodeNet[4] = -2;
    const g = decodeFieldBlob(encodeFieldBlob(f), { nx: 6, ny: 5, fields: 1 });
    expect(g.netNames).toEqual(['trace', 'gnd', 'Ω-net']);
    expect(g.nodeNet[3]).toBe(2);
    expect(g.nodeNet[4]).toBe(-2);
    const bad = { ...sample(6, 5, 1), netNames: ['a'] };
    bad.nodeNet[0] = 1; // names no net
    expect(codeOf(() => decodeFieldBlob(encodeFieldBlob(bad)))).toBe('bad_values');
  });

  it('refuses a flipped bit in the compressed data', () => {
    const blob = encodeFieldBlob(sample());
    let refused = 0;
    for (const at of [FIELD_BLOB_HEADER_BYTES + 5, Math.floor(blob.length / 2), blob.length - 3]) {
      const bad = blob.slice();
      bad[at]! ^= 0x10;
      const code = codeOf(() => decodeFieldBlob(bad));
      expect(['corrupt', 'checksum']).toContain(code);
      refused++;
    }
    expect(refused).toBe(3);
  });

  it('refuses a wrong magic, version, truncated data and a wrong checksum', () => {
    const blob = encodeFieldBlob(sample());
    const m = blob.slice();
    m[0] = 0x58;
    expect(codeOf(() => decodeFieldBlob(m))).toBe('bad_magic');
    const v = blob.slice();
    new DataView(v.buffer).setUint16(4, 9, true);
    expect(codeOf(() => decodeFieldBlob(v))).toBe('bad_version');
    expect(codeOf(() => decodeFieldBlob(blob.subarray(0, 10)))).toBe('too_short');
    expect(codeOf(() => decodeFieldBlob(blob.subarray(0, blob.length - 4)))).toBe('bad_size');
    const c = blob.slice();
    new DataView(c.buffer).setUint32(24, 12345, true);
    expect(codeOf(() => decodeFieldBlob(c))).toBe('checksum');
  });

  it('refuses data that does not match the solve it is stored with', () => {
    const blob = encodeFieldBlob(sample(13, 9, 2));
    expect(codeOf(() => decodeFieldBlob(blob, { nx: 14, ny: 9, fields: 2 }))).toBe('mismatch');
    expect(codeOf(() => decodeFieldBlob(blob, { nx: 13, ny: 9, fields: 1 }))).toBe('mismatch');
  });

  it('refuses headers announcing a huge payload before inflating anything', () => {
    const blob = encodeFieldBlob(sample());
    const h = blob.slice();
    const dv = new DataView(h.buffer);
    dv.setUint32(8, 60000, true);
    dv.setUint32(12, 60000, true);
    expect(codeOf(() => decodeFieldBlob(h))).toBe('too_large');
  });

  it('refuses a stream that inflates to more than its header announces', () => {
    const f = sample(4, 3, 1);
    const good = encodeFieldBlob(f);
    const header = good.subarray(0, FIELD_BLOB_HEADER_BYTES).slice();
    const big = deflateSync(new Uint8Array(100_000));
    const bomb = new Uint8Array(FIELD_BLOB_HEADER_BYTES + big.length);
    bomb.set(header);
    bomb.set(big, FIELD_BLOB_HEADER_BYTES);
    new DataView(bomb.buffer).setUint32(28, big.length, true);
    expect(codeOf(() => decodeFieldBlob(bomb))).toBe('corrupt');
  });

  it('refuses non-finite potentials and a non-increasing mesh even with a valid checksum', () => {
    const f = sample(5, 4, 1);
    f.potentials[0]![3] = Number.NaN;
    expect(codeOf(() => decodeFieldBlob(encodeFieldBlob(f)))).toBe('bad_values');
    const g = sample(5, 4, 1);
    g.xs[2] = g.xs[1]!;
    expect(codeOf(() => decodeFieldBlob(encodeFieldBlob(g)))).toBe('bad_values');
  });
});

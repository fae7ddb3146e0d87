/** The one JSON error shape and the body readers (lib/server/http.ts). */
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { ApiError, apiHandler, parseJsonBody, parseSearchParams, readBodyBytes, readParams } from '@/lib/server/http';

const schema = z.strictObject({ name: z.string().min(1), items: z.array(z.object({ w: z.number().positive() })).optional() });

function req(body: BodyInit | null, headers: Record<string, string> = {}) {
  return new Request('http://localhost/x', { method: 'POST', body, headers: { 'content-type': 'application/json', ...headers } });
}

describe('apiHandler', () => {
  it('turns ApiError into the JSON error shape with its status', async () => {
    const h = apiHandler(async () => {
      throw new ApiError(403, 'forbidden', 'No.', 'name');
    });
    const res = await h(new Request('http://localhost/'), {});
    expect(res.status).toBe(403);
    expect(await res.json()).toEqual({ error: { code: 'forbidden', message: 'No.', field: 'name' } });
  });

  it('answers 500 without leaking the internal message', async () => {
    const h = apiHandler(async () => {
      throw new Error('relation "secret_table" does not exist at /srv/app/db.ts:12');
    });
    const orig = console.error;
    console.error = () => {};
    const res = await h(new Request('http://localhost/'), {});
    console.error = orig;
    expect(res.status).toBe(500);
    const text = await res.text();
    expect(text).not.toContain('secret_table');
    expect(JSON.parse(text).error.code).toBe('internal');
  });

  it('turns a thrown ZodError into 422 with the field path', async () => {
    const h = apiHandler(async () => {
      schema.parse({ name: 'a', items: [{ w: -1 }] });
      return new Response('unreachable');
    });
    const res = await h(new Request('http://localhost/'), {});
    expect(res.status).toBe(422);
    expect((await res.json()).error.field).toBe('items.0.w');
  });
});

describe('parseJsonBody', () => {
  it('returns the parsed data', async () => {
    expect(await parseJsonBody(req('{"name":"a"}'), schema)).toEqual({ name: 'a' });
  });
  it('400 on malformed JSON', async () => {
    await expect(parseJsonBody(req('{"name":'), schema)).rejects.toMatchObject({ status: 400, code: 'bad_json' });
  });
  it('422 naming the field', async () => {
    await expect(parseJsonBody(req('{"name":"a","items":[{"w":0}]}'), schema)).rejects.toMatchObject({
      status: 422,
      field: 'items.0.w',
    });
    await expect(parseJsonBody(req('{"name":"a","extra":1}'), schema)).rejects.toMatchObject({ status: 422 });
  });
  it('422 for NUL characters in strings or keys', async () => {
    await expect(parseJsonBody(req(JSON.stringify({ name: 'a\u0000' })), schema)).rejects.toMatchObject({ status: 422, field: 'name' });
    await expect(parseJsonBody(req(JSON.stringify({ name: 'a', items: [{ ['k\u0000']: 1 }] })), schema)).rejects.toMatchObject({
      status: 422,
      field: 'items.0.k\u0000',
    });
  });
  it('413 from the declared length, before reading', async () => {
    await expect(parseJsonBody(req('{}', { 'content-length': '5000' }), schema, { maxBytes: 100 })).rejects.toMatchObject({ status: 413 });
  });
  it('413 while streaming a body without a declared length', async () => {
    let pulled = 0;
    const stream = new ReadableStream<Uint8Array>({
      pull(c) {
        pulled++;
        if (pulled > 1000) c.close();
        else c.enqueue(new Uint8Array(1024).fill(32));
      },
    });
    const r = new Request('http://localhost/x', { method: 'POST', body: stream, duplex: 'half' } as RequestInit);
    await expect(readBodyBytes(r, 10 * 1024)).rejects.toMatchObject({ status: 413, code: 'too_large' });
    expect(pulled).toBeLessThan(20); // stopped early, did not read the whole megabyte
  });
});

describe('parseSearchParams and readParams', () => {
  const q = z.object({ sort: z.enum(['name', 'updated']).default('updated') });
  it('validates the query', () => {
    expect(parseSearchParams(new Request('http://l/x?sort=name'), q)).toEqual({ sort: 'name' });
    expect(() => parseSearchParams(new Request('http://l/x?sort=size'), q)).toThrow(ApiError);
    expect(() => parseSearchParams(new Request('http://l/x?sort=%00'), q)).toThrow(/NUL/);
  });
  it('404 for ids that cannot be ours', async () => {
    await expect(readParams({ params: Promise.resolve({ id: 'a1b2-c3' }) })).resolves.toEqual({ id: 'a1b2-c3' });
    await expect(readParams({ params: Promise.resolve({ id: "1' or '1'='1" }) })).rejects.toMatchObject({ status: 404 });
    await expect(readParams({ params: Promise.resolve({ id: 'x'.repeat(65) }) })).rejects.toMatchObject({ status: 404 });
  });
});

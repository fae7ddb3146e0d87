/**
 * The demo's stored solves (lib/demo/seed-solves.ts): real solves of demo sections, stored
 * with the same settings hash the browser computes (so a re-solve in the app is recognised as
 * the same solve) and a field blob that the field route's own checks accept.
 */
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
vi.mock('server-only', () => ({}));

import { eq } from 'drizzle-orm';
import { setDbForTesting, type DbHandle } from '@/db/client';
import { comments, solves } from '@/db/schema';
import { seedDemo } from '@/lib/demo/seed';
import { seedDemoSolves } from '@/lib/demo/seed-solves';
import { settingsHash } from '@/lib/client/settings-hash';
import { decodeFieldBlob } from '@/lib/field/codec';
import type { SectionResult } from '@/lib/engine/types';
import { createTestDb } from './helpers/db';

let handle: DbHandle;
beforeAll(async () => {
  handle = await createTestDb();
  setDbForTesting(handle);
  await seedDemo(handle.db);
});
afterAll(async () => {
  setDbForTesting(undefined);
  await handle?.close();
});

describe('demo solves', () => {
  it('stores solved demo sections with fields and comments, once', async () => {
    const n = await seedDemoSolves(handle.db);
    expect(n).toBe(3);
    const rows = await handle.db.select().from(solves);
    expect(rows).toHaveLength(3);
    const hash = await settingsHash({ preset: 'standard', tolerance: 1e-10 });
    for (const r of rows) {
      expect(r.status).toBe('done');
      expect(r.settingsHash).toBe(hash);
      const result = r.result as SectionResult;
      expect(result.format).toBe('edgefield.result/1');
      // A capacitance per unit length is positive (common practice, no published source).
      expect(result.capacitance.maxwell[0]![0]!).toBeGreaterThan(0);
      const f = decodeFieldBlob(r.field!, { nx: result.mesh.nx, ny: result.mesh.ny, fields: result.nets.length });
      expect(f.xs.length).toBe(result.mesh.nx);
      expect(r.fieldBytes).toBe(r.field!.byteLength);
    }
    const thread = await handle.db.select().from(comments);
    expect(thread.length).toBeGreaterThanOrEqual(2);
    expect(await seedDemoSolves(handle.db)).toBe(0);
    expect(await handle.db.select().from(solves).where(eq(solves.status, 'done'))).toHaveLength(3);
  }, 600_000);
});

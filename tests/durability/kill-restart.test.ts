/**
 * Kill-and-restart (issue 8, durability): the production server (`next start` of the build in
 * NEXT_DIST_DIR, default .next-e2e) on one embedded data folder, ROUNDS times in a row:
 *   1. concurrent writes through the API (revisions, sections, solves with results, field
 *      blobs, comments), signed in through next-auth's credentials flow;
 *   2. SIGKILL at a random moment in the middle of them;
 *   3. restart on the same folder: the stale pid lock is taken over with a message;
 *   4. every acknowledged write is there and intact, every unacknowledged one wholly there
 *      or absent, revision numbers without gaps (checks.ts verifyRound).
 * Then a clean shutdown with writes in flight: SIGTERM, exit code 0, the lock released, and
 * the folder opens without the stale-lock path; the SQL integrity checks and PostgreSQL's
 * amcheck (heap and B-tree indexes) run on it.
 *
 * Run: `npx vitest run -c vitest.durability.config.mts` after building (scripts/test.sh).
 * DURABILITY_ROUNDS (default 20) sets the number of rounds.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openPglite } from '@/db/client';
import { workspaces } from '@/db/schema';
import { DEMO_ACCOUNTS, DEMO_WORKSPACE_NAME } from '@/lib/demo/accounts';
import { seedDemo } from '@/lib/demo/seed';
import { templateBlob } from '../integration/helpers/db';
import { amcheckAll, sqlIntegrity, verifyRound, type RoundSummary } from './checks';
import { getJson, request, requireBuild, signIn, splitRequest, startServer, type Server } from './harness';
import { createSection, newLedger, runWriters, solvePipeline, solvePipelineWithoutField, tally, type Ledger } from './workload';

const ROUNDS = Number(process.env.DURABILITY_ROUNDS || 20);
const owner = DEMO_ACCOUNTS.find((a) => a.role === 'owner')!;

let dataDir: string;
let server: Server | null = null;

beforeAll(async () => {
  requireBuild();
  dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'edgefield-durability-'));
  // The starting point: the migrated template (initdb is the slow part), the demo team, and
  // its workspace on the team plan so the free plan's solve limit does not refuse the writes.
  const h = await openPglite(path.join(dataDir, 'pglite'), { lockDir: dataDir, loadDataDir: await templateBlob() });
  try {
    await seedDemo(h.db);
    await h.db.update(workspaces).set({ plan: 'team' }).where(eq(workspaces.name, DEMO_WORKSPACE_NAME));
  } finally {
    await h.close();
  }
});

afterAll(async () => {
  if (server && server.proc.exitCode === null && server.proc.signalCode === null) {
    server.proc.kill('SIGKILL');
    await server.exited;
  }
  if (dataDir) fs.rmSync(dataDir, { recursive: true, force: true });
});

const lockFile = () => path.join(dataDir, 'edgefield.lock');

describe('kill-and-restart', () => {
  it(`loses no acknowledged write over ${ROUNDS} SIGKILLs in a row, then shuts down cleanly on SIGTERM`, async () => {
    server = await startServer(dataDir);
    const cookie = await signIn(owner.email, owner.password);
    const { workspaces: mine } = await getJson<{ workspaces: { id: string; name: string }[] }>('/api/workspaces', cookie);
    const ws = mine.find((w) => w.name === DEMO_WORKSPACE_NAME)!.id;

    const ledgers: Ledger[] = [];
    const totals = { revisions: { acked: 0, unacked: 0 }, solves: { acked: 0, unacked: 0 }, fields: { acked: 0, unacked: 0 }, comments: { acked: 0, unacked: 0 } };
    const log: string[] = [];
    for (let round = 1; round <= ROUNDS; round++) {
      const l = newLedger(round);
      ledgers.push(l);
      // Two sections to write into (acknowledged before the kill can come).
      const base = [await createSection(l, ws, cookie, `${l.prefix}base0`), await createSection(l, ws, cookie, `${l.prefix}base1`)];
      expect(base.every(Boolean), `round ${round}: base sections refused: ${l.refusals.join('; ')}`).toBe(true);
      // …and one acknowledged solve with its field and a comment, so every kind is checked every round.
      const first = await solvePipeline(l, ws, cookie, base[0]!, 'setup');
      expect([first.state, first.fieldState, first.comments[0]?.state], `round ${round}: ${l.refusals.join('; ')}`).toEqual(['acked', 'acked', 'acked']);

      const killAfter = 100 + Math.floor(Math.random() * 1900);
      const writing = runWriters(l, ws, cookie, base.map((b) => b!));
      await new Promise((r) => setTimeout(r, killAfter));
      const pid = server.proc.pid!;
      server.proc.kill('SIGKILL');
      const gone = await server.exited;
      expect(gone.signal).toBe('SIGKILL');
      await writing;
      expect(l.refusals, `round ${round}: writes refused before the kill`).toEqual([]);
      // The killed process left its lock behind.
      expect(JSON.parse(fs.readFileSync(lockFile(), 'utf8')).pid).toBe(pid);

      server = await startServer(dataDir);
      expect(server.output(), `round ${round}: the stale lock was not reported`).toMatch(
        new RegExp(`taking over the lock of .* left by pid ${pid}`),
      );
      expect(JSON.parse(fs.readFileSync(lockFile(), 'utf8')).pid).toBe(server.proc.pid);

      const sum: RoundSummary = await verifyRound(l, ws, cookie);
      const t = tally(l);
      for (const k of Object.keys(totals) as (keyof typeof totals)[]) {
        totals[k].acked += t[k].acked;
        totals[k].unacked += t[k].unacked;
      }
      log.push(
        `round ${round}: killed after ${killAfter} ms, ${l.counts.acked}/${l.counts.sent} writes acknowledged ` +
          `(in flight at the kill: ${Object.entries(t).map(([k, v]) => `${v.unacked} ${k}`).join(', ')}); ` +
          `found ${sum.sections} sections, ${sum.revisions} revisions, ${sum.solves} solves (${sum.fields} fields), ` +
          `${sum.comments} comments; ${sum.unackedPresent} unacknowledged writes found committed`,
      );
      console.log(log[log.length - 1]);
    }

    console.log(`all rounds: ${JSON.stringify(totals)}`);
    // Earlier rounds are untouched by later kills.
    for (const l of ledgers.slice(0, -1)) await verifyRound(l, ws, cookie);

    // Clean shutdown with writes in flight: SIGTERM lets them finish, closes the database,
    // releases the lock and exits 0. One upload is held half-sent across the signal: it must
    // still be answered 201 and stored, while new connections are refused meanwhile.
    const last = newLedger(ROUNDS + 1);
    ledgers.push(last);
    const base = [await createSection(last, ws, cookie, `${last.prefix}base0`)];
    const held = await solvePipelineWithoutField(last, ws, cookie, base[0]!);
    const upload = splitRequest('PUT', `/api/workspaces/${ws}/solves/${held.id}/field`, held.field, cookie);
    held.fieldState = 'unacked';
    await new Promise((r) => setTimeout(r, 300)); // the server has the headers and half the body
    const writing = runWriters(last, ws, cookie, base.map((b) => b!));
    await new Promise((r) => setTimeout(r, 300));
    server.proc.kill('SIGTERM');
    await new Promise((r) => setTimeout(r, 500));
    expect(server.proc.exitCode, 'the server waits for the request in flight').toBe(null);
    await expect(request('GET', '/api/auth/csrf'), 'new connections are refused while shutting down').rejects.toThrow();
    upload.finish();
    const uploaded = await upload.reply;
    expect(uploaded.status, uploaded.body.toString('utf8')).toBe(201);
    held.fieldState = 'acked';
    const ended = await server.exited;
    await writing;
    expect(ended, `exit after SIGTERM; server output:\n${server.output().slice(-3000)}`).toEqual({ code: 0, signal: null });
    expect(server.output()).toContain('Edgefield: database closed');
    expect(fs.existsSync(lockFile()), 'the lock is released').toBe(false);
    // Requests in flight at SIGTERM finished (2xx); later ones found no listener (network error).
    expect(last.refusals).toEqual([]);

    // The folder opens without the stale-lock path, and the database holds together.
    const warnings: string[] = [];
    const origWarn = console.warn;
    console.warn = (...a: unknown[]) => void warnings.push(a.join(' '));
    let h;
    try {
      h = await openPglite(path.join(dataDir, 'pglite'), { lockDir: dataDir });
    } finally {
      console.warn = origWarn;
    }
    try {
      expect(warnings.filter((w) => w.includes('taking over the lock'))).toEqual([]);
      await sqlIntegrity(h, 'dur-r');
      // Every acknowledged write of every round, the SIGTERM one included, is in the database.
      const ack = (xs: Iterable<{ state: string; id?: string }>) => [...xs].filter((x) => x.state === 'acked').map((x) => x.id!);
      const db = h.db as unknown as { execute(q: unknown): Promise<{ rows: Record<string, unknown>[] }> };
      const { sql } = await import('drizzle-orm');
      for (const l of ledgers) {
        const want = {
          sections: ack(l.sections.values()),
          revisions: ack(l.revisions.values()),
          solves: ack(l.solves.values()),
          comments: ack([...l.solves.values()].flatMap((s) => s.comments)),
          fields: [...l.solves.values()].filter((s) => s.fieldState === 'acked').map((s) => s.id!),
        };
        const got = async (q: string, ids: string[]) =>
          ids.length ? (await db.execute(sql.raw(q.replace('$IDS', ids.map((i) => `'${i}'`).join(','))))).rows.length : 0;
        expect(await got('select id from sections where id in ($IDS)', want.sections)).toBe(want.sections.length);
        expect(await got('select id from section_revisions where id in ($IDS)', want.revisions)).toBe(want.revisions.length);
        expect(await got('select id from solves where id in ($IDS)', want.solves)).toBe(want.solves.length);
        expect(await got('select id from comments where id in ($IDS)', want.comments)).toBe(want.comments.length);
        expect(await got('select id from solves where field is not null and id in ($IDS)', want.fields)).toBe(want.fields.length);
      }
      // The upload held across SIGTERM is stored byte for byte.
      const [stored] = (await db.execute(sql.raw(`select encode(field, 'hex') as h from solves where id = '${held.id}'`))).rows;
      expect(stored?.h).toBe(Buffer.from(held.field).toString('hex'));
    } finally {
      await h.close();
    }
    // PostgreSQL's own checks: sound heap pages, every row in every index (bt_index_check
    // raises an error on a broken index, which fails the test).
    const checked = await amcheckAll(path.join(dataDir, 'pglite'));
    expect(checked.tables).toBeGreaterThanOrEqual(18);
    expect(checked.indexes).toBeGreaterThan(checked.tables);
    console.log(`SIGTERM round: ${last.counts.acked}/${last.counts.sent} writes acknowledged before the shutdown`);
  }, 900_000);
});

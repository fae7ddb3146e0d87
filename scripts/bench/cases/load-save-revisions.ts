/**
 * Bench case "load-save-revisions" (issue 8, Load): 50 connections of signed-in editors saving
 * section revisions for 30 s against a production build (`next start` on loopback, fresh
 * embedded data folder in demo mode; scripts/bench/load-server.ts). Before the timed run each
 * connection creates a section of its own (the demo microstrip); during it, every request is a
 * real new revision of that section: a valid section whose trace width and title change with
 * each save, sent with the revision it builds on (`baseRevisionId`, as the editor does, so a
 * lost or reordered save would come back as a 409 and count as an error) and with the page's
 * Origin header (the CSRF check). The workspace has 49 members who may edit (the demo owner and
 * editor and 47 bench editors), so one of them works in two tabs.
 *
 * Afterwards every section's revision list is read back: each acknowledged save must be there
 * (`lostWrites`, expected 0).
 *
 * Reported, never asserted: rps, p50Ms, p99Ms (2xx answers), errors (non-2xx + connection
 * errors + timeouts). BENCH_LOAD_SECONDS shortens the run for quick checks.
 */
import type { EventEmitter } from 'node:events';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { templateSection } from '@/lib/section/templates';
import { runLoad, type LoadFigures, type LoadRequest } from '../load-run';
import { signInAll, startServer } from '../load-server';

export const name = 'load-save-revisions';

export interface LoadSaveResult extends LoadFigures {
  users: number;
  sections: number;
  /** Saves answered 201 during the timed run. */
  savedRevisions: number;
  /** Acknowledged saves missing from the revision lists afterwards (expected 0). */
  lostWrites: number;
  /** Bytes of one save request body (JSON). */
  bodyBytes: number;
  /**
   * 409 answers on connections that had a timeout before: the timed-out save was stored after
   * all, so the next one builds on a stale revision and is refused, as an editor's would be.
   */
  conflictsAfterTimeout: number;
}

interface Slot {
  cookie: string;
  sectionId: string;
  base: string;
  n: number;
  saved: number;
  timeouts: number;
  conflictsAfterTimeout: number;
}

function content(slot: number, n: number) {
  const s = templateSection('microstrip');
  // 1.50 … 2.49 mm: always a valid trace narrower than the 12 mm laminate.
  s.variables = { ...(s.variables ?? {}), w: Math.round((1.5 + ((slot * 37 + n) % 100) * 0.01) * 100) / 100 };
  s.title = `Bench feed ${slot + 1}, save ${n}`;
  return s;
}

export async function run(): Promise<LoadSaveResult> {
  const server = await startServer();
  try {
    const { origin, workspaceId: w } = server;
    const editors = server.users.filter((u) => u.role === 'editor' || u.role === 'owner');
    const cookies = await signInAll(origin, editors);
    const connections = 50;
    const json = (cookie: string) => ({ cookie, origin, 'content-type': 'application/json' });

    // One section per connection, created through the API by that connection's user.
    const slots: Slot[] = [];
    for (let i = 0; i < connections; i++) {
      const cookie = cookies[i % cookies.length]!;
      const r = await fetch(`${origin}/api/workspaces/${w}/sections`, {
        method: 'POST',
        headers: json(cookie),
        body: JSON.stringify({ name: `Bench feed ${i + 1}`, content: content(i, 0), message: 'Load bench: first revision' }),
      });
      if (r.status !== 201) throw new Error(`creating section ${i + 1} answered HTTP ${r.status}: ${await r.text()}`);
      const b = (await r.json()) as { section: { id: string }; revision: { id: string } };
      slots.push({ cookie, sectionId: b.section.id, base: b.revision.id, n: 0, saved: 0, timeouts: 0, conflictsAfterTimeout: 0 });
    }
    const bodyBytes = Buffer.byteLength(JSON.stringify({ content: content(0, 1), baseRevisionId: slots[0]!.base, message: 'Load bench save 1' }));

    const figures = await runLoad({
      origin,
      serverCpuMs: server.cpuMs,
      connections,
      requestsFor: (i, client): LoadRequest[] => {
        const slot = slots[i]!;
        // autocannon emits 'timeout' on the connection (its typings leave the event out)
        (client as EventEmitter).on('timeout', () => slot.timeouts++);
        return [
          {
            method: 'POST',
            path: `/api/workspaces/${w}/sections/${slot.sectionId}/revisions`,
            headers: json(slot.cookie),
            setupRequest: (req) => {
              slot.n++;
              return { ...req, body: JSON.stringify({ content: content(i, slot.n), baseRevisionId: slot.base, message: `Load bench save ${slot.n}` }) };
            },
            onResponse: (status, body) => {
              if (status === 409 && slot.timeouts > 0) slot.conflictsAfterTimeout++;
              if (status !== 201) return;
              slot.base = (JSON.parse(body) as { revision: { id: string } }).revision.id;
              slot.saved++;
            },
          },
        ];
      },
    });

    // Every acknowledged save is stored (a save still in flight when the run stopped may be
    // stored without having been counted, so more is fine; fewer is a lost write).
    let lostWrites = 0;
    for (const s of slots) {
      const r = await fetch(`${origin}/api/workspaces/${w}/sections/${s.sectionId}/revisions`, { headers: { cookie: s.cookie } });
      if (!r.ok) throw new Error(`reading the revisions back answered HTTP ${r.status}`);
      const { revisions } = (await r.json()) as { revisions: unknown[] };
      lostWrites += Math.max(0, 1 + s.saved - revisions.length);
    }
    return {
      ...figures,
      users: Math.min(connections, cookies.length),
      sections: slots.length,
      savedRevisions: slots.reduce((a, s) => a + s.saved, 0),
      lostWrites,
      bodyBytes,
      conflictsAfterTimeout: slots.reduce((a, s) => a + s.conflictsAfterTimeout, 0),
    };
  } finally {
    await server.stop();
  }
}

export default { name, run };

// Run on its own: npx tsx scripts/bench/cases/load-save-revisions.ts
if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  run().then(
    (r) => console.log(JSON.stringify({ name, ...r })),
    (e) => {
      console.error(e);
      process.exit(1);
    },
  );
}

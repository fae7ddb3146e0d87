/**
 * Bench case "load-read-solves" (issue 8, Load): 50 signed-in members of the demo workspace,
 * one connection each, reading saved solves for 30 s against a production build (`next start`
 * on loopback, fresh embedded data folder in demo mode; scripts/bench/load-server.ts). Each
 * connection cycles through what a viewer's browser asks the API for: the solves list, a
 * solve's JSON, its comment thread and its stored field, over the demo's stored solves, each
 * connection starting at a different point of the cycle.
 *
 * The measured run follows 36 sequential warm-up requests and 5 s of the same load that is not
 * counted (its non-2xx answers and errors are reported as warmupErrors); the measured run
 * still opens its 50 connections at once.
 *
 * Reported, never asserted: rps, p50Ms, p99Ms (2xx answers), errors (non-2xx + connection
 * errors + timeouts). Target on the project's 2-core machine: p99 under 200 ms, zero errors.
 * BENCH_LOAD_SECONDS shortens the run for quick checks.
 */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { runLoad, type LoadFigures, type LoadRequest } from '../load-run';
import { signInAll, startServer } from '../load-server';

export const name = 'load-read-solves';

export interface LoadReadResult extends LoadFigures {
  users: number;
  solves: number;
  /** The routes of one cycle (ids shown as {id}). */
  routes: string;
  /** Warm-up requests sent (sequentially) before the timed run. */
  warmupRequests: number;
}

export async function run(): Promise<LoadReadResult> {
  const server = await startServer();
  try {
    const { origin, workspaceId: w } = server;
    const users = server.users.slice(0, 50);
    const cookies = await signInAll(origin, users);
    const list = await fetch(`${origin}/api/workspaces/${w}/solves`, { headers: { cookie: cookies[0]! } });
    if (!list.ok) throw new Error(`listing solves failed (HTTP ${list.status})`);
    const ids = ((await list.json()) as { solves: { id: string }[] }).solves.map((s) => s.id);
    if (ids.length === 0) throw new Error('the demo data has no stored solves to read');

    const base = `/api/workspaces/${w}`;
    const cycle: string[] = [];
    for (const id of ids) cycle.push(`${base}/solves`, `${base}/solves/${id}`, `${base}/solves/${id}/comments`, `${base}/solves/${id}/field`);

    // Warm-up: load every route module once per user session kind, outside the timed run.
    let warmupRequests = 0;
    for (let k = 0; k < 3; k++) {
      for (const p of cycle) {
        const r = await fetch(origin + p, { headers: { cookie: cookies[k % cookies.length]! } });
        await r.arrayBuffer();
        if (!r.ok) throw new Error(`warm-up GET ${p} answered HTTP ${r.status}`);
        warmupRequests++;
      }
    }

    const figures = await runLoad({
      origin,
      serverCpuMs: server.cpuMs,
      warmupS: 5,
      connections: 50,
      requestsFor: (i): LoadRequest[] => {
        const headers = { cookie: cookies[i % cookies.length]! };
        const start = (i * 5) % cycle.length;
        return cycle.map((_, j) => ({ method: 'GET', path: cycle[(start + j) % cycle.length]!, headers }));
      },
    });
    return {
      ...figures,
      users: Math.min(50, cookies.length),
      solves: ids.length,
      routes: 'GET solves, solves/{id}, solves/{id}/comments, solves/{id}/field',
      warmupRequests,
    };
  } finally {
    await server.stop();
  }
}

export default { name, run };

// Run on its own: npx tsx scripts/bench/cases/load-read-solves.ts
if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  run().then(
    (r) => console.log(JSON.stringify({ name, ...r })),
    (e) => {
      console.error(e);
      process.exit(1);
    },
  );
}

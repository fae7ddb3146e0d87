/**
 * One autocannon run for the load bench cases: N connections (one signed-in user each, 50 by
 * default as issue 8 asks) for a fixed time (30 s by default; BENCH_LOAD_SECONDS shortens it
 * for quick checks). Every connection gets its own request list from `requestsFor(i)`, so
 * cookies and per-user state (the revision an editor saves on top of) never mix between
 * connections. Pipelining 1: each connection waits for its answer, as a person's browser tab does.
 *
 * errors = every non-2xx answer + connection errors + timeouts (autocannon counts timeouts
 * among its connection errors; they are reported separately too). Latencies are of the 2xx
 * answers (autocannon's default), in ms.
 */
import type { EventEmitter } from 'node:events';
import { appendFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import autocannon from 'autocannon';

/** A request as autocannon takes it (path, method, headers, body, setupRequest, onResponse). */
export type LoadRequest = autocannon.Request;

export interface LoadOptions {
  origin: string;
  /** @default 50 */
  connections?: number;
  /** Seconds. @default BENCH_LOAD_SECONDS or 30 */
  durationS?: number;
  /**
   * Request list of connection i (called once per connection, in order 0, 1, …); `client`
   * emits autocannon's per-connection events ('timeout', 'response', …).
   */
  requestsFor(i: number, client: autocannon.Client): LoadRequest[];
  /** Seconds after which a request counts as timed out. @default 10 */
  timeoutS?: number;
  /** The server process's CPU time so far, ms (for serverCpuMsPerRequest). */
  serverCpuMs?: () => number;
  /**
   * Seconds of load at the same concurrency before the measured run, not counted (their
   * non-2xx answers and errors are reported as warmupErrors). @default 0
   */
  warmupS?: number;
}

export interface LoadFigures {
  /** Answers per second (2xx and others), mean over the run's seconds. */
  rps: number;
  p50Ms: number;
  p99Ms: number;
  errors: number;
  requests: number;
  connections: number;
  durationS: number;
  non2xx: number;
  timeouts: number;
  connErrors: number;
  p90Ms: number;
  maxMs: number;
  meanMs: number;
  /** Seconds of uncounted load before the measured run, and its non-2xx answers + errors. */
  warmupS: number;
  warmupErrors: number;
  /** Load average (1 min) of the machine when the run started and ended. */
  loadAvgStart: number;
  loadAvgEnd: number;
  /** HTTP status → count, for anything but 2xx (empty when all went well). */
  statusOther: Record<string, number>;
  /**
   * Server CPU time (user + system) per answer during the run, ms: steadier than the latencies
   * on a busy machine; 1000 / this is about the answers per second one free core would give.
   */
  serverCpuMsPerRequest: number;
}

export function loadDurationS(): number {
  const v = process.env.BENCH_LOAD_SECONDS;
  if (v === undefined || v === '') return 30;
  const n = Number(v);
  if (!Number.isFinite(n) || n < 1 || n > 600) throw new Error(`BENCH_LOAD_SECONDS must be a number of seconds from 1 to 600 (got "${v}")`);
  return n;
}

export async function runLoad(opts: LoadOptions): Promise<LoadFigures> {
  const connections = opts.connections ?? 50;
  const durationS = opts.durationS ?? loadDurationS();
  const warmupS = opts.warmupS ?? 0;
  let warmupErrors = 0;
  if (warmupS > 0) {
    let c = 0;
    const w = await autocannon({
      url: opts.origin,
      connections,
      pipelining: 1,
      duration: warmupS,
      timeout: opts.timeoutS ?? 10,
      setupClient: (client) => client.setRequests(opts.requestsFor(c++, client)),
    });
    warmupErrors = w.non2xx + w.errors;
  }
  const loadAvgStart = loadavg()[0]!;
  const cpu0 = opts.serverCpuMs?.() ?? NaN;
  let nextClient = 0;
  const instance = autocannon({
    url: opts.origin,
    connections,
    pipelining: 1,
    duration: durationS,
    timeout: opts.timeoutS ?? 10,
    // Each connection replaces the default request with its own list (autocannon deep-copies
    // its options per connection; the functions in the list close over that connection's state).
    setupClient: (client) => {
      client.setRequests(opts.requestsFor(nextClient++, client));
    },
  });
  // BENCH_LOAD_TRACE=<file>: appends one line per answer, "ms-since-start status latency-ms", to see
  // whether slow answers come in bursts (a stall of the server) or spread out (queueing).
  const trace = process.env.BENCH_LOAD_TRACE;
  const lines: string[] = [];
  const t0 = performance.now();
  if (trace) {
    // without a callback autocannon returns its event emitter with a then() (the typings only show the promise)
    (instance as unknown as EventEmitter).on('response', (_client: unknown, status: number, _bytes: number, ms: number) => {
      lines.push(`${Math.round(performance.now() - t0)} ${status} ${Math.round(ms)}`);
    });
  }
  const result = await instance;
  const serverCpu = (opts.serverCpuMs?.() ?? NaN) - cpu0;
  if (trace) appendFileSync(trace, `# run of ${connections} connections, ${durationS} s, started ${new Date(Date.now() - (performance.now() - t0)).toISOString()}\n${lines.join('\n')}\n`);
  const statusOther: Record<string, number> = {};
  for (const [code, v] of Object.entries(result.statusCodeStats ?? {})) {
    if (!/^2\d\d$/.test(code)) statusOther[code] = v?.count ?? 0;
  }
  return {
    rps: Math.round(result.requests.average * 10) / 10,
    p50Ms: result.latency.p50,
    p99Ms: result.latency.p99,
    errors: result.non2xx + result.errors,
    requests: result.requests.total,
    connections,
    durationS,
    non2xx: result.non2xx,
    timeouts: result.timeouts,
    connErrors: result.errors,
    p90Ms: result.latency.p90,
    maxMs: result.latency.max,
    meanMs: Math.round(result.latency.mean * 10) / 10,
    loadAvgStart: Math.round(loadAvgStart * 100) / 100,
    loadAvgEnd: Math.round(loadavg()[0]! * 100) / 100,
    statusOther,
    warmupS,
    warmupErrors,
    serverCpuMsPerRequest: Math.round((serverCpu / Math.max(1, result.requests.total)) * 100) / 100,
  };
}

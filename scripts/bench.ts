/**
 * Edgefield benchmark harness.
 *
 *   npm run bench                          readable table
 *   npm run --silent bench -- --json       stdout is only JSON: { "cases": [ { "name", ... } ] }
 *   npm run bench -- --only a,b            run a subset by name
 *   npm run bench -- --list                list the registered cases
 *
 * Cases are modules in scripts/bench/cases/ (any *.ts file), each exporting
 *   name: string
 *   run(): Promise<Record<string, unknown>>
 * either as named exports or as the default export's properties. Drop a file in to add a case;
 * nothing here needs to change. Cases run one after another in file-name order. A case that
 * throws is reported with { "name", "error" }; a case that cannot run returns { "skipped": reason }.
 * In --json mode everything a case prints goes to stderr so that stdout stays pure JSON, and
 * result keys starting with "_" (extra detail for the table, such as process CPU times) are left out.
 */
import { readdirSync } from 'node:fs';
import { loadavg, cpus } from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { AMG_ANCHOR } from './bench/amg-anchor';

interface BenchCase {
  name: string;
  run(): Promise<Record<string, unknown>>;
}

type CaseResult = { name: string } & Record<string, unknown>;

const CASES_DIR = path.join(import.meta.dirname, 'bench', 'cases');

function parseArgs(argv: string[]): { json: boolean; only: string[] | null; list: boolean } {
  let json = false, list = false;
  let only: string[] | null = null;
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--json') json = true;
    else if (a === '--list') list = true;
    else if (a === '--only') only = (argv[++i] ?? '').split(',').map((s) => s.trim()).filter(Boolean);
    else if (a.startsWith('--only=')) only = a.slice(7).split(',').map((s) => s.trim()).filter(Boolean);
    else {
      process.stderr.write(`bench: unknown argument ${a}\n`);
      process.exit(2);
    }
  }
  return { json, only, list };
}

function asCase(mod: Record<string, unknown>, file: string): BenchCase {
  const src = (mod.default && typeof mod.default === 'object' ? mod.default : mod) as Record<string, unknown>;
  if (typeof src.name !== 'string' || typeof src.run !== 'function') {
    throw new Error(`bench case ${file} must export name (string) and run() (async function)`);
  }
  return { name: src.name, run: src.run as BenchCase['run'] };
}

async function loadCases(): Promise<BenchCase[]> {
  const files = readdirSync(CASES_DIR).filter((f) => /\.(ts|mts|js|mjs)$/.test(f) && !f.endsWith('.d.ts')).sort();
  const cases: BenchCase[] = [];
  for (const f of files) {
    const mod = (await import(pathToFileURL(path.join(CASES_DIR, f)).href)) as Record<string, unknown>;
    cases.push(asCase(mod, f));
  }
  const seen = new Set<string>();
  for (const c of cases) {
    if (seen.has(c.name)) throw new Error(`two bench cases are named ${c.name}`);
    seen.add(c.name);
  }
  return cases;
}

function fmt(v: unknown): string {
  if (typeof v === 'number') {
    if (v !== 0 && (Math.abs(v) < 1e-3 || Math.abs(v) >= 1e7)) return v.toExponential(2);
    if (Number.isInteger(v)) return v.toLocaleString('en-US');
    return String(Number(v.toPrecision(4)));
  }
  return String(v);
}

const SOLVER_FIELDS = ['unknowns', 'setupMs', 'solveMs', 'matvecMs', 'workUnits', 'iterations', 'relResidual'] as const;

const LOAD_FIELDS = ['rps', 'p50Ms', 'p99Ms', 'errors'] as const;

/** The load cases (scripts/bench/cases/load-*.ts): one row each, and what the figures mean. */
function printLoadTable(rows: CaseResult[], out: (s?: string) => void): void {
  const cols: [string, string][] = [
    ['case', 'name'], ['conn.', 'connections'], ['s', 'durationS'], ['requests', 'requests'], ['req/s', 'rps'],
    ['p50 ms', 'p50Ms'], ['p90 ms', 'p90Ms'], ['p99 ms', 'p99Ms'], ['max ms', 'maxMs'], ['errors', 'errors'],
    ['non-2xx', 'non2xx'], ['timeouts', 'timeouts'], ['load avg', 'loadAvgStart'], ['srv cpu ms/req', 'serverCpuMsPerRequest'],
  ];
  const cells = rows.map((r) => cols.map(([, k]) => (r[k] === undefined ? '-' : fmt(r[k]))));
  const widths = cols.map(([h], i) => Math.max(h.length, ...cells.map((c) => c[i]!.length)));
  const line = (c: string[]) => c.map((x, i) => (i === 0 ? x.padEnd(widths[i]!) : x.padStart(widths[i]!))).join('  ');
  out(line(cols.map(([h]) => h)));
  out(widths.map((w) => '-'.repeat(w)).join('  '));
  for (const c of cells) out(line(c));
  for (const r of rows) {
    const other = r.statusOther as Record<string, number> | undefined;
    if (other && Object.keys(other).length) out(`  ${r.name}: answers other than 2xx: ${Object.entries(other).map(([k, v]) => `${k} ×${v}`).join(', ')}`);
    if (typeof r.warmupS === 'number' && r.warmupS > 0) out(`  ${r.name}: after ${fmt(r.warmupS)} s of the same load, not counted (${fmt(r.warmupErrors)} errors in it)`);
    if (typeof r.lostWrites === 'number') out(`  ${r.name}: ${fmt(r.savedRevisions)} revisions saved, ${fmt(r.lostWrites)} acknowledged saves missing afterwards`);
    if (typeof r.conflictsAfterTimeout === 'number' && r.conflictsAfterTimeout > 0) out(`  ${r.name}: ${fmt(r.conflictsAfterTimeout)} of the 409s came after a timed-out save on the same connection (stored after all; the next save built on a stale revision)`);
  }
  const read = rows.find((r) => r.name === 'load-read-solves');
  if (read) out(`${(read.p99Ms as number) < 200 && read.errors === 0 ? 'ok  ' : 'MISS'} reads: p99 ${fmt(read.p99Ms)} ms with ${fmt(read.errors)} errors (target: p99 under 200 ms, zero errors; reported, not asserted)`);
  out('Load cases: a production build (next start, loopback, fresh demo data) under autocannon, one signed-in user per');
  out('connection, pipelining 1. Latencies are of 2xx answers; errors = non-2xx + connection errors + timeouts (10 s).');
  out('"load avg" is the machine\'s 1-minute load average when the run started: other work on the 2 cores slows the server.');
  out('"srv cpu ms/req" is the server process\'s CPU time per answer, steadier on a busy machine: 1000 / it ≈ answers/s on one free core.');
  out('BENCH_LOAD_SECONDS=5 shortens the runs (default 30 s); see DEVELOPERS.md, Profiling.');
  out();
}

function printTable(results: CaseResult[], wallMs: number): void {
  const out = (s = '') => process.stdout.write(s + '\n');
  const load = loadavg().map((v) => v.toFixed(2)).join(' ');
  out(`Edgefield bench: ${results.length} case(s), ${(wallMs / 1000).toFixed(1)} s, ${cpus().length} CPU(s), load average ${load}`);
  out('Timings are wall-clock and distorted by other load on the machine; work units and iterations are the steadier figures.');
  out();
  const solverRows = results.filter((r) => SOLVER_FIELDS.every((f) => typeof r[f] === 'number'));
  if (solverRows.length) {
    const head = ['case', 'unknowns', 'setup ms', 'solve ms', 'matvec ms', 'work units', 'iterations', 'rel. residual', 'cpu: setup', 'solve', 'matvec', 'WU'];
    const cpuCell = (r: CaseResult, f: string) => {
      const c = r._cpu as Record<string, number> | undefined;
      return c && typeof c[f] === 'number' ? fmt(c[f]) : '-';
    };
    const rows = solverRows.map((r) => [
      r.name,
      ...SOLVER_FIELDS.map((f) => fmt(r[f])),
      cpuCell(r, 'setupMs'), cpuCell(r, 'solveMs'), cpuCell(r, 'matvecMs'), cpuCell(r, 'workUnits'),
    ]);
    const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => String(r[i]).length)));
    const line = (cells: string[]) => cells.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('  ');
    out(line(head));
    out(widths.map((w) => '-'.repeat(w)).join('  '));
    for (const r of rows) out(line(r as string[]));
    out();
  }
  out('The "cpu:" columns are process CPU times (ms) of the same runs: on a loaded machine they are closer to what an idle one shows.');
  out();
  const loadRows = results.filter((r) => LOAD_FIELDS.every((f) => typeof r[f] === 'number'));
  if (loadRows.length) printLoadTable(loadRows, out);
  for (const r of results) {
    if (solverRows.includes(r) || loadRows.includes(r)) continue;
    const rest = Object.entries(r).filter(([k]) => k !== 'name' && !k.startsWith('_')).map(([k, v]) => `${k}=${fmt(v)}`).join('  ');
    out(`${r.name}: ${rest}`);
  }
  if (results.some((r) => !solverRows.includes(r))) out();

  // quality bars of the solver (issue 3)
  const get = (n: string) => solverRows.find((r) => r.name === n);
  const u250 = get('solver-uniform-250k'), u1m = get('solver-uniform-1m'), anchor = get('solver-anchor-975k'), std = get('solver-standard-graded');
  const mark = (ok: boolean) => (ok ? 'ok  ' : 'MISS');
  const cpuOf = (r: CaseResult, f: string): number | undefined => (r._cpu as Record<string, number> | undefined)?.[f];
  const also = (v: number | undefined, text: (v: number) => string) => (v === undefined ? '' : `; on CPU time ${text(v)}`);
  if (u1m) {
    const wu = u1m.workUnits as number;
    out(`${mark(wu <= 60 && (u1m.relResidual as number) <= 1e-8)} 1M uniform: relative residual ${fmt(u1m.relResidual)} in ${fmt(wu)} work units (bar: 1e-8 in ≤ 60)` +
      also(cpuOf(u1m, 'workUnits'), (v) => `${fmt(v)} work units`));
    const first = u1m._firstRun as { setupMs: number; solveMs: number } | undefined;
    if (first) {
      out(`     medians of 5 runs after 2 warm-up runs (each a fresh set-up and solve; the kernels compile during the first ones): ` +
        `the first run in this process took set-up ${fmt(first.setupMs)} ms + solve ${fmt(first.solveMs)} ms = ${fmt(first.solveMs / (u1m.matvecMs as number))} work units`);
    }
    const half = cpuOf(u1m, 'matvecHalfMs'), wuHalf = cpuOf(u1m, 'workUnitsHalf');
    if (half !== undefined && wuHalf !== undefined) {
      out(`${mark(wuHalf <= 60)} 1M uniform, stricter: against the product on the solver's own symmetric-half storage (${fmt(half)} ms CPU, vs ${fmt(cpuOf(u1m, 'matvecMs'))} ms for applyOperator): ${fmt(wuHalf)} work units`);
    }
  }
  if (u250 && u1m) {
    const g = (u1m.solveMs as number) / (u250.solveMs as number);
    const n = (u1m.unknowns as number) / (u250.unknowns as number);
    const c1 = cpuOf(u1m, 'solveMs'), c0 = cpuOf(u250, 'solveMs');
    out(`${mark(g <= 4.6)} solve time 250k → 1M: ×${g.toFixed(2)} for ×${n.toFixed(2)} unknowns (bar: ≤ ×4.6)` +
      also(c1 !== undefined && c0 !== undefined ? c1 / c0 : undefined, (v) => `×${v.toFixed(2)}`));
  }
  if (anchor) {
    const ref = AMG_ANCHOR[1];
    const ours = ((anchor.setupMs as number) + (anchor.solveMs as number)) / 1000;
    const theirs = ref.setupS + ref.solveS;
    const cs = cpuOf(anchor, 'setupMs'), cv = cpuOf(anchor, 'solveMs');
    out(`${mark(ours <= theirs / 2)} anchor 975k: set-up + solve ${ours.toFixed(2)} s (bar: ≤ ${(theirs / 2).toFixed(2)} s, half of pyamg's)` +
      also(cs !== undefined && cv !== undefined ? (cs + cv) / 1000 : undefined, (v) => `${v.toFixed(2)} s`));
    out(`     pyamg 5.3.0 SA + CG on the same system (${ref.unknowns.toLocaleString('en-US')} unknowns, from amg_anchor.json, 2026-12-01, not run here):`);
    out(`     set-up ${ref.setupS} s + solve ${ref.solveS} s = ${theirs.toFixed(2)} s, ${ref.iterations} iterations, matvec ${ref.matvecMs} ms, ` +
      `${(ref.solveS * 1000 / ref.matvecMs).toFixed(0)} work units; ours: ${fmt(anchor.iterations)} iterations, ${fmt(anchor.workUnits)} work units`);
  }
  if (std) out(`     standard preset microstrip: ${fmt(std.unknowns)} nodes on the finest mesh; every linear solve of the pipeline together took ${fmt(std.workUnits)} work units`);
  const under1 = results.find((r) => r.name === 'solver-standard-under-1s' && typeof r.coaxMs === 'number');
  if (under1) {
    const c = under1.coaxMs as number, m = under1.microstripMs as number;
    const accurate = (under1.coaxError as number) <= 1e-3 && (under1.coaxEstimate as number) <= 1e-3 && (under1.microstripEstimate as number) <= 1e-3;
    out(`${c < 1000 && m < 1000 && accurate ? 'PASS' : 'MISS'} standard preset, whole pipeline (warm, median of 3, wall-clock): coax ${fmt(c)} ms, microstrip ${fmt(m)} ms (bar: < 1000 ms each, within 0.1%)` +
      `; on CPU time ${fmt(under1.coaxCpuMs)} ms and ${fmt(under1.microstripCpuMs)} ms; first run in this process ${fmt(under1.coaxColdMs)} and ${fmt(under1.microstripColdMs)} ms`);
    out(`     coax error against the exact 2πε/ln(b/a): ${fmt(under1.coaxError)} (estimate ${fmt(under1.coaxEstimate)}); microstrip estimated error ${fmt(under1.microstripEstimate)}`);
  }
  const skipped = results.filter((r) => typeof r.skipped === 'string');
  for (const r of skipped) out(`skipped ${r.name}: ${r.skipped}`);
  const failed = results.filter((r) => typeof r.error === 'string');
  for (const r of failed) out(`FAILED ${r.name}: ${r.error}`);
}

async function main(): Promise<void> {
  const { json, only, list } = parseArgs(process.argv.slice(2));
  const realLog = console.log;
  if (json) {
    // keep stdout for the JSON document only
    const toErr = (...a: unknown[]) => process.stderr.write(a.map(String).join(' ') + '\n');
    console.log = toErr;
    console.info = toErr;
    console.debug = toErr;
  }
  const all = await loadCases();
  if (list) {
    for (const c of all) realLog(c.name);
    return;
  }
  if (only) {
    const unknown = only.filter((n) => !all.some((c) => c.name === n));
    if (unknown.length) {
      process.stderr.write(`bench: no case named ${unknown.join(', ')} (have: ${all.map((c) => c.name).join(', ')})\n`);
      process.exit(2);
    }
  }
  const selected = only ? all.filter((c) => only.includes(c.name)) : all;
  const results: CaseResult[] = [];
  const t0 = performance.now();
  for (const c of selected) {
    process.stderr.write(`bench: ${c.name} ...\n`);
    const started = performance.now();
    try {
      const r = await c.run();
      results.push({ name: c.name, ...r });
    } catch (err) {
      results.push({ name: c.name, error: err instanceof Error ? err.message : String(err) });
    }
    process.stderr.write(`bench: ${c.name} done in ${((performance.now() - started) / 1000).toFixed(1)} s\n`);
  }
  const wall = performance.now() - t0;
  if (json) {
    const pub = results.map((r) => Object.fromEntries(Object.entries(r).filter(([k]) => !k.startsWith('_'))));
    process.stdout.write(JSON.stringify({ cases: pub }, null, 1) + '\n');
  }
  else printTable(results, wall);
}

main().catch((err) => {
  process.stderr.write(`bench: ${err instanceof Error ? err.stack ?? err.message : String(err)}\n`);
  process.exit(1);
});

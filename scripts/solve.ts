/**
 * Edgefield command line: solve one section file.
 *
 *   npm run --silent solve -- <section.json> [--json] [--preset quick|standard|precise] [--tolerance <x>]
 *
 * --json prints only the result JSON ("edgefield.result/1", docs/result-format.md) on
 * stdout; without it a readable table. Exit status: 0 solved; 2 the file cannot be read,
 * is not JSON, is not a valid section, fails the checks, or the solver refuses it (size
 * limits), or the options are wrong; 1 any other failure. Messages go to stderr.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { parseSectionFile } from '../lib/section/parse';
import { formatIssuePath } from '../lib/section/issues';
import { SectionError, solveSection, type SolveSectionOptions } from '../lib/engine/solve-section';
import type { SectionResult } from '../lib/engine/types';
import { UNIT_LABELS } from '../lib/section/units';
import { MESH_PRESETS } from '../lib/section/schema';
import type { MeshPreset } from '../lib/fdm/types';
import { analysisText } from '../lib/analysis/text';

const USAGE = `usage: npm run --silent solve -- <section.json> [--json] [--preset quick|standard|precise] [--tolerance <x>] [--progress]
       [--frequency <Hz>] [--volts <V>] [--length <m>] [--rise-time <s>]

Solves an Edgefield section file ("edgefield.section/1", see docs/section-format.md) and
prints the capacitance matrix, error estimate, line values and plate values.
  --json         print only the result JSON (docs/result-format.md) on stdout
  --preset P     mesh preset, overriding the file's own (default: the file's, else standard)
  --tolerance X  relative residual of each linear solve (default 1e-10)
  --progress     report progress on stderr
  --frequency F  add losses at F hertz: G', R', attenuation (materials' loss tangents, nets' conductivity)
  --volts V      add the peak field with V volts on the first signal net (others and the reference at 0 V)
  --length L     coupled length in metres for the crosstalk figures
  --rise-time T  rise time in seconds for the crosstalk figures
Exit status: 0 solved, 2 invalid input, 1 other failure.`;

class UsageError extends Error {}

interface Args {
  file: string;
  json: boolean;
  preset?: MeshPreset;
  tolerance?: number;
  progress: boolean;
  frequencyHz?: number;
  volts?: number;
  lengthM?: number;
  riseTimeS?: number;
}

function parseArgs(argv: string[]): Args | 'help' {
  let file: string | undefined;
  const out: Omit<Args, 'file'> = { json: false, progress: false };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i]!;
    const value = (name: string): string => {
      const eq = a.indexOf('=');
      if (eq > 0) return a.slice(eq + 1);
      const v = argv[++i];
      if (v === undefined) throw new UsageError(`${name} needs a value`);
      return v;
    };
    if (a === '--help' || a === '-h') return 'help';
    else if (a === '--json') out.json = true;
    else if (a === '--progress') out.progress = true;
    else if (a === '--preset' || a.startsWith('--preset=')) {
      const p = value('--preset');
      if (!(MESH_PRESETS as readonly string[]).includes(p)) throw new UsageError(`--preset must be one of ${MESH_PRESETS.join(', ')} (got "${p}")`);
      out.preset = p as MeshPreset;
    } else if (a === '--tolerance' || a.startsWith('--tolerance=')) {
      const t = Number(value('--tolerance'));
      if (!(t > 0 && t < 1)) throw new UsageError('--tolerance must be a number between 0 and 1, for example 1e-10');
      out.tolerance = t;
    } else if (a === '--frequency' || a.startsWith('--frequency=')) {
      const f = Number(value('--frequency'));
      if (!(f > 0 && Number.isFinite(f))) throw new UsageError('--frequency must be a positive number of hertz, for example 1e9');
      out.frequencyHz = f;
    } else if (a === '--volts' || a.startsWith('--volts=')) {
      const v = Number(value('--volts'));
      if (!Number.isFinite(v) || v === 0) throw new UsageError('--volts must be a non-zero number of volts, for example 1000');
      out.volts = v;
    } else if (a === '--length' || a.startsWith('--length=')) {
      const v = Number(value('--length'));
      if (!(v > 0 && Number.isFinite(v))) throw new UsageError('--length must be a positive number of metres');
      out.lengthM = v;
    } else if (a === '--rise-time' || a.startsWith('--rise-time=')) {
      const v = Number(value('--rise-time'));
      if (!(v > 0 && Number.isFinite(v))) throw new UsageError('--rise-time must be a positive number of seconds');
      out.riseTimeS = v;
    } else if (a.startsWith('-') && a !== '-') throw new UsageError(`unknown option ${a}`);
    else if (file === undefined) file = a;
    else throw new UsageError(`only one section file at a time (got "${file}" and "${a}")`);
  }
  if (file === undefined) throw new UsageError('no section file given');
  return { file, ...out };
}

// ---------- readable output ----------

const SI: { p: string; f: number }[] = [
  { p: 'n', f: 1e-9 },
  { p: 'p', f: 1e-12 },
  { p: 'f', f: 1e-15 },
  { p: 'a', f: 1e-18 },
];

/** Pick one prefix for a whole matrix of F/m values so that its largest entry reads well. */
function capUnit(values: number[]): { label: string; f: number } {
  const m = Math.max(...values.map(Math.abs));
  const u = SI.find((s) => m >= s.f) ?? SI[SI.length - 1]!;
  return { label: `${u.p}F/m`, f: u.f };
}

const sig = (v: number, n = 5) => {
  if (!Number.isFinite(v)) return String(v);
  const s = v.toPrecision(n);
  return s.includes('e') ? s : String(Number(s));
};
const pct = (rel: number) => (rel < 1e-4 ? `${(rel * 100).toPrecision(2)} %` : `${sig(rel * 100, 2)} %`);

function table(title: string, names: string[], m: number[][], err?: number[][]): string {
  const unit = capUnit(m.flat());
  const cells = m.map((row, i) => row.map((v, j) => `${sig(v / unit.f, 6)}${err ? ` ±${pct(err[i]?.[j] ?? NaN)}` : ''}`));
  const w0 = Math.max(...names.map((n) => n.length), 4);
  const w = Math.max(...cells.flat().map((c) => c.length), ...names.map((n) => n.length)) + 2;
  const lines = [`${title} (${unit.label})`, `  ${''.padEnd(w0)}${names.map((n) => n.padStart(w)).join('')}`];
  cells.forEach((row, i) => lines.push(`  ${names[i]!.padEnd(w0)}${row.map((c) => c.padStart(w)).join('')}`));
  return lines.join('\n');
}

function readable(file: string, units: string, r: SectionResult): string {
  const out: string[] = [];
  const e = r.errorEstimate;
  out.push(`Edgefield solve of ${file}`);
  out.push(`  reference (0 V): ${r.reference.join(', ')}`);
  out.push(`  signal nets, in matrix order: ${r.nets.join(', ')}`);
  if (r.symmetry) {
    out.push(`  mirror boundary (${r.symmetry.mirrors.join(', ')}): the matrices are those of the drawn part; line and plate values are for the whole structure (${r.symmetry.factor} × the drawn part)`);
  }
  out.push('');
  out.push(table('Capacitance per unit length, Maxwell form', r.nets, r.capacitance.maxwell, e.perEntry));
  out.push('');
  out.push(table('Capacitance per unit length, mutual (branch) form', r.nets, r.capacitance.mutual));
  out.push('');
  out.push(table('Capacitance with every dielectric replaced by vacuum, Maxwell form', r.nets, r.capacitance.vacuum));
  out.push('');
  out.push(
    `Estimated relative error: ${pct(e.relative)} (${e.monotone ? 'monotone convergence' : 'convergence NOT monotone'}${e.observedOrder !== undefined ? `, observed order ${sig(e.observedOrder, 3)}` : ''})`,
  );
  if (e.note) out.push(`  ${e.note}`);
  if (r.line) {
    const l = r.line;
    out.push('');
    out.push(`Line values (one signal net, quasi-static${r.symmetry && r.symmetry.factor > 1 ? ', whole structure' : ''}):`);
    out.push(`  C'    = ${sig(l.capacitancePerM * 1e12, 6)} pF/m  ±${pct(e.relative)}`);
    out.push(`  L'    = ${sig(l.inductancePerM * 1e9, 6)} nH/m  ±${pct(e.relative)}`);
    out.push(`  Z0    = ${sig(l.z0Ohm, 6)} Ω  ±${pct(e.relative)}`);
    out.push(`  εeff  = ${sig(l.epsEff, 6)}  ±${pct(2 * e.relative)}`);
    out.push(`  v     = ${sig(l.velocityMPerS, 6)} m/s (${sig(l.velocityMPerS / 299792458, 4)} c)`);
    out.push(`  delay = ${sig(l.delaySPerM * 1e9, 6)} ns/m`);
  }
  if (r.plates) {
    const p = r.plates;
    const u = UNIT_LABELS[units as keyof typeof UNIT_LABELS] ?? units;
    out.push('');
    out.push(p.mirrored ? 'Plate pair (whole pair: the drawn halves end on a mirror boundary):' : 'Plate pair:');
    out.push(`  width (overlap) = ${sig(p.width, 6)} ${u}, gap = ${sig(p.gap, 6)} ${u}, gap/width = ${sig(p.gapToWidth, 4)}`);
    out.push(`  ideal ε·w/d     = ${sig(p.idealPerM * 1e12, 6)} pF/m${p.epsR !== undefined ? ` (εr = ${sig(p.epsR, 4)} in the gap)` : ''}`);
    if (p.solvedPerM !== undefined) out.push(`  solved          = ${sig(p.solvedPerM * 1e12, 6)} pF/m  ±${pct(e.relative)}`);
    out.push(`  solved / ideal  = ${sig(p.solvedOverIdeal, 5)} (fringing adds ${sig((p.solvedOverIdeal - 1) * 100, 3)} %)`);
  }
  const extra = analysisText(r);
  if (extra) out.push('', extra);
  out.push('');
  out.push(`Mesh: ${r.mesh.nx} × ${r.mesh.ny} = ${r.mesh.nodes} nodes (finest member), preset ${r.mesh.preset}, finest spacing ${sig(r.mesh.finestM * 1e6, 4)} µm`);
  out.push(`Solver: ${r.solver.method}, ${r.solver.iterations} iterations, relative residual ${r.solver.relResidual.toExponential(1)}`);
  out.push(`Time: ${Math.round(r.timing.ms)} ms (set-up ${Math.round(r.timing.setupMs)} ms, solve ${Math.round(r.timing.solveMs)} ms)`);
  if (r.warnings.length > 0) {
    out.push('');
    out.push('Warnings:');
    for (const w of r.warnings) out.push(`  - ${w}`);
  }
  return out.join('\n');
}

function fail(status: number, message: string): never {
  process.stderr.write(`${message.endsWith('\n') ? message : `${message}\n`}`);
  process.exit(status);
}

function main(): void {
  let args: Args | 'help';
  try {
    args = parseArgs(process.argv.slice(2));
  } catch (e) {
    if (e instanceof UsageError) fail(2, `solve: ${e.message}\n${USAGE}`);
    throw e;
  }
  if (args === 'help') {
    process.stdout.write(`${USAGE}\n`);
    return;
  }
  // npm runs scripts from the package root; resolve relative paths against the caller's folder.
  const base = process.env.INIT_CWD ?? process.cwd();
  const file = path.resolve(base, args.file);
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder' : code === 'EACCES' ? 'permission denied' : String((e as Error).message);
    fail(2, `solve: cannot read ${args.file}: ${why}`);
  }
  const parsed = parseSectionFile(text);
  if (!parsed.ok) {
    const details = parsed.issues.filter((i) => i.severity === 'error' && i.path && i.path.length > 0);
    const where = details.length === 1 ? ` [at ${formatIssuePath(details[0]!.path)}]` : '';
    fail(2, `solve: ${args.file}: ${parsed.message}${where}`);
  }
  const opts: SolveSectionOptions = {};
  if (args.preset) opts.preset = args.preset;
  if (args.tolerance !== undefined) opts.tolerance = args.tolerance;
  if (args.frequencyHz !== undefined) opts.frequencyHz = args.frequencyHz;
  if (args.volts !== undefined) opts.volts = args.volts;
  if (args.lengthM !== undefined) opts.lengthM = args.lengthM;
  if (args.riseTimeS !== undefined) opts.riseTimeS = args.riseTimeS;
  if (args.progress) {
    let last = 0;
    opts.onProgress = (p) => {
      const t = Date.now();
      if (t - last < 250 && p.stage === 'solve') return;
      last = t;
      const bits = [p.stage, p.level !== undefined ? `level ${p.level}` : '', p.iteration !== undefined ? `iteration ${p.iteration}` : '', p.relResidual !== undefined ? `residual ${p.relResidual.toExponential(1)}` : '', p.fraction !== undefined ? `${Math.round(p.fraction * 100)} %` : ''];
      process.stderr.write(`  ${bits.filter(Boolean).join(', ')}\n`);
    };
  }
  let result: SectionResult;
  try {
    result = solveSection(parsed.section, opts).result;
  } catch (e) {
    if (e instanceof SectionError) fail(2, `solve: ${args.file}: ${e.message}`);
    if (e instanceof RangeError) fail(2, `solve: ${args.file}: the solver refused the section: ${e.message}`);
    fail(1, `solve: ${args.file}: solve failed: ${e instanceof Error ? (e.stack ?? e.message) : String(e)}`);
  }
  if (args.json) process.stdout.write(`${JSON.stringify(result, null, 2)}\n`);
  else process.stdout.write(`${readable(args.file, parsed.section.units, result)}\n`);
}

main();

/**
 * Prints the measured accuracy of the reference cases as a Markdown table (for
 * docs/numerics.md): `npx tsx tests/reference/accuracy-table.ts [quick|standard|precise]`.
 * Times are wall-clock on whatever machine runs it and include every solve (three meshes,
 * and the vacuum solves where there is a dielectric); a shared machine inflates them.
 */
import { solveProblem } from '../../lib/fdm';
import type { MeshPreset } from '../../lib/fdm/types';
import { C0, microstripHammerstadJensen } from '../../lib/analytic/formulas';
import { microstripProblem, REFERENCE_CASES } from './cases';

const preset = (process.argv[2] ?? 'standard') as MeshPreset;
const pct = (x: number) => `${(100 * x).toFixed(4)}%`;
console.log(`| case (${preset}) | reference | true error | estimated error | finest-mesh error | order | nodes (finest) | iterations | time |`);
console.log('|---|---|---|---|---|---|---|---|---|');
for (const c of REFERENCE_CASES) {
  solveProblem(c.problem(preset)); // warm up the JIT so the time is representative
  const t = Date.now();
  const r = solveProblem(c.problem(preset));
  const ms = Date.now() - t;
  const err = r.maxwell[0][0] / c.exact - 1;
  const fin = r.finest.maxwell[0][0] / c.exact - 1;
  console.log(
    `| ${c.name} | ${c.source} | ${pct(err)} | ${pct(r.error.relative)} | ${pct(fin)} | ${r.error.observedOrder?.toFixed(2) ?? '–'} | ${r.mesh.nodes} | ${r.solver.iterations} | ${ms} ms |`,
  );
}
for (const [u, er] of [
  [1, 4.4],
  [3, 9.8],
] as const) {
  const p = microstripProblem(u, 1, er, preset);
  solveProblem(p);
  const t = Date.now();
  const r = solveProblem(p);
  const ms = Date.now() - t;
  const C = r.maxwell[0][0];
  const Cv = r.vacuum[0][0];
  const hj = microstripHammerstadJensen(u, 1, er);
  const z0 = 1 / (C0 * Math.sqrt(C * Cv));
  console.log(
    `| microstrip u = ${u}, εr = ${er}: Z0 / εeff | Hammerstad & Jensen 1980 (±0.01–0.03% Z01, ±0.2% εeff) | ${pct(z0 / hj.z0 - 1)} / ${pct(C / Cv / hj.epsEff - 1)} | ${pct(r.error.relative)} | – | ${r.error.observedOrder?.toFixed(2) ?? '–'} | ${r.mesh.nodes} | ${r.solver.iterations} | ${ms} ms |`,
  );
}

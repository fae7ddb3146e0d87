/**
 * The node limit (MAX_NODES in lib/fdm/solve-problem.ts): a section whose mesh would exceed it
 * is refused while the mesh is being built, before any set-up (operator, multigrid hierarchy)
 * or linear solve starts, with a message that gives the limit and what to change; through
 * solveSection (RangeError) and the CLI (status 2, stderr). The worker's answer to the same
 * section is checked in tests/unit/worker/solver-worker.test.ts.
 * "Before set-up" is shown by the progress stages reported, not by timing.
 * Also: assertFiniteResult refuses a result with a value that is not a finite number.
 */
import { describe, expect, it } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { spawnSync } from 'node:child_process';
import { assertFiniteResult, solveSection } from '@/lib/engine/solve-section';
import type { SectionResult } from '@/lib/engine/types';
import { MAX_NODES } from '@/lib/fdm/solve-problem';
import type { Section } from '@/lib/section/schema';

const LIMIT_MESSAGE = `the mesh would need more than the limit of ${MAX_NODES.toLocaleString('en-US')} nodes: use a coarser preset or a larger finest spacing`;

/**
 * Three traces (2 × 0.3 mm, staggered) over a ground plate 10 mm wide on a εr = 4.4 layer,
 * with the given mesh settings. With the expert controls finest 1e-3 mm (1e-4 of the section,
 * the smallest the checks allow) and growth 1.05 at the precise preset, every trace edge
 * carries a long graded run of fine cells and the mesh passes the node limit.
 */
function traces(mesh: Section['mesh']): Section {
  return {
    format: 'edgefield.section/1',
    units: 'mm',
    background: { epsR: 1 },
    materials: [{ id: 'fr', name: 'substrate', epsR: 4.4 }],
    nets: [
      { name: 'sig', role: 'signal' },
      { name: 'gnd', role: 'ground' },
    ],
    shapes: [
      { id: 'layer', type: 'rect', x: 0, y: 0.5, width: 10, height: 0.5, dielectric: 'fr' },
      { id: 'plate', type: 'rect', x: 0, y: 0, width: 10, height: 0.5, conductor: 'gnd' },
      ...[0, 1, 2].map((i) => ({ id: `trace${i}`, type: 'rect' as const, x: 0.5 + 3.1 * i, y: 1 + 0.37 * i, width: 2, height: 0.3, conductor: 'sig' })),
    ],
    boundary: { left: { type: 'open' }, right: { type: 'open' }, bottom: { type: 'open' }, top: { type: 'open' } },
    mesh,
  };
}
const EXPERT: Section['mesh'] = { preset: 'precise', finest: 1e-3, growth: 1.05 };

/** A conductor polygon of 2000 corners (a wavy circle, every corner on its own mesh lines) over a ground plate. */
const manyCorners: Section = {
  ...traces({ preset: 'precise' }),
  materials: [],
  shapes: [
    { id: 'plate', type: 'rect', x: -3, y: -3, width: 6, height: 0.5, conductor: 'gnd' },
    {
      id: 'wavy',
      type: 'polygon',
      points: Array.from({ length: 2000 }, (_, i) => {
        const a = (2 * Math.PI * i) / 2000;
        const r = 1 + 0.01 * (i % 7);
        return [Math.round(r * Math.cos(a) * 1e9) / 1e9, Math.round(r * Math.sin(a) * 1e9) / 1e9] as [number, number];
      }),
      conductor: 'sig',
    },
  ],
};

function refusal(section: Section): { error: unknown; stages: string[] } {
  const stages: string[] = [];
  try {
    solveSection(section, { onProgress: (p) => stages.push(p.stage) });
  } catch (error) {
    return { error, stages };
  }
  return { error: undefined, stages };
}

describe('node limit', () => {
  it('expert mesh controls (finest 1e-3 mm, growth 1.05, precise) on three traces: refused while meshing, before set-up', () => {
    const { error, stages } = refusal(traces(EXPERT));
    expect(error).toBeInstanceOf(RangeError);
    expect((error as Error).message).toBe(LIMIT_MESSAGE);
    expect(stages.length).toBeGreaterThan(0);
    expect(stages.every((s) => s === 'mesh')).toBe(true);
  });

  it('a 2000-corner polygon at the precise preset: refused while meshing, before set-up', () => {
    const { error, stages } = refusal(manyCorners);
    expect(error).toBeInstanceOf(RangeError);
    expect((error as Error).message).toBe(LIMIT_MESSAGE);
    expect(stages.every((s) => s === 'mesh')).toBe(true);
  });

  it('the same traces without the expert controls solve (the limit is about the mesh asked for)', () => {
    const { result } = solveSection(traces({ preset: 'quick' }));
    expect(result.mesh.nodes).toBeLessThan(MAX_NODES);
    expect(result.capacitance.maxwell[0]![0]!).toBeGreaterThan(0);
  });

  it('the CLI exits with status 2 and the limit on stderr, nothing on stdout', () => {
    const file = path.join(mkdtempSync(path.join(tmpdir(), 'edgefield-limit-')), 'fine.section.json');
    writeFileSync(file, JSON.stringify(traces(EXPERT), null, 2));
    const r = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/solve.ts', file, '--json'], { cwd: path.resolve(import.meta.dirname, '../../..'), encoding: 'utf8' });
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toContain(`the solver refused the section: ${LIMIT_MESSAGE}`);
  });
});

describe('tolerance of the linear solves', () => {
  it('outside 1e-14 … 1e-4 (NaN, 0, 1e-300, 1e-3, 2) is refused before any solving', () => {
    for (const tolerance of [Number.NaN, 0, 1e-300, 1e-3, 2]) {
      let stages = 0;
      expect(() => solveSection(traces({ preset: 'quick' }), { tolerance, onProgress: () => stages++ })).toThrow(
        new RangeError(`the tolerance must be a number from 1e-14 to 0.0001 (got ${tolerance})`),
      );
      expect(stages).toBe(0);
    }
  });
});

describe('assertFiniteResult', () => {
  const result = () => solveSection(traces({ preset: 'quick' })).result;
  it('passes a real result and names the first value that is not finite', () => {
    const good = result();
    expect(() => assertFiniteResult(good)).not.toThrow();
    const nan: SectionResult = structuredClone(good);
    nan.capacitance.maxwell[0]![0] = Number.NaN;
    expect(() => assertFiniteResult(nan)).toThrow('the solver produced a value that is not a finite number (capacitance.maxwell[0][0] = NaN)');
    const inf: SectionResult = structuredClone(good);
    inf.line!.z0Ohm = Infinity;
    expect(() => assertFiniteResult(inf)).toThrow('(line.z0Ohm = Infinity)');
    const est: SectionResult = structuredClone(good);
    est.errorEstimate.relative = Number.NaN;
    expect(() => assertFiniteResult(est)).toThrow('(errorEstimate.relative = NaN)');
  });
});

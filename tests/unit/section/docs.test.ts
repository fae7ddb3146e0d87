import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { parseSectionFile } from '@/lib/section/parse';
import { sectionSchemaJson } from '@/lib/section/json-schema';
import { Ajv2020 } from 'ajv/dist/2020';
import { solveSection } from '@/lib/engine/solve-section';
import type { SectionResult } from '@/lib/engine/types';
import { SHARED_SAMPLES } from '../../support/shared';

const root = path.resolve(import.meta.dirname, '../../..');

describe('docs/section-format.md', () => {
  const md = readFileSync(path.join(root, 'docs/section-format.md'), 'utf8');
  const blocks = [...md.matchAll(/```json\n([\s\S]*?)```/g)].map((m) => m[1]!);

  it('has at least five complete examples', () => {
    expect(blocks.length).toBeGreaterThanOrEqual(5);
  });

  blocks.forEach((text, k) => {
    const title = /"title":\s*"([^"]*)"/.exec(text)?.[1] ?? `block ${k + 1}`;
    it(`example ${k + 1} (${title}) is a valid section with no warning`, () => {
      const r = parseSectionFile(text);
      expect(r.ok ? r.warnings : r.message).toEqual([]);
    });
  });

  it('covers every shape type and boundary kind', () => {
    const all = blocks.join('\n');
    for (const t of ['rect', 'circle', 'ring', 'polygon', 'strip']) expect(all).toContain(`"type": "${t}"`);
    for (const b of ['ground', 'mirror']) expect(all).toContain(`"type": "${b}"`);
  });
});

describe('docs/section.schema.json', () => {
  it('equals a fresh generation from the zod schema (run npm run gen:schema)', () => {
    expect(readFileSync(path.join(root, 'docs/section.schema.json'), 'utf8')).toBe(sectionSchemaJson());
  });
});

describe('docs/section-format.md examples solve to the values the text states', () => {
  const md = readFileSync(path.join(root, 'docs/section-format.md'), 'utf8');
  const blocks = [...md.matchAll(/```json\n([\s\S]*?)```/g)].map((m) => m[1]!);
  const byTitle = (t: string) => {
    const b = blocks.find((x) => x.includes(t));
    if (!b) throw new Error(`no example titled ${t}`);
    return b;
  };
  const EPS0 = 8.8541878128e-12; // CODATA 2018
  const cases: { title: string; exact: (r: SectionResult) => [number, number]; source: string }[] = [
    // Method of images: C' = 2πε0 / arccosh(h/a), h = 3 mm, a = 0.5 mm.
    { title: 'Wire over a ground plane', exact: (r) => [r.capacitance.maxwell[0]![0]!, (2 * Math.PI * EPS0) / Math.acosh(6)], source: 'method of images (exact)' },
    // Gauss's law: C' = 2πε0εr / ln(b/a).
    { title: 'Coaxial cable with a PTFE-like fill', exact: (r) => [r.capacitance.maxwell[0]![0]!, (2 * Math.PI * EPS0 * 2.1) / Math.log(1.5 / 0.46)], source: "Gauss's law (exact)" },
    // Cohn 1954, IRE Trans. MTT 2:52: Z0 = (30π/√εr)·K(k)/K(k'), k = sech(πw/2b).
    { title: 'Centred stripline', exact: (r) => [r.line!.z0Ohm, cohnZ0(8, 20, 3)], source: 'Cohn 1954 (exact)' },
    // Whole pair (mirrored halves): ideal ε0·w/d with w = 400 µm, d = 50 µm.
    { title: 'Sensor plate pair', exact: (r) => [r.plates!.idealPerM, (EPS0 * 400) / 50], source: 'parallel-plate formula' },
  ];
  for (const c of cases) {
    it(`${c.title}: within the estimated error of ${c.source}`, () => {
      const parsed = parseSectionFile(byTitle(c.title));
      if (!parsed.ok) throw new Error(parsed.message);
      const { result } = solveSection(parsed.section, { preset: 'quick' });
      const [got, want] = c.exact(result);
      const err = Math.abs(got / want - 1);
      // Line impedance and the ideal plate value are exact to rounding or follow C' (Z0 ∝ 1/C').
      expect(err).toBeLessThanOrEqual(Math.max(result.errorEstimate.relative, 1e-12));
    });
  }
});

/** Complete elliptic integral of the first kind by the arithmetic-geometric mean (Abramowitz & Stegun 17.6). */
function ellipK(k: number): number {
  let a = 1,
    b = Math.sqrt(1 - k * k);
  for (let i = 0; i < 40 && Math.abs(a - b) > 1e-16 * a; i++) [a, b] = [(a + b) / 2, Math.sqrt(a * b)];
  return Math.PI / (2 * a);
}
function cohnZ0(w: number, b: number, epsR: number): number {
  const k = 1 / Math.cosh((Math.PI * w) / (2 * b));
  return ((30 * Math.PI) / Math.sqrt(epsR)) * (ellipK(k) / ellipK(Math.sqrt(1 - k * k)));
}

describe('docs/section.schema.json as a JSON Schema (checked with Ajv, draft 2020-12)', () => {
  const schema = JSON.parse(readFileSync(path.join(root, 'docs/section.schema.json'), 'utf8'));
  const ajv = new Ajv2020({ allErrors: true, strict: false });
  const validate = ajv.compile(schema);
  const md = readFileSync(path.join(root, 'docs/section-format.md'), 'utf8');
  const blocks = [...md.matchAll(/```json\n([\s\S]*?)```/g)].map((m) => m[1]!);
  const samples = ['coax', 'plates', 'twin-wires'].map((n) => readFileSync(`${SHARED_SAMPLES}/${n}.section.json`, 'utf8'));

  it('accepts every documentation example and shared sample', () => {
    for (const text of [...blocks, ...samples]) {
      const ok = validate(JSON.parse(text));
      expect(ok ? [] : validate.errors).toEqual([]);
    }
  });

  it('refuses structural mistakes', () => {
    const good = JSON.parse(samples[0]!);
    const bad = [
      { ...good, format: 'edgefield.section/2' },
      { ...good, units: 'cm' },
      { ...good, extra: 1 },
      { ...good, shapes: [{ ...good.shapes[0], type: 'blob' }] },
      { ...good, shapes: [{ ...good.shapes[1], r: null }] },
      { ...good, nets: [] },
      { ...good, boundary: { left: { type: 'ground' } } },
    ];
    for (const b of bad) expect(validate(b)).toBe(false);
  });
});

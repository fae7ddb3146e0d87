import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { resolveSection } from '@/lib/section/resolve';
import { convertSection, convertSectionDetailed, convertResolvedSection, formatLength, formatMetres, toMetres, fromMetres } from '@/lib/section/units';
import { parseSectionFile } from '@/lib/section/parse';
import { locateJsonError } from '@/lib/section/json-locate';
import { section } from './helpers';
import { SHARED_SAMPLES } from '../../support/shared';

const nets = [
  { name: 'sig', role: 'signal' },
  { name: 'gnd', role: 'ground' },
];

describe('resolveSection', () => {
  it('resolves variables and expressions everywhere', () => {
    const r = resolveSection(section({
      variables: { w: 2, d: 'w/4', er: '4.4' },
      materials: [{ id: 'fr4', name: 'FR-4 class laminate', epsR: 'er', lossTangent: '0.02' }],
      background: { epsR: '1' },
      nets,
      shapes: [
        { id: 'trace', type: 'rect', x: '-w/2', y: 'd', width: 'w', height: 0.035, conductor: 'sig' },
        { id: 'poly', type: 'polygon', points: [[0, 0], ['w', 0], ['w', 'd']], dielectric: 'fr4' },
      ],
      boundary: { bottom: { type: 'ground', at: '-d' } },
    }));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const s = r.section;
    expect(s.variables).toEqual({ w: 2, d: 0.5, er: 4.4 });
    expect(s.materials[0]).toEqual({ id: 'fr4', name: 'FR-4 class laminate', epsR: 4.4, lossTangent: 0.02 });
    expect(s.shapes[0]).toEqual({ id: 'trace', type: 'rect', x: -1, y: 0.5, width: 2, height: 0.035, conductor: 'sig' });
    expect(s.shapes[1]).toMatchObject({ points: [[0, 0], [2, 0], [2, 0.5]] });
    expect(s.boundary.bottom).toEqual({ type: 'ground', at: -0.5 });
    expect(s.boundary.top).toEqual({ type: 'open' });
  });

  it('reports each failing value with its path and shape id', () => {
    const r = resolveSection(section({
      variables: { w: 1 },
      nets,
      shapes: [
        { id: 'a', type: 'rect', x: 0, y: 0, width: 1, height: 1, conductor: 'sig' },
        { id: 'b', type: 'rect', x: 0, y: 0, width: 1, height: 1, conductor: 'sig' },
        { id: 'c', type: 'rect', x: 0, y: 0, width: 1, height: 1, conductor: 'sig' },
        { id: 'top', type: 'rect', x: 0, y: 0, width: 'w/2 + wd', height: '(w', conductor: 'sig' },
      ],
    }));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issues).toEqual([
      { severity: 'error', code: 'expression', message: `shape "top": width: unknown name 'wd' at column 7`, path: ['shapes', 3, 'width'], shapeIds: ['top'] },
      { severity: 'error', code: 'expression', message: `shape "top": height: missing ')' at column 3`, path: ['shapes', 3, 'height'], shapeIds: ['top'] },
    ]);
    expect(Number.isNaN((r.partial.shapes[3] as { width: number }).width)).toBe(true);
    expect((r.partial.shapes[2] as { width: number }).width).toBe(1);
  });

  it('names a broken variable instead of calling it unknown, and reports the cycle', () => {
    const r = resolveSection(section({ variables: { w: 'd', d: 'w' }, nets, shapes: [{ id: 's', type: 'circle', cx: 0, cy: 0, r: 'w', conductor: 'sig' }] }));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issues.map((i) => i.message)).toEqual([
      'variables form a cycle: w → d → w',
      `shape "s": r: uses variable 'w', which has an error`,
    ]);
    expect(r.issues[0]!.path).toEqual(['variables', 'w']);
  });
});

describe('units', () => {
  it('toMetres and fromMetres use exact unit definitions', () => {
    // 1 mil = 25.4 µm and 1 in = 25.4 mm exactly (international yard and pound agreement, 1959).
    expect(toMetres(1, 'mil')).toBeCloseTo(25.4e-6, 20);
    expect(toMetres(2, 'in')).toBeCloseTo(0.0508, 16);
    expect(fromMetres(0.001, 'um')).toBeCloseTo(1000, 9);
  });

  it('formats lengths', () => {
    expect(formatLength(1.23456, 'mm')).toBe('1.235 mm');
    expect(formatLength(35, 'um')).toBe('35 µm');
    expect(formatMetres(3.5e-4)).toBe('350 µm');
    expect(formatMetres(0.0254)).toBe('25.4 mm');
    expect(formatMetres(0)).toBe('0 m');
  });

  const expressive = () => section({
    variables: { w: 1.2, h: 0.8, gap: 'w/4', k: 2 },
    materials: [{ id: 'm', name: 'M', epsR: 'k*2' }],
    nets,
    shapes: [
      { id: 't', type: 'rect', x: '-w/2', y: 'h', width: 'w', height: 0.035, conductor: 'sig' },
      { id: 'c', type: 'circle', cx: 'w + gap', cy: 'h', r: 0.1, conductor: 'sig' },
      { id: 'sub', type: 'polygon', points: [[-5, 0], [5, 0], [5, 'h'], [-5, 'h']], dielectric: 'm' },
    ],
    boundary: { bottom: { type: 'ground', at: 0 } },
    mesh: { preset: 'quick', finest: 0.01 },
  });

  it('round trip mm → um → mm gives the same resolved lengths', () => {
    const s0 = expressive();
    const s1 = convertSection(s0, 'um');
    const s2 = convertSection(s1, 'mm');
    const r0 = resolveSection(s0), r2 = resolveSection(s2), r1 = resolveSection(s1);
    if (!r0.ok || !r1.ok || !r2.ok) throw new Error('does not resolve');
    expect(r1.section.units).toBe('um');
    expect((r1.section.shapes[0] as { width: number }).width).toBeCloseTo(1200, 9);
    expect((r1.section.shapes[1] as { cx: number }).cx).toBeCloseTo(1500, 9);
    expect(r1.section.mesh?.finest).toBeCloseTo(10, 12);
    expect(r1.section.materials[0]!.epsR).toBe(4); // not a length: unchanged
    expect(r2.section).toEqual(r0.section);
  });

  it('scales the variables when that is exact, keeping expressions readable', () => {
    const c = convertSectionDetailed(expressive(), 'um');
    expect(c.strategy).toBe('scale-variables');
    expect(c.section.variables).toEqual({ w: 1200, h: 800, gap: 'w/4', k: 2 });
    expect((c.section.shapes[0] as { x: unknown }).x).toBe('-w/2');
    expect((c.section.shapes[0] as { height: unknown }).height).toBe(35);
  });

  it('wraps the expressions when a literal in an expression is a length', () => {
    const s = section({ variables: { w: 1 }, nets, shapes: [{ id: 't', type: 'rect', x: 'w + 1', y: 0, width: 'w', height: 1, conductor: 'sig' }], boundary: { bottom: { type: 'ground', at: -1 } } });
    const c = convertSectionDetailed(s, 'mil');
    expect(c.strategy).toBe('wrap-expressions');
    expect(c.section.variables).toEqual({ w: 1 });
    expect((c.section.shapes[0] as { x: unknown }).x).toBe('(w + 1)*39.3700787401575');
    const r = resolveSection(c.section);
    if (!r.ok) throw new Error('does not resolve');
    expect((r.section.shapes[0] as { x: number }).x).toBeCloseTo(2 / 0.0254, 9);
    expect((r.section.boundary.bottom as { at: number }).at).toBeCloseTo(-1 / 0.0254, 9);
  });

  it('does not scale a variable that is also used for a permittivity', () => {
    const s = section({ variables: { a: 2 }, materials: [{ id: 'm', name: 'M', epsR: 'a' }], nets, shapes: [{ id: 't', type: 'rect', x: 0, y: 0, width: 'a', height: 1, conductor: 'sig' }, { id: 'g', type: 'rect', x: 0, y: -3, width: 1, height: 1, conductor: 'gnd' }] });
    const c = convertSectionDetailed(s, 'um');
    expect(c.strategy).toBe('wrap-expressions');
    const r = resolveSection(c.section);
    if (!r.ok) throw new Error('does not resolve');
    expect(r.section.materials[0]!.epsR).toBe(2);
    expect((r.section.shapes[0] as { width: number }).width).toBeCloseTo(2000, 9);
  });

  it('converts resolved sections', () => {
    const r = resolveSection(expressive());
    if (!r.ok) throw new Error('does not resolve');
    const m = convertResolvedSection(r.section, 'm');
    expect((m.shapes[0] as { width: number }).width).toBeCloseTo(0.0012, 15);
    expect(convertResolvedSection(m, 'mm')).toEqual(r.section);
  });
});

describe('parseSectionFile', () => {
  it('JSON syntax errors give line and column', () => {
    const text = '{\n  "format": "edgefield.section/1",\n  "units": "mm"\n  "nets": []\n}';
    const r = parseSectionFile(text);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.stage).toBe('json');
    expect(r.message).toBe(`not valid JSON: line 4, column 3: expected ',' or '}' after a property value but found '"'`);
  });

  it('locates other JSON mistakes', () => {
    expect(locateJsonError('{"a": 1,}')).toMatchObject({ line: 1, column: 9, message: "trailing comma before '}' (JSON allows none)" });
    expect(locateJsonError("{'a': 1}")).toMatchObject({ line: 1, column: 2 });
    expect(locateJsonError('[1, 2')).toMatchObject({ line: 1, column: 6, message: "expected ',' or ']' after a list item but found the end of the file" });
    expect(locateJsonError('{"a": "x\n"}')).toMatchObject({ line: 1, column: 9 });
    expect(locateJsonError('{} x')).toMatchObject({ column: 4 });
    expect(locateJsonError('{"a": [true, null, -1.5e3, "\\u00e9"]}')).toBeNull();
  });

  it('schema problems name the shape by index and id', () => {
    const r = parseSectionFile(JSON.stringify({
      format: 'edgefield.section/1',
      units: 'mm',
      nets: [{ name: 'a', role: 'signal' }],
      shapes: [
        { id: 'ok', type: 'circle', cx: 0, cy: 0, r: 1, conductor: 'a' },
        { id: 'ok2', type: 'circle', cx: 0, cy: 0, r: 1, conductor: 'a' },
        { id: 'top', type: 'rect', x: 0, y: 0, width: true, height: 1, conductor: 'a' },
      ],
    }));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.stage).toBe('schema');
    expect(r.message).toBe('not a valid section: shapes[2] (id "top"): width: must be a number or an expression string (got boolean)');
    expect(r.issues[0]!.shapeIds).toEqual(['top']);
  });

  it('a number that is not finite', () => {
    const r = parseSectionFile('{"format": "edgefield.section/1", "units": "mm", "nets": [{"name": "a", "role": "signal"}], "shapes": [{"id": "top", "type": "rect", "x": 0, "y": 0, "width": 1e999, "height": 1, "conductor": "a"}]}');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toBe('not a valid section: shapes[0] (id "top"): width: must be a finite number');
  });

  it('several problems are listed', () => {
    const r = parseSectionFile(JSON.stringify({ format: 'edgefield.section/1', units: 'cm', nets: [{ name: 'a', role: 'sig' }], shapes: [{ id: 's', type: 'blob' }], extra: 1 }));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.message.split('\n')).toEqual([
      'not a valid section (4 problems):',
      '  units: must be one of "m", "mm", "um", "mil", "in" (got the string "cm")',
      '  nets[0] (name "a"): role: must be one of "signal", "ground" (got the string "sig")',
      '  shapes[0] (id "s"): type: must be one of "rect", "circle", "ring", "polygon", "strip" (got the string "blob")',
      '  unknown field "extra"',
    ]);
  });

  it('not a section at all', () => {
    for (const [text, msg] of [
      ['[]', 'not a section: expected a JSON object with "format": "edgefield.section/1", got a list'],
      ['{"units": "mm"}', 'not an Edgefield section: "format" is missing: an Edgefield section starts with "format": "edgefield.section/1"'],
      ['', 'not JSON: the file is empty'],
    ] as const) {
      const r = parseSectionFile(text);
      expect(r.ok ? 'ok' : r.message).toBe(msg);
    }
  });

  it('resolve and check failures come after the schema', () => {
    const base = { format: 'edgefield.section/1', units: 'mm', nets };
    const r1 = parseSectionFile(JSON.stringify({ ...base, shapes: [{ id: 's', type: 'circle', cx: 0, cy: 0, r: 'rr', conductor: 'sig' }] }));
    expect(r1.ok ? '' : r1.stage).toBe('resolve');
    const r2 = parseSectionFile(JSON.stringify({ ...base, shapes: [{ id: 's', type: 'circle', cx: 0, cy: 0, r: 1, conductor: 'sig' }] }));
    expect(r2.ok ? '' : r2.stage).toBe('check');
    expect(r2.ok ? '' : r2.message).toContain('no reference');
  });

  it('a valid file with a warning', () => {
    const r = parseSectionFile(readFileSync(`${SHARED_SAMPLES}/coax.section.json`, 'utf8').replace('"nets": [', '"nets": [{"name": "spare", "role": "signal"},'));
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.warnings.map((w) => w.code)).toEqual(['empty-net']);
  });

  it('a byte order mark is accepted', () => {
    expect(parseSectionFile('\ufeff' + readFileSync(`${SHARED_SAMPLES}/plates.section.json`, 'utf8')).ok).toBe(true);
  });
});

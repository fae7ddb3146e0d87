/**
 * Drawing import (issue 7): the SVG and DXF readers, the layer mapping to a section, and
 * that the sample drawings (made for these tests, tests/fixtures/import) solve.
 */
import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ImportError, MAX_DRAWING_BYTES, drawingToSection, readDrawing, readDxf, readSvg, type ImportOptions } from '@/lib/import';
import { flattenPath, parseTransform } from '@/lib/import/svg';
import { signedArea } from '@/lib/import/geometry';
import { solveSection } from '@/lib/engine/solve-section';

const fixture = (f: string) => fs.readFileSync(path.resolve('tests/fixtures/import', f), 'utf8');
const svg = (body: string, attrs = 'viewBox="0 0 10 10"') => `<svg xmlns="http://www.w3.org/2000/svg" ${attrs}>${body}</svg>`;

describe('SVG reader', () => {
  it('reads the sample: layers from <g>, units from width/viewBox, y flipped, transforms applied', () => {
    const d = readSvg(fixture('microstrip-and-wire.svg'));
    expect(d.declaredUnits).toBe('mm');
    expect(d.layers).toEqual([
      { name: 'FR4', shapes: 1 },
      { name: 'GND', shapes: 1 },
      { name: 'TRACE', shapes: 1 },
      { name: 'wire', shapes: 1 },
    ]);
    const byLayer = Object.fromEntries(d.shapes.map((s) => [s.layer, s]));
    expect(byLayer.FR4).toMatchObject({ type: 'rect', x: 2, width: 16 });
    expect(byLayer.FR4!.type === 'rect' && byLayer.FR4.y).toBeCloseTo(-6.6, 12);
    expect(byLayer.FR4!.type === 'rect' && byLayer.FR4.height).toBeCloseTo(1.6, 12);
    // The trace path (relative commands under translate(8 0)) is an axis-aligned box → rect.
    expect(byLayer.TRACE).toMatchObject({ type: 'rect', x: 9, width: 2 });
    expect(byLayer.TRACE!.type === 'rect' && byLayer.TRACE.y).toBeCloseTo(-5, 12);
    // circle r=0.15 under translate(15 3) scale(2): centre (15, -3), r 0.3.
    expect(byLayer.wire).toMatchObject({ type: 'circle', cx: 15, cy: -3 });
    expect(byLayer.wire!.type === 'circle' && byLayer.wire.r).toBeCloseTo(0.3, 12);
    expect(d.warnings.join(' ')).toMatch(/<text>.*skipped/);
    expect(d.warnings.join(' ')).toMatch(/<line>.*skipped/);
  });

  it('composes transforms in SVG order (rotate about a point, then translate)', () => {
    // Exact arithmetic on the transform definitions of SVG 1.1, section 7.6 (W3C, 2011).
    const m = parseTransform('translate(10,0) rotate(90 1 1)', 't');
    const at = (x: number, y: number) => [m[0] * x + m[2] * y + m[4], m[1] * x + m[3] * y + m[5]];
    const p = at(2, 1); // (2,1) rotated 90° about (1,1) is (1,2); then +10 in x
    expect(p[0]).toBeCloseTo(11, 12);
    expect(p[1]).toBeCloseTo(2, 12);
    expect(() => parseTransform('rotate(1,2)', 't')).toThrow(ImportError);
    expect(() => parseTransform('spin(3)', 't')).toThrow(/not understood/);
  });

  it('a rotated rect becomes a polygon of the right area; a rotated circle stays a circle', () => {
    const d = readSvg(svg('<rect x="0" y="0" width="4" height="2" transform="rotate(30)"/><circle cx="1" cy="1" r="2" transform="rotate(45)"/>'));
    const poly = d.shapes.find((s) => s.type === 'polygon');
    expect(poly?.type === 'polygon' && Math.abs(signedArea(poly.points))).toBeCloseTo(8, 10);
    const c = d.shapes.find((s) => s.type === 'circle');
    expect(c).toMatchObject({ type: 'circle' });
    expect(c?.type === 'circle' && c.r).toBeCloseTo(2, 12);
  });

  it('an ellipse becomes a polygon with a warning; its area approaches πab', () => {
    const d = readSvg(svg('<ellipse cx="0" cy="0" rx="3" ry="1"/>'));
    const p = d.shapes[0]!;
    expect(p.type).toBe('polygon');
    // Inscribed 48-gon of an ellipse: area = (n/2) a b sin(2π/n) (exact for the affine image of a regular polygon).
    const n = p.type === 'polygon' ? p.points.length : 0;
    expect(n).toBe(48);
    expect(p.type === 'polygon' && Math.abs(signedArea(p.points))).toBeCloseTo((n / 2) * 3 * Math.sin((2 * Math.PI) / n), 9);
    expect(d.warnings[0]).toMatch(/ellipse.*polygon/);
  });

  it('flattens H/V/L, cubic, quadratic and arc commands; end points are exact', () => {
    const [a] = flattenPath('M0 0 H 4 V 2 L 0 2 Z', 'p');
    expect(a).toEqual({ points: [[0, 0], [4, 0], [4, 2], [0, 2]], closed: true });
    const [b] = flattenPath('M0 0 C 0 1 1 1 1 0 S 2 -1 2 0 Q 3 1 4 0 T 6 0 A 1 1 0 0 1 8 0 z', 'p');
    expect(b!.closed).toBe(true);
    const pts = b!.points;
    // Every command's end point is on the outline.
    for (const q of [[1, 0], [2, 0], [4, 0], [6, 0], [8, 0]]) {
      expect(pts.some((p) => Math.abs(p[0] - q[0]!) < 1e-12 && Math.abs(p[1] - q[1]!) < 1e-12)).toBe(true);
    }
    // The arc from (6,0) to (8,0) with r = 1 is a half circle: every flattened point is 1 from (7,0).
    const arc = pts.slice(pts.findIndex((p) => p[0] === 6 && p[1] === 0) + 1);
    for (const p of arc) expect(Math.hypot(p[0] - 7, p[1])).toBeCloseTo(1, 9);
    expect(() => flattenPath('L 1 1', 'p')).toThrow(/must start with a move/);
    expect(() => flattenPath('M 0 0 L 1', 'p')).toThrow(/needs 2 numbers/);
    expect(() => flattenPath('M 0 0 % 1', 'p')).toThrow(/unexpected character/);
  });

  it('layer names: data-layer wins over the enclosing group', () => {
    const d = readSvg(svg('<g id="outer"><rect width="1" height="1"/><g data-layer="copper"><g id="inner"><rect x="2" width="1" height="1"/></g></g></g><rect x="5" width="1" height="1"/>'));
    expect(d.shapes.map((s) => s.layer)).toEqual(['outer', 'copper', '(no layer)']);
  });

  it('malformed or empty SVG: a clear error', () => {
    expect(() => readSvg('<svg><rect width="1" height="1"></svg>')).toThrow(/not well-formed XML.*line 1/);
    expect(() => readSvg('<html></html>')).toThrow(/not an SVG/);
    expect(() => readSvg(svg('<text>hi</text>'))).toThrow(/no outlines/);
    expect(() => readSvg(svg('<rect width="1mm" height="1"/>'))).toThrow(/not a plain number/);
  });
});

describe('DXF reader', () => {
  it('reads the sample: polylines, LINE+ARC chains, bulges, circles, $INSUNITS', () => {
    const d = readDxf(fixture('electrode-pair.dxf'));
    expect(d.declaredUnits).toBe('mm');
    expect(d.layers).toEqual([
      { name: 'DRIVE', shapes: 1 },
      { name: 'GLASS', shapes: 1 },
      { name: 'SENSE', shapes: 1 },
      { name: 'SHIELD', shapes: 2 },
    ]);
    const drive = d.shapes.find((s) => s.layer === 'DRIVE');
    expect(drive).toEqual({ type: 'rect', layer: 'DRIVE', source: expect.stringContaining('A1'), x: -3, y: 0, width: 2, height: 0.1 });
    // Glass: 8 × 1 box whose left side is a half circle of r 0.5 bulging out: area 8 + π/8 (minus
    // the flattening deficit of the inscribed polygon, < 1 %).
    const glass = d.shapes.find((s) => s.layer === 'GLASS');
    expect(glass?.type).toBe('polygon');
    const area = glass?.type === 'polygon' ? Math.abs(signedArea(glass.points)) : 0;
    expect(area).toBeGreaterThan(8 + (Math.PI / 8) * 0.99);
    expect(area).toBeLessThanOrEqual(8 + Math.PI / 8);
    // Shield: the bottom edge bulges down by sagitta = bulge × chord / 2 = 0.05 × 8 / 2 = 0.2 (DXF bulge definition).
    const shield = d.shapes.find((s) => s.layer === 'SHIELD' && s.type === 'polygon');
    const ymin = shield?.type === 'polygon' ? Math.min(...shield.points.map((p) => p[1])) : 0;
    expect(ymin).toBeCloseTo(-1.7, 9);
    expect(d.shapes.find((s) => s.type === 'circle')).toMatchObject({ cx: 0, cy: 1.5, r: 0.25, layer: 'SHIELD' });
    expect(d.warnings).toEqual(['1 TEXT entity was skipped (not an outline).']);
  });

  it('lines that do not close are skipped with a warning', () => {
    const dxf = ['0', 'SECTION', '2', 'ENTITIES', '0', 'LINE', '8', 'L', '10', '0', '20', '0', '11', '1', '21', '0', '0', 'CIRCLE', '8', 'C', '10', '0', '20', '0', '40', '1', '0', 'ENDSEC', '0', 'EOF'].join('\n');
    const d = readDxf(dxf);
    expect(d.shapes).toHaveLength(1);
    expect(d.warnings.join(' ')).toMatch(/Layer "L": 1 chain .* did not close/);
  });

  it('not a DXF, or no outlines: a clear error', () => {
    expect(() => readDxf('hello')).toThrow(/not a DXF/);
    expect(() => readDxf(['0', 'SECTION', '2', 'ENTITIES', '0', 'ENDSEC', '0', 'EOF'].join('\n'))).toThrow(/no closed outlines/);
  });
});

describe('readDrawing', () => {
  it('refuses oversized, binary and unknown files, naming the problem', () => {
    expect(() => readDrawing('big.svg', 'x', MAX_DRAWING_BYTES + 1)).toThrow(/at most 2 MB/);
    expect(() => readDrawing('a.svg', 'ab\u0000cd')).toThrow(/binary/);
    expect(() => readDrawing('a.png', 'PNG...')).toThrow(/Only SVG \(.svg\) and DXF/);
  });
});

describe('drawing → section → solve', () => {
  const svgOptions: ImportOptions = {
    units: 'mm',
    layers: {
      FR4: { as: 'dielectric', material: 'fr4', name: 'FR-4', epsR: 4.3 },
      GND: { as: 'conductor', net: 'gnd', role: 'ground' },
      TRACE: { as: 'conductor', net: 'trace', role: 'signal' },
      wire: { as: 'conductor', net: 'wire', role: 'signal' },
    },
  };

  it('the SVG sample gives the expected section and solves', () => {
    const out = drawingToSection(readSvg(fixture('microstrip-and-wire.svg')), svgOptions);
    const s = out.section;
    expect(s.units).toBe('mm');
    expect(s.nets).toEqual([
      { name: 'gnd', role: 'ground' },
      { name: 'trace', role: 'signal' },
      { name: 'wire', role: 'signal' },
    ]);
    expect(s.materials).toEqual([{ id: 'fr4', name: 'FR-4', epsR: 4.3 }]);
    expect(s.shapes.map((x) => [x.id, x.type])).toEqual([
      ['fr4-1', 'rect'],
      ['gnd-1', 'rect'],
      ['trace-1', 'rect'],
      ['wire-1', 'circle'],
    ]);
    expect(s.shapes[0]).toMatchObject({ x: 2, y: -6.6, width: 16, height: 1.6, dielectric: 'fr4' });
    expect(out.counts).toEqual({ conductors: 3, dielectrics: 1, ignored: 0 });

    const { result } = solveSection(s, { preset: 'quick' });
    expect(result.nets).toEqual(['trace', 'wire']);
    const C = result.capacitance.maxwell;
    // Known properties of the Maxwell capacitance matrix: symmetric, positive diagonal,
    // negative off-diagonal (from memory; e.g. any electrostatics text on multi-conductor systems).
    expect(C[0]![0]).toBeGreaterThan(0);
    expect(C[1]![1]).toBeGreaterThan(0);
    expect(C[0]![1]).toBeLessThan(0);
    expect(Math.abs(C[0]![1]! - C[1]![0]!)).toBeLessThan(1e-3 * C[0]![0]!);
    // A 2 mm trace on 1.6 mm FR-4 (w/h = 1.25) has C' of order 100 pF/m (magnitude check, from memory).
    expect(C[0]![0]).toBeGreaterThan(40e-12);
    expect(C[0]![0]).toBeLessThan(250e-12);
  }, 120_000);

  it('the DXF sample, with the glass as a dielectric and notes ignored, gives the expected section and solves', () => {
    const out = drawingToSection(readDxf(fixture('electrode-pair.dxf')), {
      units: 'mm',
      layers: {
        DRIVE: { as: 'conductor', net: 'drive', role: 'signal' },
        SENSE: { as: 'conductor', net: 'sense', role: 'signal' },
        GLASS: { as: 'dielectric', material: 'glass', epsR: 6.7 },
        SHIELD: { as: 'conductor', net: 'shield', role: 'ground' },
      },
    });
    expect(out.section.shapes.map((x) => [x.id, x.type, x.conductor ?? x.dielectric])).toEqual([
      ['glass-1', 'polygon', 'glass'],
      ['drive-1', 'rect', 'drive'],
      ['sense-1', 'rect', 'sense'],
      ['shield-1', 'polygon', 'shield'],
      ['shield-2', 'circle', 'shield'],
    ]);
    const { result } = solveSection(out.section, { preset: 'quick' });
    expect(result.nets).toEqual(['drive', 'sense']);
    const C = result.capacitance.maxwell;
    expect(C[0]![0]).toBeGreaterThan(0);
    expect(C[0]![1]).toBeLessThan(0);
    // Mirror-symmetric electrodes (the shield's circle and bulge are symmetric too): equal self terms.
    expect(Math.abs(C[0]![0]! - C[1]![1]!) / C[0]![0]!).toBeLessThan(0.02);
  }, 120_000);

  it('a mapping that shorts two nets, or leaves a layer unmapped, is refused with a clear message', () => {
    const d = readSvg(fixture('microstrip-and-wire.svg'));
    expect(() => drawingToSection(d, { ...svgOptions, layers: { ...svgOptions.layers, FR4: { as: 'conductor', net: 'trace', role: 'signal' } } })).toThrow(
      /short circuit/,
    );
    const { wire: _w, ...rest } = svgOptions.layers;
    expect(() => drawingToSection(d, { ...svgOptions, layers: rest })).toThrow(/Choose what layer "wire" is/);
    expect(() =>
      drawingToSection(d, { ...svgOptions, layers: { ...svgOptions.layers, wire: { as: 'conductor', net: 'gnd', role: 'signal' } } }),
    ).toThrow(/both signal and ground/);
  });
});

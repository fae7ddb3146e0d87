import { describe, expect, it } from 'vitest';
import { templateSection } from '@/lib/section/templates';
import { resolveSection } from '@/lib/section/resolve';
import type { ResolvedSection, Section } from '@/lib/section/schema';
import * as cmd from '@/lib/editor/commands';
import { addToValue, parseTyped, renameIdentifier } from '@/lib/editor/values';
import { shapeBox } from '@/lib/editor/geometry';

const resolved = (d: Section): ResolvedSection => {
  const r = resolveSection(d);
  if (!r.ok) throw new Error(r.issues.map((i) => i.message).join('; '));
  return r.section;
};
const rect = (id: string, x: number, y: number, w: number, h: number, net = 'trace') =>
  ({ id, type: 'rect', conductor: net, x, y, width: w, height: h }) as const;

function blank(): Section {
  const d = templateSection('microstrip');
  return { ...d, shapes: [] };
}

describe('values (common practice, no published source)', () => {
  it('adds a constant to numbers and keeps expressions', () => {
    expect(addToValue(1.2, 0.1)).toBe(1.3);
    expect(addToValue('w/2', 0.5)).toBe('w/2 + 0.5');
    expect(addToValue('w/2 + 0.5', -0.5)).toBe('w/2');
    expect(addToValue('w/2 - 1', 0.25)).toBe('w/2 - 0.75');
    expect(addToValue('x*1e-3', 1)).toBe('x*1e-3 + 1');
    expect(addToValue('-(s/2 + g)', 2)).toBe('-(s/2 + g) + 2');
  });
  it('parses what is typed: numbers stay numbers', () => {
    expect(parseTyped(' 2.5 ')).toBe(2.5);
    expect(parseTyped('1e-3')).toBe(0.001);
    expect(parseTyped('w/2 + d')).toBe('w/2 + d');
  });
  it('renames whole identifiers only', () => {
    expect(renameIdentifier('w + w2 + max(w, ww)', 'w', 'width')).toBe('width + w2 + max(width, ww)');
  });
});

describe('shape commands', () => {
  it('moves shapes, keeping expressions and their variables', () => {
    const d = templateSection('microstrip');
    const moved = cmd.moveShapes(d, ['trace'], 0.5, 0);
    const t = moved.shapes.find((s) => s.id === 'trace')!;
    expect(t.type === 'rect' && t.x).toBe('-w/2 + 0.5');
    const r = resolved(moved).shapes.find((s) => s.id === 'trace')!;
    expect(r.type === 'rect' && r.x).toBeCloseTo(-0.95 + 0.5, 12);
    // The input is untouched (commands are pure).
    expect(d.shapes.find((s) => s.id === 'trace')!.type === 'rect' && (d.shapes.find((s) => s.id === 'trace') as { x: unknown }).x).toBe('-w/2');
  });

  it('duplicates with fresh ids and an offset, deletes', () => {
    let d = blank();
    d = cmd.addShape(d, rect('a', 0, 0, 1, 1));
    const { doc, ids } = cmd.duplicateShapes(d, ['a'], 2, 0);
    expect(ids).toEqual(['a_copy_1']);
    expect(doc.shapes.map((s) => s.id)).toEqual(['a', 'a_copy_1']);
    expect((doc.shapes[1] as { x: number }).x).toBe(2);
    expect(cmd.deleteShapes(doc, ['a']).shapes.map((s) => s.id)).toEqual(['a_copy_1']);
    expect(() => cmd.addShape(doc, rect('a', 0, 0, 1, 1))).toThrow(cmd.CommandError);
  });

  it('reorders: forward, backward, front, back', () => {
    let d = blank();
    for (const id of ['a', 'b', 'c', 'd']) d = cmd.addShape(d, rect(id, 0, 0, 1, 1));
    const ids = (x: Section) => x.shapes.map((s) => s.id).join('');
    expect(ids(cmd.reorderShapes(d, ['b'], 'forward'))).toBe('acbd');
    expect(ids(cmd.reorderShapes(d, ['c'], 'backward'))).toBe('acbd');
    expect(ids(cmd.reorderShapes(d, ['a', 'c'], 'front'))).toBe('bdac');
    expect(ids(cmd.reorderShapes(d, ['d'], 'back'))).toBe('dabc');
    expect(cmd.reorderShapes(d, ['d'], 'forward')).toBe(d);
  });

  it('aligns left edges, centres and tops', () => {
    let d = blank();
    d = cmd.addShape(d, rect('a', 0, 0, 2, 1));
    d = cmd.addShape(d, rect('b', 5, 3, 1, 2));
    const left = resolved(cmd.alignShapes(d, resolved(d).shapes, ['a', 'b'], 'left'));
    expect(left.shapes.map((s) => shapeBox(s).minX)).toEqual([0, 0]);
    const mid = resolved(cmd.alignShapes(d, resolved(d).shapes, ['a', 'b'], 'hcentre'));
    // Selection spans x 0..6, centre 3.
    expect(mid.shapes.map((s) => (shapeBox(s).minX + shapeBox(s).maxX) / 2)).toEqual([3, 3]);
    const top = resolved(cmd.alignShapes(d, resolved(d).shapes, ['a', 'b'], 'top'));
    expect(top.shapes.map((s) => shapeBox(s).maxY)).toEqual([5, 5]);
  });

  it('distributes with equal gaps, keeping the outermost in place', () => {
    let d = blank();
    d = cmd.addShape(d, rect('a', 0, 0, 1, 1));
    d = cmd.addShape(d, rect('b', 1.5, 0, 2, 1));
    d = cmd.addShape(d, rect('c', 9, 0, 1, 1));
    const r = resolved(cmd.distributeShapes(d, resolved(d).shapes, ['a', 'b', 'c'], 'x'));
    const boxes = r.shapes.map(shapeBox);
    // Span 0..10, sizes 1+2+1 = 4, two gaps of 3: b from 4 to 6.
    expect(boxes[0]!.minX).toBe(0);
    expect(boxes[1]!.minX).toBeCloseTo(4, 12);
    expect(boxes[2]!.minX).toBe(9);
    expect(cmd.distributeShapes(d, resolved(d).shapes, ['a', 'b'], 'x')).toBe(d);
  });

  it('writes handle geometry only into fields that changed, so expressions survive', () => {
    const d = templateSection('microstrip');
    const trace = resolved(d).shapes.find((s) => s.id === 'trace')!;
    const next = cmd.setShapeGeometry(d, trace, { x: -0.95, y: 1, width: 3, height: 0.035 });
    const t = next.shapes.find((s) => s.id === 'trace') as { x: unknown; width: unknown; height: unknown };
    expect(t.x).toBe('-w/2');
    expect(t.height).toBe('t');
    expect(t.width).toBe(3);
  });

  it('changes a shape to a dielectric, but never a strip', () => {
    const d = templateSection('stripline');
    const n = cmd.setShapeRole(d, ['strip', 'core'], { dielectric: 'glass-epoxy' });
    expect(n.shapes.find((s) => s.id === 'strip')!.conductor).toBe('strip');
    expect(() => cmd.setShapeRole(d, ['core'], { conductor: 'nope' })).toThrow(/no net "nope"/);
  });
});

describe('nets, materials, variables', () => {
  it('renames a net everywhere and refuses duplicates', () => {
    const d = templateSection('coplanar');
    const n = cmd.renameNet(d, 'gnd', 'return');
    expect(n.shapes.filter((s) => s.conductor === 'return').map((s) => s.id)).toEqual(['gnd_left', 'gnd_right']);
    expect(() => cmd.renameNet(d, 'gnd', 'centre')).toThrow(/already exists/);
    expect(() => cmd.deleteNet(d, 'gnd')).toThrow(/used by "gnd_left", "gnd_right"/);
    const added = cmd.addNet(d, 'signal');
    expect(added.name).toBe('net1');
    expect(cmd.deleteNet(added.doc, 'net1').nets.length).toBe(2);
  });

  it('adds materials with unique ids and refuses to delete used ones', () => {
    const d = templateSection('microstrip');
    const r = cmd.addMaterial(d, { id: 'glass-epoxy', name: 'Other', epsR: 4 });
    expect(r.id).toBe('glass-epoxy_2');
    expect(() => cmd.deleteMaterial(d, 'glass-epoxy')).toThrow(/used by "laminate"/);
  });

  it('renames a variable in every expression and refuses to delete a used one', () => {
    const d = templateSection('coplanar');
    const n = cmd.renameVariable(d, 'g', 'gap');
    expect(n.variables).toHaveProperty('gap', 0.25);
    expect(n.variables).not.toHaveProperty('g');
    expect((n.shapes.find((s) => s.id === 'gnd_right') as { x1: unknown }).x1).toBe('s/2 + gap');
    expect(resolved(n).shapes).toEqual(resolved(d).shapes);
    expect(() => cmd.deleteVariable(d, 'g')).toThrow(/"g" is used by/);
    expect(() => cmd.setVariable(d, '2w', 1)).toThrow(/not a valid variable name/);
  });

  it('changing a variable moves every dependant', () => {
    const d = templateSection('edge-coupled-pair');
    const before = resolved(d);
    const after = resolved(cmd.setVariable(d, 's', 10));
    const pBefore = shapeBox(before.shapes.find((s) => s.id === 'trace_n')!);
    const pAfter = shapeBox(after.shapes.find((s) => s.id === 'trace_n')!);
    expect(pAfter.minX - pBefore.minX).toBeCloseTo(2, 12); // s/2 grows from 3 to 5
  });
});

/** diffSections: shapes matched by id, field-level changes, section settings (issue 7 history). */
import { describe, expect, it } from 'vitest';
import { diffSections } from '@/lib/teamwork/section-diff';
import { sectionSchema } from '@/lib/section/schema';

const base = sectionSchema.parse({
  format: 'edgefield.section/1',
  units: 'mm',
  materials: [{ id: 'fr4', name: 'FR-4', epsR: 4.3 }],
  nets: [
    { name: 'sig', role: 'signal' },
    { name: 'gnd', role: 'ground' },
  ],
  shapes: [
    { id: 'sub', type: 'rect', x: -5, y: 0, width: 10, height: 1.6, dielectric: 'fr4' },
    { id: 'trace', type: 'rect', x: -1, y: 1.6, width: 2, height: 0.035, conductor: 'sig' },
    { id: 'plane', type: 'rect', x: -5, y: -0.035, width: 10, height: 0.035, conductor: 'gnd' },
  ],
});

describe('diffSections', () => {
  it('identical sections: everything unchanged', () => {
    const d = diffSections(base, structuredClone(base));
    expect(d.counts).toEqual({ added: 0, removed: 0, changed: 0, unchanged: 3 });
    expect(d.settings).toEqual([]);
  });

  it('finds added, removed and changed shapes with the changed fields, and changed settings', () => {
    const after = structuredClone(base);
    after.shapes[1] = { ...after.shapes[1]!, width: 2.5 } as (typeof after.shapes)[number];
    after.shapes = after.shapes.filter((s) => s.id !== 'plane');
    after.shapes.push({ id: 'guard', type: 'circle', cx: 3, cy: 2, r: 0.2, conductor: 'gnd' });
    after.materials = [{ id: 'fr4', name: 'FR-4', epsR: 4.5 }];
    const d = diffSections(base, after);
    expect(d.shapes).toEqual([
      { id: 'sub', change: 'unchanged', fields: [] },
      { id: 'trace', change: 'changed', fields: ['width'] },
      { id: 'guard', change: 'added', fields: [] },
      { id: 'plane', change: 'removed', fields: [] },
    ]);
    expect(d.settings).toEqual(['materials']);
    expect(d.counts).toEqual({ added: 1, removed: 1, changed: 1, unchanged: 1 });
  });

  it('key order does not count as a change; a role change does', () => {
    const after = structuredClone(base);
    const t = after.shapes[1]!;
    after.shapes[1] = JSON.parse(JSON.stringify({ conductor: 'sig', height: 0.035, width: 2, y: 1.6, x: -1, type: 'rect', id: t.id }));
    expect(diffSections(base, after).counts.changed).toBe(0);
    after.shapes[1] = { ...after.shapes[1]!, conductor: 'gnd' } as (typeof after.shapes)[number];
    expect(diffSections(base, after).shapes[1]).toEqual({ id: 'trace', change: 'changed', fields: ['conductor'] });
  });
});

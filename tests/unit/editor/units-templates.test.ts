import { describe, expect, it } from 'vitest';
import { sectionSchema, type Section } from '@/lib/section/schema';
import { resolveSection } from '@/lib/section/resolve';
import { checkSection } from '@/lib/section/check';
import { TEMPLATES, templateSection } from '@/lib/section/templates';
import { MATERIALS_LIBRARY } from '@/lib/section/materials-library';
import { convertUnits, lengthVariables } from '@/lib/editor/units';
import { analyseSection } from '@/lib/editor/analyse';
import { addShape } from '@/lib/editor/commands';
import { loadDraft, saveDraft, clearDraft } from '@/lib/editor/draft';

const resolved = (d: Section) => {
  const r = resolveSection(d);
  if (!r.ok) throw new Error(r.issues.map((i) => i.message).join('; '));
  return r.section;
};

describe('starting sections', () => {
  it.each(TEMPLATES.map((t) => t.id))('%s is valid by the schema and passes checkSection with no errors', (id) => {
    const s = templateSection(id);
    const parsed = sectionSchema.safeParse(s);
    expect(parsed.success).toBe(true);
    const issues = checkSection(resolved(s));
    expect(issues.filter((i) => i.severity === 'error')).toEqual([]);
    expect(analyseSection(s).canSolve).toBe(true);
    // Parametrised: named dimensions exist and shapes use them through expressions.
    expect(Object.keys(s.variables ?? {}).length).toBeGreaterThan(0);
    const usesExpression = s.shapes.some((sh) => Object.entries(sh).some(([k, v]) => k !== 'id' && k !== 'type' && k !== 'conductor' && k !== 'dielectric' && typeof v === 'string'));
    expect(usesExpression).toBe(true);
  });
  it('returns fresh copies', () => {
    const a = templateSection('coax');
    a.shapes.pop();
    expect(templateSection('coax').shapes.length).toBe(3);
  });
});

describe('materials library', () => {
  it('gives every entry a source and values inside its stated range (REFERENCES.md §7)', () => {
    for (const m of MATERIALS_LIBRARY) {
      expect(m.source.length).toBeGreaterThan(10);
      expect(m.epsR).toBeGreaterThanOrEqual(1);
      const nums = m.ranges.epsR.match(/\d+(\.\d+)?/g)!.map(Number);
      expect(m.epsR).toBeGreaterThanOrEqual(Math.min(...nums) - 1e-9);
      expect(m.epsR).toBeLessThanOrEqual(Math.max(...nums) + 1e-9);
    }
  });
});

describe('unit conversion of the document (1 mil = 25.4 µm exactly, by definition of the inch)', () => {
  it('keeps every physical length when going mm → mil → mm', () => {
    const d = templateSection('microstrip');
    const before = resolved(d);
    const { doc, notes } = convertUnits(d, 'mil');
    expect(notes).toEqual([]);
    expect(doc.units).toBe('mil');
    expect(doc.variables!.w).toBeCloseTo(1.9 / 0.0254, 9);
    // Expressions stay expressions.
    expect((doc.shapes[1] as { x: unknown }).x).toBe('-w/2');
    const after = resolved(doc);
    const t0 = before.shapes[1]!;
    const t1 = after.shapes[1]!;
    if (t0.type !== 'rect' || t1.type !== 'rect') throw new Error('rect expected');
    expect(t1.width * 25.4e-6).toBeCloseTo(t0.width * 1e-3, 15);
    const back = convertUnits(doc, 'mm').doc;
    expect(back.variables!.w).toBeCloseTo(1.9, 12);
    expect(back.boundary.bottom).toEqual({ type: 'ground', at: 0 });
  });

  it('freezes an expression that does not scale, and says so', () => {
    const d = { ...templateSection('microstrip') };
    d.shapes = d.shapes.map((s) => (s.id === 'trace' ? { ...s, x: 'w/2 + 0.1' } : s)) as Section['shapes'];
    const before = resolved(d);
    const { doc, notes } = convertUnits(d, 'um');
    expect(notes.length).toBe(1);
    expect(notes[0]).toMatch(/trace\.x/);
    const after = resolved(doc);
    const x0 = (before.shapes[1] as { x: number }).x;
    const x1 = (after.shapes[1] as { x: number }).x;
    expect(x1).toBeCloseTo(x0 * 1000, 9);
  });

  it('does not scale variables used only by material values', () => {
    const d = addShape({ ...templateSection('microstrip'), variables: { ...templateSection('microstrip').variables, er: 4.4 } }, {
      id: 'x',
      type: 'rect',
      dielectric: 'glass-epoxy',
      x: 0,
      y: 5,
      width: 1,
      height: 1,
    });
    d.materials = d.materials.map((m) => ({ ...m, epsR: 'er' }));
    expect(lengthVariables(d).has('er')).toBe(false);
    const { doc } = convertUnits(d, 'in');
    expect(doc.variables!.er).toBe(4.4);
  });
});

describe('live analysis', () => {
  it('flags a short circuit between nets and blocks solving', () => {
    const d = addShape(templateSection('edge-coupled-pair'), { id: 'bridge', type: 'rect', conductor: 'p', x: -4, y: 4, width: 8, height: 1.4 });
    const a = analyseSection(d);
    expect(a.canSolve).toBe(false);
    expect(a.issues.some((i) => i.severity === 'error' && i.shapeIds?.includes('bridge'))).toBe(true);
    expect(a.byShape.get('bridge')?.length).toBeGreaterThan(0);
  });
  it('reports unknown names and cycles in variables', () => {
    const d = { ...templateSection('coax'), variables: { a: 'b2 * 2', b: 'c', c: 'b', s: 0.2 } };
    const a = analyseSection(d);
    expect(a.canSolve).toBe(false);
    const msgs = a.issues.map((i) => i.message).join('\n');
    expect(msgs).toMatch(/b2/);
    expect(msgs).toMatch(/cycle/);
  });
});

describe('drafts kept in the browser', () => {
  it('stores, loads and clears a draft; ignores garbage', () => {
    const mem = new Map<string, string>();
    const store = { getItem: (k: string) => mem.get(k) ?? null, setItem: (k: string, v: string) => void mem.set(k, v), removeItem: (k: string) => void mem.delete(k) };
    const s = templateSection('coax');
    saveDraft(store, 'sec1', s, 'rev1', new Date('2026-01-02T03:04:05Z'));
    const d = loadDraft(store, 'sec1');
    expect(d?.baseRevisionId).toBe('rev1');
    expect(d?.content).toEqual(sectionSchema.parse(s));
    mem.set('edgefield:draft:sec2', '{"content":{"format":"nope"},"savedAt":"x"}');
    expect(loadDraft(store, 'sec2')).toBeNull();
    clearDraft(store, 'sec1');
    expect(loadDraft(store, 'sec1')).toBeNull();
  });
});

/**
 * Resolve a section: evaluate the named variables, then every value that may be an
 * expression, giving a `ResolvedSection` in which every value is a number (still in the
 * section's units). Range checks (width > 0, εr ≥ 1 ...) are not made here but in
 * check.ts, which runs on the resolved section.
 */
import type { ResolvedSection, Section, Value } from './schema';
import { evaluateExpression, expressionDependencies, resolveVariables } from './expression';
import type { IssuePath, SectionIssue } from './issues';

export type ResolveResult =
  | { ok: true; section: ResolvedSection }
  | {
      ok: false;
      issues: SectionIssue[];
      /** The section with every value that could be resolved; the others are NaN (for live drawing only). */
      partial: ResolvedSection;
    };

/** Who a value belongs to, for messages: `shape "top"`, `material "fr4"`, `background`. */
interface Owner {
  label: string;
  shapeId?: string;
  net?: string;
}

export function resolveSection(section: Section): ResolveResult {
  const issues: SectionIssue[] = [];
  const vars = section.variables ?? {};
  const vr = resolveVariables(vars);
  const values = vr.values;
  if (!vr.ok) {
    for (const e of vr.errors) {
      issues.push({ severity: 'error', code: e.cycle ? 'variable-cycle' : 'variable', message: e.message, path: ['variables', e.name] });
    }
  }

  const val = (v: Value, path: IssuePath, field: string, owner: Owner): number => {
    if (typeof v === 'number') return v;
    const r = evaluateExpression(v, values);
    if (r.ok) return r.value;
    // Name a failing variable rather than calling it unknown.
    const broken = expressionDependencies(v).filter((d) => Object.hasOwn(vars, d) && !Object.hasOwn(values, d));
    const message =
      broken.length > 0
        ? `${owner.label}: ${field}: uses variable ${broken.map((b) => `'${b}'`).join(', ')}, which has an error`
        : `${owner.label}: ${field}: ${r.error.message}`;
    issues.push({
      severity: 'error',
      code: 'expression',
      message,
      path,
      ...(owner.shapeId !== undefined ? { shapeIds: [owner.shapeId] } : {}),
      ...(owner.net !== undefined ? { net: owner.net } : {}),
    });
    return NaN;
  };
  const opt = (v: Value | undefined, path: IssuePath, field: string, owner: Owner): number | undefined =>
    v === undefined ? undefined : val(v, path, field, owner);

  const bgOwner: Owner = { label: 'background' };
  const background: ResolvedSection['background'] = {
    epsR: val(section.background.epsR, ['background', 'epsR'], 'epsR', bgOwner),
  };
  if (section.background.lossTangent !== undefined) {
    background.lossTangent = val(section.background.lossTangent, ['background', 'lossTangent'], 'lossTangent', bgOwner);
  }

  const materials: ResolvedSection['materials'] = section.materials.map((m, i) => {
    const owner: Owner = { label: `material "${m.id}"` };
    const out: ResolvedSection['materials'][number] = {
      id: m.id,
      name: m.name,
      epsR: val(m.epsR, ['materials', i, 'epsR'], 'epsR', owner),
    };
    const lt = opt(m.lossTangent, ['materials', i, 'lossTangent'], 'lossTangent', owner);
    if (lt !== undefined) out.lossTangent = lt;
    const bd = opt(m.breakdownKVPerMm, ['materials', i, 'breakdownKVPerMm'], 'breakdownKVPerMm', owner);
    if (bd !== undefined) out.breakdownKVPerMm = bd;
    if (m.source !== undefined) out.source = m.source;
    return out;
  });

  const nets: ResolvedSection['nets'] = section.nets.map((n, i) => {
    const owner: Owner = { label: `net "${n.name}"`, net: n.name };
    const out: ResolvedSection['nets'][number] = { name: n.name, role: n.role };
    const c = opt(n.conductivitySPerM, ['nets', i, 'conductivitySPerM'], 'conductivitySPerM', owner);
    if (c !== undefined) out.conductivitySPerM = c;
    if (n.color !== undefined) out.color = n.color;
    return out;
  });

  const shapes: ResolvedSection['shapes'] = section.shapes.map((s, i) => {
    const owner: Owner = { label: `shape "${s.id}"`, shapeId: s.id };
    const base = {
      id: s.id,
      ...(s.label !== undefined ? { label: s.label } : {}),
      ...(s.conductor !== undefined ? { conductor: s.conductor } : {}),
      ...(s.dielectric !== undefined ? { dielectric: s.dielectric } : {}),
    };
    const f = (key: string, v: Value) => val(v, ['shapes', i, key], key, owner);
    switch (s.type) {
      case 'rect':
        return { ...base, type: 'rect', x: f('x', s.x), y: f('y', s.y), width: f('width', s.width), height: f('height', s.height) };
      case 'circle':
        return { ...base, type: 'circle', cx: f('cx', s.cx), cy: f('cy', s.cy), r: f('r', s.r) };
      case 'ring':
        return {
          ...base,
          type: 'ring',
          cx: f('cx', s.cx),
          cy: f('cy', s.cy),
          rInner: f('rInner', s.rInner),
          rOuter: f('rOuter', s.rOuter),
        };
      case 'strip':
        return { ...base, type: 'strip', x1: f('x1', s.x1), y1: f('y1', s.y1), x2: f('x2', s.x2), y2: f('y2', s.y2) };
      case 'polygon':
        return {
          ...base,
          type: 'polygon',
          points: s.points.map(
            ([x, y], k) =>
              [
                val(x, ['shapes', i, 'points', k, 0], `points[${k}].x`, owner),
                val(y, ['shapes', i, 'points', k, 1], `points[${k}].y`, owner),
              ] as [number, number],
          ),
        };
    }
  });

  const side = (key: 'left' | 'right' | 'bottom' | 'top'): ResolvedSection['boundary']['left'] => {
    const b = section.boundary[key];
    if (b.type === 'open') return { type: 'open' };
    return { type: b.type, at: val(b.at, ['boundary', key, 'at'], 'at', { label: `boundary ${key}` }) };
  };
  const boundary: ResolvedSection['boundary'] = {
    left: side('left'),
    right: side('right'),
    bottom: side('bottom'),
    top: side('top'),
  };

  const resolved: ResolvedSection = {
    format: section.format,
    ...(section.title !== undefined ? { title: section.title } : {}),
    units: section.units,
    ...(section.variables !== undefined ? { variables: { ...values } } : {}),
    background,
    materials,
    nets,
    shapes,
    boundary,
    ...(section.mesh !== undefined ? { mesh: { ...section.mesh } } : {}),
  };
  if (issues.length > 0) return { ok: false, issues, partial: resolved };
  return { ok: true, section: resolved };
}

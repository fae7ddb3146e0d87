/**
 * Editor commands: pure functions from a section (the document, values may be expressions)
 * to a new section. Nothing here mutates its input; unchanged parts are shared, so the undo
 * history can keep whole documents cheaply.
 *
 * Commands that need positions (align, distribute, handle drags) take the resolved shapes
 * (all numbers) alongside; they write numbers only into the fields they must change and
 * keep expressions (adding a constant) when they merely move a shape.
 */
import type { Boundary, BoundarySide, Material, Net, ResolvedShape, Section, Shape, Value } from '../section/schema';
import { shapeBox, type Box } from './geometry';
import type { GeometryPatch } from './handles';
import { pickNetColor } from './palette';
import { addToValue, identifiersOf, renameIdentifier, tidy } from './values';

export class CommandError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'CommandError';
  }
}

const ID_RE = /^[A-Za-z0-9_.-]+$/;

/** A fresh shape id like "rect_3" that the section does not use yet. */
export function newShapeId(doc: Section, prefix: string): string {
  const used = new Set(doc.shapes.map((s) => s.id));
  for (let i = 1; ; i++) {
    const id = `${prefix}_${i}`;
    if (!used.has(id)) return id;
  }
}

export function addShape(doc: Section, shape: Shape): Section {
  if (doc.shapes.some((s) => s.id === shape.id)) throw new CommandError(`a shape with id "${shape.id}" already exists`);
  return { ...doc, shapes: [...doc.shapes, shape] };
}

function mapShapes(doc: Section, ids: ReadonlySet<string>, f: (s: Shape) => Shape): Section {
  let changed = false;
  const shapes = doc.shapes.map((s) => {
    if (!ids.has(s.id)) return s;
    const n = f(s);
    if (n !== s) changed = true;
    return n;
  });
  return changed ? { ...doc, shapes } : doc;
}

/** Geometry fields of each shape type (positions and sizes). */
export const GEOMETRY_FIELDS = {
  rect: ['x', 'y', 'width', 'height'],
  circle: ['cx', 'cy', 'r'],
  ring: ['cx', 'cy', 'rInner', 'rOuter'],
  strip: ['x1', 'y1', 'x2', 'y2'],
  polygon: [],
} as const;

/** Set one geometry field (or a polygon vertex coordinate "points.3.0") to a value. */
export function setShapeValue(doc: Section, id: string, field: string, value: Value): Section {
  return mapShapes(doc, new Set([id]), (s) => {
    if (s.type === 'polygon') {
      const m = /^points\.(\d+)\.([01])$/.exec(field);
      if (!m) throw new CommandError(`polygon "${id}" has no field "${field}"`);
      const i = Number(m[1]);
      const k = Number(m[2]) as 0 | 1;
      if (i >= s.points.length) throw new CommandError(`polygon "${id}" has no point ${i + 1}`);
      const points = s.points.map((p, j) => (j === i ? ((k === 0 ? [value, p[1]] : [p[0], value]) as [Value, Value]) : p));
      return { ...s, points };
    }
    const fields = GEOMETRY_FIELDS[s.type] as readonly string[];
    if (!fields.includes(field)) throw new CommandError(`${s.type} "${id}" has no field "${field}"`);
    if ((s as Record<string, unknown>)[field] === value) return s;
    return { ...s, [field]: value } as Shape;
  });
}

export function setShapeLabel(doc: Section, id: string, label: string): Section {
  return mapShapes(doc, new Set([id]), (s) => {
    const next = { ...s };
    if (label.trim()) next.label = label.trim();
    else delete next.label;
    return next;
  });
}

/** Make shapes conductors of a net or dielectrics of a material. */
export function setShapeRole(doc: Section, ids: readonly string[], role: { conductor: string } | { dielectric: string }): Section {
  if ('conductor' in role && !doc.nets.some((n) => n.name === role.conductor)) throw new CommandError(`there is no net "${role.conductor}"`);
  if ('dielectric' in role && !doc.materials.some((m) => m.id === role.dielectric)) {
    throw new CommandError(`there is no material "${role.dielectric}"`);
  }
  return mapShapes(doc, new Set(ids), (s) => {
    if ('dielectric' in role && s.type === 'strip') return s; // a strip has zero thickness: conductor only
    const { conductor: _c, dielectric: _d, ...rest } = s;
    return { ...rest, ...role } as Shape;
  });
}

export function renameShape(doc: Section, id: string, newId: string): Section {
  const t = newId.trim();
  if (!t || !ID_RE.test(t) || t.length > 64) throw new CommandError('a shape id holds letters, digits, "_", "-" or "." (at most 64)');
  if (t === id) return doc;
  if (doc.shapes.some((s) => s.id === t)) throw new CommandError(`a shape with id "${t}" already exists`);
  return mapShapes(doc, new Set([id]), (s) => ({ ...s, id: t }));
}

/** Move shapes by (dx, dy) section units; expressions keep their variables and gain a constant. */
export function moveShapes(doc: Section, ids: readonly string[], dx: number, dy: number): Section {
  if (dx === 0 && dy === 0) return doc;
  return mapShapes(doc, new Set(ids), (s) => moveShape(s, dx, dy));
}

function moveShape(s: Shape, dx: number, dy: number): Shape {
  switch (s.type) {
    case 'rect':
      return { ...s, x: addToValue(s.x, dx), y: addToValue(s.y, dy) };
    case 'circle':
    case 'ring':
      return { ...s, cx: addToValue(s.cx, dx), cy: addToValue(s.cy, dy) };
    case 'strip':
      return { ...s, x1: addToValue(s.x1, dx), y1: addToValue(s.y1, dy), x2: addToValue(s.x2, dx), y2: addToValue(s.y2, dy) };
    case 'polygon':
      return { ...s, points: s.points.map(([x, y]) => [addToValue(x, dx), addToValue(y, dy)] as [Value, Value]) };
  }
}

export function deleteShapes(doc: Section, ids: readonly string[]): Section {
  const set = new Set(ids);
  if (!doc.shapes.some((s) => set.has(s.id))) return doc;
  return { ...doc, shapes: doc.shapes.filter((s) => !set.has(s.id)) };
}

/** Copies of the shapes, offset by (dx, dy), placed right above their originals' topmost. */
export function duplicateShapes(doc: Section, ids: readonly string[], dx: number, dy: number): { doc: Section; ids: string[] } {
  const set = new Set(ids);
  let next = doc;
  const newIds: string[] = [];
  for (const s of doc.shapes) {
    if (!set.has(s.id)) continue;
    const base = s.id.replace(/_copy(_\d+)?$/, '');
    const nid = newShapeId(next, `${base}_copy`);
    next = { ...next, shapes: [...next.shapes, { ...moveShape(structuredClone(s), dx, dy), id: nid }] };
    newIds.push(nid);
  }
  return { doc: next, ids: newIds };
}

export type ReorderOp = 'forward' | 'backward' | 'front' | 'back';

/** Change drawing order (later shapes cover earlier ones within dielectrics and within conductors). */
export function reorderShapes(doc: Section, ids: readonly string[], op: ReorderOp): Section {
  const set = new Set(ids);
  const shapes = [...doc.shapes];
  if (op === 'front' || op === 'back') {
    const sel = shapes.filter((s) => set.has(s.id));
    const rest = shapes.filter((s) => !set.has(s.id));
    return { ...doc, shapes: op === 'front' ? [...rest, ...sel] : [...sel, ...rest] };
  }
  if (op === 'forward') {
    for (let i = shapes.length - 2; i >= 0; i--) {
      if (set.has(shapes[i]!.id) && !set.has(shapes[i + 1]!.id)) [shapes[i], shapes[i + 1]] = [shapes[i + 1]!, shapes[i]!];
    }
  } else {
    for (let i = 1; i < shapes.length; i++) {
      if (set.has(shapes[i]!.id) && !set.has(shapes[i - 1]!.id)) [shapes[i], shapes[i - 1]] = [shapes[i - 1]!, shapes[i]!];
    }
  }
  return shapes.every((s, i) => s === doc.shapes[i]) ? doc : { ...doc, shapes };
}

export type AlignOp = 'left' | 'hcentre' | 'right' | 'bottom' | 'vcentre' | 'top';

/** Align the selected shapes' bounding boxes to the selection's edge or centre line. */
export function alignShapes(doc: Section, resolved: readonly ResolvedShape[], ids: readonly string[], op: AlignOp): Section {
  const set = new Set(ids);
  const boxes = resolved.filter((s) => set.has(s.id)).map((s) => ({ id: s.id, b: shapeBox(s) }));
  if (boxes.length < 2) return doc;
  const minX = Math.min(...boxes.map((e) => e.b.minX));
  const maxX = Math.max(...boxes.map((e) => e.b.maxX));
  const minY = Math.min(...boxes.map((e) => e.b.minY));
  const maxY = Math.max(...boxes.map((e) => e.b.maxY));
  let next = doc;
  for (const { id, b } of boxes) {
    let dx = 0;
    let dy = 0;
    if (op === 'left') dx = minX - b.minX;
    else if (op === 'right') dx = maxX - b.maxX;
    else if (op === 'hcentre') dx = (minX + maxX) / 2 - (b.minX + b.maxX) / 2;
    else if (op === 'bottom') dy = minY - b.minY;
    else if (op === 'top') dy = maxY - b.maxY;
    else dy = (minY + maxY) / 2 - (b.minY + b.maxY) / 2;
    next = moveShapes(next, [id], tidy(dx), tidy(dy));
  }
  return next;
}

/** Space three or more shapes so the gaps between neighbours are equal; the outermost stay put. */
export function distributeShapes(doc: Section, resolved: readonly ResolvedShape[], ids: readonly string[], axis: 'x' | 'y'): Section {
  const set = new Set(ids);
  const lo = (b: Box) => (axis === 'x' ? b.minX : b.minY);
  const hi = (b: Box) => (axis === 'x' ? b.maxX : b.maxY);
  const items = resolved
    .filter((s) => set.has(s.id))
    .map((s) => ({ id: s.id, b: shapeBox(s) }))
    .sort((a, b) => lo(a.b) + hi(a.b) - (lo(b.b) + hi(b.b)));
  if (items.length < 3) return doc;
  const total = items.reduce((acc, e) => acc + (hi(e.b) - lo(e.b)), 0);
  const span = hi(items[items.length - 1]!.b) - lo(items[0]!.b);
  const gap = (span - total) / (items.length - 1);
  let pos = lo(items[0]!.b);
  let next = doc;
  for (const e of items) {
    const d = tidy(pos - lo(e.b));
    next = axis === 'x' ? moveShapes(next, [e.id], d, 0) : moveShapes(next, [e.id], 0, d);
    pos += hi(e.b) - lo(e.b) + gap;
  }
  return next;
}

/**
 * Write new numeric geometry into a shape (from a handle drag). Only fields whose value
 * really changed are overwritten, so expressions on the untouched ones survive.
 */
export function setShapeGeometry(doc: Section, current: ResolvedShape, geometry: GeometryPatch): Section {
  return mapShapes(doc, new Set([current.id]), (s) => {
    const next: Record<string, unknown> = { ...s };
    let changed = false;
    for (const [k, v] of Object.entries(geometry)) {
      if (typeof v !== 'number') continue;
      const old = (current as Record<string, unknown>)[k];
      if (typeof old === 'number' && Math.abs(old - v) <= 1e-12 * Math.max(1, Math.abs(v))) continue;
      next[k] = tidy(v);
      changed = true;
    }
    if (geometry.points && s.type === 'polygon' && current.type === 'polygon') {
      next.points = geometry.points.map(([x, y], i) => {
        const op = current.points[i];
        const sp = s.points[i];
        const same = (a: number | undefined, b: number) => a !== undefined && Math.abs(a - b) <= 1e-12 * Math.max(1, Math.abs(b));
        return [sp && op && same(op[0], x) ? sp[0] : tidy(x), sp && op && same(op[1], y) ? sp[1] : tidy(y)];
      });
      changed = true;
    }
    return changed ? (next as Shape) : s;
  });
}

// ---------------------------------------------------------------- nets

export function addNet(doc: Section, role: 'signal' | 'ground', name?: string): { doc: Section; name: string } {
  const used = new Set(doc.nets.map((n) => n.name));
  let n = name?.trim();
  if (n) {
    if (used.has(n)) throw new CommandError(`a net named "${n}" already exists`);
  } else {
    const prefix = role === 'ground' ? 'gnd' : 'net';
    for (let i = 1; ; i++) if (!used.has((n = `${prefix}${i}`))) break;
  }
  const net: Net = { name: n!, role, color: pickNetColor(role, doc.nets.map((x) => x.color)) };
  return { doc: { ...doc, nets: [...doc.nets, net] }, name: n! };
}

export function renameNet(doc: Section, from: string, to: string): Section {
  const t = to.trim();
  if (!t) throw new CommandError('a net name must not be empty');
  if (t.length > 120) throw new CommandError('a net name must be at most 120 characters');
  if (t === from) return doc;
  if (doc.nets.some((n) => n.name === t)) throw new CommandError(`a net named "${t}" already exists`);
  if (!doc.nets.some((n) => n.name === from)) throw new CommandError(`there is no net "${from}"`);
  return {
    ...doc,
    nets: doc.nets.map((n) => (n.name === from ? { ...n, name: t } : n)),
    shapes: doc.shapes.map((s) => (s.conductor === from ? { ...s, conductor: t } : s)),
  };
}

export function updateNet(doc: Section, name: string, patch: Partial<Pick<Net, 'role' | 'color'>>): Section {
  if (!doc.nets.some((n) => n.name === name)) throw new CommandError(`there is no net "${name}"`);
  return { ...doc, nets: doc.nets.map((n) => (n.name === name ? { ...n, ...patch } : n)) };
}

export function deleteNet(doc: Section, name: string): Section {
  const users = doc.shapes.filter((s) => s.conductor === name);
  if (users.length) throw new CommandError(`net "${name}" is used by ${users.map((s) => `"${s.id}"`).join(', ')}; reassign or delete those shapes first`);
  if (doc.nets.length <= 1) throw new CommandError('a section needs at least one net');
  return { ...doc, nets: doc.nets.filter((n) => n.name !== name) };
}

// ---------------------------------------------------------------- materials

export function addMaterial(doc: Section, m: Material): { doc: Section; id: string } {
  let id = m.id;
  const used = new Set(doc.materials.map((x) => x.id));
  if (used.has(id)) {
    for (let i = 2; ; i++) if (!used.has((id = `${m.id}_${i}`))) break;
  }
  return { doc: { ...doc, materials: [...doc.materials, { ...m, id }] }, id };
}

export function updateMaterial(doc: Section, id: string, patch: Partial<Omit<Material, 'id'>>): Section {
  if (!doc.materials.some((m) => m.id === id)) throw new CommandError(`there is no material "${id}"`);
  return {
    ...doc,
    materials: doc.materials.map((m) => {
      if (m.id !== id) return m;
      const next: Record<string, unknown> = { ...m, ...patch };
      for (const k of Object.keys(next)) if (next[k] === undefined) delete next[k];
      return next as Material;
    }),
  };
}

export function deleteMaterial(doc: Section, id: string): Section {
  const users = doc.shapes.filter((s) => s.dielectric === id);
  if (users.length) throw new CommandError(`material "${id}" is used by ${users.map((s) => `"${s.id}"`).join(', ')}`);
  return { ...doc, materials: doc.materials.filter((m) => m.id !== id) };
}

export function setBackground(doc: Section, epsR: Value, lossTangent?: Value): Section {
  return { ...doc, background: lossTangent === undefined ? { epsR } : { epsR, lossTangent } };
}

// ---------------------------------------------------------------- boundary, title, mesh

export function setBoundarySide(doc: Section, side: keyof Boundary, value: BoundarySide): Section {
  return { ...doc, boundary: { ...doc.boundary, [side]: value } };
}

export function setTitle(doc: Section, title: string): Section {
  const next = { ...doc };
  if (title.trim()) next.title = title.trim();
  else delete next.title;
  return next;
}

export function setMeshPreset(doc: Section, preset: 'quick' | 'standard' | 'precise'): Section {
  return { ...doc, mesh: { ...(doc.mesh ?? {}), preset } };
}

// ---------------------------------------------------------------- variables

const VAR_RE = /^[A-Za-z_][A-Za-z0-9_]*$/;

export function setVariable(doc: Section, name: string, value: Value): Section {
  if (!VAR_RE.test(name) || name.length > 40) {
    throw new CommandError(`"${name}" is not a valid variable name: start with a letter or _, then letters, digits or _`);
  }
  return { ...doc, variables: { ...(doc.variables ?? {}), [name]: value } };
}

/** Every value in the section, with a path, for rewriting and dependency search. */
export function forEachValue(doc: Section, f: (v: Value, path: string) => Value): Section {
  const mapV = (v: Value, path: string) => f(v, path);
  const variables = doc.variables
    ? Object.fromEntries(Object.entries(doc.variables).map(([k, v]) => [k, mapV(v, `variables.${k}`)]))
    : undefined;
  const shapes = doc.shapes.map((s) => {
    if (s.type === 'polygon') {
      return { ...s, points: s.points.map(([x, y], i) => [mapV(x, `shapes.${s.id}.points.${i}.0`), mapV(y, `shapes.${s.id}.points.${i}.1`)] as [Value, Value]) };
    }
    const next: Record<string, unknown> = { ...s };
    for (const k of GEOMETRY_FIELDS[s.type]) next[k] = mapV((s as Record<string, Value>)[k]!, `shapes.${s.id}.${k}`);
    return next as Shape;
  });
  const materials = doc.materials.map((m) => {
    const next: Material = { ...m, epsR: mapV(m.epsR, `materials.${m.id}.epsR`) };
    if (m.lossTangent !== undefined) next.lossTangent = mapV(m.lossTangent, `materials.${m.id}.lossTangent`);
    if (m.breakdownKVPerMm !== undefined) next.breakdownKVPerMm = mapV(m.breakdownKVPerMm, `materials.${m.id}.breakdownKVPerMm`);
    return next;
  });
  const side = (b: BoundarySide, name: string): BoundarySide => (b.type === 'open' ? b : { ...b, at: mapV(b.at, `boundary.${name}.at`) });
  const boundary = {
    left: side(doc.boundary.left, 'left'),
    right: side(doc.boundary.right, 'right'),
    bottom: side(doc.boundary.bottom, 'bottom'),
    top: side(doc.boundary.top, 'top'),
  };
  const background = { ...doc.background, epsR: mapV(doc.background.epsR, 'background.epsR') };
  if (doc.background.lossTangent !== undefined) background.lossTangent = mapV(doc.background.lossTangent, 'background.lossTangent');
  const nets = doc.nets.map((n) =>
    n.conductivitySPerM === undefined ? n : { ...n, conductivitySPerM: mapV(n.conductivitySPerM, `nets.${n.name}.conductivitySPerM`) },
  );
  const out: Section = { ...doc, shapes, materials, boundary, background, nets };
  if (variables) out.variables = variables;
  return out;
}

/** Paths of the values whose expressions mention `name`. */
export function dependantsOf(doc: Section, name: string): string[] {
  const out: string[] = [];
  forEachValue(doc, (v, path) => {
    if (typeof v === 'string' && identifiersOf(v).includes(name)) out.push(path);
    return v;
  });
  return out;
}

export function renameVariable(doc: Section, from: string, to: string): Section {
  if (from === to) return doc;
  if (!doc.variables || !(from in doc.variables)) throw new CommandError(`there is no variable "${from}"`);
  if (!VAR_RE.test(to) || to.length > 40) throw new CommandError(`"${to}" is not a valid variable name`);
  if (to in doc.variables) throw new CommandError(`a variable named "${to}" already exists`);
  const rewritten = forEachValue(doc, (v) => (typeof v === 'string' ? renameIdentifier(v, from, to) : v));
  const variables: Record<string, Value> = {};
  for (const [k, v] of Object.entries(rewritten.variables ?? {})) variables[k === from ? to : k] = v;
  return { ...rewritten, variables };
}

export function deleteVariable(doc: Section, name: string): Section {
  if (!doc.variables || !(name in doc.variables)) return doc;
  const deps = dependantsOf(doc, name);
  if (deps.length) throw new CommandError(`"${name}" is used by ${deps.slice(0, 4).join(', ')}${deps.length > 4 ? ` and ${deps.length - 4} more` : ''}`);
  const { [name]: _gone, ...rest } = doc.variables;
  return { ...doc, variables: rest };
}

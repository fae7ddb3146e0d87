/**
 * Read conductor/dielectric outlines from an SVG drawing.
 *
 * Understood: <rect>, <circle>, <ellipse> (a circle when rx = ry, else a polygon of
 * CURVE_SEGMENTS points, with a warning), <polygon>, <polyline> (closed, with a warning),
 * <path> with M/L/H/V/Z and the curves C/S/Q/T/A flattened to straight segments, the
 * `transform` attribute on any element (matrix, translate, scale, rotate, skewX, skewY),
 * nested <g>. Layers: the nearest `data-layer` attribute, else the nearest enclosing <g>'s
 * `inkscape:label` or `id`, else "(no layer)". SVG's y axis points down; it is flipped so
 * that the section's y points up. Text, images, <use> and lines are skipped with a warning.
 *
 * XML is parsed with fast-xml-parser (no DOM), so this runs in the browser and in Node.
 */
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import {
  IDENTITY,
  apply,
  asAxisRect,
  cleanRing,
  cubicPoints,
  ellipseArcPoints,
  isAxisAligned,
  isSimilarity,
  multiply,
  quadPoints,
  shapesBBox,
  summariseLayers,
  svgArcPoints,
  type Affine,
} from './geometry';
import { CURVE_SEGMENTS, ImportError, type ImportedDrawing, type ImportedShape } from './types';

type Node = Record<string, unknown> & { ':@'?: Record<string, string> };

const SKIP_SUBTREE = new Set(['defs', 'clipPath', 'mask', 'symbol', 'pattern', 'marker', 'style', 'metadata', 'title', 'desc', 'script', 'linearGradient', 'radialGradient', 'filter', 'sodipodi:namedview']);
const WARN_SKIP = new Set(['text', 'image', 'use', 'line', 'foreignObject', 'tspan']);
const NO_LAYER = '(no layer)';

function tagOf(n: Node): string | null {
  for (const k of Object.keys(n)) if (k !== ':@') return k;
  return null;
}

function num(v: string | undefined, what: string, fallback?: number): number {
  if (v === undefined || v.trim() === '') {
    if (fallback !== undefined) return fallback;
    throw new ImportError(`${what} is missing.`);
  }
  const m = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(px)?\s*$/.exec(v);
  if (!m) throw new ImportError(`${what} is "${v}", which is not a plain number (units other than user units are not supported inside the drawing).`);
  return Number(m[1]);
}

const NUM_RE = /[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?/g;

function numbers(s: string): number[] {
  return (s.match(NUM_RE) ?? []).map(Number);
}

/** Parse an SVG transform list into one matrix (applied right to left, as SVG does). */
export function parseTransform(s: string | undefined, where: string): Affine {
  if (!s || !s.trim()) return IDENTITY;
  let m: Affine = IDENTITY;
  const re = /(matrix|translate|scale|rotate|skewX|skewY)\s*\(([^)]*)\)/g;
  let consumed = '';
  for (const part of s.matchAll(re)) {
    consumed += part[0];
    const fn = part[1]!;
    const a = numbers(part[2]!);
    let t: Affine;
    const bad = () => new ImportError(`${where}: transform "${part[0]}" has the wrong number of values.`);
    switch (fn) {
      case 'matrix':
        if (a.length !== 6) throw bad();
        t = a as Affine;
        break;
      case 'translate':
        if (a.length < 1 || a.length > 2) throw bad();
        t = [1, 0, 0, 1, a[0]!, a[1] ?? 0];
        break;
      case 'scale':
        if (a.length < 1 || a.length > 2) throw bad();
        t = [a[0]!, 0, 0, a[1] ?? a[0]!, 0, 0];
        break;
      case 'rotate': {
        if (a.length !== 1 && a.length !== 3) throw bad();
        const r = (a[0]! * Math.PI) / 180;
        const c = Math.cos(r);
        const sn = Math.sin(r);
        t = [c, sn, -sn, c, 0, 0];
        if (a.length === 3) t = multiply(multiply([1, 0, 0, 1, a[1]!, a[2]!], t), [1, 0, 0, 1, -a[1]!, -a[2]!]);
        break;
      }
      case 'skewX':
        if (a.length !== 1) throw bad();
        t = [1, 0, Math.tan((a[0]! * Math.PI) / 180), 1, 0, 0];
        break;
      default:
        if (a.length !== 1) throw bad();
        t = [1, Math.tan((a[0]! * Math.PI) / 180), 0, 1, 0, 0];
    }
    m = multiply(m, t);
  }
  if (consumed.replace(/\s|,/g, '').length !== s.replace(/\s|,/g, '').length) {
    throw new ImportError(`${where}: transform "${s}" is not understood.`);
  }
  return m;
}

/** Split path data into subpaths of points (curves flattened). `closed` tells whether Z ended it. */
export function flattenPath(d: string, where: string): { points: [number, number][]; closed: boolean }[] {
  const tokens: (string | number)[] = [];
  const re = /([MmLlHhVvCcSsQqTtAaZz])|([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)|([\s,]+)|(.)/g;
  for (const m of d.matchAll(re)) {
    if (m[1]) tokens.push(m[1]);
    else if (m[2]) tokens.push(Number(m[2]));
    else if (m[4]) throw new ImportError(`${where}: path data has an unexpected character "${m[4]}".`);
  }
  const out: { points: [number, number][]; closed: boolean }[] = [];
  let cur: [number, number][] = [];
  let x = 0;
  let y = 0;
  let sx = 0;
  let sy = 0;
  let lastCtrl: [number, number] | null = null;
  let lastQ: [number, number] | null = null;
  let i = 0;
  let cmd = '';
  const finish = (closed: boolean) => {
    if (cur.length) out.push({ points: cur, closed });
    cur = [];
  };
  const need = (n: number) => {
    const v: number[] = [];
    for (let k = 0; k < n; k++) {
      const t = tokens[i++];
      if (typeof t !== 'number') throw new ImportError(`${where}: path command "${cmd}" needs ${n} numbers.`);
      v.push(t);
    }
    return v;
  };
  // Arc flags must be separate numbers 0 or 1 (flags written together, "00", are refused).
  const flag = (): boolean => {
    const t = tokens[i];
    if (t === 0 || t === 1) {
      i++;
      return t === 1;
    }
    throw new ImportError(`${where}: an arc flag must be 0 or 1.`);
  };
  while (i < tokens.length) {
    const t = tokens[i];
    if (typeof t === 'string') {
      if (!cmd && t !== 'M' && t !== 'm') throw new ImportError(`${where}: path data must start with a move command (M).`);
      cmd = t;
      i++;
    } else if (!cmd) throw new ImportError(`${where}: path data must start with a move command (M).`);
    const rel = cmd === cmd.toLowerCase();
    const C = cmd.toUpperCase();
    if (C === 'Z') {
      finish(true);
      x = sx;
      y = sy;
      lastCtrl = lastQ = null;
      continue;
    }
    if (C !== 'M' && cur.length === 0) cur.push([x, y]);
    switch (C) {
      case 'M': {
        const [a, b] = need(2);
        finish(false);
        x = rel ? x + a! : a!;
        y = rel ? y + b! : b!;
        sx = x;
        sy = y;
        cur.push([x, y]);
        cmd = rel ? 'l' : 'L';
        lastCtrl = lastQ = null;
        break;
      }
      case 'L': {
        const [a, b] = need(2);
        x = rel ? x + a! : a!;
        y = rel ? y + b! : b!;
        cur.push([x, y]);
        lastCtrl = lastQ = null;
        break;
      }
      case 'H': {
        const [a] = need(1);
        x = rel ? x + a! : a!;
        cur.push([x, y]);
        lastCtrl = lastQ = null;
        break;
      }
      case 'V': {
        const [b] = need(1);
        y = rel ? y + b! : b!;
        cur.push([x, y]);
        lastCtrl = lastQ = null;
        break;
      }
      case 'C':
      case 'S': {
        let p1: [number, number];
        let v: number[];
        if (C === 'C') {
          v = need(6);
          p1 = rel ? [x + v[0]!, y + v[1]!] : [v[0]!, v[1]!];
          v = v.slice(2);
        } else {
          v = need(4);
          p1 = lastCtrl ? [2 * x - lastCtrl[0], 2 * y - lastCtrl[1]] : [x, y];
        }
        const p2: [number, number] = rel ? [x + v[0]!, y + v[1]!] : [v[0]!, v[1]!];
        const p3: [number, number] = rel ? [x + v[2]!, y + v[3]!] : [v[2]!, v[3]!];
        cur.push(...cubicPoints([x, y], p1, p2, p3));
        lastCtrl = p2;
        lastQ = null;
        [x, y] = p3;
        break;
      }
      case 'Q':
      case 'T': {
        let q: [number, number];
        let p: [number, number];
        if (C === 'Q') {
          const v = need(4);
          q = rel ? [x + v[0]!, y + v[1]!] : [v[0]!, v[1]!];
          p = rel ? [x + v[2]!, y + v[3]!] : [v[2]!, v[3]!];
        } else {
          const v = need(2);
          q = lastQ ? [2 * x - lastQ[0], 2 * y - lastQ[1]] : [x, y];
          p = rel ? [x + v[0]!, y + v[1]!] : [v[0]!, v[1]!];
        }
        cur.push(...quadPoints([x, y], q, p));
        lastQ = q;
        lastCtrl = null;
        [x, y] = p;
        break;
      }
      case 'A': {
        const [rx, ry, rot] = need(3);
        const large = flag();
        const sweep = flag();
        const [a, b] = need(2);
        const p: [number, number] = rel ? [x + a!, y + b!] : [a!, b!];
        cur.push(...svgArcPoints([x, y], rx!, ry!, rot!, large, sweep, p));
        [x, y] = p;
        lastCtrl = lastQ = null;
        break;
      }
      default:
        throw new ImportError(`${where}: path command "${cmd}" is not supported.`);
    }
  }
  finish(false);
  return out;
}

function pointsAttr(s: string | undefined, where: string): [number, number][] {
  const v = numbers(s ?? '');
  if (v.length % 2) throw new ImportError(`${where}: "points" has an odd number of coordinates.`);
  const out: [number, number][] = [];
  for (let k = 0; k < v.length; k += 2) out.push([v[k]!, v[k + 1]!]);
  return out;
}

function declaredUnits(root: Record<string, string>): { units?: ImportedDrawing['declaredUnits']; scale: number } {
  const w = /^\s*([\d.]+(?:e[+-]?\d+)?)\s*(mm|cm|in)\s*$/i.exec(root.width ?? '');
  const vb = numbers(root.viewBox ?? '');
  if (!w || vb.length !== 4 || !(vb[2]! > 0)) return { scale: 1 };
  const physical = Number(w[1]);
  const unit = w[2]!.toLowerCase();
  const perUser = physical / vb[2]!; // physical units per user unit
  if (unit === 'cm') return { units: 'mm', scale: perUser * 10 };
  return { units: unit as 'mm' | 'in', scale: perUser };
}

/** Read an SVG document. Throws ImportError with a sentence naming the problem. */
export function readSvg(text: string): ImportedDrawing {
  if (!/<svg[\s>]/.test(text)) throw new ImportError('This is not an SVG drawing: no <svg> element was found.');
  const valid = XMLValidator.validate(text, { allowBooleanAttributes: true });
  if (valid !== true) {
    throw new ImportError(`The SVG is not well-formed XML: ${valid.err.msg} (line ${valid.err.line}, column ${valid.err.col}).`);
  }
  const parser = new XMLParser({
    preserveOrder: true,
    ignoreAttributes: false,
    attributeNamePrefix: '',
    allowBooleanAttributes: true,
    parseAttributeValue: false,
    parseTagValue: false,
    processEntities: false,
    ignoreDeclaration: true,
    ignorePiTags: true,
  });
  const doc = parser.parse(text) as Node[];
  const rootNode = doc.find((n) => tagOf(n) === 'svg');
  if (!rootNode) throw new ImportError('This is not an SVG drawing: the top element is not <svg>.');
  const rootAttrs = rootNode[':@'] ?? {};
  const { units, scale } = declaredUnits(rootAttrs);
  const shapes: ImportedShape[] = [];
  const warnings: string[] = [];
  const skipped = new Map<string, number>();
  // Flip y (SVG y points down) and apply the declared physical scale.
  const base: Affine = [scale, 0, 0, -scale, 0, 0];
  let counter = 0;

  const visit = (nodes: Node[], ctm: Affine, layer: string, layerFromData: boolean) => {
    for (const n of nodes) {
      const tag = tagOf(n);
      if (!tag || tag === '#text' || tag === '#comment' || tag === '?xml') continue;
      const attrs = n[':@'] ?? {};
      if (SKIP_SUBTREE.has(tag)) continue;
      if (attrs.display === 'none' || /display\s*:\s*none/.test(attrs.style ?? '')) continue;
      const id = attrs.id ? `#${attrs.id}` : `<${tag}> ${++counter}`;
      const where = `SVG ${tag} ${attrs.id ? `"${attrs.id}"` : `number ${counter}`}`;
      const m = multiply(ctm, parseTransform(attrs.transform, where));
      let myLayer = layer;
      let fromData = layerFromData;
      if (attrs['data-layer']) {
        myLayer = attrs['data-layer'];
        fromData = true;
      } else if (tag === 'g' && !layerFromData && (attrs['inkscape:label'] || attrs.id)) {
        myLayer = (attrs['inkscape:label'] || attrs.id)!;
      }
      const children = (n[tag] as Node[] | undefined) ?? [];
      if (tag === 'g' || tag === 'svg' || tag === 'a' || tag === 'switch') {
        visit(children, m, myLayer, fromData);
        continue;
      }
      if (WARN_SKIP.has(tag)) {
        skipped.set(tag, (skipped.get(tag) ?? 0) + 1);
        continue;
      }
      const pushRing = (pts: [number, number][]) => {
        const mapped = pts.map(([px, py]) => apply(m, px, py));
        const scale = Math.max(...mapped.map((q) => Math.max(Math.abs(q[0]), Math.abs(q[1]))), 1e-300);
        const ring = cleanRing(mapped, scale * 1e-12);
        if (ring.length < 3) {
          warnings.push(`${where}: fewer than 3 distinct points, skipped.`);
          return;
        }
        const size = Math.max(...ring.map((q) => Math.max(Math.abs(q[0]), Math.abs(q[1]))), 1e-300);
        const rect = asAxisRect(ring, size * 1e-12);
        if (rect) shapes.push({ type: 'rect', layer: myLayer, source: id, ...rect });
        else shapes.push({ type: 'polygon', layer: myLayer, source: id, points: ring });
      };
      switch (tag) {
        case 'rect': {
          const x = num(attrs.x, `${where}: x`, 0);
          const y = num(attrs.y, `${where}: y`, 0);
          const w = num(attrs.width, `${where}: width`);
          const h = num(attrs.height, `${where}: height`);
          if (!(w > 0) || !(h > 0)) {
            warnings.push(`${where}: width or height is not positive, skipped.`);
            break;
          }
          if (attrs.rx || attrs.ry) warnings.push(`${where}: rounded corners (rx/ry) are drawn square.`);
          if (isAxisAligned(m)) {
            const [ax, ay] = apply(m, x, y);
            const [bx, by] = apply(m, x + w, y + h);
            shapes.push({ type: 'rect', layer: myLayer, source: id, x: Math.min(ax, bx), y: Math.min(ay, by), width: Math.abs(bx - ax), height: Math.abs(by - ay) });
          } else {
            pushRing([
              [x, y],
              [x + w, y],
              [x + w, y + h],
              [x, y + h],
            ]);
          }
          break;
        }
        case 'circle':
        case 'ellipse': {
          const cx = num(attrs.cx, `${where}: cx`, 0);
          const cy = num(attrs.cy, `${where}: cy`, 0);
          const rx = tag === 'circle' ? num(attrs.r, `${where}: r`) : num(attrs.rx, `${where}: rx`);
          const ry = tag === 'circle' ? rx : num(attrs.ry, `${where}: ry`);
          if (!(rx > 0) || !(ry > 0)) {
            warnings.push(`${where}: radius is not positive, skipped.`);
            break;
          }
          // Rotations, mirrors, translations and uniform scales keep a circle a circle.
          if (rx === ry && isSimilarity(m)) {
            const [px, py] = apply(m, cx, cy);
            shapes.push({ type: 'circle', layer: myLayer, source: id, cx: px, cy: py, r: rx * Math.sqrt(Math.abs(m[0] * m[3] - m[1] * m[2])) });
          } else {
            if (tag === 'ellipse' && rx !== ry) warnings.push(`${where}: an ellipse is not a section shape; it became a polygon of ${CURVE_SEGMENTS} points.`);
            else warnings.push(`${where}: a skewed or rotated-and-stretched circle became a polygon of ${CURVE_SEGMENTS} points.`);
            pushRing([[cx + rx, cy], ...ellipseArcPoints(cx, cy, rx, ry, 0, 0, 2 * Math.PI)]);
          }
          break;
        }
        case 'polygon':
        case 'polyline': {
          const pts = pointsAttr(attrs.points, where);
          if (tag === 'polyline' && pts.length >= 3) warnings.push(`${where}: a polyline was closed to make an outline.`);
          pushRing(pts);
          break;
        }
        case 'path': {
          const subs = flattenPath(attrs.d ?? '', where);
          if (subs.length > 1) warnings.push(`${where}: has ${subs.length} subpaths; each became its own shape (holes are not supported).`);
          for (const sp of subs) {
            if (!sp.closed && sp.points.length >= 3) warnings.push(`${where}: an open subpath was closed to make an outline.`);
            pushRing(sp.points);
          }
          break;
        }
        default:
          skipped.set(tag, (skipped.get(tag) ?? 0) + 1);
      }
    }
  };
  visit((rootNode.svg as Node[]) ?? [], base, NO_LAYER, false);
  for (const [tag, n] of skipped) warnings.push(`${n} <${tag}> element${n === 1 ? ' was' : 's were'} skipped (not an outline).`);
  if (shapes.length === 0) throw new ImportError('The SVG has no outlines to import (rect, circle, ellipse, polygon, polyline or path).');
  return { kind: 'svg', shapes, layers: summariseLayers(shapes), warnings, declaredUnits: units, bbox: shapesBBox(shapes) };
}

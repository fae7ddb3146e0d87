// server-only: imported only by the report route (kept testable in Node)
/**
 * PDF report of a solve, sweep or fringing study (pdfkit; DejaVu Sans shipped in
 * assets/fonts, so Greek letters and units print without any download): the drawing, the
 * field picture, a chart, every table with units, method, mesh and error estimate, the
 * sources of the formulas and materials, and the cautions.
 */
import path from 'node:path';
import { readFileSync } from 'node:fs';
import PDFDocument from 'pdfkit';
import type { ReportRequest } from '@/lib/validations/report';
import { resolveSection } from '@/lib/section/resolve';
import type { ResolvedSection } from '@/lib/section/schema';
import { sectionSchema } from '@/lib/section/schema';
import { FIELD_CAUTION } from '@/lib/analysis/peak-field';

const FONT_DIR = path.join(process.cwd(), 'assets', 'fonts');
let fonts: { regular: Buffer; bold: Buffer } | null = null;
const loadFonts = () => (fonts ??= { regular: readFileSync(path.join(FONT_DIR, 'DejaVuSans.ttf')), bold: readFileSync(path.join(FONT_DIR, 'DejaVuSans-Bold.ttf')) });

export const REPORT_SOURCES = [
  'Finite-volume discretisation with Shortley & Weller cut distances (J. Appl. Phys. 9:334, 1938) in the symmetric form of Gibou, Fedkiw, Cheng & Kang (J. Comput. Phys. 176:205, 2002).',
  'Error estimate: Richardson extrapolation over three meshes of one family; grid convergence index after Roache (J. Fluids Eng. 116:405, 1994).',
  'Line values and modes: Paul, Analysis of Multiconductor Transmission Lines, 2nd ed., Wiley 2008; Pozar, Microwave Engineering, 4th ed., 2012, §7.6.',
  "Conductor loss: Wheeler's incremental-inductance rule (Proc. IRE 30:412, 1942); Rs = √(πfμ0/σ). Dielectric loss: each material's loss tangent by its share of stored energy.",
  'Plate fringing: Palmer (Trans. AIEE 56:363, 1937); Hammerstad & Jensen (IEEE MTT-S Digest 1980, pp. 407–409) via the equipotential mid-plane.',
  'Field singularities at corners and edges: Jackson, Classical Electrodynamics, 3rd ed., §2.11.',
  'Material values are typical handbook figures (CRC Handbook of Chemistry and Physics; von Hippel, Dielectric Materials and Applications, 1954); they vary with grade, frequency, temperature and moisture. Dielectric strengths are laboratory figures, not ratings.',
];

export const REPORT_CAUTIONS = [
  FIELD_CAUTION,
  'Idealised model: infinitely long, perfect conductors (except in the loss estimate), linear dielectrics; no discharge, tracking, humidity, contamination, ageing or transients.',
  'Results do not replace the applicable product standard, type tests, local codes or a qualified engineer. High voltage can kill.',
];

const INK = '#1d2433';
const SOFT = '#5b6477';
const ACCENT = '#0f766e';

function drawSection(doc: PDFKit.PDFDocument, s: ResolvedSection, x: number, y: number, w: number, h: number): void {
  const boxes: [number, number, number, number][] = [];
  for (const sh of s.shapes) {
    if (sh.type === 'rect') boxes.push([sh.x, sh.y, sh.x + sh.width, sh.y + sh.height]);
    else if (sh.type === 'circle') boxes.push([sh.cx - sh.r, sh.cy - sh.r, sh.cx + sh.r, sh.cy + sh.r]);
    else if (sh.type === 'ring') boxes.push([sh.cx - sh.rOuter, sh.cy - sh.rOuter, sh.cx + sh.rOuter, sh.cy + sh.rOuter]);
    else if (sh.type === 'strip') boxes.push([Math.min(sh.x1, sh.x2), Math.min(sh.y1, sh.y2), Math.max(sh.x1, sh.x2), Math.max(sh.y1, sh.y2)]);
    else boxes.push([Math.min(...sh.points.map((q) => q[0])), Math.min(...sh.points.map((q) => q[1])), Math.max(...sh.points.map((q) => q[0])), Math.max(...sh.points.map((q) => q[1]))]);
  }
  if (!boxes.length) return;
  // frame the conductors (dielectric slabs may be very wide)
  const cond = s.shapes.map((sh, i) => (sh.conductor !== undefined ? boxes[i]! : null)).filter((b): b is [number, number, number, number] => b !== null);
  const use = cond.length ? cond : boxes;
  let x0 = Math.min(...use.map((b) => b[0])), y0 = Math.min(...use.map((b) => b[1]));
  let x1 = Math.max(...use.map((b) => b[2])), y1 = Math.max(...use.map((b) => b[3]));
  const span = Math.max(x1 - x0, y1 - y0) || 1;
  x0 -= 0.4 * span; x1 += 0.4 * span; y0 -= 0.4 * span; y1 += 0.4 * span;
  const k = Math.min(w / (x1 - x0), h / (y1 - y0));
  const ox = x + (w - k * (x1 - x0)) / 2;
  const oy = y + (h - k * (y1 - y0)) / 2;
  const X = (v: number) => ox + k * (v - x0);
  const Y = (v: number) => oy + k * (y1 - v);
  doc.save();
  doc.rect(x, y, w, h).lineWidth(0.5).stroke('#c9cfda');
  doc.rect(x, y, w, h).clip();
  const palette = ['#dbeafe', '#dcfce7', '#fef3c7', '#fae8ff', '#e0f2fe', '#fee2e2'];
  const matColour = new Map(s.materials.map((m, i) => [m.id, palette[i % palette.length]!]));
  for (const sh of s.shapes) {
    const fill = sh.conductor !== undefined ? '#b45309' : (matColour.get(sh.dielectric ?? '') ?? '#e5e7eb');
    const stroke = sh.conductor !== undefined ? '#78350f' : '#94a3b8';
    if (sh.type === 'rect') doc.rect(X(sh.x), Y(sh.y + sh.height), k * sh.width, k * sh.height).fillAndStroke(fill, stroke);
    else if (sh.type === 'circle') doc.circle(X(sh.cx), Y(sh.cy), k * sh.r).fillAndStroke(fill, stroke);
    else if (sh.type === 'ring') {
      doc.circle(X(sh.cx), Y(sh.cy), k * sh.rOuter).circle(X(sh.cx), Y(sh.cy), k * sh.rInner).fillAndStroke(fill, stroke, 'even-odd' as never);
    } else if (sh.type === 'strip') doc.moveTo(X(sh.x1), Y(sh.y1)).lineTo(X(sh.x2), Y(sh.y2)).lineWidth(2).stroke(fill);
    else {
      const [p0, ...rest] = sh.points;
      doc.moveTo(X(p0![0]), Y(p0![1]));
      for (const q of rest) doc.lineTo(X(q[0]), Y(q[1]));
      doc.closePath().fillAndStroke(fill, stroke);
    }
    doc.lineWidth(0.5);
  }
  const b = s.boundary;
  doc.lineWidth(1.5);
  if (b.bottom.type === 'ground') doc.moveTo(x, Y(b.bottom.at)).lineTo(x + w, Y(b.bottom.at)).stroke('#78350f');
  if (b.top.type === 'ground') doc.moveTo(x, Y(b.top.at)).lineTo(x + w, Y(b.top.at)).stroke('#78350f');
  if (b.left.type === 'ground') doc.moveTo(X(b.left.at), y).lineTo(X(b.left.at), y + h).stroke('#78350f');
  if (b.right.type === 'ground') doc.moveTo(X(b.right.at), y).lineTo(X(b.right.at), y + h).stroke('#78350f');
  doc.restore();
}

function drawChart(doc: PDFKit.PDFDocument, c: NonNullable<ReportRequest['chart']>, x: number, y: number, w: number, h: number): void {
  const pts = c.series.flatMap((s) => s.points).filter(([a, b]) => Number.isFinite(a) && Number.isFinite(b) && (!c.logX || a > 0));
  if (!pts.length) return;
  const fx = (v: number) => (c.logX ? Math.log10(v) : v);
  let xa = Math.min(...pts.map((p) => fx(p[0]))), xb = Math.max(...pts.map((p) => fx(p[0])));
  let ya = Math.min(...pts.map((p) => p[1])), yb = Math.max(...pts.map((p) => p[1]));
  if (xa === xb) { xa -= 1; xb += 1; }
  if (ya === yb) { ya -= 1; yb += 1; }
  const pad = 0.05 * (yb - ya);
  ya -= pad; yb += pad;
  const L = x + 48, R = x + w - 8, T = y + 18, B = y + h - 30;
  const X = (v: number) => L + ((fx(v) - xa) / (xb - xa)) * (R - L);
  const Y = (v: number) => B - ((v - ya) / (yb - ya)) * (B - T);
  doc.font('body-bold').fontSize(9).fillColor(INK).text(c.title, x, y, { width: w });
  doc.lineWidth(0.5).rect(L, T, R - L, B - T).stroke('#c9cfda');
  doc.font('body').fontSize(7).fillColor(SOFT);
  for (let i = 0; i <= 4; i++) {
    const v = ya + ((yb - ya) * i) / 4;
    doc.text(Number(v.toPrecision(3)).toString(), x, Y(v) - 3, { width: 44, align: 'right' });
    const u = xa + ((xb - xa) * i) / 4;
    const label = c.logX ? Number((10 ** u).toPrecision(2)).toString() : Number(u.toPrecision(3)).toString();
    doc.text(label, L + ((R - L) * i) / 4 - 20, B + 3, { width: 40, align: 'center' });
  }
  doc.text(c.xLabel, L, B + 14, { width: R - L, align: 'center' });
  doc.save().rotate(-90, { origin: [x + 6, (T + B) / 2] }).text(c.yLabel, x + 6 - 60, (T + B) / 2 - 4, { width: 120, align: 'center' }).restore();
  const colours = [ACCENT, '#b45309', '#6d28d9', '#be123c', '#1d4ed8', '#4d7c0f', '#334155', '#a16207'];
  c.series.forEach((s, i) => {
    const ps = s.points.filter(([a, b]) => Number.isFinite(a) && Number.isFinite(b) && (!c.logX || a > 0));
    if (!ps.length) return;
    const col = colours[i % colours.length]!;
    doc.save().lineWidth(1.2);
    if (s.dashed) doc.dash(3, { space: 2 });
    doc.moveTo(X(ps[0]![0]), Y(ps[0]![1]));
    for (const p of ps.slice(1)) doc.lineTo(X(p[0]), Y(p[1]));
    doc.stroke(col);
    doc.undash();
    if (!s.dashed) for (const p of ps) doc.circle(X(p[0]), Y(p[1]), 1.6).fill(col);
    doc.restore();
    doc.font('body').fontSize(7).fillColor(col).text(`— ${s.name}`, R - 190, T + 4 + 9 * i, { width: 185, align: 'right' });
  });
  doc.fillColor(INK);
}

function drawTable(doc: PDFKit.PDFDocument, t: ReportRequest['tables'][number]): void {
  const left = doc.page.margins.left;
  const width = doc.page.width - doc.page.margins.left - doc.page.margins.right;
  const n = Math.max(t.columns.length, 1);
  const colW = width / n;
  const fs = n > 6 ? 6.5 : 8;
  const ensure = (need: number) => {
    if (doc.y + need > doc.page.height - doc.page.margins.bottom) doc.addPage();
  };
  ensure(40);
  doc.moveDown(0.6);
  doc.font('body-bold').fontSize(9.5).fillColor(INK).text(t.title, left, doc.y, { width });
  doc.moveDown(0.2);
  const row = (cells: (string | number | null)[], bold: boolean) => {
    doc.font(bold ? 'body-bold' : 'body').fontSize(fs);
    const texts = cells.map((c) => (c === null ? '—' : String(c)));
    const hgt = Math.max(...texts.map((s) => doc.heightOfString(s, { width: colW - 4 }))) + 3;
    ensure(hgt);
    const y0 = doc.y;
    texts.forEach((s, i) => doc.fillColor(bold ? SOFT : INK).text(s, left + i * colW + 2, y0 + 1.5, { width: colW - 4 }));
    doc.y = y0 + hgt;
    doc.moveTo(left, doc.y).lineTo(left + width, doc.y).lineWidth(0.3).stroke('#e3e7ee');
  };
  row(t.columns, true);
  for (const r of t.rows) row(r, false);
  if (t.note) {
    doc.moveDown(0.2);
    doc.font('body').fontSize(7.5).fillColor(SOFT).text(t.note, left, doc.y, { width });
  }
  doc.x = left;
}

export async function renderReportPdf(req: ReportRequest, meta: { workspace: string; author: string; date: Date }): Promise<Buffer> {
  const f = loadFonts();
  const doc = new PDFDocument({ size: 'A4', margin: 48, info: { Title: req.title, Creator: 'Edgefield', Producer: 'Edgefield' } });
  doc.registerFont('body', f.regular);
  doc.registerFont('body-bold', f.bold);
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  const left = doc.page.margins.left;
  const width = doc.page.width - doc.page.margins.left - doc.page.margins.right;

  doc.font('body-bold').fontSize(8).fillColor(ACCENT).text('EDGEFIELD REPORT', left, 40);
  doc.font('body-bold').fontSize(16).fillColor(INK).text(req.title, left, doc.y + 2, { width });
  const kindWord = req.kind === 'solve' ? 'Solve' : req.kind === 'sweep' ? 'Sweep' : 'Fringing study';
  doc.font('body').fontSize(8.5).fillColor(SOFT).text(`${kindWord} · workspace ${meta.workspace} · prepared by ${meta.author} · ${meta.date.toISOString().slice(0, 16).replace('T', ' ')} UTC`, { width });
  doc.moveDown(0.8);

  // drawing and field picture side by side
  const top = doc.y;
  const boxH = 170;
  let section: ResolvedSection | null = null;
  if (req.section !== undefined) {
    const parsed = sectionSchema.safeParse(req.section);
    if (parsed.success) {
      const r = resolveSection(parsed.data);
      section = r.ok ? r.section : (r.partial ?? null);
    }
  }
  const half = (width - 12) / 2;
  if (section) {
    doc.font('body-bold').fontSize(8).fillColor(SOFT).text('Drawing', left, top, { width: half });
    drawSection(doc, section, left, top + 12, half, boxH);
  }
  if (req.fieldImage) {
    doc.font('body-bold').fontSize(8).fillColor(SOFT).text('Field of the first signal net at 1 V', left + half + 12, top, { width: half });
    try {
      doc.image(Buffer.from(req.fieldImage.slice(req.fieldImage.indexOf(',') + 1), 'base64'), left + half + 12, top + 12, { fit: [half, boxH], align: 'center', valign: 'center' });
    } catch {
      doc.font('body').fontSize(8).text('(the field picture could not be read)', left + half + 12, top + 20);
    }
  }
  if (section || req.fieldImage) doc.y = top + boxH + 20;
  doc.x = left;

  if (req.chart) {
    if (doc.y + 220 > doc.page.height - doc.page.margins.bottom) doc.addPage();
    const y0 = doc.y;
    drawChart(doc, req.chart, left, y0, width, 210);
    doc.y = y0 + 220;
    doc.x = left;
  }

  for (const t of req.tables) drawTable(doc, t);

  const para = (title: string, lines: string[]) => {
    if (doc.y + 60 > doc.page.height - doc.page.margins.bottom) doc.addPage();
    doc.moveDown(0.8);
    doc.font('body-bold').fontSize(9.5).fillColor(INK).text(title, left, doc.y, { width });
    doc.moveDown(0.2);
    doc.font('body').fontSize(7.5).fillColor(INK);
    for (const l of lines) doc.text(`• ${l}`, left, doc.y, { width });
  };
  if (req.method) para('Method', [req.method]);
  if (req.warnings?.length) para('Warnings from the solve', req.warnings);
  para('Sources of formulas and materials', REPORT_SOURCES);
  para('Cautions', REPORT_CAUTIONS);
  doc.end();
  return done;
}

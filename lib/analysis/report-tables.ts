/**
 * Every table of a solve, sweep or fringing study as plain data with units: the same tables
 * feed the screen, the CSV export and the PDF report.
 */
import type { SectionResult } from '../engine/types';
import { toCsv } from './csv';
import type { FringingRow, Threshold } from './fringing-study';
import { thresholdText } from './fringing-study';
import { FIELD_CAUTION } from './peak-field';
import type { SweepPoint } from './sweep';
import { sweepMetrics } from './sweep';

export interface ReportTable {
  id: string;
  title: string;
  columns: string[];
  rows: (string | number | null)[][];
  note?: string;
}

const p = (v: number, n = 6) => Number(v.toPrecision(n));

function matrixTable(id: string, title: string, nets: string[], m: number[][], factor: number): ReportTable {
  return { id, title, columns: ['', ...nets], rows: m.map((row, i) => [nets[i]!, ...row.map((v) => p(v / factor))]) };
}

export function resultTables(r: SectionResult): ReportTable[] {
  const t: ReportTable[] = [];
  t.push(matrixTable('maxwell', 'Capacitance per unit length, Maxwell form (pF/m)', r.nets, r.capacitance.maxwell, 1e-12));
  t.push(matrixTable('mutual', 'Capacitance per unit length, mutual (branch) form (pF/m)', r.nets, r.capacitance.mutual, 1e-12));
  t.push(matrixTable('vacuum', 'Capacitance with every dielectric replaced by vacuum (pF/m)', r.nets, r.capacitance.vacuum, 1e-12));
  if (r.inductancePerM) t.push(matrixTable('inductance', 'Inductance per unit length (nH/m)', r.nets, r.inductancePerM, 1e-9));
  const e = r.errorEstimate;
  t.push({
    id: 'error',
    title: 'Mesh and error estimate',
    columns: ['quantity', 'value'],
    rows: [
      ['estimated relative error (%)', p(e.relative * 100, 3)],
      ['convergence monotone', e.monotone ? 'yes' : 'no'],
      ['observed order', e.observedOrder !== undefined ? p(e.observedOrder, 3) : '—'],
      ['finest mesh nodes', r.mesh.nodes],
      ['mesh family (nodes)', e.family.map((f) => f.nodes).join(' / ')],
      ['preset', r.mesh.preset],
      ['finest spacing (µm)', p(r.mesh.finestM * 1e6, 4)],
      ['solver', `${r.solver.method}, ${r.solver.iterations} iterations, residual ${r.solver.relResidual.toExponential(1)}`],
    ],
    note: e.note,
  });
  if (r.line) {
    const l = r.line;
    t.push({
      id: 'line',
      title: 'Line values (quasi-TEM)',
      columns: ['quantity', 'value', 'unit'],
      rows: [
        ["C'", p(l.capacitancePerM * 1e12), 'pF/m'],
        ["L'", p(l.inductancePerM * 1e9), 'nH/m'],
        ['Z0', p(l.z0Ohm), 'Ω'],
        ['εeff', p(l.epsEff), ''],
        ['velocity', p(l.velocityMPerS / 299792458, 5), 'c'],
        ['delay', p(l.delaySPerM * 1e9), 'ns/m'],
      ],
    });
  }
  if (r.plates) {
    const q = r.plates;
    t.push({
      id: 'plates',
      title: 'Plate pair',
      columns: ['quantity', 'value', 'unit'],
      rows: [
        ['gap / width', p(q.gapToWidth, 5), ''],
        ['ideal εw/d', p(q.idealPerM * 1e12), 'pF/m'],
        ['solved', q.solvedPerM !== undefined ? p(q.solvedPerM * 1e12) : null, 'pF/m'],
        ['solved / ideal', p(q.solvedOverIdeal), ''],
      ],
    });
  }
  if (r.modes) {
    const m = r.modes;
    t.push({
      id: 'modes',
      title: 'Coupled pair modes',
      columns: ['mode', 'Z (Ω)', 'εeff'],
      rows: [
        ['even', p(m.even.z0Ohm), p(m.even.epsEff)],
        ['odd', p(m.odd.z0Ohm), p(m.odd.epsEff)],
        ['differential', p(m.differentialOhm), null],
        ['common', p(m.commonOhm), null],
      ],
    });
  }
  if (r.modal) t.push({ id: 'modal', title: 'Propagation modes', columns: ['mode', 'Z (Ω)', 'εeff'], rows: r.modal.map((m, i) => [i + 1, p(m.z0Ohm), p(m.epsEff)]) });
  if (r.crosstalk?.length)
    t.push({
      id: 'crosstalk',
      title: 'Crosstalk (weak coupling, matched lines)',
      columns: ['aggressor', 'victim', 'near-end', 'far-end (ns/m)'],
      rows: r.crosstalk.map((x) => [x.aggressor, x.victim, p(x.nearEnd, 4), p(x.farEndPerLength * 1e9, 4)]),
      note: 'far-end noise ratio = far-end coefficient × coupled length / rise time',
    });
  if (r.losses) {
    const l = r.losses;
    const rows: (string | number | null)[][] = [];
    if (typeof l.gPerM === 'number') rows.push(["G'", p(l.gPerM, 5), 'S/m']);
    if (typeof l.rPerM === 'number') rows.push(["R'", p(l.rPerM, 5), 'Ω/m']);
    if (typeof l.alphaDbPerM === 'number') rows.push(['α', p(l.alphaDbPerM, 5), 'dB/m']);
    else l.alphaDbPerM.forEach((a, i) => rows.push([`α mode ${r.modes ? (i === 0 ? 'even' : 'odd') : i + 1}`, p(a, 5), 'dB/m']));
    l.rDcPerM?.forEach((v, i) => rows.push([`R DC ${r.nets[i]}`, v === null ? null : p(v, 5), 'Ω/m']));
    Object.entries(l.skinDepthM ?? {}).forEach(([n, d]) => rows.push([`skin depth ${n}`, p(d * 1e6, 4), 'µm']));
    t.push({ id: 'losses', title: `Losses at ${p(l.frequencyHz / 1e9, 4)} GHz`, columns: ['quantity', 'value', 'unit'], rows, note: [l.method, ...(l.warnings ?? [])].join(' ') });
    if (typeof l.gPerM !== 'number') t.push(matrixTable('g', "G' matrix (S/m)", r.nets, l.gPerM, 1));
    if (typeof l.rPerM !== 'number') t.push(matrixTable('r', "R' matrix (Ω/m)", r.nets, l.rPerM, 1));
  }
  if (r.peakField) {
    t.push({
      id: 'peak',
      title: `Peak field${r.peakFieldInfo ? ` (${Object.entries(r.peakFieldInfo.voltages).map(([n, v]) => `${n} ${v} V`).join(', ')})` : ''}`,
      columns: ['where', '|E| (kV/mm)', 'x (mm)', 'y (mm)', 'singular', 'strength (kV/mm)', 'margin', 'suggested radius (mm)'],
      rows: r.peakField.map((q) => [
        q.where,
        p(q.vPerM / 1e6, 4),
        p(q.x * 1e3, 4),
        p(q.y * 1e3, 4),
        q.singular ? 'yes (mesh-dependent)' : 'no',
        q.strengthVPerM !== undefined ? p(q.strengthVPerM / 1e6, 3) : null,
        q.margin !== undefined ? p(q.margin, 3) : null,
        q.suggestedCornerRadiusM !== undefined ? p(q.suggestedCornerRadiusM * 1e3, 2) : null,
      ]),
      note: `Caution: ${FIELD_CAUTION} Strengths are typical laboratory figures, not ratings.`,
    });
  }
  return t;
}

export function sweepTable(label: string, unit: string, points: readonly SweepPoint[]): ReportTable {
  const metrics = sweepMetrics(points);
  return {
    id: 'sweep',
    title: `Sweep of ${label}`,
    columns: [`${label}${unit ? ` (${unit})` : ''}`, ...metrics.map((m) => `${m.label}${m.unit ? ` (${m.unit})` : ''}`), 'note'],
    rows: points.map((pt) => [
      p(pt.value),
      ...metrics.map((m) => {
        const v = pt.result ? m.get(pt.result) : undefined;
        return v === undefined ? null : p(v / m.factor);
      }),
      pt.error ?? '',
    ]),
  };
}

export function fringingTable(rows: readonly FringingRow[], thresholds: readonly Threshold[], range: { from: number; to: number }): ReportTable[] {
  return [
    {
      id: 'fringing',
      title: 'Fringing study: solved and published capacitance over the ideal εw/d',
      columns: ['gap/width', 'solved/ideal', 'Palmer 1937/ideal', 'Hammerstad–Jensen mid-plane/ideal', 'ideal off by (%)', 'solve error (%)'],
      rows: rows.map((r) => [p(r.gapToWidth, 4), p(r.solvedOverIdeal, 5), p(r.palmerOverIdeal, 5), p(r.hammerstadJensenOverIdeal, 5), p(100 * r.idealError, 3), p(100 * r.relativeErrorEstimate, 2)]),
      note: 'Published curves are for two equal thin plates in one medium. Palmer 1937 holds for d ≪ w.',
    },
    { id: 'fringing-thresholds', title: 'Where the ideal formula holds', columns: ['tolerance', 'gap/width'], rows: thresholds.map((t) => [`${Math.round(t.tolerance * 100)}%`, thresholdText(t, range)]) },
  ];
}

/** All tables in one CSV: a title row before each table, a blank row between. */
export function tablesCsv(tables: readonly ReportTable[]): string {
  const rows: (string | number | null)[][] = [];
  for (const t of tables) {
    if (rows.length) rows.push([]);
    rows.push([t.title]);
    rows.push(t.columns);
    rows.push(...t.rows);
    if (t.note) rows.push([t.note]);
  }
  return toCsv(rows);
}

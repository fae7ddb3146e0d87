'use client';
/**
 * Engineering analysis below the section editor: coupled-line values, losses and peak field,
 * sweeps with a chart and a table, the fringing study of a plate pair, goal seek, and the
 * exports (PDF report, CSV of every table, SPICE netlists). Every solve here runs in the
 * analysis worker (workers/analysis.worker.ts); nothing is saved.
 */
import { useEffect, useMemo, useState } from 'react';
import type { Section } from '@/lib/section/schema';
import type { SectionFields, SectionResult } from '@/lib/engine/types';
import { resolveSection } from '@/lib/section/resolve';
import type { AnalyseOutcome, AnalysisSettings } from '@/workers/analysis-protocol';
import { sweepValues, sweepCsv, targetLabel, type SweepPoint, type SweepRange, type SweepTarget } from '@/lib/analysis/sweep';
import { availableMetrics, metricById } from '@/lib/analysis/metrics';
import { fringingCsv, fringingRow, fringingThresholds, FRINGING_RATIOS, thresholdText, type FringingRow } from '@/lib/analysis/fringing-study';
import { fringingTable, resultTables, sweepTable, tablesCsv, type ReportTable } from '@/lib/analysis/report-tables';
import type { GoalMetric, GoalSeekEvaluation, GoalSeekOutcome } from '@/lib/analysis/goal-seek';
import { capacitanceSubcircuit, rlgcLadder } from '@/lib/analysis/spice';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Input, Select } from '@/components/ui/field';
import { cn } from '@/components/ui/cn';
import { Dialog } from '@/components/ui/dialog';
import { MeasuredUpload } from '@/components/teamwork/measured-upload';
import type { Units } from '@/lib/section/schema';
import { FieldCaution } from '@/components/field/caution';
import { paintOverlay } from '@/components/field/field-overlay';
import { AnalysisChart, type ChartSeries } from './analysis-chart';
import { useAnalysisJob } from './use-analysis-job';
import { matchMeasured, type MeasuredSet, type OverlayMatch } from './measured-overlay';

export interface AnalysisAreaProps {
  workspaceId: string;
  /** The section as drawn now (sweeps and goal seek start from it). */
  section: Section | null;
  canSolve: boolean;
  /** The last solve of the page (its section, result and fields). */
  result: SectionResult | null;
  fields: SectionFields | null;
  solvedSection: Section | null;
  /** For the measured-data overlay. */
  sectionId?: string;
  /** Editors and owners may add measured data from the sweep card. */
  canEdit?: boolean;
}

/** Colours of measured sets (the solved curve keeps the chart's first colour). */
const MEASURED_COLOURS = ['#be123c', '#1d4ed8', '#7c3aed', '#b45309', '#4d7c0f', '#0e7490', '#a21caf', '#475569'];

interface SweepState {
  label: string;
  unit: string;
  log: boolean;
  target: SweepTarget;
  units: Units;
  range: { min: number; max: number };
  points: SweepPoint[];
}

type Tab = 'lines' | 'sweep' | 'fringing' | 'goal';
type Preset = AnalysisSettings['preset'];

function download(name: string, type: string, data: BlobPart): void {
  const url = URL.createObjectURL(new Blob([data], { type }));
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 5000);
}

const slug = (s: string) => s.replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'section';

export function TableView({ table, testId }: { table: ReportTable; testId?: string }) {
  return (
    <div className="overflow-x-auto" data-testid={testId ?? `table-${table.id}`}>
      <h4 className="mb-1 text-sm font-semibold text-ink">{table.title}</h4>
      <table className="w-full border-collapse text-xs tabular-nums">
        <thead>
          <tr>
            {table.columns.map((c, i) => (
              <th key={i} className="border-b border-line px-2 py-1 text-left font-medium text-ink-soft">
                {c}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {table.rows.map((r, i) => (
            <tr key={i} className="odd:bg-surface-muted/50">
              {r.map((c, j) => (
                <td key={j} className="px-2 py-1 text-ink">
                  {c === null ? '—' : String(c)}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
      {table.note ? <p className="mt-1 text-xs text-ink-soft">{table.note}</p> : null}
    </div>
  );
}

function NumberInput({ label, value, onChange, testId, step }: { label: string; value: string; onChange: (v: string) => void; testId: string; step?: string }) {
  return (
    <label className="flex flex-col gap-1 text-xs text-ink-soft">
      {label}
      <Input className="h-8 w-28 text-sm" inputMode="decimal" value={value} step={step} onChange={(e) => onChange(e.target.value)} data-testid={testId} />
    </label>
  );
}

export function AnalysisArea({ workspaceId, section, canSolve, result, fields, solvedSection, sectionId, canEdit = false }: AnalysisAreaProps) {
  // One job at a time in the analysis worker: busy, progress, message, run and cancel.
  const { busy, running, progress, message, setMessage, run, withBusy, cancel: stop } = useAnalysisJob();

  const [tab, setTab] = useState<Tab>('lines');
  const [preset, setPreset] = useState<Preset>('standard');

  // ---- lines and losses
  const [freqGHz, setFreqGHz] = useState('1');
  const [volts, setVolts] = useState('100');
  const [analysed, setAnalysed] = useState<SectionResult | null>(null);
  useEffect(() => setAnalysed(null), [result]);
  const shown = analysed ?? result;

  // ---- sweep
  const variables = Object.keys(section?.variables ?? {});
  const targets: { key: string; target: SweepTarget; label: string }[] = useMemo(() => {
    const t: { key: string; target: SweepTarget; label: string }[] = [];
    for (const v of Object.keys(section?.variables ?? {})) t.push({ key: `v:${v}`, target: { kind: 'variable', name: v }, label: `dimension ${v}` });
    for (const m of section?.materials ?? []) {
      t.push({ key: `m:${m.id}:epsR`, target: { kind: 'material', id: m.id, property: 'epsR' }, label: `${m.id} εr` });
      t.push({ key: `m:${m.id}:lossTangent`, target: { kind: 'material', id: m.id, property: 'lossTangent' }, label: `${m.id} tanδ` });
    }
    t.push({ key: 'b:epsR', target: { kind: 'background', property: 'epsR' }, label: 'background εr' });
    return t;
  }, [section]);
  const [targetKey, setTargetKey] = useState('');
  const target = targets.find((t) => t.key === targetKey) ?? targets[0];
  const [rangeKind, setRangeKind] = useState<SweepRange['kind']>('linear');
  const [from, setFrom] = useState('0.5');
  const [to, setTo] = useState('2');
  const [count, setCount] = useState('12');
  const [list, setList] = useState('0.5, 1, 2');
  const [sweep, setSweep] = useState<SweepState | null>(null);
  const [metricId, setMetricId] = useState('');
  const sweepMetricsAvail = useMemo(() => {
    const r = sweep?.points.find((p) => p.result)?.result;
    return r ? availableMetrics(r) : [];
  }, [sweep]);
  const metric = sweepMetricsAvail.find((m) => m.id === metricId) ?? sweepMetricsAvail.find((m) => m.id === 'z0' || m.id === 'solvedOverIdeal') ?? sweepMetricsAvail[0];

  // ---- measured data overlay (kept with the section by the teamwork features)
  const [measured, setMeasured] = useState<MeasuredSet[]>([]);
  const [measuredError, setMeasuredError] = useState<string | null>(null);
  const [measuredLoads, setMeasuredLoads] = useState(0);
  const [hiddenSets, setHiddenSets] = useState<ReadonlySet<string>>(() => new Set());
  const [addMeasuredOpen, setAddMeasuredOpen] = useState(false);
  useEffect(() => {
    if (!sectionId) return;
    let stop = false;
    fetch(`/api/workspaces/${workspaceId}/sections/${sectionId}/measurements`)
      .then(async (r) => {
        const j = (await r.json().catch(() => null)) as { measurements?: MeasuredSet[]; error?: { message?: string } } | null;
        if (stop) return;
        if (r.ok && j?.measurements) {
          setMeasured(j.measurements.map((m) => ({ id: m.id, name: m.name, data: m.data })));
          setMeasuredError(null);
        } else setMeasuredError(`Measured data could not be loaded: ${j?.error?.message ?? `the server answered ${r.status}`}.`);
      })
      .catch(() => {
        if (!stop) setMeasuredError('Measured data could not be loaded: the server did not answer.');
      });
    return () => {
      stop = true;
    };
  }, [workspaceId, sectionId, measuredLoads]);

  // ---- fringing
  const [fringing, setFringing] = useState<{ rows: FringingRow[]; errors: string[] } | null>(null);

  // ---- goal seek
  const [goalVar, setGoalVar] = useState('');
  const [goalLo, setGoalLo] = useState('0.5');
  const [goalHi, setGoalHi] = useState('3');
  const [goalMetric, setGoalMetric] = useState<GoalMetric>('z0');
  const [goalTarget, setGoalTarget] = useState('50');
  const [goalEvals, setGoalEvals] = useState<GoalSeekEvaluation[]>([]);
  const [goal, setGoal] = useState<GoalSeekOutcome | null>(null);
  const [confirm, setConfirm] = useState<{ value: number; metric: number } | null>(null);

  // ---- spice
  const [lengthMm, setLengthMm] = useState('100');
  const [cells, setCells] = useState('20');

  const settings = (extra: Partial<AnalysisSettings> = {}): AnalysisSettings => ({ preset, ...extra });
  const title = section?.title || solvedSection?.title || 'Section';

  const runAnalyse = async () => {
    const s = solvedSection ?? section;
    if (!s) return;
    const f = Number(freqGHz) * 1e9;
    const v = Number(volts);
    const out = await run<AnalyseOutcome>('analyse', {}, (api) => api.analyse(s, settings({ ...(f > 0 ? { frequencyHz: f } : {}), ...(Number.isFinite(v) && v !== 0 ? { volts: v } : {}) })));
    if ('value' in out) {
      if (out.value.ok) setAnalysed(out.value.result);
      else setMessage(out.value.message);
    }
  };

  const runSweep = async () => {
    if (!section || !target) return;
    let values: number[];
    try {
      values =
        rangeKind === 'list'
          ? sweepValues({ kind: 'list', values: list.split(/[\s,;]+/).filter(Boolean).map(Number) })
          : sweepValues({ kind: rangeKind, from: Number(from), to: Number(to), points: Number(count) });
    } catch (e) {
      setMessage(e instanceof Error ? e.message : String(e));
      return;
    }
    const unit = target.target.kind === 'variable' ? (section.units === 'um' ? 'µm' : section.units) : '';
    const acc: SweepPoint[] = [];
    const swept = { label: target.label, unit, log: rangeKind === 'log', target: target.target, units: section.units, range: { min: Math.min(...values), max: Math.max(...values) } } satisfies Omit<SweepState, 'points'>;
    setSweep({ ...swept, points: [] });
    await run('sweep', { total: values.length }, (api, job) =>
      api.sweep(
        { section, target: target.target, values, settings: settings() },
        job.live((p: SweepPoint) => {
          acc.push(p);
          setSweep({ ...swept, points: [...acc] });
        }),
        job.onProgress,
      ),
    );
  };

  const runFringing = async () => {
    const s = solvedSection ?? section;
    if (!s) return;
    const ratios = sweepValues({ kind: 'log', ...FRINGING_RATIOS });
    const rows: FringingRow[] = [];
    const errors: string[] = [];
    setFringing({ rows: [], errors: [] });
    await run('fringing', { total: ratios.length }, (api, job) =>
      api.fringing(
        { section: s, ratios, settings: settings() },
        job.live((p: SweepPoint) => {
          const row = p.result ? fringingRow(p.result) : null;
          if (row) rows.push(row);
          else errors.push(`d/w = ${p.value}: ${p.error ?? 'no plate pair'}`);
          setFringing({ rows: [...rows], errors: [...errors] });
        }),
        job.onProgress,
      ),
    );
  };

  const goalUnit = metricById(goalMetric);
  const runGoal = async () => {
    if (!section) return;
    const variable = goalVar || variables[0];
    if (!variable) {
      setMessage('Goal seek needs a named dimension: add a variable (for example w) and use it in the drawing.');
      return;
    }
    setGoal(null);
    setConfirm(null);
    setGoalEvals([]);
    const acc: GoalSeekEvaluation[] = [];
    const out = await run<GoalSeekOutcome>('goal', {}, (api, job) =>
      api.goalSeek(
        { section, variable, lo: Number(goalLo), hi: Number(goalHi), metric: goalMetric, target: Number(goalTarget) * goalUnit.factor, settings: settings() },
        job.live((e: GoalSeekEvaluation) => {
          acc.push(e);
          setGoalEvals([...acc]);
        }),
      ),
    );
    if ('value' in out) setGoal(out.value);
  };

  const runConfirm = async () => {
    if (!section || !goal?.ok) return;
    const variable = goalVar || variables[0]!;
    const s = structuredClone(section);
    s.variables = { ...(s.variables ?? {}), [variable]: goal.value };
    const out = await run<AnalyseOutcome>('confirm', {}, (api) => api.analyse(s, settings(goalMetric === 'peak' ? { volts: 1 } : {})));
    if ('value' in out) {
      if (out.value.ok) setConfirm({ value: goal.value, metric: goalUnit.get(out.value.result) ?? NaN });
      else setMessage(out.value.message);
    }
  };

  const fieldImage = (): string | undefined => {
    if (!result || !fields || !solvedSection) return undefined;
    try {
      const r = resolveSection(solvedSection);
      const o = paintOverlay(result, fields, r.ok ? r.section : (r.partial ?? null), 'potential', 700);
      return o?.image.toDataURL('image/png');
    } catch {
      return undefined;
    }
  };

  const report = (body: Record<string, unknown>, name: string) =>
    withBusy('report', async () => {
      const res = await fetch(`/api/workspaces/${workspaceId}/report`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
      if (!res.ok) {
        const j = (await res.json().catch(() => null)) as { error?: { message?: string } } | null;
        throw new Error(j?.error?.message ?? `The report could not be made (${res.status}).`);
      }
      download(name, 'application/pdf', await res.blob());
    });

  const solveTables = shown ? resultTables(shown) : [];
  const sweepTbl = sweep && sweep.points.length ? sweepTable(sweep.label, sweep.unit, sweep.points) : null;
  const fringeThresholds = fringing ? fringingThresholds(fringing.rows) : [];
  const fringeTables = fringing && fringing.rows.length ? fringingTable(fringing.rows, fringeThresholds, FRINGING_RATIOS) : [];

  const sweepSeries: ChartSeries[] = [];
  if (sweep && metric) {
    sweepSeries.push({
      name: `${metric.label}${metric.unit ? ` (${metric.unit})` : ''}`,
      points: sweep.points.flatMap((p) => {
        const v = p.result ? metric.get(p.result) : undefined;
        return v === undefined ? [] : [[p.value, v / metric.factor] as [number, number]];
      }),
    });
  }
  // Measured sets: each matched against the swept quantity and the charted value (units of both axes).
  const materialNames = Object.fromEntries((section?.materials ?? []).map((m) => [m.id, m.name]));
  const overlays: { set: MeasuredSet; colour: string; match: OverlayMatch }[] =
    sweep && metric
      ? measured.map((set, k) => ({
          set,
          colour: MEASURED_COLOURS[k % MEASURED_COLOURS.length]!,
          match: matchMeasured(set, { target: sweep.target, units: sweep.units, materialNames }, metric, { ...sweep.range, log: sweep.log }),
        }))
      : [];
  for (const o of overlays)
    if (o.match.ok && !hiddenSets.has(o.set.id))
      for (const s of o.match.series) sweepSeries.push({ name: `measured: ${s.name}`, points: s.points, markersOnly: true, colour: o.colour, testId: 'measured-point' });
  const toggleSet = (id: string) =>
    setHiddenSets((h) => {
      const n = new Set(h);
      if (n.has(id)) n.delete(id);
      else n.add(id);
      return n;
    });
  const sweepHint =
    target?.target.kind === 'variable' && section
      ? `This section's sweep of ${target.target.name} is in ${section.units === 'um' ? 'µm' : section.units}: a first column "${target.target.name} (${section.units === 'um' ? 'µm' : section.units})" lines up with it (other length units are converted).`
      : target
        ? `To compare with a sweep of ${target.label}, name the first column "${target.target.kind !== 'variable' && target.target.property === 'lossTangent' ? 'tanδ' : 'εr'}" (no unit).`
        : undefined;
  const fringeSeries: ChartSeries[] = fringing
    ? [
        { name: 'solved / ideal', points: fringing.rows.map((r) => [r.gapToWidth, r.solvedOverIdeal]) },
        { name: 'Palmer 1937', points: fringing.rows.map((r) => [r.gapToWidth, r.palmerOverIdeal]), dashed: true },
        { name: 'Hammerstad–Jensen (mid-plane)', points: fringing.rows.map((r) => [r.gapToWidth, r.hammerstadJensenOverIdeal]), dashed: true },
        { name: 'ideal εw/d', points: fringing.rows.map((r) => [r.gapToWidth, 1]), dashed: true },
      ]
    : [];

  const tabs: { id: Tab; label: string }[] = [
    { id: 'lines', label: 'Lines, losses, peak field' },
    { id: 'sweep', label: 'Sweep' },
    { id: 'fringing', label: 'Fringing study' },
    { id: 'goal', label: 'Goal seek' },
  ];

  return (
    <Card className="p-4" aria-label="Analysis" data-testid="analysis-card">
      <div className="mb-3 flex flex-wrap items-center gap-2">
        <h2 className="mr-2 text-md font-semibold text-ink">Analysis</h2>
        <div role="tablist" className="flex flex-wrap gap-1">
          {tabs.map((t) => (
            <button
              key={t.id}
              role="tab"
              aria-selected={tab === t.id}
              className={cn('rounded-md px-2.5 py-1 text-sm', tab === t.id ? 'bg-accent-50 font-medium text-accent-700' : 'text-ink-soft hover:bg-surface-muted')}
              onClick={() => setTab(t.id)}
              data-testid={`analysis-tab-${t.id}`}
            >
              {t.label}
            </button>
          ))}
        </div>
        <label className="ml-auto flex items-center gap-1 text-xs text-ink-soft">
          Mesh
          <Select className="h-8 w-32 text-sm" value={preset} onChange={(e) => setPreset(e.target.value as Preset)} data-testid="analysis-preset">
            <option value="quick">quick</option>
            <option value="standard">standard</option>
            <option value="precise">precise</option>
          </Select>
        </label>
        {running ? (
          <Button size="sm" variant="danger" onClick={stop} data-testid="analysis-cancel">
            Cancel
          </Button>
        ) : null}
      </div>
      {progress ? (
        <p className="mb-2 text-xs tabular-nums text-ink-soft" data-testid="analysis-progress" role="status">
          {progress.done} of {progress.total} points{progress.fraction !== undefined ? ` · current point ${Math.round(progress.fraction * 100)}%` : ''}
        </p>
      ) : null}
      {message ? (
        <p className="mb-2 rounded-md border border-amber-100 bg-amber-50 px-3 py-2 text-sm text-amber-700" role="alert" data-testid="analysis-message">
          {message}
        </p>
      ) : null}

      {tab === 'lines' ? (
        <div className="flex flex-col gap-3" data-testid="analysis-lines">
          {!shown ? <p className="text-sm text-ink-soft">Solve the section first; coupled-line values, losses and the peak field appear here.</p> : null}
          <div className="flex flex-wrap items-end gap-3">
            <NumberInput label="Frequency (GHz)" value={freqGHz} onChange={setFreqGHz} testId="analysis-frequency" />
            <NumberInput label="Voltage on the first signal net (V)" value={volts} onChange={setVolts} testId="analysis-volts" />
            <Button size="sm" variant="primary" disabled={!shown || running} onClick={runAnalyse} pending={busy === 'analyse'} data-testid="analysis-run-losses">
              Losses and peak field
            </Button>
          </div>
          {shown?.peakField ? <FieldCaution compact /> : null}
          <div className="grid gap-4 xl:grid-cols-2">
            {solveTables
              .filter((t) => !['maxwell', 'mutual', 'vacuum', 'error'].includes(t.id))
              .map((t) => (
                <TableView key={t.id} table={t} />
              ))}
          </div>
          {shown ? (
            <div className="flex flex-wrap items-end gap-3 border-t border-line pt-3">
              <Button
                size="sm"
                disabled={busy === 'report'}
                onClick={() =>
                  void report(
                    { kind: 'solve', title, section: solvedSection ?? section, tables: solveTables, fieldImage: fieldImage(), method: shown.errorEstimate.note, warnings: shown.warnings },
                    `edgefield-${slug(title)}-report.pdf`,
                  )
                }
                data-testid="report-solve-pdf"
              >
                PDF report
              </Button>
              <Button size="sm" onClick={() => download(`edgefield-${slug(title)}-tables.csv`, 'text/csv', tablesCsv(solveTables))} data-testid="report-solve-csv">
                CSV of every table
              </Button>
              <Button
                size="sm"
                onClick={() => download(`edgefield-${slug(title)}-capacitance.cir`, 'text/plain', capacitanceSubcircuit(shown.nets, shown.capacitance.maxwell, Number(lengthMm) * 1e-3, { title: `${title}: capacitance matrix` }))}
                data-testid="report-spice-c"
              >
                SPICE capacitance subcircuit
              </Button>
              <NumberInput label="Length (mm)" value={lengthMm} onChange={setLengthMm} testId="spice-length" />
              <NumberInput label="RLGC sections" value={cells} onChange={setCells} testId="spice-cells" />
              <Button
                size="sm"
                disabled={!shown.inductancePerM}
                onClick={() => {
                  try {
                    const l = shown.losses;
                    const r = l ? (typeof l.rPerM === 'number' ? [l.rPerM] : l.rPerM.map((row, i) => row[i]!)) : undefined;
                    const g = l ? (typeof l.gPerM === 'number' ? [[l.gPerM]] : l.gPerM) : undefined;
                    const f = shown.symmetry?.factor ?? 1;
                    const c = shown.nets.length === 1 && f !== 1 ? [[shown.line!.capacitancePerM]] : shown.capacitance.maxwell;
                    const text = rlgcLadder(shown.nets, { c, l: shown.inductancePerM!, ...(r ? { r } : {}), ...(g ? { g } : {}) }, Number(lengthMm) * 1e-3, Number(cells), { title: `${title}: line of ${lengthMm} mm` });
                    download(`edgefield-${slug(title)}-line.cir`, 'text/plain', text);
                  } catch (e) {
                    setMessage(e instanceof Error ? e.message : String(e));
                  }
                }}
                data-testid="report-spice-line"
              >
                SPICE line (RLGC)
              </Button>
            </div>
          ) : null}
        </div>
      ) : null}

      {tab === 'sweep' ? (
        <div className="flex flex-col gap-3" data-testid="analysis-sweep">
          <div className="flex flex-wrap items-end gap-3">
            <label className="flex flex-col gap-1 text-xs text-ink-soft">
              Vary
              <Select className="h-8 w-44 text-sm" value={target?.key ?? ''} onChange={(e) => setTargetKey(e.target.value)} data-testid="sweep-target">
                {targets.map((t) => (
                  <option key={t.key} value={t.key}>
                    {t.label}
                  </option>
                ))}
              </Select>
            </label>
            <label className="flex flex-col gap-1 text-xs text-ink-soft">
              Range
              <Select className="h-8 w-32 text-sm" value={rangeKind} onChange={(e) => setRangeKind(e.target.value as SweepRange['kind'])} data-testid="sweep-kind">
                <option value="linear">linear</option>
                <option value="log">logarithmic</option>
                <option value="list">list</option>
              </Select>
            </label>
            {rangeKind === 'list' ? (
              <label className="flex flex-col gap-1 text-xs text-ink-soft">
                Values
                <Input className="h-8 w-64 text-sm" value={list} onChange={(e) => setList(e.target.value)} data-testid="sweep-list" />
              </label>
            ) : (
              <>
                <NumberInput label="From" value={from} onChange={setFrom} testId="sweep-from" />
                <NumberInput label="To" value={to} onChange={setTo} testId="sweep-to" />
                <NumberInput label="Points" value={count} onChange={setCount} testId="sweep-points" />
              </>
            )}
            <Button size="sm" variant="primary" disabled={!section || !canSolve || running || !target} onClick={runSweep} pending={busy === 'sweep'} data-testid="sweep-run">
              Run sweep
            </Button>
            {sectionId && canEdit ? (
              <Button size="sm" onClick={() => setAddMeasuredOpen(true)} data-testid="sweep-add-measured">
                Add measured data
              </Button>
            ) : null}
          </div>
          {sweep && sweep.points.length ? (
            <>
              <div className="flex flex-wrap items-end gap-3">
                <label className="flex flex-col gap-1 text-xs text-ink-soft">
                  Chart
                  <Select className="h-8 w-64 text-sm" value={metric?.id ?? ''} onChange={(e) => setMetricId(e.target.value)} data-testid="sweep-metric">
                    {sweepMetricsAvail.map((m) => (
                      <option key={m.id} value={m.id}>
                        {m.label}
                        {m.unit ? ` (${m.unit})` : ''}
                      </option>
                    ))}
                  </Select>
                </label>
                <Button size="sm" onClick={() => download(`edgefield-${slug(title)}-sweep.csv`, 'text/csv', sweepCsv(sweep.label, sweep.unit, sweep.points))} data-testid="sweep-csv">
                  CSV
                </Button>
                <Button
                  size="sm"
                  disabled={busy === 'report'}
                  onClick={() =>
                    void report(
                      {
                        kind: 'sweep',
                        title: `${title}: sweep of ${sweep.label}`,
                        section,
                        tables: sweepTbl ? [sweepTbl] : [],
                        chart: { title: `${metric?.label ?? ''} against ${sweep.label}`, xLabel: `${sweep.label}${sweep.unit ? ` (${sweep.unit})` : ''}`, yLabel: metric ? `${metric.label} ${metric.unit}` : '', logX: sweep.log, series: sweepSeries.filter((s) => !s.markersOnly).map((s) => ({ name: s.name, points: s.points, ...(s.dashed ? { dashed: true } : {}) })) },
                        method: `Each point is a full solve at the ${preset} preset. ${sweep.points[0]?.result?.errorEstimate.note ?? ''}`,
                      },
                      `edgefield-${slug(title)}-sweep.pdf`,
                    )
                  }
                  data-testid="sweep-pdf"
                >
                  PDF report
                </Button>
              </div>
              {metric?.id === 'peak' ? <FieldCaution compact /> : null}
              <AnalysisChart series={sweepSeries} logX={sweep.log} xLabel={`${sweep.label}${sweep.unit ? ` (${sweep.unit})` : ''}`} yLabel={metric ? `${metric.label}${metric.unit ? ` (${metric.unit})` : ''}` : ''} testId="sweep-chart" />
              {overlays.length ? (
                <div className="rounded-md border border-line px-3 py-2" data-testid="measured-legend">
                  <h4 className="mb-1 text-sm font-semibold text-ink">Measured data</h4>
                  <ul className="flex flex-col gap-1.5">
                    {overlays.map(({ set, colour, match }) => (
                      <li key={set.id} className="text-sm" data-testid="measured-set" data-set-name={set.name} data-matched={match.ok ? 'true' : 'false'}>
                        {match.ok ? (
                          <label className="flex min-w-0 cursor-pointer items-center gap-2">
                            <input type="checkbox" checked={!hiddenSets.has(set.id)} onChange={() => toggleSet(set.id)} data-testid="measured-toggle" aria-label={`Show ${set.name} on the chart`} />
                            <svg width="12" height="12" viewBox="-6 -6 12 12" aria-hidden className="shrink-0">
                              <path d="M0,-5L5,0L0,5L-5,0Z" fill="#ffffff" stroke={colour} strokeWidth={2} />
                            </svg>
                            <span className="min-w-0 truncate font-medium text-ink">{set.name}</span>
                            <span className="shrink-0 text-xs text-ink-soft">
                              {set.data.x.length} {set.data.x.length === 1 ? 'row' : 'rows'} · {set.data.series.map((c) => `${c.name} (${c.unit})`).join(', ')}
                            </span>
                          </label>
                        ) : (
                          <div className="flex min-w-0 items-start gap-2">
                            <input type="checkbox" disabled checked={false} readOnly aria-label={`${set.name} cannot be shown on this chart`} className="mt-1" />
                            <span className="min-w-0">
                              <span className="font-medium text-ink">{set.name}</span>
                              <span className="text-ink-soft"> is not shown: </span>
                              <span className="text-amber-700" data-testid="measured-note">
                                {match.reason}
                              </span>
                            </span>
                          </div>
                        )}
                        {match.ok && match.notes.length ? (
                          <p className="ml-6 text-xs text-ink-soft" data-testid="measured-note">
                            {match.notes.join(' ')}
                          </p>
                        ) : null}
                      </li>
                    ))}
                  </ul>
                  <p className="mt-1 text-xs text-ink-muted">Measured points are hollow diamonds, drawn as uploaded (converted to the chart's units); the PDF report charts the solved values only.</p>
                </div>
              ) : null}
              {sweepTbl ? <TableView table={sweepTbl} testId="sweep-table" /> : null}
            </>
          ) : (
            <p className="text-sm text-ink-soft">
              Vary a named dimension or a material value; each point is a full solve in the background. Cancel keeps the points already done.
              {measured.length ? ` ${measured.length} measured ${measured.length === 1 ? 'set is' : 'sets are'} kept with this section and show on capacitance charts where they match the swept quantity.` : ''}
            </p>
          )}
          {measuredError ? (
            <p className="text-xs text-danger" data-testid="measured-load-error">
              {measuredError}
            </p>
          ) : null}
          {sectionId && canEdit ? (
            <Dialog open={addMeasuredOpen} onClose={() => setAddMeasuredOpen(false)} title="Add measured data" description="A CSV of measured capacitance per length, kept with this section for comparison on sweep charts." data-testid="add-measured-dialog">
              <MeasuredUpload
                workspaceId={workspaceId}
                sectionId={sectionId}
                hint={sweepHint}
                onUploaded={() => {
                  setMeasuredLoads((n) => n + 1);
                }}
              />
            </Dialog>
          ) : null}
        </div>
      ) : null}

      {tab === 'fringing' ? (
        <div className="flex flex-col gap-3" data-testid="analysis-fringing">
          <p className="text-sm text-ink-soft">
            For a plate pair: sweeps the gap-to-width ratio from {FRINGING_RATIOS.from} to {FRINGING_RATIOS.to} ({FRINGING_RATIOS.points} points, logarithmic) by moving the upper plate, and compares the solved capacitance
            with the ideal εw/d and with published curves for two thin plates.
          </p>
          <div className="flex flex-wrap gap-2">
            <Button size="sm" variant="primary" disabled={!result?.plates || running} onClick={runFringing} pending={busy === 'fringing'} data-testid="fringing-run" title={result?.plates ? '' : 'Solve a plate pair first'}>
              Run fringing study
            </Button>
            {fringing && fringing.rows.length ? (
              <>
                <Button size="sm" onClick={() => download(`edgefield-${slug(title)}-fringing.csv`, 'text/csv', fringingCsv(fringing.rows, fringeThresholds, FRINGING_RATIOS))} data-testid="fringing-csv">
                  CSV
                </Button>
                <Button
                  size="sm"
                  disabled={busy === 'report'}
                  onClick={() =>
                    void report(
                      {
                        kind: 'fringing',
                        title: `${title}: fringing study`,
                        section: solvedSection ?? section,
                        tables: fringeTables,
                        chart: { title: 'Capacitance over the ideal εw/d', xLabel: 'gap / width', yLabel: 'C / (εw/d)', logX: true, series: fringeSeries.map((s) => ({ name: s.name, points: s.points, ...(s.dashed ? { dashed: true } : {}) })) },
                        method: `Each point is a full solve at the ${preset} preset with the upper plate moved to the gap asked.`,
                      },
                      `edgefield-${slug(title)}-fringing.pdf`,
                    )
                  }
                  data-testid="fringing-pdf"
                >
                  PDF report
                </Button>
              </>
            ) : null}
          </div>
          {!result?.plates ? <p className="text-sm text-ink-soft">Solve a section that is a plate pair (two strips or rectangles on different nets facing each other) to enable the study.</p> : null}
          {fringing && fringing.rows.length ? (
            <>
              <AnalysisChart series={fringeSeries} logX xLabel="gap / width" yLabel="C / (εw/d)" testId="fringing-chart" />
              <ul className="text-sm text-ink" data-testid="fringing-thresholds">
                {fringeThresholds.map((t) => (
                  <li key={t.tolerance}>The ideal formula is {thresholdText(t, FRINGING_RATIOS)}.</li>
                ))}
              </ul>
              {fringeTables.map((t) => (
                <TableView key={t.id} table={t} testId={t.id === 'fringing' ? 'fringing-table' : undefined} />
              ))}
            </>
          ) : null}
          {fringing?.errors.length ? <p className="text-xs text-danger">{fringing.errors.join('; ')}</p> : null}
        </div>
      ) : null}

      {tab === 'goal' ? (
        <div className="flex flex-col gap-3" data-testid="analysis-goal">
          <div className="flex flex-wrap items-end gap-3">
            <label className="flex flex-col gap-1 text-xs text-ink-soft">
              Dimension
              <Select className="h-8 w-32 text-sm" value={goalVar || variables[0] || ''} onChange={(e) => setGoalVar(e.target.value)} data-testid="goal-variable">
                {variables.map((v) => (
                  <option key={v} value={v}>
                    {v}
                  </option>
                ))}
              </Select>
            </label>
            <NumberInput label="From" value={goalLo} onChange={setGoalLo} testId="goal-lo" />
            <NumberInput label="To" value={goalHi} onChange={setGoalHi} testId="goal-hi" />
            <label className="flex flex-col gap-1 text-xs text-ink-soft">
              Target
              <Select className="h-8 w-48 text-sm" value={goalMetric} onChange={(e) => setGoalMetric(e.target.value as GoalMetric)} data-testid="goal-metric">
                <option value="z0">Z0 (Ω)</option>
                <option value="c11">capacitance C11 (pF/m)</option>
                <option value="zDiff">differential impedance (Ω)</option>
                <option value="peak">peak field at 1 V (kV/mm)</option>
              </Select>
            </label>
            <NumberInput label={`Value (${goalUnit.unit})`} value={goalTarget} onChange={setGoalTarget} testId="goal-target" />
            <Button size="sm" variant="primary" disabled={!section || !canSolve || running || variables.length === 0} onClick={runGoal} pending={busy === 'goal'} data-testid="goal-run">
              Find
            </Button>
          </div>
          {variables.length === 0 ? <p className="text-sm text-ink-soft">Goal seek varies a named dimension: add a variable (for example w) and use it in the drawing.</p> : null}
          {goalMetric === 'peak' ? <FieldCaution compact /> : null}
          {goalEvals.length ? (
            <TableView
              testId="goal-evaluations"
              table={{ id: 'goal', title: 'Solves so far', columns: [goalVar || variables[0] || 'value', `${goalUnit.label} (${goalUnit.unit})`], rows: goalEvals.map((e) => [Number(e.value.toPrecision(6)), Number((e.metric / goalUnit.factor).toPrecision(6))]) }}
            />
          ) : null}
          {goal ? (
            goal.ok ? (
              <div className="flex flex-wrap items-center gap-3 rounded-md border border-line bg-surface-muted px-3 py-2 text-sm" data-testid="goal-result">
                <span>
                  <span className="font-semibold" data-testid="goal-value" data-value={goal.value}>
                    {goalVar || variables[0]} = {goal.value.toPrecision(5)}
                  </span>{' '}
                  gives {(goal.achieved / goalUnit.factor).toPrecision(5)} {goalUnit.unit} ({goal.evaluations.length} solves{goal.converged ? '' : ', stopped before converging'}).
                </span>
                <Button size="sm" onClick={runConfirm} pending={busy === 'confirm'} disabled={running} data-testid="goal-confirm">
                  Confirm with a direct solve
                </Button>
                {confirm ? (
                  <span data-testid="goal-confirmed" data-metric={confirm.metric}>
                    Direct solve: {(confirm.metric / goalUnit.factor).toPrecision(5)} {goalUnit.unit} ({((confirm.metric / (Number(goalTarget) * goalUnit.factor) - 1) * 100).toFixed(3)}% from the target)
                  </span>
                ) : null}
              </div>
            ) : (
              <p className="rounded-md border border-amber-100 bg-amber-50 px-3 py-2 text-sm text-amber-700" role="alert" data-testid="goal-error">
                {goal.message}
              </p>
            )
          ) : null}
        </div>
      ) : null}
    </Card>
  );
}

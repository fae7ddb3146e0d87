'use client';
/**
 * Everything a solve says, as numbers with units and an error estimate beside each:
 * capacitance matrix (Maxwell and mutual form) per length and for a length the user enters,
 * the two-terminal capacitance, line values for one signal net, the plate-pair card, and
 * how the solve went (time, mesh, iterations). Every table copies as tab-separated text.
 */
import { useMemo, useState } from 'react';
import type { SectionFields, SectionResult } from '@/lib/engine/types';
import type { Section } from '@/lib/section/schema';
import { CAP_UNIT_FACTOR, type CapUnit, formatRelError, LENGTH_UNITS, type LengthUnit, sig, withPrefix } from '@/lib/field/format';
import { cn } from '@/components/ui/cn';
import { CopyButton } from './copy-button';
import { Block, Item, ValueRow } from './blocks';
import { LineSummary } from './line-summary';

const C0 = 299_792_458; // speed of light in vacuum, m/s (exact, SI definition)
const CAP_UNITS: CapUnit[] = ['pF/m', 'nF/m', 'pF/mm', 'fF/µm', 'pF/in'];

export interface ResultsPanelProps {
  result: SectionResult;
  /** Section units, for the plate gap and width. */
  units?: string;
  /** Start with this per-length unit (the user can change it). */
  initialUnit?: CapUnit;
  className?: string;
  /** This solve's finest-mesh fields and section: the summary works out losses and peak field from them. */
  fields?: SectionFields | null;
  section?: Section | null;
  /** Shows a link from the summary to the detailed Analysis card. */
  onShowDetails?: () => void;
}

/** Relative error of a sum Σ a_k given each term's relative error (worst case). */
function sumRelError(terms: number[], errs: number[]): number {
  let abs = 0;
  let total = 0;
  terms.forEach((t, k) => {
    abs += Math.abs(t) * (errs[k] ?? 0);
    total += t;
  });
  return total !== 0 ? abs / Math.abs(total) : Number.NaN;
}

export function twoTerminal(maxwell: number[][]): number | null {
  if (maxwell.length === 1) return maxwell[0]![0]!;
  if (maxwell.length === 2) {
    const [[a, b], [c, d]] = maxwell as [[number, number], [number, number]];
    const denom = a + d + b + c;
    return denom > 0 ? (a * d - b * c) / denom : null;
  }
  return null;
}

/** "(boundary)" is the engine's name for ground boundaries; say it in words. */
export function referenceWords(reference: string[]): string {
  const parts = reference.map((r) => (r === '(boundary)' ? 'the ground plane at the boundary' : r));
  return parts.length ? parts.join(' and ') : 'ground';
}

export function ResultsPanel({ result, units, initialUnit = 'pF/m', className, fields, section, onShowDetails }: ResultsPanelProps) {
  const [unit, setUnit] = useState<CapUnit>(initialUnit);
  const [lenText, setLenText] = useState('10');
  const [lenUnit, setLenUnit] = useState<LengthUnit>('mm');
  const lengthM = Number(lenText) * LENGTH_UNITS[lenUnit];
  const validLength = Number.isFinite(lengthM) && lengthM > 0;
  const nets = result.nets;
  const M = result.capacitance.maxwell;
  const rel = result.errorEstimate.relative;
  const per = result.errorEstimate.perEntry ?? M.map((r) => r.map(() => rel));
  const f = CAP_UNIT_FACTOR[unit];
  const unitLabel = units === 'um' ? 'µm' : (units ?? '');

  const mutual = useMemo(() => {
    const n = M.length;
    const val: number[][] = [];
    const err: number[][] = [];
    for (let i = 0; i < n; i++) {
      val.push([]);
      err.push([]);
      for (let j = 0; j < n; j++) {
        if (i === j) {
          const row = M[i]!;
          val[i]!.push(row.reduce((s, v) => s + v, 0));
          err[i]!.push(sumRelError(row, per[i] ?? []));
        } else {
          val[i]!.push(-M[i]![j]!);
          err[i]!.push(per[i]?.[j] ?? rel);
        }
      }
    }
    return { val, err };
  }, [M, per, rel]);

  const perLen = (v: number) => sig(v * f, 4);
  const total = (v: number) => (validLength ? withPrefix(v * lengthM, 'F', 4) : '—');

  const matrixTsv = (vals: number[][], title: string) => () => {
    const head = [`${title} (${unit})`, ...nets].join('\t');
    const rows = vals.map((r, i) => [nets[i], ...r.map((v) => String(v * f))].join('\t'));
    return [head, ...rows].join('\n');
  };

  const C2 = twoTerminal(M);
  const line = result.line;
  const plates = result.plates;

  return (
    <div className={cn('flex flex-col gap-4 text-sm text-ink', className)} data-testid="results-panel">
      {/* the exact numbers, for scripts and tests that compare with the CLI */}
      <output hidden data-testid="result-json" data-json={JSON.stringify({ capacitance: result.capacitance, line: result.line, mesh: result.mesh })} />
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-xs font-medium text-ink-soft">
          Per-length unit
          <select
            className="h-8 rounded-md border border-line-strong bg-surface px-2 text-sm text-ink"
            value={unit}
            onChange={(e) => setUnit(e.target.value as CapUnit)}
            data-testid="results-unit"
          >
            {CAP_UNITS.map((u) => (
              <option key={u} value={u}>
                {u}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-xs font-medium text-ink-soft">
          For a length of
          <span className="flex gap-1">
            <input
              className={cn(
                'h-8 w-24 rounded-md border bg-surface px-2 text-right text-sm tabular-nums text-ink',
                validLength ? 'border-line-strong' : 'border-danger',
              )}
              inputMode="decimal"
              value={lenText}
              onChange={(e) => setLenText(e.target.value)}
              aria-invalid={!validLength}
              data-testid="results-length"
            />
            <select
              className="h-8 rounded-md border border-line-strong bg-surface px-2 text-sm text-ink"
              value={lenUnit}
              onChange={(e) => setLenUnit(e.target.value as LengthUnit)}
              aria-label="Length unit"
            >
              {(Object.keys(LENGTH_UNITS) as LengthUnit[]).map((u) => (
                <option key={u} value={u}>
                  {u === 'um' ? 'µm' : u}
                </option>
              ))}
            </select>
          </span>
        </label>
        <p className="pb-1.5 text-xs text-ink-muted">Estimated error {formatRelError(rel)} (beside each value).</p>
      </div>

      {line || result.modes || result.modal || result.losses || result.peakField ? (
        <LineSummary result={result} fields={fields} section={section} unit={unit} onShowDetails={onShowDetails} />
      ) : null}

      {C2 !== null ? (
        <Block title="Two-terminal capacitance" testId="results-two-terminal">
          <p className="text-ink-soft">
            {nets.length === 1
              ? `Between ${nets[0]} and the reference: ${referenceWords(result.reference)}.`
              : `Between ${nets[0]} and ${nets[1]}, with equal and opposite charges on them and none on the reference.`}
          </p>
          <ValueRow label="per length" value={`${perLen(C2)} ${unit}`} err={nets.length === 1 ? per[0]?.[0] : rel} testId="two-terminal-value" />
          <ValueRow label={`for ${validLength ? `${lenText} ${lenUnit === 'um' ? 'µm' : lenUnit}` : 'the length'}`} value={total(C2)} err={nets.length === 1 ? per[0]?.[0] : rel} />
        </Block>
      ) : null}

      <Block
        title="Capacitance matrix, Maxwell form"
        hint="Q = C·V. Diagonal: a net's capacitance with every other net and the reference held at 0 V. Off-diagonal entries are negative."
        actions={<CopyButton label="Copy table" text={matrixTsv(M, 'Maxwell')} testId="copy-maxwell" />}
        testId="results-maxwell"
      >
        <Matrix nets={nets} values={M} errs={per} fmt={perLen} unit={unit} />
        {validLength ? (
          <p className="mt-1 text-xs text-ink-muted">
            For {lenText} {lenUnit === 'um' ? 'µm' : lenUnit}: {M.map((r, i) => `${nets[i]} ${total(r[i]!)}`).join(' · ')}
          </p>
        ) : null}
      </Block>

      <Block
        title="Capacitance matrix, mutual (branch) form"
        hint="As in a circuit: the diagonal is each net's capacitance to the reference, off-diagonal entries the capacitance between two nets (positive)."
        actions={<CopyButton label="Copy table" text={matrixTsv(mutual.val, 'Mutual')} testId="copy-mutual" />}
        testId="results-mutual"
      >
        <Matrix nets={nets} values={mutual.val} errs={mutual.err} fmt={perLen} unit={unit} />
        {validLength ? (
          <Matrix nets={nets} values={mutual.val} errs={mutual.err} fmt={total} unit={`for ${lenText} ${lenUnit === 'um' ? 'µm' : lenUnit}`} compact />
        ) : null}
      </Block>

      {line ? (
        <Block
          title={`Line values of ${nets[0]}`}
          hint="Quasi-static (TEM) values; L′ from the solve with every dielectric replaced by vacuum."
          actions={<CopyButton label="Copy table" text={() => lineTsv(result)} testId="copy-line" />}
          testId="results-line"
        >
          <dl className="flex flex-col">
            <ValueRow label="C′" value={`${perLen(line.capacitancePerM)} ${unit}`} err={rel} testId="line-c" />
            <ValueRow label="L′" value={withPrefix(line.inductancePerM, 'H/m', 4)} err={rel} testId="line-l" />
            <ValueRow label="Z0" value={`${sig(line.z0Ohm, 4)} Ω`} err={rel} testId="line-z0" />
            <ValueRow label="εeff" value={sig(line.epsEff, 4)} err={2 * rel} testId="line-epseff" />
            <ValueRow label="Phase velocity" value={`${withPrefix(line.velocityMPerS, 'm/s', 4)} (${sig(line.velocityMPerS / C0, 3)} c)`} err={rel} />
            <ValueRow
              label="Delay"
              value={`${sig(line.delaySPerM * 1e9, 4)} ns/m · ${sig(line.delaySPerM * 1e12 * 1e-3, 4)} ps/mm · ${sig(line.delaySPerM * 1e12 * 0.0254, 4)} ps/in`}
              err={rel}
            />
            {validLength ? (
              <ValueRow label={`Delay over ${lenText} ${lenUnit === 'um' ? 'µm' : lenUnit}`} value={withPrefix(line.delaySPerM * lengthM, 's', 4)} err={rel} />
            ) : null}
          </dl>
        </Block>
      ) : null}

      {plates ? <PlatesCard result={result} unit={unit} unitLabel={unitLabel} /> : null}

      <Block title="How the solve went" testId="results-solve-info" actions={<CopyButton label="Copy" text={() => solveTsv(result)} />}>
        <dl className="flex flex-col text-sm">
          <Item k="Solve time" v={`${sig(result.timing.ms / 1000, 3)} s`} />
          <Item k="Mesh" v={`${result.mesh.nx} × ${result.mesh.ny} = ${result.mesh.nodes.toLocaleString('en-US')} nodes (${result.mesh.preset})`} />
          <Item k="Finest spacing" v={withPrefix(result.mesh.finestM, 'm', 3)} />
          <Item k="Iterations" v={String(result.solver.iterations)} />
          <Item k="Residual" v={sig(result.solver.relResidual, 2)} />
          <Item k="Method" v={result.solver.method} />
          <Item k="Error estimate" v={formatRelError(rel)} />
          {result.errorEstimate.observedOrder !== undefined ? <Item k="Observed order" v={sig(result.errorEstimate.observedOrder, 3)} /> : null}
        </dl>
        {result.errorEstimate.note ? <p className="mt-1.5 text-xs text-ink-muted">{result.errorEstimate.note}</p> : null}
        {!result.errorEstimate.monotone ? (
          <p className="mt-1.5 rounded bg-amber-50 px-2 py-1 text-xs text-amber-700">Convergence over the mesh family was not monotone: treat the error estimate as rough.</p>
        ) : null}
        {result.warnings.length ? (
          <ul className="mt-1.5 list-disc pl-5 text-xs text-amber-700">
            {result.warnings.map((w, k) => (
              <li key={k}>{w}</li>
            ))}
          </ul>
        ) : null}
      </Block>
    </div>
  );
}

function PlatesCard({ result, unit, unitLabel }: { result: SectionResult; unit: CapUnit; unitLabel: string }) {
  const p = result.plates!;
  const excess = (p.solvedOverIdeal - 1) * 100;
  const solved = p.idealPerM * p.solvedOverIdeal;
  const f = CAP_UNIT_FACTOR[unit];
  const rel = result.errorEstimate.relative;
  let words: string;
  if (Math.abs(excess) < 1) {
    words = `Here the ideal formula εw/d is within ${sig(Math.abs(excess), 2)} % of the solved value: fringing hardly matters at this gap.`;
  } else if (excess < 10) {
    words = `Here the ideal formula εw/d is ${sig(excess, 2)} % low: the fringing field adds that much, enough to matter for precise work.`;
  } else {
    words = `Here the ideal formula εw/d is far off: it gives only ${sig(100 / p.solvedOverIdeal, 3)} % of the solved capacitance; the fringing field adds ${sig(excess, 3)} %.`;
  }
  return (
    <Block title="Plate pair against C = εw/d" testId="results-plates" tone="accent">
      <p className="text-base font-medium text-ink" data-testid="plates-sentence">
        {words}
      </p>
      <dl className="mt-2 flex flex-col">
        <ValueRow label="Ideal εw/d" value={`${sig(p.idealPerM * f, 4)} ${unit}`} />
        <ValueRow label="Solved" value={`${sig(solved * f, 4)} ${unit}`} err={rel} />
        <ValueRow label="Fringing excess" value={`${sig(excess, 3)} %`} errText={`±${sig(rel * p.solvedOverIdeal * 100, 2)} points`} testId="plates-excess" />
        <ValueRow label="Gap / width" value={sig(p.gapToWidth, 3)} />
        <ValueRow label="Gap" value={`${sig(p.gap, 4)} ${unitLabel}`} />
        <ValueRow label="Width (overlap)" value={`${sig(p.width, 4)} ${unitLabel}`} />
      </dl>
    </Block>
  );
}

function lineTsv(r: SectionResult): string {
  const l = r.line!;
  const e = r.errorEstimate.relative;
  return [
    'quantity\tvalue\tunit\trelative error',
    `C'\t${l.capacitancePerM}\tF/m\t${e}`,
    `L'\t${l.inductancePerM}\tH/m\t${e}`,
    `Z0\t${l.z0Ohm}\tohm\t${e}`,
    `eps_eff\t${l.epsEff}\t\t${2 * e}`,
    `phase velocity\t${l.velocityMPerS}\tm/s\t${e}`,
    `delay\t${l.delaySPerM}\ts/m\t${e}`,
  ].join('\n');
}

function solveTsv(r: SectionResult): string {
  return [
    `solve time\t${r.timing.ms}\tms`,
    `mesh nodes\t${r.mesh.nodes}\t${r.mesh.nx} x ${r.mesh.ny}`,
    `preset\t${r.mesh.preset}`,
    `iterations\t${r.solver.iterations}`,
    `relative residual\t${r.solver.relResidual}`,
    `error estimate (relative)\t${r.errorEstimate.relative}`,
  ].join('\n');
}

function Matrix({
  nets,
  values,
  errs,
  fmt,
  unit,
  compact,
}: {
  nets: string[];
  values: number[][];
  errs: number[][];
  fmt: (v: number) => string;
  unit: string;
  compact?: boolean;
}) {
  return (
    <div className={cn('overflow-x-auto', compact && 'mt-2')}>
      <table className="w-full border-collapse text-sm tabular-nums">
        <thead>
          <tr className="bg-surface-muted text-xs text-ink-soft">
            <th className="px-2 py-1 text-left font-medium">{unit}</th>
            {nets.map((n) => (
              <th key={n} className="px-2 py-1 text-right font-medium" scope="col">
                {n}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {values.map((row, i) => (
            <tr key={nets[i]} className="border-b border-line/60">
              <th scope="row" className="px-2 py-1 text-left text-xs font-medium text-ink-soft">
                {nets[i]}
              </th>
              {row.map((v, j) => (
                <td key={j} className="px-2 py-1 text-right" data-testid={compact ? undefined : `cell-${i}-${j}`}>
                  <span className={cn('font-medium', i === j ? 'text-ink' : 'text-ink-soft')}>{fmt(v)}</span>
                  {!compact ? <span className="block text-[0.7rem] leading-tight text-ink-muted">{formatRelError(errs[i]?.[j])}</span> : null}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

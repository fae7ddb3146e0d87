'use client';
/**
 * The results panel's compact summary of the line values: C′, L′, Z0, εeff and delay (or the
 * modes of coupled lines), the loss figures at a frequency, and the peak field with its place
 * and the breakdown margin at a voltage, with the field caution (product rule 4).
 *
 * Losses and peak field come from the result when it holds them, else they are worked out
 * from this solve's finest-mesh fields with the same functions the CLI and the Analysis card
 * use (lib/analysis/losses.ts, lib/analysis/peak-field.ts), in the summary worker
 * (workers/summary.worker.ts through lib/client/summary-client.ts), so the page stays
 * responsive. Requests go out after the field has been drawn (a timeout after the next frame,
 * which also lets typing settle); the latest request of each kind wins.
 */
import { useEffect, useMemo, useState } from 'react';
import type { LossValues, PeakFieldEntry, SectionFields, SectionResult } from '@/lib/engine/types';
import { METRES_PER_UNIT, type ResolvedSection, type Section, type Units } from '@/lib/section/schema';
import { resolveSection } from '@/lib/section/resolve';
import { SummaryClient } from '@/lib/client/summary-client';
import { CAP_UNIT_FACTOR, type CapUnit, sig, withPrefix } from '@/lib/field/format';
import { FieldCaution } from '@/components/field/caution';
import { cn } from '@/components/ui/cn';
import { Block } from './blocks';

const C0 = 299_792_458; // speed of light in vacuum, m/s (exact, SI definition)
const UNIT_LABEL: Record<string, string> = { m: 'm', mm: 'mm', um: 'µm', mil: 'mil', in: 'in' };

export interface LineSummaryProps {
  result: SectionResult;
  /** Finest-mesh fields of this solve (losses and peak field are computed from them). */
  fields?: SectionFields | null;
  /** The solved section (materials, conductivities, strengths, units). */
  section?: Section | null;
  /** Per-length capacitance unit chosen in the panel. */
  unit: CapUnit;
  /** Shows a link to the detailed Analysis card. */
  onShowDetails?: () => void;
}

/** Frequency (GHz) and voltage (V) as typed → values or a message naming the field. */
export function parseSummaryInputs(freqText: string, voltsText: string): { frequencyHz: number; volts: number } | { error: string } {
  const f = Number(freqText.trim().replace(',', '.'));
  if (freqText.trim() === '' || !Number.isFinite(f) || f <= 0 || f > 1e4) {
    return { error: `Frequency: enter a number of GHz above 0 and up to 10 000 (got “${freqText.slice(0, 20)}”).` };
  }
  const v = Number(voltsText.trim().replace(',', '.'));
  if (voltsText.trim() === '' || !Number.isFinite(v) || v === 0 || Math.abs(v) > 1e7) {
    return { error: `Voltage: enter a non-zero number of volts up to 10 MV (got “${voltsText.slice(0, 20)}”).` };
  }
  return { frequencyHz: f * 1e9, volts: v };
}

/** The largest field over the materials and the smallest breakdown margin (with where they are). */
export function peakSummary(entries: PeakFieldEntry[]): { peak: PeakFieldEntry | null; weakest: PeakFieldEntry | null } {
  let peak: PeakFieldEntry | null = null;
  let weakest: PeakFieldEntry | null = null;
  for (const e of entries) {
    if (e.kind === 'conductor') continue;
    if (!peak || e.vPerM > peak.vPerM) peak = e;
    if (e.margin !== undefined && (!weakest || e.margin < weakest.margin!)) weakest = e;
  }
  return { peak, weakest };
}

interface Extra {
  losses?: LossValues;
  peak?: PeakFieldEntry[];
  volts?: number;
  error?: string;
}

export function LineSummary({ result, fields, section, unit, onShowDetails }: LineSummaryProps) {
  const units = (section?.units ?? 'm') as Units;
  const unitLabel = UNIT_LABEL[units] ?? units;
  const perUnit = METRES_PER_UNIT[units] ?? 1;
  const [freqText, setFreqText] = useState(() => String((result.losses?.frequencyHz ?? 1e9) / 1e9));
  const [voltsText, setVoltsText] = useState(() => String(result.peakFieldInfo?.volts ?? 100));
  const parsed = parseSummaryInputs(freqText, voltsText);
  const inputError = 'error' in parsed ? parsed.error : null;
  const frequencyHz = 'error' in parsed ? null : parsed.frequencyHz;
  const volts = 'error' in parsed ? null : parsed.volts;

  const resolved: ResolvedSection | null = useMemo(() => {
    if (!section) return null;
    const r = resolveSection(section);
    return r.ok ? r.section : null;
  }, [section]);
  const canCompute = !!(fields && resolved && result.nets.length > 0);

  // Worked out in the summary worker after the picture is on screen, each kind on its own (a
  // new voltage does not redo the losses); bad input keeps the last values.
  const [client] = useState(() => new SummaryClient());
  useEffect(() => () => client.dispose(), [client]);
  const [peakOut, setPeakOut] = useState<{ entries: PeakFieldEntry[]; volts: number } | { error: string } | null>(null);
  const [lossOut, setLossOut] = useState<LossValues | { error: string } | null>(null);
  useEffect(() => {
    setPeakOut(null);
    setLossOut(null);
  }, [result]);
  const peakPending = useAfterPaint(
    canCompute && volts !== null
      ? async (live) => {
          const a = await client.peakField({ section: resolved!, result, fields: fields! }, volts);
          if (a.stale || !live()) return;
          setPeakOut(a.ok ? { entries: a.value, volts } : { error: a.message });
        }
      : null,
    [canCompute, resolved, result, fields, volts],
  );
  const lossPending = useAfterPaint(
    canCompute && frequencyHz !== null
      ? async (live) => {
          const a = await client.losses({ section: resolved!, result, fields: fields! }, frequencyHz);
          if (a.stale || !live()) return;
          setLossOut(a.ok ? a.value : { error: a.message });
        }
      : null,
    [canCompute, resolved, result, fields, frequencyHz],
    180,
  );
  const pending = peakPending || lossPending;
  const extra: Extra = {
    ...(peakOut && 'entries' in peakOut ? { peak: peakOut.entries, volts: peakOut.volts } : {}),
    ...(lossOut && !('error' in lossOut) ? { losses: lossOut } : {}),
  };
  const errors = [peakOut && 'error' in peakOut ? peakOut.error : null, lossOut && 'error' in lossOut ? lossOut.error : null].filter(Boolean);
  if (errors.length) extra.error = errors.join(' ');

  const losses = canCompute ? extra.losses : result.losses;
  const peakEntries = canCompute ? extra.peak : result.peakField;
  const lossWait = canCompute && lossPending && !losses;
  const peakWait = canCompute && peakPending && !peakEntries;
  const peakVolts = canCompute ? extra.volts : result.peakFieldInfo?.volts;
  const { peak, weakest } = peakEntries ? peakSummary(peakEntries) : { peak: null, weakest: null };
  const f = CAP_UNIT_FACTOR[unit];
  const line = result.line;
  const modes = result.modes;
  const modal = result.modal;
  const delay = (epsEff: number) => `${sig((Math.sqrt(epsEff) / C0) * 1e9, 4)} ns/m`;
  const at = (e: PeakFieldEntry) => `at x ${sig(e.x / perUnit, 4)}, y ${sig(e.y / perUnit, 4)} ${unitLabel}`;
  const whereWords = (w: string) => (w === 'background' ? 'the background' : w === '(boundary)' ? 'the ground plane' : w);

  return (
    <Block
      title="Summary"
      hint="Quasi-static (TEM) values; loss and peak field from this solve's mesh."
      testId="results-summary"
    >
      <dl className="flex flex-col text-sm">
        {line ? (
          <>
            <Row k="C′" v={`${sig(line.capacitancePerM * f, 4)} ${unit}`} testId="summary-c" />
            <Row k="L′" v={withPrefix(line.inductancePerM, 'H/m', 4)} testId="summary-l" />
            <Row k="Z0" v={`${sig(line.z0Ohm, 4)} Ω`} testId="summary-z0" />
            <Row k="εeff" v={sig(line.epsEff, 4)} testId="summary-epseff" />
            <Row k="Delay" v={`${sig(line.delaySPerM * 1e9, 4)} ps/mm · ${sig(line.delaySPerM * 1e12 * 0.0254, 4)} ps/in`} testId="summary-delay" />
          </>
        ) : null}
        {modes ? (
          <>
            <Row k="Z0 even / odd" v={`${sig(modes.even.z0Ohm, 4)} / ${sig(modes.odd.z0Ohm, 4)} Ω`} testId="summary-modes-z0" />
            <Row k="εeff even / odd" v={`${sig(modes.even.epsEff, 4)} / ${sig(modes.odd.epsEff, 4)}`} />
            <Row k="Delay even / odd" v={`${delay(modes.even.epsEff)} / ${delay(modes.odd.epsEff)}`} />
            <Row k="Differential / common" v={`${sig(modes.differentialOhm, 4)} / ${sig(modes.commonOhm, 4)} Ω`} testId="summary-zdiff" />
          </>
        ) : null}
        {modal
          ? modal.map((m, k) => <Row key={k} k={`Mode ${k + 1}`} v={`${sig(m.z0Ohm, 4)} Ω · εeff ${sig(m.epsEff, 4)} · ${delay(m.epsEff)}`} testId={k === 0 ? 'summary-modal' : undefined} />)
          : null}
        {!line && !modes && !modal && result.inductancePerM ? (
          <Row k={`L′ of ${result.nets[0]}`} v={withPrefix(result.inductancePerM[0]![0]!, 'H/m', 4)} />
        ) : null}
      </dl>

      {canCompute ? (
        <div className="mt-2 flex flex-wrap items-center gap-x-2 gap-y-1 text-xs text-ink-soft">
          <label className="flex items-center gap-1">
            at
            <input
              className={cn('h-7 w-16 rounded border bg-surface px-1.5 text-right text-xs tabular-nums text-ink', frequencyHz === null && inputError?.startsWith('Frequency') ? 'border-danger' : 'border-line-strong')}
              inputMode="decimal"
              value={freqText}
              onChange={(e) => setFreqText(e.target.value)}
              aria-label="Frequency for the losses, GHz"
              aria-invalid={!!inputError?.startsWith('Frequency')}
              data-testid="summary-frequency"
            />
            GHz
          </label>
          <label className="flex items-center gap-1">
            and
            <input
              className={cn('h-7 w-20 rounded border bg-surface px-1.5 text-right text-xs tabular-nums text-ink', inputError?.startsWith('Voltage') ? 'border-danger' : 'border-line-strong')}
              inputMode="decimal"
              value={voltsText}
              onChange={(e) => setVoltsText(e.target.value)}
              aria-label={`Voltage on ${result.nets[0] ?? 'the first signal net'} for the peak field, V`}
              aria-invalid={!!inputError?.startsWith('Voltage')}
              data-testid="summary-volts"
            />
            V on {result.nets[0]}
          </label>
          {pending ? <span className="text-ink-muted">working…</span> : null}
        </div>
      ) : null}
      {inputError ? (
        <p className="mt-1 text-xs text-danger" role="alert" data-testid="summary-input-error">
          {inputError} The values below are for the last valid input.
        </p>
      ) : null}
      {extra.error ? <p className="mt-1 text-xs text-danger">{extra.error}</p> : null}

      <dl className="mt-1 flex flex-col text-sm" data-testid="summary-losses">
        {losses ? (
          <>
            <Row
              k={`Loss at ${withPrefix(losses.frequencyHz, 'Hz', 3)}`}
              v={
                typeof losses.alphaDbPerM === 'number'
                  ? `${sig(losses.alphaDbPerM, 3)} dB/m`
                  : losses.alphaDbPerM.map((a, k) => `${modes ? (k === 0 ? 'even ' : 'odd ') : `mode ${k + 1} `}${sig(a, 3)}`).join(' · ') + ' dB/m'
              }
              testId="summary-alpha"
            />
            {typeof losses.rPerM === 'number' && typeof losses.gPerM === 'number' ? (
              <Row k="R′ · G′" v={`${withPrefix(losses.rPerM, 'Ω/m', 3)} · ${withPrefix(losses.gPerM, 'S/m', 3)}`} />
            ) : null}
          </>
        ) : (
          <Row k="Loss" v={lossWait ? '…' : canCompute ? '—' : 'not part of this result'} />
        )}
      </dl>

      <dl className="mt-1 flex flex-col text-sm" data-testid="summary-peak">
        {peak && peakVolts !== undefined ? (
          <>
            <Row k={`Peak |E| at ${Number(peakVolts.toPrecision(6))} V`} v={`${withPrefix(peak.vPerM, 'V/m', 3)} (${sig(peak.vPerM / 1e6, 3)} kV/mm)`} testId="summary-peak-value" />
            <p className="pb-1 text-right text-xs text-ink-soft" data-testid="summary-peak-where">
              in {whereWords(peak.where)} {at(peak)}
              {peak.singular ? ' · at a sharp corner or edge: grows as the mesh is refined' : ''}
            </p>
            <Row k="Breakdown margin" v={weakest ? `${sig(weakest.margin!, 3)} ×` : 'no strength given'} testId="summary-margin" warn={weakest ? weakest.margin! < 1 : false} />
            <p className="pb-1 text-right text-xs text-ink-soft" data-testid="summary-margin-where">
              {weakest
                ? `typical strength of ${whereWords(weakest.where)} (${Number((weakest.strengthVPerM! / 1e6).toPrecision(3))} kV/mm) over its peak field${weakest.margin! < 1 ? ': the peak exceeds it' : ''}`
                : 'No material of this section has a dielectric strength.'}
            </p>
          </>
        ) : (
          <Row k="Peak |E|" v={peakWait ? '…' : canCompute ? '—' : 'not part of this result'} />
        )}
      </dl>
      {peak || canCompute ? <FieldCaution compact className="mt-2" testId="summary-caution" /> : null}
      {onShowDetails ? (
        <button type="button" onClick={onShowDetails} className="mt-2 text-xs font-medium text-accent hover:underline" data-testid="results-summary-details">
          Details, sweeps and exports in the Analysis card ↓
        </button>
      ) : null}
    </Block>
  );
}

/**
 * Starts `work` after the next frame has been painted (a timeout of `delayMs` after it, which
 * also lets typing settle), again whenever `deps` change; true until its answer is in. `work`
 * gets `live()`, false once `deps` changed or the component left (its answer is then dropped).
 */
function useAfterPaint(work: ((live: () => boolean) => Promise<void>) | null, deps: unknown[], delayMs = 120): boolean {
  const [waiting, setWaiting] = useState(false);
  useEffect(() => {
    if (!work) return;
    let stop = false;
    let timer: ReturnType<typeof setTimeout> | undefined;
    setWaiting(true);
    const frame = requestAnimationFrame(() => {
      timer = setTimeout(() => {
        if (stop) return;
        const live = () => !stop;
        work(live).finally(() => {
          if (!stop) setWaiting(false);
        });
      }, delayMs);
    });
    return () => {
      stop = true;
      cancelAnimationFrame(frame);
      if (timer) clearTimeout(timer);
      setWaiting(false);
    };
    // `work` is rebuilt on every render: `deps` name what it reads
  }, deps);
  return waiting;
}

function Row({ k, v, testId, warn }: { k: string; v: string; testId?: string; warn?: boolean }) {
  return (
    <div className="flex items-baseline justify-between gap-3 border-b border-line/60 py-0.5 last:border-b-0">
      <dt className="shrink-0 text-ink-soft">{k}</dt>
      <dd className={cn('min-w-0 text-right font-medium tabular-nums', warn ? 'text-danger' : 'text-ink')} data-testid={testId}>
        {v}
      </dd>
    </div>
  );
}

'use client';
/**
 * Solve, read and save, for the section page: the solve bar (preset, Solve, Cancel, live
 * progress), the results panel and the field views of the last solve, and saving the solve
 * to the workspace. The solver runs in a Web Worker, so the page never freezes.
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import Link from 'next/link';
import { CircleStop, Play, Save } from 'lucide-react';
import type { Section } from '@/lib/section/schema';
import { useSolver } from '@/lib/client/use-solver';
import { NotSavedError, saveSolve, type SavedSolveRef } from '@/lib/client/save-solve';
import { canonicalJson } from '@/lib/client/settings-hash';
import { DEFAULT_TOLERANCE, type SolvePreset, type SolveSettings } from '@/workers/protocol';
import { sig } from '@/lib/field/format';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { errorMessage } from '@/components/ui/api';
import { cn } from '@/components/ui/cn';
import { FieldView } from '@/components/field/field-view';
import { ResultsPanel } from './results-panel';

const STAGE_WORDS: Record<string, string> = {
  mesh: 'Building the mesh',
  setup: 'Setting up the solver',
  solve: 'Solving',
  charges: 'Computing charges',
  refine: 'Refining for the error estimate',
};

export interface SolveWorkbenchProps {
  workspaceId: string;
  sectionId: string;
  /** The drawing as it is now (from the editor). */
  section: Section | null;
  /** False when the editor reports errors (short circuit, no reference ...). */
  canSolve: boolean;
  /** Why solving is blocked, shown beside the button. */
  blockedReason?: string;
  canEdit: boolean;
  /** Where the results and field go: 'stack' (one column) or 'split' (results beside field). */
  layout?: 'stack' | 'split';
}

export type Solver = ReturnType<typeof useSolver>;

/** Solve, read and save in one column (or results beside the field with layout="split"). */
export function SolveWorkbench(props: SolveWorkbenchProps) {
  const solver = useSolver();
  return (
    <div className="flex flex-col gap-3" data-testid="solve-workbench">
      <SolveBar {...props} solver={solver} />
      <SolveOutput solver={solver} layout={props.layout} />
    </div>
  );
}

/** The solve controls: mesh preset, Solve / Cancel, live progress, status, save, messages. */
export function SolveBar({
  workspaceId,
  sectionId,
  section,
  canSolve,
  blockedReason,
  canEdit,
  solver,
}: Omit<SolveWorkbenchProps, 'layout'> & { solver: Solver }) {
  const { state, solve, cancel } = solver;
  const sectionPreset = (section?.mesh?.preset as SolvePreset | undefined) ?? 'standard';
  const [preset, setPreset] = useState<SolvePreset | 'section'>('section');
  const settings: SolveSettings = { preset: preset === 'section' ? sectionPreset : preset, tolerance: DEFAULT_TOLERANCE };
  const [saving, setSaving] = useState(false);
  const [saved, setSaved] = useState<SavedSolveRef | null>(null);
  const [saveError, setSaveError] = useState<string | null>(null);
  const running = state.status === 'running';
  const stale = useMemo(
    () => !!(state.solvedSection && section && canonicalJson(state.solvedSection) !== canonicalJson(section)),
    [state.solvedSection, section],
  );
  const lastJob = useRef(0);
  useEffect(() => {
    if (state.status === 'done' && state.jobId !== lastJob.current) {
      lastJob.current = state.jobId;
      setSaved(null);
      setSaveError(null);
    }
  }, [state.status, state.jobId]);

  const onSolve = () => {
    if (!section) return;
    setSaved(null);
    setSaveError(null);
    void solve(section, settings);
  };
  const onSave = async () => {
    if (!state.result || !state.fields || !state.solvedSection || !state.solvedSettings) return;
    setSaving(true);
    setSaveError(null);
    try {
      setSaved(
        await saveSolve({
          workspaceId,
          sectionId,
          section: state.solvedSection,
          settings: state.solvedSettings,
          result: state.result,
          fields: state.fields,
        }),
      );
    } catch (e) {
      setSaveError(e instanceof NotSavedError ? e.message : errorMessage(e));
    } finally {
      setSaving(false);
    }
  };

  const p = state.progress;
  const fraction = p?.fraction;
  return (
    <div className="flex flex-col gap-3" data-testid="solve-bar">
      <div className="flex flex-wrap items-center gap-2 rounded-md border border-line bg-surface px-3 py-2 shadow-xs">
        <label className="flex items-center gap-1.5 text-sm text-ink-soft">
          Mesh
          <select
            className="h-8 rounded-md border border-line-strong bg-surface px-2 text-sm text-ink"
            value={preset}
            onChange={(e) => setPreset(e.target.value as SolvePreset | 'section')}
            data-testid="solve-preset"
            disabled={running}
          >
            <option value="section">As in the section ({sectionPreset})</option>
            <option value="quick">Quick</option>
            <option value="standard">Standard</option>
            <option value="precise">Precise</option>
          </select>
        </label>
        {running ? (
          <Button variant="danger" onClick={cancel} data-testid="solve-cancel">
            <CircleStop className="size-4" aria-hidden /> Cancel
          </Button>
        ) : (
          <Button variant="primary" onClick={onSolve} disabled={!section || !canSolve} data-testid="solve-button">
            <Play className="size-4" aria-hidden /> Solve
          </Button>
        )}
        {running ? (
          <div className="flex min-w-56 flex-1 flex-col gap-1" role="status" aria-live="polite" data-testid="solve-progress">
            <div className="flex justify-between text-xs text-ink-soft">
              <span>
                {p ? STAGE_WORDS[p.stage] ?? p.stage : 'Starting the solver'}
                {p?.level !== undefined ? ` · level ${p.level}` : ''}
                {p?.iteration !== undefined ? ` · iteration ${p.iteration}` : ''}
              </span>
              <span className="tabular-nums">
                {p?.relResidual !== undefined ? `residual ${sig(p.relResidual, 2)}` : ''}
                {p ? ` · ${sig(p.elapsedMs / 1000, 2)} s` : ''}
              </span>
            </div>
            <div className="h-1.5 overflow-hidden rounded-full bg-grey-100">
              <div
                className={cn('h-full rounded-full bg-accent transition-[width]', fraction === undefined && 'w-1/3 animate-pulse')}
                style={fraction !== undefined ? { width: `${Math.round(fraction * 100)}%` } : undefined}
              />
            </div>
          </div>
        ) : (
          <p className="text-sm text-ink-muted" data-testid="solve-status">
            {!canSolve && blockedReason
              ? blockedReason
              : state.status === 'done' && state.result
                ? `Solved in ${sig((state.wallMs ?? state.result.timing.ms) / 1000, 3)} s on ${state.result.mesh.nodes.toLocaleString('en-US')} nodes.`
                : state.status === 'cancelled'
                  ? 'Solve cancelled.'
                  : 'Press Solve to compute capacitance, line values and the field.'}
          </p>
        )}
        {state.status === 'done' && state.result && canEdit ? (
          <div className="ml-auto flex items-center gap-2">
            {saved ? (
              <span className="text-sm text-green-700" data-testid="solve-saved">
                {saved.created ? 'Saved' : 'Already saved (same revision and settings)'} ·{' '}
                <Link href={`/w/${workspaceId}/solves/${saved.id}`} className="font-medium text-accent hover:underline" data-testid="solve-saved-link">
                  open solve r{saved.revisionNumber}
                </Link>
              </span>
            ) : (
              <Button onClick={onSave} pending={saving} disabled={stale || running} data-testid="solve-save" title={stale ? 'The drawing changed since this solve' : undefined}>
                <Save className="size-4" aria-hidden /> Save solve
              </Button>
            )}
          </div>
        ) : null}
      </div>

      {state.status === 'error' ? (
        <Alert tone="danger" title="The section could not be solved." data-testid="solve-error">
          {state.error}
          {state.issues?.length ? (
            <ul className="mt-1 list-disc pl-5">
              {state.issues.slice(0, 8).map((i, k) => (
                <li key={k}>{i.message}</li>
              ))}
            </ul>
          ) : null}
        </Alert>
      ) : null}
      {saveError ? (
        <Alert tone="warning" title="The solve was not saved." data-testid="solve-save-error">
          {saveError}
        </Alert>
      ) : null}
      {stale && state.result ? (
        <Alert tone="info">The drawing has changed since this solve; the results below belong to the drawing as it was. Solve again to update them.</Alert>
      ) : null}

    </div>
  );
}

/** The results and field of the solver's last solve (tabs, or side by side with layout="split"). */
export function SolveOutput({ solver, layout = 'stack' }: { solver: Solver; layout?: 'stack' | 'split' }) {
  const { state } = solver;
  const [tab, setTab] = useState<'results' | 'field'>('results');
  return (
    <>
      {state.result && state.fields && state.solvedSection ? (
        layout === 'split' ? (
          <div className="grid grid-cols-1 gap-4 xl:grid-cols-[minmax(0,26rem)_minmax(0,1fr)]">
            <ResultsPanel result={state.result} units={state.solvedSection.units} fields={state.fields} section={state.solvedSection} />
            <FieldView result={state.result} fields={state.fields} section={state.solvedSection} />
          </div>
        ) : (
          <div className="flex flex-col gap-3">
            <div role="tablist" aria-label="Solve output" className="inline-flex self-start rounded-md border border-line-strong bg-surface p-0.5">
              {(['results', 'field'] as const).map((t) => (
                <button
                  key={t}
                  type="button"
                  role="tab"
                  aria-selected={tab === t}
                  data-testid={`solve-tab-${t}`}
                  onClick={() => setTab(t)}
                  className={cn('h-8 rounded px-3 text-sm font-medium', tab === t ? 'bg-ink text-white' : 'text-ink-soft hover:bg-grey-100')}
                >
                  {t === 'results' ? 'Results' : 'Field'}
                </button>
              ))}
            </div>
            {tab === 'results' ? (
              <ResultsPanel result={state.result} units={state.solvedSection.units} fields={state.fields} section={state.solvedSection} />
            ) : (
              <FieldView result={state.result} fields={state.fields} section={state.solvedSection} />
            )}
          </div>
        )
      ) : null}
    </>
  );
}

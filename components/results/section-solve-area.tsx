'use client';
/**
 * The section page's editor with solving built in: the Solve button and progress at the end
 * of the editor's toolbar, a "Results" tab in its side panel (solve bar, save, results), the
 * field picture laid over the drawing in the editor's world layer, and the full field views
 * (probe, cut line, colour bar, field lines, mesh) below the editor.
 *
 * Mount it where the page mounts SectionEditorClient, with the same props.
 */
import dynamic from 'next/dynamic';
import { useCallback, useMemo, useState } from 'react';
import { CircleStop, Play } from 'lucide-react';
import type { ResolvedSection, Section } from '@/lib/section/schema';
import type { SectionIssue } from '@/lib/section/issues';
import { resolveSection } from '@/lib/section/resolve';
import { useSolver } from '@/lib/client/use-solver';
import { DEFAULT_TOLERANCE } from '@/workers/protocol';
import { sig } from '@/lib/field/format';
import { SectionEditorClient, type SectionEditorClientProps } from '@/components/canvas/section-editor-client';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { cn } from '@/components/ui/cn';
import { FieldView } from '@/components/field/field-view';
import { paintOverlay, type OverlayKind } from '@/components/field/field-overlay';
import { ResultsPanel } from './results-panel';
import { SolveBar } from './solve-workbench';
import { AnalysisArea } from '@/components/analysis/analysis-area';

const FieldKonvaLayer = dynamic(() => import('@/components/field/field-konva-layer').then((m) => m.FieldKonvaLayer), {
  ssr: false,
  loading: () => null,
});

export type SectionSolveAreaProps = Omit<SectionEditorClientProps, 'sidePanel' | 'sidePanelLabel' | 'toolbarEnd' | 'worldLayer' | 'onSectionChange'>;

export function SectionSolveArea(props: SectionSolveAreaProps) {
  const { workspaceId, sectionId, canEdit, className } = props;
  const solver = useSolver();
  const { state, solve, cancel } = solver;
  const [section, setSection] = useState<Section | null>(null);
  const [canSolve, setCanSolve] = useState(false);
  const [issueCount, setIssueCount] = useState(0);
  const [overlayKind, setOverlayKind] = useState<OverlayKind | 'off'>('potential');

  const onSectionChange = useCallback((s: Section, _r: ResolvedSection, issues: SectionIssue[], ok: boolean) => {
    setSection(s);
    setCanSolve(ok);
    setIssueCount(issues.filter((i) => i.severity === 'error').length);
  }, []);

  const solvedResolved = useMemo(() => {
    if (!state.solvedSection) return null;
    const r = resolveSection(state.solvedSection);
    return r.ok ? r.section : r.partial;
  }, [state.solvedSection]);
  const overlay = useMemo(() => {
    if (overlayKind === 'off' || !state.result || !state.fields) return null;
    return paintOverlay(state.result, state.fields, solvedResolved, overlayKind);
  }, [overlayKind, state.result, state.fields, solvedResolved]);

  const running = state.status === 'running';
  const p = state.progress;
  // the summary in the results panel links to the detailed Analysis card below the editor
  const showAnalysis = useCallback(() => {
    const card = document.querySelector<HTMLElement>('[data-testid="analysis-card"]');
    card?.scrollIntoView({ behavior: 'smooth', block: 'start' });
    card?.querySelector<HTMLElement>('[data-testid="analysis-tab-lines"]')?.focus({ preventScroll: true });
  }, []);
  const quickSolve = () => {
    if (section) void solve(section, { preset: (section.mesh?.preset as 'quick' | 'standard' | 'precise' | undefined) ?? 'standard', tolerance: DEFAULT_TOLERANCE });
  };
  const blockedReason = issueCount ? `Solving is blocked: fix the ${issueCount === 1 ? 'problem' : `${issueCount} problems`} listed under Checks.` : 'Solving is blocked until the drawing is valid.';

  const toolbarEnd = (
    <div className="flex items-center gap-2">
      {running ? (
        <>
          <span className="hidden text-xs tabular-nums text-ink-soft lg:inline" data-testid="toolbar-progress">
            {p ? `${p.stage}${p.iteration !== undefined ? ` · it ${p.iteration}` : ''}${p.relResidual !== undefined ? ` · ${sig(p.relResidual, 2)}` : ''}` : 'starting…'}
          </span>
          <Button size="sm" variant="danger" onClick={cancel} data-testid="toolbar-cancel">
            <CircleStop className="size-3.5" aria-hidden /> Cancel
          </Button>
        </>
      ) : (
        <Button size="sm" variant="primary" onClick={quickSolve} disabled={!section || !canSolve} data-testid="toolbar-solve" title={canSolve ? 'Solve with the section’s mesh preset' : blockedReason}>
          <Play className="size-3.5" aria-hidden /> Solve
        </Button>
      )}
      {state.result ? (
        <label className="flex items-center gap-1 text-xs text-ink-soft">
          <span className="hidden xl:inline">Show</span>
          <select
            className="h-7 rounded border border-line-strong bg-surface px-1 text-xs text-ink"
            value={overlayKind}
            onChange={(e) => setOverlayKind(e.target.value as OverlayKind | 'off')}
            data-testid="overlay-kind"
            aria-label="Field shown over the drawing"
          >
            <option value="potential">potential</option>
            <option value="field">|E|</option>
            <option value="off">no field</option>
          </select>
        </label>
      ) : null}
    </div>
  );

  const sidePanel = (
    <div className="flex flex-col gap-3 p-3" data-testid="results-side">
      <SolveBar
        workspaceId={workspaceId}
        sectionId={sectionId}
        section={section}
        canSolve={canSolve}
        blockedReason={blockedReason}
        canEdit={canEdit}
        solver={solver}
      />
      {state.result && state.solvedSection ? (
        <ResultsPanel result={state.result} units={state.solvedSection.units} fields={state.fields} section={state.solvedSection} onShowDetails={showAnalysis} />
      ) : null}
    </div>
  );

  return (
    <div className="flex min-h-0 flex-1 flex-col">
      <SectionEditorClient
        {...props}
        className={cn('h-[calc(100vh-9rem)] min-h-[34rem]', className)}
        onSectionChange={onSectionChange}
        toolbarEnd={toolbarEnd}
        sidePanel={sidePanel}
        sidePanelLabel="Results"
        worldLayer={overlay ? <FieldKonvaLayer image={overlay.image} rect={overlay.rect} unit={overlay.unit} /> : undefined}
      />
      {state.result && state.fields && state.solvedSection ? (
        <div className="px-4 py-5">
          <Card className="p-4" aria-label="Field views" data-testid="field-card">
            <h2 className="mb-3 text-md font-semibold text-ink">Field of the last solve</h2>
            <FieldView result={state.result} fields={state.fields} section={state.solvedSection} />
          </Card>
        </div>
      ) : null}
      <div className="px-4 pb-5">
        <AnalysisArea
          workspaceId={workspaceId}
          sectionId={sectionId}
          canEdit={canEdit}
          section={section}
          canSolve={canSolve}
          result={state.result}
          fields={state.fields}
          solvedSection={state.solvedSection}
        />
      </div>
    </div>
  );
}

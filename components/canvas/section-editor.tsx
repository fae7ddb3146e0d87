'use client';

/**
 * The section editor: toolbar, canvas (Konva, loaded in the browser only), side panels,
 * undo/redo, keyboard shortcuts, live checks, drafts kept in the browser, import/export
 * and saving through a callback (see section-editor-client.tsx for the API wiring).
 *
 * Ways in for other parts of the page (solve button, results, field views):
 *  - `toolbarEnd`: nodes at the right end of the toolbar (the solve button).
 *  - `sidePanel`: a tab of its own in the side panel (`sidePanelLabel`).
 *  - `overlay(ctx)`: HTML over the canvas, given the view transform (world ↔ screen).
 *  - `worldLayer`: react-konva nodes in world coordinates (section units, y up), drawn
 *    above dielectrics and below conductors (field colour maps).
 *  - `onSectionChange(section, resolved, issues, canSolve)`: after every change.
 */
import dynamic from 'next/dynamic';
import { useCallback, useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import {
  Circle as CircleIcon,
  CircleDot,
  Copy,
  Download,
  Eye,
  Grid3x3,
  Hand,
  HelpCircle,
  Magnet,
  Maximize,
  Minus,
  MousePointer2,
  Pentagon,
  Plus,
  Redo2,
  Save,
  Square,
  Trash2,
  Undo2,
  Upload,
  X,
} from 'lucide-react';
import type { ResolvedSection, Section, Units } from '@/lib/section/schema';
import { sectionSchema } from '@/lib/section/schema';
import type { SectionIssue } from '@/lib/section/issues';
import { parseSectionFile } from '@/lib/section/parse';
import { analyseSection } from '@/lib/editor/analyse';
import * as cmd from '@/lib/editor/commands';
import { boxOfShapes, isEmptyBox, unionBox, type Box, type Pt } from '@/lib/editor/geometry';
import type { GeometryPatch } from '@/lib/editor/handles';
import { breakCoalescing, canRedo, canUndo, commit, createHistory, redo, undo, type History } from '@/lib/editor/history';
import { netColor } from '@/lib/editor/palette';
import { actionForKey, displayKey, SHORTCUTS, type EditorAction } from '@/lib/editor/shortcuts';
import { convertUnits, UNIT_LABELS } from '@/lib/editor/units';
import { tidy } from '@/lib/editor/values';
import { fitView, gridSteps, toScreen, toWorld, zoomAt, type View } from '@/lib/editor/view';
import { clearDraft, loadDraft, saveDraft, type Draft } from '@/lib/editor/draft';
import { cn } from '@/components/ui/cn';
import type { LayerVisibility, Tool } from './editor-stage';
import { BoundaryPanel, ChecksPanel, MaterialsPanel, NetsPanel, PropertiesPanel, VariablesPanel, type CustomMaterialsProps } from './panels';

const EditorStage = dynamic(() => import('./editor-stage').then((m) => m.EditorStage), {
  ssr: false,
  loading: () => <div className="grid h-full place-items-center text-sm text-ink-muted">Loading the drawing…</div>,
});

export interface ViewContext {
  view: View;
  width: number;
  height: number;
  toScreen: (p: Pt) => Pt;
  toWorld: (p: Pt) => Pt;
}

export interface SaveOutcome {
  revisionId: string;
}

export interface SectionEditorProps extends CustomMaterialsProps {
  initialSection: Section;
  /** Viewers: drawing and values only, nothing can be changed. */
  readOnly?: boolean;
  /** Key for unsaved work kept in the browser; without it nothing is kept. */
  draftKey?: string;
  baseRevisionId?: string | null;
  onSave?: (section: Section, message?: string) => Promise<SaveOutcome>;
  onSectionChange?: (section: Section, resolved: ResolvedSection, issues: SectionIssue[], canSolve: boolean) => void;
  overlay?: (ctx: ViewContext) => ReactNode;
  worldLayer?: ReactNode;
  sidePanel?: ReactNode;
  sidePanelLabel?: string;
  toolbarEnd?: ReactNode;
  /** Height of the editor; default fills the viewport below the page header. */
  className?: string;
}

type Tab = 'shape' | 'variables' | 'nets' | 'materials' | 'boundary' | 'checks' | 'extra';

const TOOLS: { tool: Tool; label: string; key: string; icon: typeof Square; edit: boolean }[] = [
  { tool: 'select', label: 'Select and move', key: 'V', icon: MousePointer2, edit: false },
  { tool: 'pan', label: 'Pan', key: 'H', icon: Hand, edit: false },
  { tool: 'rect', label: 'Rectangle', key: 'R', icon: Square, edit: true },
  { tool: 'circle', label: 'Circle', key: 'C', icon: CircleIcon, edit: true },
  { tool: 'ring', label: 'Ring', key: 'O', icon: CircleDot, edit: true },
  { tool: 'polygon', label: 'Polygon', key: 'P', icon: Pentagon, edit: true },
  { tool: 'strip', label: 'Strip (zero thickness)', key: 'S', icon: Minus, edit: true },
];

const RULER = 22;

function sectionBox(r: ResolvedSection): Box {
  let b = boxOfShapes(r.shapes.filter((s) => Object.values(s).every((v) => typeof v !== 'number' || Number.isFinite(v))));
  for (const side of ['left', 'right', 'bottom', 'top'] as const) {
    const s = r.boundary[side];
    if (s.type === 'open' || !Number.isFinite(s.at)) continue;
    b = side === 'left' || side === 'right' ? unionBox(b, { minX: s.at, maxX: s.at, minY: isEmptyBox(b) ? 0 : b.minY, maxY: isEmptyBox(b) ? 0 : b.maxY }) : unionBox(b, { minY: s.at, maxY: s.at, minX: isEmptyBox(b) ? 0 : b.minX, maxX: isEmptyBox(b) ? 0 : b.maxX });
  }
  if (isEmptyBox(b)) return { minX: -5, minY: -5, maxX: 5, maxY: 5 };
  return b;
}

function fitTo(r: ResolvedSection, w: number, h: number): View {
  const v = fitView(sectionBox(r), Math.max(50, w - RULER), Math.max(50, h - RULER), 56);
  return { ...v, ox: v.ox + RULER, oy: v.oy + RULER };
}

const isTyping = (t: EventTarget | null) =>
  t instanceof HTMLInputElement || t instanceof HTMLTextAreaElement || t instanceof HTMLSelectElement || (t instanceof HTMLElement && t.isContentEditable);

export function SectionEditor(props: SectionEditorProps) {
  const { initialSection, readOnly = false, draftKey, onSave, onSectionChange, overlay, worldLayer, sidePanel, sidePanelLabel, toolbarEnd, className } = props;
  const [history, setHistory] = useState<History<Section>>(() => createHistory(initialSection));
  const doc = history.present;
  const docRef = useRef(doc);
  docRef.current = doc;
  const analysis = useMemo(() => analyseSection(doc), [doc]);
  const [savedDoc, setSavedDoc] = useState<Section>(initialSection);
  const [baseRevisionId, setBaseRevisionId] = useState<string | null>(props.baseRevisionId ?? null);
  const dirty = doc !== savedDoc;

  const [selectionRaw, setSelection] = useState<string[]>([]);
  const selection = useMemo(() => selectionRaw.filter((id) => doc.shapes.some((s) => s.id === id)), [selectionRaw, doc.shapes]);
  const selectionSet = useMemo(() => new Set(selection), [selection]);
  const [tool, setTool] = useState<Tool>('select');
  const [size, setSize] = useState({ w: 0, h: 0 });
  const [view, setView] = useState<View | null>(null);
  const [snap, setSnap] = useState(true);
  const [gridOn, setGridOn] = useState(true);
  const [layers, setLayers] = useState<LayerVisibility>({ conductors: true, dielectrics: true, boundary: true, dimensions: true });
  const [showLayers, setShowLayers] = useState(false);
  const [tab, setTab] = useState<Tab>(sidePanel ? 'extra' : 'shape');
  const [currentNet, setCurrentNet] = useState(() => initialSection.nets.find((n) => n.role === 'signal')?.name ?? initialSection.nets[0]?.name ?? '');
  const [currentMaterial, setCurrentMaterial] = useState(() => initialSection.materials[0]?.id ?? '');
  const [newKind, setNewKind] = useState<'conductor' | 'dielectric'>('conductor');
  const [message, setMessage] = useState<{ kind: 'error' | 'info'; text: string } | null>(null);
  const [unitNotes, setUnitNotes] = useState<string[]>([]);
  const [showHelp, setShowHelp] = useState(false);
  const [draftOffer, setDraftOffer] = useState<Draft | null>(null);
  const [saving, setSaving] = useState(false);
  const [saveMessage, setSaveMessage] = useState('');
  const canvasRef = useRef<HTMLDivElement>(null);
  const fileRef = useRef<HTMLInputElement>(null);

  // ------------------------------------------------------------ document changes
  const apply = useCallback((f: (d: Section) => Section, label: string, coalesce?: string): boolean => {
    try {
      const next = f(docRef.current);
      if (next === docRef.current) return true;
      docRef.current = next;
      setHistory((h) => commit(h, next, label, coalesce));
      setMessage(null);
      return true;
    } catch (e) {
      if (e instanceof cmd.CommandError) {
        setMessage({ kind: 'error', text: e.message });
        return false;
      }
      throw e;
    }
  }, []);

  const doUndo = useCallback(() => setHistory((h) => undo(h)), []);
  const doRedo = useCallback(() => setHistory((h) => redo(h)), []);

  useEffect(() => {
    onSectionChange?.(doc, analysis.resolved, analysis.issues, analysis.canSolve);
  }, [analysis, doc, onSectionChange]);

  // Keep the current net and material valid after renames and deletions.
  useEffect(() => {
    if (!doc.nets.some((n) => n.name === currentNet)) setCurrentNet(doc.nets.find((n) => n.role === 'signal')?.name ?? doc.nets[0]?.name ?? '');
    if (currentMaterial && !doc.materials.some((m) => m.id === currentMaterial)) setCurrentMaterial(doc.materials[0]?.id ?? '');
    if (!currentMaterial && doc.materials[0]) setCurrentMaterial(doc.materials[0].id);
  }, [doc.nets, doc.materials, currentNet, currentMaterial]);

  // ------------------------------------------------------------ drafts in the browser
  useEffect(() => {
    if (!draftKey || readOnly) return;
    const d = loadDraft(window.localStorage, draftKey);
    if (d && JSON.stringify(d.content) !== JSON.stringify(initialSection)) setDraftOffer(d);
    // Only on mount: a later draft is our own.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, []);
  useEffect(() => {
    if (!draftKey || readOnly) return;
    if (!dirty) return;
    const t = window.setTimeout(() => saveDraft(window.localStorage, draftKey, doc, baseRevisionId), 300);
    return () => window.clearTimeout(t);
  }, [doc, dirty, draftKey, readOnly, baseRevisionId]);
  useEffect(() => {
    if (!dirty || readOnly) return;
    const warn = (e: BeforeUnloadEvent) => {
      e.preventDefault();
    };
    window.addEventListener('beforeunload', warn);
    return () => window.removeEventListener('beforeunload', warn);
  }, [dirty, readOnly]);

  // ------------------------------------------------------------ canvas size and view
  useEffect(() => {
    const el = canvasRef.current;
    if (!el) return;
    const ro = new ResizeObserver(() => {
      const r = el.getBoundingClientRect();
      setSize({ w: Math.floor(r.width), h: Math.floor(r.height) });
    });
    ro.observe(el);
    return () => ro.disconnect();
  }, []);
  useEffect(() => {
    if (!view && size.w > 0 && size.h > 0) setView(fitTo(analysis.resolved, size.w, size.h));
  }, [size, view, analysis.resolved]);

  const fit = useCallback(() => {
    if (size.w > 0) setView(fitTo(analysis.resolved, size.w, size.h));
  }, [analysis.resolved, size]);
  const zoomBy = useCallback(
    (f: number) => setView((v) => (v ? zoomAt(v, f, { x: RULER + (size.w - RULER) / 2, y: RULER + (size.h - RULER) / 2 }) : v)),
    [size],
  );

  // ------------------------------------------------------------ actions
  const nudgeStep = view ? gridSteps(view).minor : 1;
  const runAction = useCallback(
    (a: EditorAction) => {
      const editing = !readOnly;
      const sel = selection;
      const nudge = (dx: number, dy: number) => {
        if (editing && sel.length) apply((d) => cmd.moveShapes(d, sel, tidy(dx), tidy(dy)), 'move', 'nudge');
      };
      switch (a) {
        case 'tool.select':
          setTool('select');
          return;
        case 'tool.pan':
          setTool('pan');
          return;
        case 'tool.rect':
        case 'tool.circle':
        case 'tool.ring':
        case 'tool.polygon':
        case 'tool.strip':
          if (editing) setTool(a.slice(5) as Tool);
          return;
        case 'undo':
          if (editing) doUndo();
          return;
        case 'redo':
          if (editing) doRedo();
          return;
        case 'delete':
          if (editing && sel.length) apply((d) => cmd.deleteShapes(d, sel), 'delete');
          return;
        case 'duplicate':
          if (editing && sel.length) {
            let ids: string[] = [];
            if (apply((d) => {
              const r = cmd.duplicateShapes(d, sel, nudgeStep * 2, -nudgeStep * 2);
              ids = r.ids;
              return r.doc;
            }, 'duplicate')) setSelection(ids);
          }
          return;
        case 'selectAll':
          setSelection(docRef.current.shapes.map((s) => s.id));
          return;
        case 'deselect':
          setSelection([]);
          return;
        case 'fit':
          fit();
          return;
        case 'zoomIn':
          zoomBy(1.25);
          return;
        case 'zoomOut':
          zoomBy(0.8);
          return;
        case 'forward':
        case 'backward':
        case 'front':
        case 'back':
          if (editing && sel.length) apply((d) => cmd.reorderShapes(d, sel, a), a === 'forward' ? 'bring forward' : a === 'backward' ? 'send backward' : a === 'front' ? 'bring to front' : 'send to back');
          return;
        case 'nudgeLeft':
          return nudge(-nudgeStep, 0);
        case 'nudgeRight':
          return nudge(nudgeStep, 0);
        case 'nudgeUp':
          return nudge(0, nudgeStep);
        case 'nudgeDown':
          return nudge(0, -nudgeStep);
        case 'bigNudgeLeft':
          return nudge(-10 * nudgeStep, 0);
        case 'bigNudgeRight':
          return nudge(10 * nudgeStep, 0);
        case 'bigNudgeUp':
          return nudge(0, 10 * nudgeStep);
        case 'bigNudgeDown':
          return nudge(0, -10 * nudgeStep);
        case 'toggleSnap':
          setSnap((s) => !s);
          return;
        case 'toggleGrid':
          setGridOn((g) => !g);
          return;
        case 'save':
          void save();
          return;
        case 'help':
          setShowHelp((h) => !h);
          return;
      }
    },
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [readOnly, selection, apply, doUndo, doRedo, fit, zoomBy, nudgeStep],
  );

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (isTyping(e.target)) return;
      if (e.key === 'Escape' && showHelp) {
        setShowHelp(false);
        return;
      }
      if (tool === 'polygon' && (e.key === 'Enter' || e.key === 'Escape' || e.key === 'Backspace')) return;
      const a = actionForKey(e);
      if (!a) return;
      e.preventDefault();
      if (a === 'tool.select' && e.key === 'Escape') setSelection((s) => (tool === 'select' ? [] : s));
      runAction(a);
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [runAction, tool, showHelp]);

  // ------------------------------------------------------------ canvas callbacks
  const onMove = useCallback((ids: string[], dx: number, dy: number) => apply((d) => cmd.moveShapes(d, ids, tidy(dx), tidy(dy)), 'move'), [apply]);
  const onGeometry = useCallback(
    (shape: ResolvedSection['shapes'][number], patch: GeometryPatch) => apply((d) => cmd.setShapeGeometry(d, shape, patch), 'reshape'),
    [apply],
  );
  const onCreate = useCallback(
    (t: Tool, g: Record<string, number> | { points: [number, number][] }) => {
      const d0 = docRef.current;
      const net = d0.nets.some((n) => n.name === currentNet) ? currentNet : d0.nets[0]!.name;
      const dielectric = newKind === 'dielectric' && t !== 'strip' && d0.materials.some((m) => m.id === currentMaterial) ? currentMaterial : undefined;
      const id = cmd.newShapeId(d0, t === 'polygon' ? 'poly' : t);
      const role = dielectric ? { dielectric } : { conductor: net };
      const geometry =
        'points' in g && Array.isArray(g.points)
          ? { points: g.points.map(([x, y]) => [tidy(x), tidy(y)] as [number, number]) }
          : Object.fromEntries(Object.entries(g as Record<string, number>).map(([k, v]) => [k, tidy(v)]));
      const shape = { id, type: t, ...role, ...geometry } as Section['shapes'][number];
      if (apply((d) => cmd.addShape(d, shape), `draw ${t}`)) {
        setSelection([id]);
        setTool('select');
        setTab('shape');
      }
    },
    [apply, currentNet, currentMaterial, newKind],
  );
  const onSelectionChange = useCallback((ids: string[]) => {
    setSelection(ids);
    if (ids.length) setTab((t) => (t === 'extra' ? t : 'shape'));
  }, []);

  const changeUnits = (u: Units) => {
    const d0 = docRef.current;
    if (u === d0.units) return;
    const r = convertUnits(d0, u);
    if (apply(() => r.doc, `units ${UNIT_LABELS[u]}`)) {
      setUnitNotes(r.notes);
      const k = factor(d0.units, u);
      setView((v) => (v ? { ...v, scale: v.scale / k } : v));
    }
  };

  // ------------------------------------------------------------ save, import, export
  const save = async () => {
    if (!onSave || readOnly || saving) return;
    const content = docRef.current;
    setSaving(true);
    setSaveMessage('Saving…');
    try {
      const r = await onSave(content);
      setSavedDoc(content);
      setBaseRevisionId(r.revisionId);
      if (draftKey) clearDraft(window.localStorage, draftKey);
      setSaveMessage('Saved as a new revision');
      setHistory((h) => breakCoalescing(h));
    } catch (e) {
      setSaveMessage('');
      setMessage({ kind: 'error', text: `Not saved: ${e instanceof Error ? e.message : 'unknown error'}. Your changes are kept in this browser.` });
    } finally {
      setSaving(false);
    }
  };

  const exportFile = () => {
    const blob = new Blob([JSON.stringify(docRef.current, null, 2) + '\n'], { type: 'application/json' });
    const a = document.createElement('a');
    const name = (docRef.current.title ?? 'section').replace(/[^A-Za-z0-9_-]+/g, '-').replace(/^-|-$/g, '').toLowerCase() || 'section';
    a.href = URL.createObjectURL(blob);
    a.download = `${name}.section.json`;
    a.click();
    window.setTimeout(() => URL.revokeObjectURL(a.href), 1000);
  };

  const importText = (text: string, fileName: string) => {
    const r = parseSectionFile(text);
    if (r.ok) {
      apply(() => r.section, 'import');
      setSelection([]);
      setMessage({ kind: 'info', text: `Imported ${fileName}.` });
      setView(null);
      return;
    }
    if (r.stage === 'resolve' || r.stage === 'check') {
      // Structurally valid: import it and show its problems in the checks panel.
      const parsed = sectionSchema.safeParse(JSON.parse(text));
      if (parsed.success) {
        apply(() => parsed.data, 'import');
        setSelection([]);
        setTab('checks');
        setView(null);
        setMessage({ kind: 'info', text: `Imported ${fileName}; it has problems to fix before solving: ${r.message}` });
        return;
      }
    }
    setMessage({ kind: 'error', text: `Could not import ${fileName}: ${r.message}` });
  };

  // ------------------------------------------------------------ derived for rendering
  const netColors = useMemo(() => new Map(doc.nets.map((n, i) => [n.name, netColor(n, i)])), [doc.nets]);
  const marked = useMemo(() => {
    const m = new Map<string, 'error' | 'warning'>();
    for (const [id, list] of analysis.byShape) m.set(id, list.some((i) => i.severity === 'error') ? 'error' : 'warning');
    return m;
  }, [analysis.byShape]);
  const errors = analysis.issues.filter((i) => i.severity === 'error').length;
  const warnings = analysis.issues.length - errors;

  const tabs: { id: Tab; label: string; badge?: ReactNode }[] = [
    ...(sidePanel ? [{ id: 'extra' as Tab, label: sidePanelLabel ?? 'Results' }] : []),
    { id: 'shape', label: 'Shape' },
    { id: 'variables', label: 'Dimensions' },
    { id: 'nets', label: 'Nets' },
    { id: 'materials', label: 'Materials' },
    { id: 'boundary', label: 'Boundary' },
    {
      id: 'checks',
      label: 'Checks',
      badge: errors ? (
        <span className="ml-1 rounded-full bg-danger px-1.5 text-2xs text-white">{errors}</span>
      ) : warnings ? (
        <span className="ml-1 rounded-full bg-warning px-1.5 text-2xs text-white">{warnings}</span>
      ) : null,
    },
  ];

  const base = { doc, analysis, apply, readOnly };
  const viewCtx: ViewContext | null = view
    ? { view, width: size.w, height: size.h, toScreen: (p) => toScreen(view, p), toWorld: (p) => toWorld(view, p) }
    : null;

  return (
    <div data-testid="section-editor" data-read-only={readOnly ? 'yes' : 'no'} className={cn('flex h-[calc(100vh-7.5rem)] min-h-[560px] flex-col overflow-hidden rounded-lg border border-line bg-surface shadow-sm', className)}>
      {/* Toolbar */}
      <div className="flex flex-wrap items-center gap-1 border-b border-line bg-surface-muted px-2 py-1.5" role="toolbar" aria-label="Drawing tools">
        {TOOLS.filter((t) => !t.edit || !readOnly).map((t) => (
          <button
            key={t.tool}
            type="button"
            data-testid={`tool-${t.tool}`}
            aria-pressed={tool === t.tool}
            title={`${t.label} (${t.key})`}
            aria-label={t.label}
            onClick={() => setTool(t.tool)}
            className={cn('inline-flex size-8 items-center justify-center rounded-md text-ink-soft hover:bg-grey-150 hover:text-ink', tool === t.tool && 'bg-surface text-accent shadow-xs ring-1 ring-line-strong')}
          >
            <t.icon className="size-4" />
          </button>
        ))}
        {!readOnly ? (
          <>
            <span className="mx-1 h-6 w-px bg-line" />
            <label className="sr-only" htmlFor="new-kind">
              New shapes are
            </label>
            <select
              id="new-kind"
              data-testid="new-kind"
              className="h-8 w-36 rounded-md border border-line-strong bg-surface px-1.5 text-sm xl:w-52"
              title="What newly drawn shapes are"
              value={newKind === 'dielectric' && currentMaterial ? `mat:${currentMaterial}` : `net:${currentNet}`}
              onChange={(e) => {
                const v = e.target.value;
                if (v.startsWith('net:')) {
                  setNewKind('conductor');
                  setCurrentNet(v.slice(4));
                } else {
                  setNewKind('dielectric');
                  setCurrentMaterial(v.slice(4));
                }
              }}
            >
              <optgroup label="Draw conductors on">
                {doc.nets.map((n) => (
                  <option key={n.name} value={`net:${n.name}`}>
                    ▮ {n.name} ({n.role})
                  </option>
                ))}
              </optgroup>
              {doc.materials.length ? (
                <optgroup label="Draw dielectric of">
                  {doc.materials.map((m) => (
                    <option key={m.id} value={`mat:${m.id}`}>
                      ▨ {m.name}
                    </option>
                  ))}
                </optgroup>
              ) : null}
            </select>
            <span className="mx-1 h-6 w-px bg-line" />
            <ToolButton label="Undo (Ctrl+Z)" testId="undo" disabled={!canUndo(history)} onClick={doUndo} icon={Undo2} />
            <ToolButton label="Redo (Ctrl+Shift+Z)" testId="redo" disabled={!canRedo(history)} onClick={doRedo} icon={Redo2} />
            <ToolButton label="Duplicate (Ctrl+D)" testId="duplicate" disabled={!selection.length} onClick={() => runAction('duplicate')} icon={Copy} />
            <ToolButton label="Delete (Del)" testId="delete" disabled={!selection.length} onClick={() => runAction('delete')} icon={Trash2} />
          </>
        ) : null}
        <span className="mx-1 h-6 w-px bg-line" />
        <ToolButton label="Zoom in (+)" testId="zoom-in" onClick={() => zoomBy(1.25)} icon={Plus} />
        <ToolButton label="Zoom out (−)" testId="zoom-out" onClick={() => zoomBy(0.8)} icon={Minus} />
        <ToolButton label="Fit the section (F)" testId="fit" onClick={fit} icon={Maximize} />
        <ToolButton label={`Snapping ${snap ? 'on' : 'off'} (N)`} testId="snap" pressed={snap} onClick={() => setSnap((s) => !s)} icon={Magnet} />
        <ToolButton label={`Grid ${gridOn ? 'on' : 'off'} (G)`} testId="grid" pressed={gridOn} onClick={() => setGridOn((g) => !g)} icon={Grid3x3} />
        <div className="relative">
          <ToolButton label="Layers" testId="layers" pressed={showLayers} onClick={() => setShowLayers((s) => !s)} icon={Eye} />
          {showLayers ? (
            <div className="absolute top-9 left-0 z-30 w-48 rounded-md border border-line bg-surface p-2 shadow-md" data-testid="layers-menu">
              {(['conductors', 'dielectrics', 'boundary', 'dimensions'] as const).map((k) => (
                <label key={k} className="flex items-center gap-2 py-0.5 text-sm capitalize">
                  <input type="checkbox" checked={layers[k]} onChange={(e) => setLayers((l) => ({ ...l, [k]: e.target.checked }))} />
                  {k}
                </label>
              ))}
            </div>
          ) : null}
        </div>
        <ToolButton label="Keyboard shortcuts (?)" testId="help" onClick={() => setShowHelp(true)} icon={HelpCircle} />
        <span className="mx-1 h-6 w-px bg-line" />
        <ToolButton label="Export the section file" testId="export" onClick={exportFile} icon={Download} />
        {!readOnly ? (
          <>
            <ToolButton label="Import a section file" testId="import" onClick={() => fileRef.current?.click()} icon={Upload} />
            <input
              ref={fileRef}
              type="file"
              accept=".json,application/json"
              className="hidden"
              data-testid="import-input"
              onChange={async (e) => {
                const f = e.target.files?.[0];
                e.target.value = '';
                if (f) importText(await f.text(), f.name);
              }}
            />
          </>
        ) : null}
        <div className="ml-auto flex items-center gap-2">
          {saveMessage ? (
            <span className="text-xs text-ink-muted" data-testid="save-status" aria-live="polite">
              {dirty && !saving ? 'Unsaved changes' : saveMessage}
            </span>
          ) : dirty && !readOnly ? (
            <span className="text-xs text-ink-muted" data-testid="save-status">
              Unsaved changes
            </span>
          ) : null}
          {!readOnly && onSave ? (
            <button
              type="button"
              data-testid="save"
              disabled={!dirty || saving}
              onClick={() => void save()}
              className="inline-flex h-8 items-center gap-1.5 rounded-md border border-line-strong bg-surface px-3 text-sm font-medium text-ink shadow-xs hover:bg-grey-50 disabled:opacity-50"
              title="Save a new revision (Ctrl+S)"
            >
              <Save className="size-4" /> {saving ? 'Saving…' : 'Save'}
            </button>
          ) : null}
          {toolbarEnd}
        </div>
      </div>

      {readOnly ? (
        <div className="border-b border-line bg-steel-50 px-3 py-1.5 text-xs text-steel-700" data-testid="read-only-banner">
          Read-only: you can look at this drawing and its values, export it, but not change it.
        </div>
      ) : null}
      {draftOffer ? (
        <div className="flex flex-wrap items-center gap-2 border-b border-line bg-amber-50 px-3 py-1.5 text-sm text-amber-700" data-testid="draft-offer">
          <span>Unsaved changes from {new Date(draftOffer.savedAt).toLocaleString()} were kept in this browser.</span>
          <button
            type="button"
            data-testid="draft-restore"
            className="rounded-sm border border-amber-600 px-2 py-0.5 text-xs font-medium hover:bg-amber-100"
            onClick={() => {
              apply(() => draftOffer.content, 'restore unsaved changes');
              setDraftOffer(null);
              setView(null);
            }}
          >
            Restore them
          </button>
          <button
            type="button"
            data-testid="draft-discard"
            className="rounded-sm px-2 py-0.5 text-xs font-medium hover:bg-amber-100"
            onClick={() => {
              if (draftKey) clearDraft(window.localStorage, draftKey);
              setDraftOffer(null);
            }}
          >
            Discard
          </button>
        </div>
      ) : null}
      {message ? (
        <div role={message.kind === 'error' ? 'alert' : 'status'} data-testid="editor-message" className={cn('flex items-start gap-2 border-b border-line px-3 py-1.5 text-sm', message.kind === 'error' ? 'bg-red-50 text-red-700' : 'bg-steel-50 text-steel-700')}>
          <span className="flex-1">{message.text}</span>
          <button type="button" aria-label="Dismiss" onClick={() => setMessage(null)}>
            <X className="size-4" />
          </button>
        </div>
      ) : null}

      <div className="flex min-h-0 flex-1">
        {/* Canvas */}
        <div className="relative min-w-0 flex-1" ref={canvasRef} data-testid="editor-canvas">
          {view && size.w > 0 ? (
            <EditorStage
              width={size.w}
              height={size.h}
              resolved={analysis.resolved}
              units={doc.units}
              view={view}
              onViewChange={setView}
              selection={selectionSet}
              onSelectionChange={onSelectionChange}
              tool={readOnly && tool !== 'pan' ? 'select' : tool}
              readOnly={readOnly}
              snapEnabled={snap}
              gridVisible={gridOn}
              layers={layers}
              marked={marked}
              netColors={netColors}
              onMove={onMove}
              onGeometry={onGeometry}
              onCreate={onCreate}
              worldLayer={worldLayer}
            />
          ) : null}
          {viewCtx && overlay ? <div className="pointer-events-none absolute inset-0">{overlay(viewCtx)}</div> : null}
          <div className="pointer-events-none absolute right-2 bottom-2 flex items-center gap-2 rounded-md bg-surface/90 px-2 py-1 text-2xs text-ink-muted shadow-xs">
            <span>{tool === 'polygon' ? 'Click points; Enter or double-click to finish, Esc to cancel' : tool === 'select' ? 'Drag to move · handles reshape · Alt skips snapping' : tool === 'pan' ? 'Drag to pan' : 'Drag to draw'}</span>
            <span className={cn('font-medium', analysis.canSolve ? 'text-success' : 'text-danger')} data-testid="solve-gate">
              {analysis.canSolve ? 'ready to solve' : 'solving blocked'}
            </span>
          </div>
          <output
            hidden
            data-testid="editor-state"
            data-view={view ? JSON.stringify(view) : ''}
            data-units={doc.units}
            data-can-solve={analysis.canSolve ? 'yes' : 'no'}
            data-selection={JSON.stringify(selection)}
            data-shapes={JSON.stringify(analysis.resolved.shapes)}
          />
        </div>

        {/* Side panel */}
        <aside className="flex w-[320px] shrink-0 flex-col border-l border-line bg-surface xl:w-[360px]" aria-label="Section properties">
          <div className="flex flex-wrap gap-0.5 border-b border-line px-1.5 pt-1.5" role="tablist">
            {tabs.map((t) => (
              <button
                key={t.id}
                type="button"
                role="tab"
                aria-selected={tab === t.id}
                data-testid={`tab-${t.id}`}
                onClick={() => setTab(t.id)}
                className={cn('-mb-px inline-flex items-center rounded-t-md border border-transparent px-2 py-1 text-xs font-medium text-ink-soft hover:text-ink', tab === t.id && 'border-line border-b-surface bg-surface text-ink')}
              >
                {t.label}
                {t.badge}
              </button>
            ))}
          </div>
          <div className="min-h-0 flex-1 overflow-y-auto" role="tabpanel">
            {tab === 'extra' ? sidePanel : null}
            {tab === 'shape' ? <PropertiesPanel {...base} selection={selection} onSelect={onSelectionChange} unitNotes={unitNotes} onUnits={changeUnits} /> : null}
            {tab === 'variables' ? <VariablesPanel {...base} /> : null}
            {tab === 'nets' ? <NetsPanel {...base} currentNet={currentNet} onCurrentNet={(n) => { setCurrentNet(n); setNewKind('conductor'); }} /> : null}
            {tab === 'materials' ? (
              <MaterialsPanel
                {...base}
                currentMaterial={currentMaterial}
                onCurrentMaterial={(m) => {
                  setCurrentMaterial(m);
                  setNewKind('dielectric');
                }}
                workspaceMaterials={props.workspaceMaterials}
                onSaveToWorkspace={props.onSaveToWorkspace}
              />
            ) : null}
            {tab === 'boundary' ? <BoundaryPanel {...base} /> : null}
            {tab === 'checks' ? <ChecksPanel analysis={analysis} onSelect={onSelectionChange} /> : null}
          </div>
        </aside>
      </div>

      {showHelp ? <HelpOverlay onClose={() => setShowHelp(false)} /> : null}
    </div>
  );
}

function factor(from: Units, to: Units): number {
  const m: Record<Units, number> = { m: 1, mm: 1e-3, um: 1e-6, mil: 25.4e-6, in: 25.4e-3 };
  return m[from] / m[to];
}

function ToolButton({
  label,
  onClick,
  icon: Icon,
  disabled,
  pressed,
  testId,
}: {
  label: string;
  onClick: () => void;
  icon: typeof Square;
  disabled?: boolean;
  pressed?: boolean;
  testId?: string;
}) {
  return (
    <button
      type="button"
      title={label}
      aria-label={label}
      aria-pressed={pressed}
      data-testid={testId}
      disabled={disabled}
      onClick={onClick}
      className={cn(
        'inline-flex size-8 items-center justify-center rounded-md text-ink-soft hover:bg-grey-150 hover:text-ink disabled:opacity-40 disabled:hover:bg-transparent',
        pressed && 'bg-surface text-accent shadow-xs ring-1 ring-line-strong',
      )}
    >
      <Icon className="size-4" />
    </button>
  );
}

function HelpOverlay({ onClose }: { onClose: () => void }) {
  const mac = typeof navigator !== 'undefined' && /Mac/.test(navigator.platform);
  const groups = ['Tools', 'Edit', 'Arrange', 'View', 'File'] as const;
  return (
    <div className="fixed inset-0 z-50 grid place-items-center bg-black/30 p-6" role="dialog" aria-modal="true" aria-labelledby="shortcuts-title" data-testid="help-overlay" onClick={onClose}>
      <div className="max-h-[85vh] w-full max-w-3xl overflow-auto rounded-lg bg-surface p-5 shadow-lg" onClick={(e) => e.stopPropagation()}>
        <div className="mb-3 flex items-center justify-between">
          <h2 id="shortcuts-title" className="text-lg font-semibold">
            Keyboard shortcuts
          </h2>
          <button type="button" aria-label="Close" onClick={onClose} className="rounded-sm p-1 hover:bg-grey-100">
            <X className="size-4" />
          </button>
        </div>
        <div className="grid gap-x-8 gap-y-4 sm:grid-cols-2">
          {groups.map((g) => (
            <section key={g}>
              <h3 className="mb-1 text-xs font-semibold tracking-wide text-ink-muted uppercase">{g}</h3>
              <table className="w-full text-sm">
                <tbody>
                  {SHORTCUTS.filter((s) => s.group === g).map((s) => (
                    <tr key={s.action} className="border-b border-line last:border-0">
                      <td className="py-1 pr-3">{s.description}</td>
                      <td className="py-1 text-right whitespace-nowrap">
                        {s.keys.map((k) => (
                          <kbd key={k} className="ml-1 rounded-xs border border-line-strong bg-surface-muted px-1.5 py-0.5 font-mono text-xs">
                            {displayKey(k, mac)}
                          </kbd>
                        ))}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </section>
          ))}
        </div>
        <p className="mt-4 text-xs text-ink-muted">
          Mouse: wheel zooms at the pointer, Shift+wheel pans sideways, middle button or Space+drag pans, two-finger pinch zooms on touch screens. Shift+click adds to the selection; dragging on empty canvas selects
          every shape inside the box.
        </p>
      </div>
    </div>
  );
}

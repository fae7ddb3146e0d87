'use client';

/**
 * Side panels of the section editor: shape properties, variables, nets, materials,
 * boundary and checks. Each edits the document only through `apply(command)`, so every
 * change is one undo step.
 */
import { useState, type ReactNode } from 'react';
import {
  AlertTriangle,
  AlignCenterHorizontal,
  AlignCenterVertical,
  AlignEndHorizontal,
  AlignEndVertical,
  AlignHorizontalDistributeCenter,
  AlignStartHorizontal,
  AlignStartVertical,
  AlignVerticalDistributeCenter,
  ArrowDownToLine,
  ArrowUpToLine,
  ChevronDown,
  ChevronUp,
  CircleCheck,
  Library,
  Plus,
  Trash2,
  XCircle,
} from 'lucide-react';
import type { BoundarySide, Section, Units, Value } from '@/lib/section/schema';
import { UNITS } from '@/lib/section/schema';
import type { SectionIssue } from '@/lib/section/issues';
import { MATERIAL_CAUTION, MATERIALS_LIBRARY, toSectionMaterial } from '@/lib/section/materials-library';
import * as cmd from '@/lib/editor/commands';
import type { Analysis } from '@/lib/editor/analyse';
import { UNIT_LABELS, UNIT_NAMES, formatLength } from '@/lib/editor/units';
import { netColor } from '@/lib/editor/palette';
import { formatValue, parseTyped } from '@/lib/editor/values';
import { ValueField } from './value-field';
import { cn } from '@/components/ui/cn';

export type Apply = (f: (doc: Section) => Section, label: string, coalesce?: string) => boolean;

interface PanelBase {
  doc: Section;
  analysis: Analysis;
  apply: Apply;
  readOnly: boolean;
}

const iconBtn =
  'inline-flex size-7 items-center justify-center rounded-sm text-ink-soft hover:bg-grey-100 hover:text-ink disabled:opacity-40 disabled:hover:bg-transparent';
const smallBtn =
  'inline-flex h-7 items-center gap-1 rounded-sm border border-line-strong bg-surface px-2 text-xs font-medium text-ink hover:bg-grey-50 disabled:opacity-50';
const selectCls = 'h-7 min-w-0 rounded-sm border border-line-strong bg-surface px-1.5 text-sm text-ink disabled:bg-surface-muted';
const textInput = 'h-7 min-w-0 rounded-sm border border-line-strong bg-surface px-2 text-sm text-ink read-only:border-transparent read-only:bg-transparent';

export function PanelSection({ title, children, actions }: { title: string; children: ReactNode; actions?: ReactNode }) {
  return (
    <section className="border-b border-line px-3 py-3 last:border-b-0">
      <div className="mb-2 flex items-center justify-between gap-2">
        <h3 className="text-xs font-semibold tracking-wide text-ink-muted uppercase">{title}</h3>
        {actions}
      </div>
      <div className="space-y-1.5">{children}</div>
    </section>
  );
}

/** A text input that commits on Enter or blur (names, ids, labels). */
function CommitText({
  value,
  onCommit,
  readOnly,
  className,
  testId,
  ariaLabel,
}: {
  value: string;
  onCommit: (v: string) => void;
  readOnly?: boolean;
  className?: string;
  testId?: string;
  ariaLabel: string;
}) {
  const [text, setText] = useState(value);
  const [focused, setFocused] = useState(false);
  const shown = focused ? text : value;
  return (
    <input
      aria-label={ariaLabel}
      data-testid={testId}
      className={cn(textInput, className)}
      value={shown}
      readOnly={readOnly}
      onFocus={() => {
        setText(value);
        setFocused(true);
      }}
      onChange={(e) => setText(e.target.value)}
      onBlur={() => {
        setFocused(false);
        if (text !== value) onCommit(text);
      }}
      onKeyDown={(e) => {
        e.stopPropagation();
        if (e.key === 'Enter') (e.target as HTMLInputElement).blur();
        if (e.key === 'Escape') {
          setText(value);
          setFocused(false);
          (e.target as HTMLInputElement).blur();
        }
      }}
    />
  );
}

const FIELD_LABELS: Record<string, string> = {
  x: 'x (left)',
  y: 'y (bottom)',
  width: 'width',
  height: 'height',
  cx: 'centre x',
  cy: 'centre y',
  r: 'radius',
  rInner: 'inner r',
  rOuter: 'outer r',
  x1: 'x1',
  y1: 'y1',
  x2: 'x2',
  y2: 'y2',
};
const POSITIVE = new Set(['width', 'height', 'r', 'rInner', 'rOuter']);

// ------------------------------------------------------------------ properties

export function PropertiesPanel({
  doc,
  analysis,
  apply,
  readOnly,
  selection,
  onSelect,
  unitNotes,
  onUnits,
}: PanelBase & { selection: string[]; onSelect: (ids: string[]) => void; unitNotes: string[]; onUnits: (u: Units) => void }) {
  const vars = analysis.resolved.variables ?? {};
  const unit = UNIT_LABELS[doc.units];
  if (selection.length === 0) {
    return (
      <>
        <PanelSection title="Section">
          <div className="flex items-center gap-2">
            <span className="w-16 text-xs font-medium text-ink-soft">Title</span>
            <CommitText
              ariaLabel="Section title"
              className="flex-1"
              value={doc.title ?? ''}
              readOnly={readOnly}
              onCommit={(t) => apply((d) => cmd.setTitle(d, t), 'rename section')}
            />
          </div>
          <div className="flex items-center gap-2">
            <label htmlFor="units-select" className="w-16 text-xs font-medium text-ink-soft">
              Units
            </label>
            <select
              id="units-select"
              data-testid="units-select"
              className={cn(selectCls, 'flex-1')}
              value={doc.units}
              disabled={readOnly}
              onChange={(e) => onUnits(e.target.value as Units)}
            >
              {UNITS.map((u) => (
                <option key={u} value={u}>
                  {UNIT_LABELS[u]} ({UNIT_NAMES[u]})
                </option>
              ))}
            </select>
          </div>
          {unitNotes.length ? (
            <div className="rounded-sm bg-amber-50 p-2 text-xs text-amber-700">
              {unitNotes.map((n) => (
                <p key={n}>{n}</p>
              ))}
            </div>
          ) : null}
          <div className="flex items-center gap-2">
            <label htmlFor="mesh-select" className="w-16 text-xs font-medium text-ink-soft">
              Mesh
            </label>
            <select
              id="mesh-select"
              className={cn(selectCls, 'flex-1')}
              value={doc.mesh?.preset ?? 'standard'}
              disabled={readOnly}
              onChange={(e) => apply((d) => cmd.setMeshPreset(d, e.target.value as 'quick' | 'standard' | 'precise'), 'mesh preset')}
            >
              <option value="quick">quick</option>
              <option value="standard">standard</option>
              <option value="precise">precise</option>
            </select>
          </div>
        </PanelSection>
        <PanelSection title="Shapes">
          <p className="text-xs text-ink-muted">
            {doc.shapes.length} shape{doc.shapes.length === 1 ? '' : 's'}. Click a shape to edit it, drag on empty canvas to select several,
            Shift+click to add.
          </p>
          <ul className="max-h-64 space-y-0.5 overflow-auto" data-testid="shape-list">
            {doc.shapes.map((s) => (
              <li key={s.id}>
                <button type="button" className="flex w-full items-center gap-2 rounded-sm px-1.5 py-0.5 text-left text-sm hover:bg-grey-100" onClick={() => onSelect([s.id])}>
                  <span className="font-mono text-xs text-ink-muted">{s.type}</span>
                  <span className="truncate">{s.id}</span>
                  <span className="ml-auto truncate text-xs text-ink-muted">{s.conductor ?? s.dielectric}</span>
                </button>
              </li>
            ))}
          </ul>
        </PanelSection>
      </>
    );
  }
  if (selection.length > 1) {
    const multi = (f: (d: Section) => Section, label: string) => apply(f, label);
    const res = analysis.resolved.shapes;
    return (
      <PanelSection title={`${selection.length} shapes selected`}>
        {!readOnly ? (
          <>
            <p className="text-xs text-ink-muted">Align</p>
            <div className="flex flex-wrap gap-1">
              {(
                [
                  ['left', AlignStartVertical, 'Align left edges'],
                  ['hcentre', AlignCenterVertical, 'Align centres horizontally'],
                  ['right', AlignEndVertical, 'Align right edges'],
                  ['top', AlignStartHorizontal, 'Align top edges'],
                  ['vcentre', AlignCenterHorizontal, 'Align centres vertically'],
                  ['bottom', AlignEndHorizontal, 'Align bottom edges'],
                ] as const
              ).map(([op, Icon, title]) => (
                <button key={op} type="button" title={title} aria-label={title} data-testid={`align-${op}`} className={iconBtn} onClick={() => multi((d) => cmd.alignShapes(d, res, selection, op), 'align')}>
                  <Icon className="size-4" />
                </button>
              ))}
              <button type="button" title="Distribute horizontally (equal gaps)" aria-label="Distribute horizontally" data-testid="distribute-x" className={iconBtn} disabled={selection.length < 3} onClick={() => multi((d) => cmd.distributeShapes(d, res, selection, 'x'), 'distribute')}>
                <AlignHorizontalDistributeCenter className="size-4" />
              </button>
              <button type="button" title="Distribute vertically (equal gaps)" aria-label="Distribute vertically" data-testid="distribute-y" className={iconBtn} disabled={selection.length < 3} onClick={() => multi((d) => cmd.distributeShapes(d, res, selection, 'y'), 'distribute')}>
                <AlignVerticalDistributeCenter className="size-4" />
              </button>
            </div>
            <RoleEditor doc={doc} ids={selection} apply={apply} readOnly={readOnly} />
          </>
        ) : null}
        <ul className="space-y-0.5 text-sm">
          {selection.map((id) => (
            <li key={id} className="truncate">
              {id}
            </li>
          ))}
        </ul>
      </PanelSection>
    );
  }
  const s = doc.shapes.find((x) => x.id === selection[0]);
  if (!s) return null;
  const issues = analysis.byShape.get(s.id) ?? [];
  const fields = cmd.GEOMETRY_FIELDS[s.type] as readonly string[];
  return (
    <>
      <PanelSection
        title={`${s.type === 'strip' ? 'Strip (zero thickness)' : s.type[0]!.toUpperCase() + s.type.slice(1)}`}
        actions={
          !readOnly ? (
            <div className="flex gap-0.5">
              <button type="button" className={iconBtn} title="Bring forward (])" aria-label="Bring forward" onClick={() => apply((d) => cmd.reorderShapes(d, [s.id], 'forward'), 'bring forward')}>
                <ChevronUp className="size-4" />
              </button>
              <button type="button" className={iconBtn} title="Send backward ([)" aria-label="Send backward" onClick={() => apply((d) => cmd.reorderShapes(d, [s.id], 'backward'), 'send backward')}>
                <ChevronDown className="size-4" />
              </button>
              <button type="button" className={iconBtn} title="Bring to front" aria-label="Bring to front" onClick={() => apply((d) => cmd.reorderShapes(d, [s.id], 'front'), 'bring to front')}>
                <ArrowUpToLine className="size-4" />
              </button>
              <button type="button" className={iconBtn} title="Send to back" aria-label="Send to back" onClick={() => apply((d) => cmd.reorderShapes(d, [s.id], 'back'), 'send to back')}>
                <ArrowDownToLine className="size-4" />
              </button>
            </div>
          ) : null
        }
      >
        <div className="flex items-center gap-2">
          <span className="w-16 text-xs font-medium text-ink-soft">Id</span>
          <CommitText
            ariaLabel="Shape id"
            testId="shape-id"
            className="flex-1 font-mono"
            value={s.id}
            readOnly={readOnly}
            onCommit={(t) => {
              if (apply((d) => cmd.renameShape(d, s.id, t), 'rename shape')) onSelect([t.trim()]);
            }}
          />
        </div>
        <RoleEditor doc={doc} ids={[s.id]} apply={apply} readOnly={readOnly} />
      </PanelSection>
      <PanelSection title={`Geometry (${unit})`}>
        {fields.map((f) => (
          <ValueField
            key={`${s.id}-${f}`}
            label={FIELD_LABELS[f] ?? f}
            testId={`prop-${f}`}
            unit={unit}
            value={(s as Record<string, Value>)[f]!}
            variables={vars}
            readOnly={readOnly}
            validate={POSITIVE.has(f) ? (n) => (n > 0 ? null : 'must be greater than 0') : undefined}
            onCommit={(v) => apply((d) => cmd.setShapeValue(d, s.id, f, v), `set ${f}`)}
          />
        ))}
        {s.type === 'polygon'
          ? s.points.map((p, i) => (
              <div key={`${s.id}-p${i}`} className="grid grid-cols-2 gap-1">
                <ValueField compact label={`p${i + 1} x`} testId={`prop-p${i}-x`} value={p[0]} variables={vars} readOnly={readOnly} onCommit={(v) => apply((d) => cmd.setShapeValue(d, s.id, `points.${i}.0`, v), 'move vertex')} />
                <ValueField compact label={`p${i + 1} y`} testId={`prop-p${i}-y`} value={p[1]} variables={vars} readOnly={readOnly} onCommit={(v) => apply((d) => cmd.setShapeValue(d, s.id, `points.${i}.1`, v), 'move vertex')} />
              </div>
            ))
          : null}
        <p className="text-2xs text-ink-muted">Type a number or an expression over the variables, for example w/2 + d.</p>
      </PanelSection>
      {issues.length ? (
        <PanelSection title="Problems">
          <IssueList issues={issues} />
        </PanelSection>
      ) : null}
    </>
  );
}

function RoleEditor({ doc, ids, apply, readOnly }: { doc: Section; ids: string[]; apply: Apply; readOnly: boolean }) {
  const shapes = doc.shapes.filter((s) => ids.includes(s.id));
  const first = shapes[0];
  if (!first) return null;
  const allStrips = shapes.every((s) => s.type === 'strip');
  const value = first.conductor !== undefined ? `net:${first.conductor}` : `mat:${first.dielectric}`;
  return (
    <div className="flex items-center gap-2">
      <label htmlFor="role-select" className="w-16 text-xs font-medium text-ink-soft">
        Is
      </label>
      <select
        id="role-select"
        data-testid="role-select"
        className={cn(selectCls, 'flex-1')}
        value={value}
        disabled={readOnly}
        onChange={(e) => {
          const v = e.target.value;
          const role = v.startsWith('net:') ? { conductor: v.slice(4) } : { dielectric: v.slice(4) };
          apply((d) => cmd.setShapeRole(d, ids, role), 'change role');
        }}
      >
        <optgroup label="Conductor on net">
          {doc.nets.map((n) => (
            <option key={n.name} value={`net:${n.name}`}>
              conductor · {n.name} ({n.role})
            </option>
          ))}
        </optgroup>
        {!allStrips ? (
          <optgroup label="Dielectric of material">
            {doc.materials.map((m) => (
              <option key={m.id} value={`mat:${m.id}`}>
                dielectric · {m.name}
              </option>
            ))}
          </optgroup>
        ) : null}
      </select>
    </div>
  );
}

// ------------------------------------------------------------------ variables

export function VariablesPanel({ doc, analysis, apply, readOnly }: PanelBase) {
  const [name, setName] = useState('');
  const [value, setValue] = useState('');
  const [error, setError] = useState<string | null>(null);
  const vars = doc.variables ?? {};
  const resolvedVars = analysis.resolved.variables ?? {};
  const unit = UNIT_LABELS[doc.units];
  const varIssues = (n: string) => analysis.issues.filter((i) => i.path?.[0] === 'variables' && i.path?.[1] === n);
  const add = () => {
    const n = name.trim();
    if (!n) return setError('give the variable a name');
    if (n in vars) return setError(`"${n}" already exists`);
    if (!value.trim()) return setError('give it a value, for example 1.5 or w/2');
    if (apply((d) => cmd.setVariable(d, n, parseTyped(value)), 'add variable')) {
      setName('');
      setValue('');
      setError(null);
    }
  };
  return (
    <PanelSection title={`Named dimensions (${unit})`}>
      <p className="text-2xs text-ink-muted">Any dimension field accepts these names. Change a value and every shape that uses it follows.</p>
      <ul className="space-y-1" data-testid="variables-list">
        {Object.entries(vars).map(([k, v]) => {
          const problems = varIssues(k);
          return (
            <li key={k} data-testid={`var-row-${k}`} className="rounded-sm border border-line p-1.5">
              <div className="flex items-center gap-1">
                <CommitText
                  ariaLabel={`Name of variable ${k}`}
                  className="w-20 font-mono"
                  value={k}
                  readOnly={readOnly}
                  onCommit={(t) => apply((d) => cmd.renameVariable(d, k, t.trim()), 'rename variable')}
                />
                <span className="text-ink-muted">=</span>
                <div className="min-w-0 flex-1">
                  <ValueField
                    compact
                    label=""
                    testId={`var-${k}`}
                    value={v}
                    variables={Object.fromEntries(Object.entries(resolvedVars).filter(([n]) => n !== k))}
                    readOnly={readOnly}
                    onCommit={(nv) => apply((d) => cmd.setVariable(d, k, nv), `set ${k}`)}
                  />
                </div>
                {!readOnly ? (
                  <button type="button" className={iconBtn} aria-label={`Delete variable ${k}`} title="Delete" onClick={() => apply((d) => cmd.deleteVariable(d, k), 'delete variable')}>
                    <Trash2 className="size-3.5" />
                  </button>
                ) : null}
              </div>
              {typeof v === 'string' && Number.isFinite(resolvedVars[k]) ? (
                <p className="pl-1 text-2xs text-ink-muted">= {formatLength(resolvedVars[k]!)}</p>
              ) : null}
              {problems.map((p) => (
                <p key={p.message} className="pl-1 text-2xs font-medium text-danger">
                  {p.message}
                </p>
              ))}
            </li>
          );
        })}
      </ul>
      {!readOnly ? (
        <div className="space-y-1 pt-1">
          <div className="flex items-center gap-1">
            <input aria-label="New variable name" data-testid="new-var-name" className={cn(textInput, 'w-20 font-mono')} placeholder="name" value={name} onChange={(e) => setName(e.target.value)} onKeyDown={(e) => e.stopPropagation()} />
            <span className="text-ink-muted">=</span>
            <input
              aria-label="New variable value"
              data-testid="new-var-value"
              className={cn(textInput, 'min-w-0 flex-1 font-mono')}
              placeholder="1.5 or w/2"
              value={value}
              onChange={(e) => setValue(e.target.value)}
              onKeyDown={(e) => {
                e.stopPropagation();
                if (e.key === 'Enter') add();
              }}
            />
            <button type="button" className={smallBtn} data-testid="add-var" onClick={add}>
              <Plus className="size-3.5" /> Add
            </button>
          </div>
          {error ? <p className="text-2xs font-medium text-danger">{error}</p> : null}
        </div>
      ) : null}
    </PanelSection>
  );
}

// ------------------------------------------------------------------ nets

export function NetsPanel({ doc, apply, readOnly, currentNet, onCurrentNet }: PanelBase & { currentNet: string; onCurrentNet: (n: string) => void }) {
  return (
    <PanelSection
      title="Nets"
      actions={
        !readOnly ? (
          <div className="flex gap-1">
            <button type="button" className={smallBtn} data-testid="add-signal-net" onClick={() => apply((d) => cmd.addNet(d, 'signal').doc, 'add net')}>
              <Plus className="size-3.5" /> Signal
            </button>
            <button type="button" className={smallBtn} data-testid="add-ground-net" onClick={() => apply((d) => cmd.addNet(d, 'ground').doc, 'add net')}>
              <Plus className="size-3.5" /> Ground
            </button>
          </div>
        ) : null
      }
    >
      <p className="text-2xs text-ink-muted">Ground nets are the 0 V reference. Each signal net gets a row of the capacitance matrix. New conductors go on the net marked ●.</p>
      <ul className="space-y-1">
        {doc.nets.map((n, i) => {
          const count = doc.shapes.filter((s) => s.conductor === n.name).length;
          const colour = netColor(n, i);
          return (
            <li key={n.name} className={cn('flex items-center gap-1.5 rounded-sm border p-1', n.name === currentNet ? 'border-accent bg-accent-soft' : 'border-line')}>
              <button type="button" aria-label={`Draw new conductors on ${n.name}`} title="Draw new conductors on this net" className="text-sm" onClick={() => onCurrentNet(n.name)}>
                {n.name === currentNet ? '●' : '○'}
              </button>
              <input
                type="color"
                aria-label={`Colour of ${n.name}`}
                className="size-6 shrink-0 cursor-pointer rounded-sm border border-line-strong bg-surface p-0"
                value={colour}
                disabled={readOnly}
                onChange={(e) => apply((d) => cmd.updateNet(d, n.name, { color: e.target.value }), 'net colour', `colour:${n.name}`)}
              />
              <CommitText
                ariaLabel={`Name of net ${n.name}`}
                testId={`net-name-${n.name}`}
                className="min-w-0 flex-1 font-mono"
                value={n.name}
                readOnly={readOnly}
                onCommit={(t) => {
                  if (apply((d) => cmd.renameNet(d, n.name, t), 'rename net') && currentNet === n.name) onCurrentNet(t.trim());
                }}
              />
              <select
                aria-label={`Role of ${n.name}`}
                className={cn(selectCls, 'w-20')}
                value={n.role}
                disabled={readOnly}
                onChange={(e) => apply((d) => cmd.updateNet(d, n.name, { role: e.target.value as 'signal' | 'ground' }), 'net role')}
              >
                <option value="signal">signal</option>
                <option value="ground">ground</option>
              </select>
              <span className="w-6 text-right text-2xs text-ink-muted" title="shapes on this net">
                {count}
              </span>
              {!readOnly ? (
                <button type="button" className={iconBtn} aria-label={`Delete net ${n.name}`} title="Delete net" onClick={() => apply((d) => cmd.deleteNet(d, n.name), 'delete net')}>
                  <Trash2 className="size-3.5" />
                </button>
              ) : null}
            </li>
          );
        })}
      </ul>
    </PanelSection>
  );
}

// ------------------------------------------------------------------ materials

export interface CustomMaterialsProps {
  /** Materials saved for the workspace (offered for every section). */
  workspaceMaterials?: { id: string; name: string; epsR: number; lossTangent?: number; breakdownKVPerMm?: number; source?: string }[];
  /** Save a section material to the workspace's list; absent when the workspace cannot store them. */
  onSaveToWorkspace?: (m: { id: string; name: string; epsR: number; lossTangent?: number; breakdownKVPerMm?: number; source?: string }) => Promise<void>;
}

export function MaterialsPanel({
  doc,
  analysis,
  apply,
  readOnly,
  currentMaterial,
  onCurrentMaterial,
  workspaceMaterials,
  onSaveToWorkspace,
}: PanelBase & { currentMaterial: string; onCurrentMaterial: (id: string) => void } & CustomMaterialsProps) {
  const [showLibrary, setShowLibrary] = useState(false);
  const [customName, setCustomName] = useState('');
  const [customEps, setCustomEps] = useState('');
  const [msg, setMsg] = useState<string | null>(null);
  const vars = analysis.resolved.variables ?? {};
  const addCustom = () => {
    const name = customName.trim();
    const eps = Number(customEps);
    if (!name) return setMsg('name the material');
    if (!(eps >= 1)) return setMsg('εr must be a number ≥ 1');
    const id = name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'material';
    if (apply((d) => cmd.addMaterial(d, { id, name, epsR: eps, source: 'custom value entered by the user' }).doc, 'add material')) {
      setCustomName('');
      setCustomEps('');
      setMsg(null);
    }
  };
  return (
    <>
      <PanelSection title="Background">
        <ValueField label="εr" value={doc.background.epsR} variables={vars} readOnly={readOnly} testId="background-eps" validate={(n) => (n >= 1 ? null : 'εr must be ≥ 1')} onCommit={(v) => apply((d) => cmd.setBackground(d, v, d.background.lossTangent), 'background εr')} />
        <p className="text-2xs text-ink-muted">The medium wherever no dielectric shape lies (air: 1).</p>
      </PanelSection>
      <PanelSection
        title="Materials in this section"
        actions={
          !readOnly ? (
            <button type="button" className={smallBtn} data-testid="open-library" onClick={() => setShowLibrary((s) => !s)}>
              <Library className="size-3.5" /> Library
            </button>
          ) : null
        }
      >
        {doc.materials.length === 0 ? <p className="text-xs text-ink-muted">None yet. Add one from the library or enter your own.</p> : null}
        <ul className="space-y-1.5">
          {doc.materials.map((m) => (
            <li key={m.id} className={cn('space-y-1 rounded-sm border p-1.5', m.id === currentMaterial ? 'border-accent bg-accent-soft' : 'border-line')}>
              <div className="flex items-center gap-1.5">
                <button type="button" aria-label={`Draw new dielectrics in ${m.name}`} title="Draw new dielectrics in this material" onClick={() => onCurrentMaterial(m.id)}>
                  {m.id === currentMaterial ? '●' : '○'}
                </button>
                <CommitText ariaLabel={`Name of material ${m.id}`} className="min-w-0 flex-1" value={m.name} readOnly={readOnly} onCommit={(t) => apply((d) => cmd.updateMaterial(d, m.id, { name: t.trim() || m.name }), 'rename material')} />
                {!readOnly && onSaveToWorkspace ? (
                  <button
                    type="button"
                    className={smallBtn}
                    title="Keep this material for every section of the workspace"
                    onClick={async () => {
                      const r = analysis.resolved.materials.find((x) => x.id === m.id);
                      if (!r || !Number.isFinite(r.epsR)) return;
                      try {
                        await onSaveToWorkspace({ id: m.id, name: m.name, epsR: r.epsR, ...(r.lossTangent !== undefined ? { lossTangent: r.lossTangent } : {}), ...(r.breakdownKVPerMm !== undefined ? { breakdownKVPerMm: r.breakdownKVPerMm } : {}), ...(m.source ? { source: m.source } : {}) });
                        setMsg(`"${m.name}" saved to the workspace`);
                      } catch (e) {
                        setMsg(e instanceof Error ? e.message : 'could not save');
                      }
                    }}
                  >
                    Keep
                  </button>
                ) : null}
                {!readOnly ? (
                  <button type="button" className={iconBtn} aria-label={`Delete material ${m.name}`} onClick={() => apply((d) => cmd.deleteMaterial(d, m.id), 'delete material')}>
                    <Trash2 className="size-3.5" />
                  </button>
                ) : null}
              </div>
              <ValueField label="εr" value={m.epsR} variables={vars} readOnly={readOnly} validate={(n) => (n >= 1 ? null : 'εr must be ≥ 1')} onCommit={(v) => apply((d) => cmd.updateMaterial(d, m.id, { epsR: v }), 'material εr')} />
              <ValueField label="tan δ" value={m.lossTangent ?? 0} variables={vars} readOnly={readOnly} validate={(n) => (n >= 0 ? null : 'must be ≥ 0')} onCommit={(v) => apply((d) => cmd.updateMaterial(d, m.id, { lossTangent: v }), 'material loss')} />
              <ValueField label="strength" unit="kV/mm" value={m.breakdownKVPerMm ?? 0} variables={vars} readOnly={readOnly} validate={(n) => (n >= 0 ? null : 'must be ≥ 0')} onCommit={(v) => apply((d) => cmd.updateMaterial(d, m.id, { breakdownKVPerMm: v }), 'material strength')} />
              {m.source ? <p className="text-2xs text-ink-muted">Source: {m.source}</p> : null}
            </li>
          ))}
        </ul>
        {msg ? <p className="text-2xs font-medium text-ink-soft">{msg}</p> : null}
        {!readOnly ? (
          <div className="flex items-center gap-1 pt-1">
            <input aria-label="Custom material name" className={cn(textInput, 'min-w-0 flex-1')} placeholder="custom material" value={customName} onChange={(e) => setCustomName(e.target.value)} onKeyDown={(e) => e.stopPropagation()} />
            <input aria-label="Custom material permittivity" className={cn(textInput, 'w-16 font-mono')} placeholder="εr" value={customEps} onChange={(e) => setCustomEps(e.target.value)} onKeyDown={(e) => { e.stopPropagation(); if (e.key === 'Enter') addCustom(); }} />
            <button type="button" className={smallBtn} onClick={addCustom}>
              <Plus className="size-3.5" /> Add
            </button>
          </div>
        ) : null}
      </PanelSection>
      {showLibrary && !readOnly ? (
        <PanelSection title="Library (typical values)">
          <p className="rounded-sm bg-amber-50 p-2 text-2xs text-amber-700">{MATERIAL_CAUTION}</p>
          {workspaceMaterials?.length ? (
            <>
              <p className="pt-1 text-xs font-semibold text-ink-soft">Saved in this workspace</p>
              <ul className="space-y-1">
                {workspaceMaterials.map((m) => (
                  <li key={`ws-${m.id}`} className="flex items-start gap-2 rounded-sm border border-line p-1.5">
                    <div className="min-w-0 flex-1 text-xs">
                      <p className="font-medium text-ink">{m.name}</p>
                      <p className="font-mono text-ink-soft">εr {m.epsR}{m.lossTangent !== undefined ? ` · tanδ ${m.lossTangent}` : ''}</p>
                      {m.source ? <p className="text-ink-muted">{m.source}</p> : null}
                    </div>
                    <button type="button" className={smallBtn} onClick={() => apply((d) => cmd.addMaterial(d, { ...m }).doc, 'add material')}>
                      Add
                    </button>
                  </li>
                ))}
              </ul>
            </>
          ) : null}
          <ul className="space-y-1" data-testid="material-library">
            {MATERIALS_LIBRARY.map((m) => (
              <li key={m.id} className="flex items-start gap-2 rounded-sm border border-line p-1.5">
                <div className="min-w-0 flex-1 text-xs">
                  <p className="font-medium text-ink">{m.name}</p>
                  <p className="font-mono text-ink-soft">
                    εr {m.ranges.epsR} · tanδ {m.ranges.lossTangent} · {m.ranges.breakdown} kV/mm
                  </p>
                  <p className="text-ink-muted">Source: {m.source}</p>
                  {m.note ? <p className="text-amber-700">{m.note}</p> : null}
                </div>
                <button
                  type="button"
                  className={smallBtn}
                  data-testid={`library-add-${m.id}`}
                  onClick={() => {
                    apply((d) => cmd.addMaterial(d, toSectionMaterial(m)).doc, 'add material');
                  }}
                >
                  Add
                </button>
              </li>
            ))}
          </ul>
        </PanelSection>
      ) : null}
    </>
  );
}

// ------------------------------------------------------------------ boundary

const SIDES = ['left', 'right', 'bottom', 'top'] as const;

export function BoundaryPanel({ doc, analysis, apply, readOnly }: PanelBase) {
  const vars = analysis.resolved.variables ?? {};
  const unit = UNIT_LABELS[doc.units];
  return (
    <PanelSection title="Boundary">
      <p className="text-2xs text-ink-muted">
        Open: the field reaches to infinity. Ground plane: an infinite conductor at 0 V along that line. Mirror: a symmetry plane (no normal field), so half a symmetric section is enough.
      </p>
      {SIDES.map((side) => {
        const b = doc.boundary[side];
        return (
          <div key={side} className="space-y-1 rounded-sm border border-line p-1.5" data-testid={`boundary-${side}`}>
            <div className="flex items-center gap-2">
              <span className="w-14 text-xs font-medium text-ink-soft capitalize">{side}</span>
              <select
                aria-label={`${side} boundary`}
                data-testid={`boundary-${side}-type`}
                className={cn(selectCls, 'flex-1')}
                value={b.type}
                disabled={readOnly}
                onChange={(e) => {
                  const t = e.target.value as BoundarySide['type'];
                  const at = b.type === 'open' ? defaultAt(analysis, side) : b.at;
                  apply((d) => cmd.setBoundarySide(d, side, t === 'open' ? { type: 'open' } : { type: t, at }), 'boundary');
                }}
              >
                <option value="open">open</option>
                <option value="ground">ground plane</option>
                <option value="mirror">mirror</option>
              </select>
            </div>
            {b.type !== 'open' ? (
              <ValueField label={side === 'left' || side === 'right' ? 'at x' : 'at y'} unit={unit} testId={`boundary-${side}-at`} value={b.at} variables={vars} readOnly={readOnly} onCommit={(v) => apply((d) => cmd.setBoundarySide(d, side, { type: b.type, at: v }), 'boundary position')} />
            ) : null}
          </div>
        );
      })}
    </PanelSection>
  );
}

function defaultAt(analysis: Analysis, side: (typeof SIDES)[number]): number {
  const shapes = analysis.resolved.shapes;
  if (!shapes.length) return 0;
  let lo = Infinity;
  let hi = -Infinity;
  for (const s of shapes) {
    const vals =
      s.type === 'rect'
        ? side === 'left' || side === 'right'
          ? [s.x, s.x + s.width]
          : [s.y, s.y + s.height]
        : s.type === 'circle'
          ? side === 'left' || side === 'right'
            ? [s.cx - s.r, s.cx + s.r]
            : [s.cy - s.r, s.cy + s.r]
          : s.type === 'ring'
            ? side === 'left' || side === 'right'
              ? [s.cx - s.rOuter, s.cx + s.rOuter]
              : [s.cy - s.rOuter, s.cy + s.rOuter]
            : s.type === 'strip'
              ? side === 'left' || side === 'right'
                ? [s.x1, s.x2]
                : [s.y1, s.y2]
              : s.points.map((p) => (side === 'left' || side === 'right' ? p[0] : p[1]));
    for (const v of vals) if (Number.isFinite(v)) {
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
  }
  if (!Number.isFinite(lo)) return 0;
  return Number((side === 'left' || side === 'bottom' ? lo : hi).toPrecision(12));
}

// ------------------------------------------------------------------ checks

export function IssueList({ issues, onSelect }: { issues: readonly SectionIssue[]; onSelect?: (ids: string[]) => void }) {
  return (
    <ul className="space-y-1" data-testid="issue-list">
      {issues.map((i, k) => (
        <li key={`${k}-${i.message}`}>
          <button
            type="button"
            data-testid={`issue-${i.severity}`}
            data-code={i.code}
            className={cn('flex w-full items-start gap-2 rounded-sm p-1.5 text-left text-xs', i.severity === 'error' ? 'bg-red-50 text-red-700' : 'bg-amber-50 text-amber-700', onSelect && i.shapeIds?.length ? 'hover:ring-1 hover:ring-current' : 'cursor-default')}
            onClick={() => (i.shapeIds?.length && onSelect ? onSelect(i.shapeIds) : undefined)}
          >
            {i.severity === 'error' ? <XCircle className="mt-0.5 size-3.5 shrink-0" /> : <AlertTriangle className="mt-0.5 size-3.5 shrink-0" />}
            <span>{i.message}</span>
          </button>
        </li>
      ))}
    </ul>
  );
}

export function ChecksPanel({ analysis, onSelect }: { analysis: Analysis; onSelect: (ids: string[]) => void }) {
  const errors = analysis.issues.filter((i) => i.severity === 'error');
  const warnings = analysis.issues.filter((i) => i.severity === 'warning');
  return (
    <PanelSection title="Checks">
      <div data-testid="can-solve" data-can-solve={analysis.canSolve ? 'yes' : 'no'} className={cn('flex items-center gap-2 rounded-sm p-2 text-sm font-medium', analysis.canSolve ? 'bg-green-50 text-green-700' : 'bg-red-50 text-red-700')}>
        {analysis.canSolve ? <CircleCheck className="size-4" /> : <XCircle className="size-4" />}
        {analysis.canSolve
          ? warnings.length
            ? `Ready to solve (${warnings.length} warning${warnings.length === 1 ? '' : 's'})`
            : 'Ready to solve: no problems found'
          : `Solving is blocked: ${errors.length} error${errors.length === 1 ? '' : 's'}`}
      </div>
      {analysis.issues.length ? <IssueList issues={analysis.issues} onSelect={onSelect} /> : null}
      <p className="text-2xs text-ink-muted">Errors block solving; warnings do not. Click a problem to select the shapes concerned.</p>
    </PanelSection>
  );
}

export function formatTyped(v: Value): string {
  return formatValue(v);
}

export type { Units };

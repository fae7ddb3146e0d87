'use client';

import { FileUp } from 'lucide-react';
import { useRouter } from 'next/navigation';
import { useId, useState, type ChangeEvent, type FormEvent } from 'react';
import { Alert } from '@/components/ui/alert';
import { ApiClientError, errorMessage } from '@/components/ui/api';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { Field, Input, Select, fieldDescribedBy } from '@/components/ui/field';
import type { ImportedDrawing } from '@/lib/import/types';
import type { LayerMapping } from '@/lib/import/to-section';
import { DrawingPreview } from './drawing-preview';
import { guessMapping } from './guess-mapping';

const UNITS = [
  ['mm', 'mm'],
  ['um', 'µm'],
  ['mil', 'mil (0.001 in)'],
  ['in', 'in'],
  ['m', 'm'],
] as const;
type UnitId = (typeof UNITS)[number][0];

const MAX_BYTES = 2 * 1024 * 1024;

interface Loaded {
  file: File;
  drawing: ImportedDrawing;
}

/** "Import drawing" on the workspace home: the button and its dialog. */
export function ImportDrawingButton({ workspaceId }: { workspaceId: string }) {
  const [open, setOpen] = useState(false);
  return (
    <>
      <Button size="sm" variant="secondary" onClick={() => setOpen(true)} data-testid="import-drawing">
        <FileUp className="size-4" aria-hidden />
        Import drawing
      </Button>
      {open ? <ImportDialog workspaceId={workspaceId} onClose={() => setOpen(false)} /> : null}
    </>
  );
}

function ImportDialog({ workspaceId, onClose }: { workspaceId: string; onClose: () => void }) {
  const id = useId();
  const router = useRouter();
  const [loaded, setLoaded] = useState<Loaded | null>(null);
  const [readError, setReadError] = useState<string>();
  const [reading, setReading] = useState(false);
  const [name, setName] = useState('');
  const [units, setUnits] = useState<UnitId>('mm');
  const [scale, setScale] = useState('1');
  const [layers, setLayers] = useState<Record<string, LayerMapping>>({});
  const [submitError, setSubmitError] = useState<string>();
  const [pending, setPending] = useState(false);

  async function onFile(ev: ChangeEvent<HTMLInputElement>) {
    const file = ev.target.files?.[0];
    setLoaded(null);
    setReadError(undefined);
    setSubmitError(undefined);
    if (!file) return;
    if (file.size > MAX_BYTES) {
      setReadError(`"${file.name}" is ${(file.size / 1048576).toFixed(1)} MB; drawings may be at most 2 MB.`);
      return;
    }
    setReading(true);
    try {
      const text = await file.text();
      const { readDrawing } = await import('@/lib/import'); // the parsers load only when needed
      const drawing = readDrawing(file.name, text, file.size);
      setLoaded({ file, drawing });
      setName(file.name.replace(/\.[^.]+$/, '').slice(0, 120) || 'Imported drawing');
      if (drawing.declaredUnits) setUnits(drawing.declaredUnits);
      setLayers(Object.fromEntries(drawing.layers.map((l) => [l.name, guessMapping(l.name)])));
    } catch (e) {
      setReadError(e instanceof Error ? e.message : String(e));
    } finally {
      setReading(false);
    }
  }

  function setLayer(layer: string, m: LayerMapping) {
    setLayers((prev) => ({ ...prev, [layer]: m }));
  }

  async function onSubmit(ev: FormEvent) {
    ev.preventDefault();
    if (!loaded) return;
    const k = Number(scale);
    if (!(k > 0)) {
      setSubmitError('The scale must be a number greater than 0.');
      return;
    }
    setPending(true);
    setSubmitError(undefined);
    const form = new FormData();
    form.set('file', loaded.file);
    form.set('options', JSON.stringify({ name: name.trim() || 'Imported drawing', units, scale: k, layers }));
    try {
      const res = await fetch(`/api/workspaces/${workspaceId}/imports`, { method: 'POST', body: form, headers: { accept: 'application/json' } });
      const data = (await res.json().catch(() => null)) as { sectionId?: string; error?: { message: string; code: string } } | null;
      if (!res.ok || !data?.sectionId) throw new ApiClientError(res.status, data?.error?.code ?? 'error', data?.error?.message ?? `The server answered ${res.status}.`);
      router.push(`/w/${workspaceId}/sections/${data.sectionId}`);
      router.refresh();
    } catch (e) {
      setSubmitError(errorMessage(e));
      setPending(false);
    }
  }

  const fileId = `${id}-file`;
  const nameId = `${id}-name`;
  const unitsId = `${id}-units`;
  const scaleId = `${id}-scale`;
  return (
    <Dialog
      open
      onClose={onClose}
      title="Import a drawing"
      description="SVG or DXF, up to 2 MB. Choose what each layer is; the original file is kept with the new section."
      className="w-[min(52rem,calc(100vw-2rem))]"
      data-testid="import-dialog"
    >
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <Field id={fileId} label="Drawing file" error={readError} hint="Outlines only: rectangles, circles, polygons and closed paths (SVG); closed polylines, circles, and lines/arcs that close (DXF).">
          <input
            id={fileId}
            type="file"
            accept=".svg,.dxf,image/svg+xml"
            onChange={(e) => void onFile(e)}
            aria-invalid={readError ? true : undefined}
            aria-describedby={fieldDescribedBy(fileId, true)}
            className="block w-full text-sm text-ink-soft file:mr-3 file:rounded-md file:border file:border-line-strong file:bg-surface file:px-3 file:py-1.5 file:text-sm file:font-medium file:text-ink hover:file:bg-grey-50"
            data-testid="import-file"
          />
        </Field>
        {reading ? <p className="text-sm text-ink-muted">Reading the drawing…</p> : null}
        {readError ? (
          <Alert tone="danger" data-testid="import-read-error">
            {readError}
          </Alert>
        ) : null}
        {loaded ? (
          <>
            <div className="grid grid-cols-[1fr_16rem] gap-4 max-lg:grid-cols-1">
              <DrawingPreview drawing={loaded.drawing} layers={layers} />
              <div className="space-y-3">
                <Field id={nameId} label="Section name">
                  <Input id={nameId} value={name} maxLength={120} onChange={(e) => setName(e.target.value)} data-testid="import-name" />
                </Field>
                <Field
                  id={unitsId}
                  label="One drawing unit is"
                  hint={loaded.drawing.declaredUnits ? `The file says ${loaded.drawing.declaredUnits}.` : 'The file does not say; check a known dimension.'}
                >
                  <div className="flex gap-2">
                    <Input id={scaleId} aria-label="Scale" inputMode="decimal" value={scale} onChange={(e) => setScale(e.target.value)} className="w-20" data-testid="import-scale" />
                    <Select id={unitsId} value={units} onChange={(e) => setUnits(e.target.value as UnitId)} data-testid="import-units" aria-describedby={`${unitsId}-hint`}>
                      {UNITS.map(([u, label]) => (
                        <option key={u} value={u}>
                          {label}
                        </option>
                      ))}
                    </Select>
                  </div>
                </Field>
                <p className="text-xs text-ink-muted" data-testid="import-summary">
                  {loaded.drawing.shapes.length} outlines on {loaded.drawing.layers.length} layer{loaded.drawing.layers.length === 1 ? '' : 's'}
                  {loaded.drawing.bbox
                    ? `, ${fmt((loaded.drawing.bbox.xmax - loaded.drawing.bbox.xmin) * (Number(scale) || 1))} × ${fmt((loaded.drawing.bbox.ymax - loaded.drawing.bbox.ymin) * (Number(scale) || 1))} ${units}`
                    : ''}
                  .
                </p>
              </div>
            </div>
            <LayerTable drawing={loaded.drawing} layers={layers} onChange={setLayer} />
            {loaded.drawing.warnings.length ? (
              <Alert tone="warning" title="Read with notes" data-testid="import-warnings">
                <ul className="list-disc pl-4">
                  {loaded.drawing.warnings.slice(0, 8).map((w, i) => (
                    <li key={i}>{w}</li>
                  ))}
                  {loaded.drawing.warnings.length > 8 ? <li>and {loaded.drawing.warnings.length - 8} more</li> : null}
                </ul>
              </Alert>
            ) : null}
          </>
        ) : null}
        {submitError ? (
          <Alert tone="danger" data-testid="import-error">
            {submitError}
          </Alert>
        ) : null}
        <div className="flex justify-end gap-2 border-t border-line pt-4">
          <Button variant="ghost" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" variant="primary" disabled={!loaded} pending={pending} data-testid="import-submit">
            Import as a new section
          </Button>
        </div>
      </form>
    </Dialog>
  );
}

function fmt(v: number) {
  return Number(v.toPrecision(4)).toString();
}

type Choice = 'signal' | 'ground' | 'dielectric' | 'ignore';

function LayerTable({
  drawing,
  layers,
  onChange,
}: {
  drawing: ImportedDrawing;
  layers: Record<string, LayerMapping>;
  onChange: (layer: string, m: LayerMapping) => void;
}) {
  return (
    <table className="w-full table-fixed text-left text-sm" data-testid="import-layers">
      <caption className="pb-2 text-left text-sm font-medium text-ink-soft">Layers</caption>
      <thead className="border-b border-line text-xs text-ink-muted">
        <tr>
          <th scope="col" className="py-1.5 pr-3 font-medium">
            Layer
          </th>
          <th scope="col" className="w-16 py-1.5 pr-3 font-medium">
            Shapes
          </th>
          <th scope="col" className="w-56 py-1.5 pr-3 font-medium">
            Is
          </th>
          <th scope="col" className="w-60 py-1.5 font-medium">
            Net or material
          </th>
        </tr>
      </thead>
      <tbody className="divide-y divide-line">
        {drawing.layers.map((l) => {
          const m = layers[l.name] ?? { as: 'ignore' };
          const choice: Choice = m.as === 'conductor' ? m.role : m.as;
          const setChoice = (c: Choice) => {
            if (c === 'ignore') onChange(l.name, { as: 'ignore' });
            else if (c === 'dielectric') onChange(l.name, { as: 'dielectric', material: slug(l.name), name: l.name, epsR: 4 });
            else onChange(l.name, { as: 'conductor', net: m.as === 'conductor' ? m.net : l.name, role: c });
          };
          return (
            <tr key={l.name} data-testid="import-layer" data-layer={l.name}>
              <td className="truncate py-1.5 pr-3 font-medium text-ink">{l.name}</td>
              <td className="py-1.5 pr-3 text-ink-muted">{l.shapes}</td>
              <td className="py-1.5 pr-3">
                <Select aria-label={`What layer ${l.name} is`} value={choice} onChange={(e) => setChoice(e.target.value as Choice)} className="h-8 text-sm" data-testid="import-layer-as">
                  <option value="signal">Conductor (signal net)</option>
                  <option value="ground">Conductor (ground net)</option>
                  <option value="dielectric">Dielectric</option>
                  <option value="ignore">Ignore</option>
                </Select>
              </td>
              <td className="py-1.5">
                {m.as === 'conductor' ? (
                  <Input aria-label={`Net of layer ${l.name}`} value={m.net} onChange={(e) => onChange(l.name, { ...m, net: e.target.value })} className="h-8 text-sm" data-testid="import-layer-net" />
                ) : m.as === 'dielectric' ? (
                  <div className="flex items-center gap-2">
                    <Input aria-label={`Material id of layer ${l.name}`} value={m.material} onChange={(e) => onChange(l.name, { ...m, material: e.target.value })} className="h-8 text-sm" />
                    <span className="text-xs text-ink-muted">εr</span>
                    <Input
                      aria-label={`Relative permittivity of layer ${l.name}`}
                      inputMode="decimal"
                      defaultValue={String(m.epsR)}
                      onChange={(e) => onChange(l.name, { ...m, epsR: Number(e.target.value) })}
                      className="h-8 w-20 text-sm"
                      data-testid="import-layer-eps"
                    />
                  </div>
                ) : (
                  <span className="text-xs text-ink-muted">Not imported</span>
                )}
              </td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}

function slug(s: string) {
  return s.toLowerCase().replace(/[^a-z0-9_.-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 64) || 'material';
}

'use client';
/**
 * Field views of one solve over the drawing: potential (filled colour + labelled
 * equipotentials), field strength |E| (colour + colour bar + peak marker), field lines, and
 * the mesh. A probe reads φ and E under the cursor; a cut line plots φ and |E| along it.
 *
 * The field images are painted once per solve and view mode into offscreen canvases; each
 * frame only draws those images with the current pan/zoom plus the vector overlays.
 */
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { Crosshair, Maximize2, Move, Ruler, X } from 'lucide-react';
import type { SectionFields, SectionResult } from '@/lib/engine/types';
import type { ResolvedSection, ResolvedShape, Section } from '@/lib/section/schema';
import { resolveSection } from '@/lib/section/resolve';
import { colorLut, type ColorScale } from '@/lib/field/colormap';
import { rasterNodes, type RasterImage, type WorldRect } from '@/lib/field/raster';
import { rasterSmoothMagnitude, sampleSmooth } from '@/lib/field/smooth';
import { samplePoint } from '@/lib/field/gradient';
import { sampleCut, type CutSamples } from '@/lib/field/cut-line';
import { pointAlong, polylineLength } from '@/lib/field/contour';
import { locate } from '@/lib/field/grid';
import { sig, withPrefix } from '@/lib/field/format';
import { Button } from '@/components/ui/button';
import { cn } from '@/components/ui/cn';
import { buildFieldModel, type FieldModel } from './field-model';
import { ColorBar } from './color-bar';
import { CutPlot } from './cut-plot';
import { FieldCaution } from './caution';

export type FieldMode = 'potential' | 'field' | 'lines' | 'mesh';
const MODES: { id: FieldMode; label: string }[] = [
  { id: 'potential', label: 'Potential' },
  { id: 'field', label: 'Field strength |E|' },
  { id: 'lines', label: 'Field lines' },
  { id: 'mesh', label: 'Mesh' },
];

const UNIT_LABEL: Record<string, string> = { m: 'm', mm: 'mm', um: 'µm', mil: 'mil', in: 'in' };

interface View {
  /** Pixels per section unit. */
  scale: number;
  ox: number;
  oy: number;
}

export interface FieldViewProps {
  result: SectionResult;
  fields: SectionFields;
  section: Section;
  initialMode?: FieldMode;
  height?: number;
}

function toImage(r: RasterImage): HTMLCanvasElement {
  const c = document.createElement('canvas');
  c.width = r.width;
  c.height = r.height;
  const ctx = c.getContext('2d')!;
  const img = new ImageData(r.data as Uint8ClampedArray<ArrayBuffer>, r.width, r.height);
  ctx.putImageData(img, 0, 0);
  return c;
}

function rasterSize(rect: WorldRect, maxPx: number): [number, number] {
  const w = rect.x1 - rect.x0;
  const h = rect.y1 - rect.y0;
  if (w >= h) return [maxPx, Math.max(2, Math.round((maxPx * h) / w))];
  return [Math.max(2, Math.round((maxPx * w) / h)), maxPx];
}

function fit(rect: WorldRect, unit: number, width: number, height: number, mesh?: WorldRect): View {
  const w = (rect.x1 - rect.x0) / unit;
  const h = (rect.y1 - rect.y0) / unit;
  const pad = 24;
  const scale = Math.min((width - 2 * pad) / w, (height - 2 * pad) / h);
  const cx = (rect.x0 + rect.x1) / 2 / unit;
  const cy = (rect.y0 + rect.y1) / 2 / unit;
  let ox = width / 2 - cx * scale;
  let oy = height / 2 + cy * scale;
  if (mesh) {
    // where the mesh is larger than the view along an axis, keep its edge at the view's edge
    const mx0 = ox + (mesh.x0 / unit) * scale;
    const mx1 = ox + (mesh.x1 / unit) * scale;
    if (mx1 - mx0 >= width) {
      if (mx0 > 0) ox -= mx0;
      else if (mx1 < width) ox += width - mx1;
    }
    const myTop = oy - (mesh.y1 / unit) * scale;
    const myBottom = oy - (mesh.y0 / unit) * scale;
    if (myBottom - myTop >= height) {
      if (myTop > 0) oy -= myTop;
      else if (myBottom < height) oy += height - myBottom;
    }
  }
  return { scale, ox, oy };
}

export function FieldView({ result, fields, section, initialMode = 'potential', height = 480 }: FieldViewProps) {
  const resolved: ResolvedSection | null = useMemo(() => {
    const r = resolveSection(section);
    return r.ok ? r.section : r.partial;
  }, [section]);
  const unitName = resolved?.units ?? 'm';
  const unitLabel = UNIT_LABEL[unitName] ?? unitName;
  const [mode, setMode] = useState<FieldMode>(initialMode);
  const [net, setNet] = useState(0);
  const [voltsText, setVoltsText] = useState('1');
  const volts = Number.isFinite(Number(voltsText)) && voltsText.trim() !== '' ? Number(voltsText) : 1;
  const [logScale, setLogScale] = useState(true);
  const [tool, setTool] = useState<'probe' | 'cut'>('probe');
  const [probe, setProbe] = useState<{ x: number; y: number } | null>(null);
  const [cut, setCut] = useState<{ x0: number; y0: number; x1: number; y1: number } | null>(null);
  const [view, setView] = useState<View | null>(null);
  const [width, setWidth] = useState(800);
  const wrapRef = useRef<HTMLDivElement>(null);
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const drag = useRef<{ kind: 'pan' | 'cut'; sx: number; sy: number; v: View } | null>(null);
  const [ready, setReady] = useState(false);
  const markedModel = useRef<unknown>(null);

  // ---- derived once per solve and drive ----
  const model: FieldModel = useMemo(() => {
    const v = result.nets.map((_, k) => (k === net ? 1 : 0));
    return buildFieldModel(result, fields, resolved, { volts: v });
  }, [result, fields, resolved, net]);

  const potScale: ColorScale = useMemo(() => ({ kind: 'linear', min: model.phiMin, max: model.phiMax > model.phiMin ? model.phiMax : model.phiMin + 1 }), [model]);
  // the |E| range needs percentiles over the mesh: only worked out once the |E| view is shown
  const eScale: ColorScale = useMemo(
    () =>
      mode !== 'field'
        ? { kind: 'linear', min: 0, max: 1 }
        : logScale
          ? { kind: 'log', min: model.eFloor, max: model.peak?.mag ?? model.eClip }
          : { kind: 'linear', min: 0, max: model.eClip },
    [model, logScale, mode],
  );
  const mask = useCallback((c: number) => model.conductorCell[c] === 1, [model]);

  // ---- offscreen images: one coarse over the whole mesh, one fine over the structure ----
  const images = useMemo(() => {
    if (typeof document === 'undefined') return null;
    const paint = (rect: WorldRect, px: number) => {
      const [w, h] = rasterSize(rect, px);
      // |E| from the field recovered at the cell corners, interpolated per pixel (smooth on graded meshes)
      if (mode === 'field') return rasterSmoothMagnitude(model.grid, model.smooth, rect, w, h, eScale, colorLut('viridis'));
      return rasterNodes(model.grid, model.phi, rect, w, h, potScale, colorLut('cividis'), mask, mode === 'potential' ? 255 : 90);
    };
    if (mode === 'mesh') return null;
    return { coarse: { rect: model.meshRect, img: toImage(paint(model.meshRect, 600)) }, fine: { rect: model.focus, img: toImage(paint(model.focus, 1400)) } };
  }, [model, mode, eScale, potScale, mask]);

  // ---- size and initial view ----
  useEffect(() => {
    const el = wrapRef.current;
    if (!el) return;
    const ro = new ResizeObserver(() => setWidth(Math.max(320, Math.floor(el.clientWidth))));
    ro.observe(el);
    setWidth(Math.max(320, Math.floor(el.clientWidth)));
    return () => ro.disconnect();
  }, []);
  const fitNow = useCallback(() => setView(fit(model.focus, model.unit, width, height, model.meshRect)), [model, width, height]);
  useEffect(() => {
    setView((v) => v ?? fit(model.focus, model.unit, width, height, model.meshRect));
  }, [model, width, height]);

  const toWorld = useCallback((v: View, px: number, py: number) => ({ x: (px - v.ox) / v.scale, y: (v.oy - py) / v.scale }), []);

  // ---- draw ----
  useEffect(() => {
    const c = canvasRef.current;
    if (!c || !view) return;
    const dpr = window.devicePixelRatio || 1;
    if (c.width !== Math.round(width * dpr) || c.height !== Math.round(height * dpr)) {
      c.width = Math.round(width * dpr);
      c.height = Math.round(height * dpr);
    }
    const ctx = c.getContext('2d');
    if (!ctx) return;
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    ctx.clearRect(0, 0, width, height);
    ctx.fillStyle = '#f5f7f6';
    ctx.fillRect(0, 0, width, height);
    const u = model.unit;
    const sx = (xm: number) => view.ox + (xm / u) * view.scale;
    const sy = (ym: number) => view.oy - (ym / u) * view.scale;
    if (images) {
      ctx.imageSmoothingEnabled = true;
      const f = images.fine.rect;
      const fx0 = sx(f.x0);
      const fy0 = sy(f.y1);
      const fw = sx(f.x1) - fx0;
      const fh = sy(f.y0) - fy0;
      // the coarse picture only outside the fine one (no double alpha where they overlap)
      ctx.save();
      ctx.beginPath();
      ctx.rect(0, 0, width, height);
      ctx.rect(fx0, fy0, fw, fh);
      ctx.clip('evenodd');
      const r = images.coarse.rect;
      ctx.drawImage(images.coarse.img, sx(r.x0), sy(r.y1), sx(r.x1) - sx(r.x0), sy(r.y0) - sy(r.y1));
      ctx.restore();
      ctx.drawImage(images.fine.img, fx0, fy0, fw, fh);
    }
    if (mode === 'mesh') drawMesh(ctx, model, sx, sy, width, height);
    drawShapes(ctx, resolved, view, mode);
    if (mode === 'potential') drawIso(ctx, model, sx, sy, width, height, volts);
    if (mode === 'lines') drawLines(ctx, model, sx, sy);
    if (mode === 'field' && model.peak) {
      const px = sx(model.peak.x);
      const py = sy(model.peak.y);
      ctx.strokeStyle = '#b02a20';
      ctx.lineWidth = 2;
      ctx.beginPath();
      ctx.arc(px, py, 9, 0, 2 * Math.PI);
      ctx.moveTo(px - 14, py);
      ctx.lineTo(px + 14, py);
      ctx.moveTo(px, py - 14);
      ctx.lineTo(px, py + 14);
      ctx.stroke();
      label(ctx, 'peak |E|', px + 12, py - 12, '#8e2019');
    }
    if (cut) {
      ctx.strokeStyle = '#141d23';
      ctx.lineWidth = 2;
      ctx.setLineDash([6, 4]);
      ctx.beginPath();
      ctx.moveTo(view.ox + cut.x0 * view.scale, view.oy - cut.y0 * view.scale);
      ctx.lineTo(view.ox + cut.x1 * view.scale, view.oy - cut.y1 * view.scale);
      ctx.stroke();
      ctx.setLineDash([]);
      for (const [x, y, t] of [
        [cut.x0, cut.y0, 'A'],
        [cut.x1, cut.y1, 'B'],
      ] as const) {
        const px = view.ox + x * view.scale;
        const py = view.oy - y * view.scale;
        ctx.fillStyle = '#141d23';
        ctx.beginPath();
        ctx.arc(px, py, 4, 0, 2 * Math.PI);
        ctx.fill();
        label(ctx, t, px + 6, py - 6, '#141d23');
      }
    }
    if (probe && tool === 'probe') {
      const px = view.ox + probe.x * view.scale;
      const py = view.oy - probe.y * view.scale;
      ctx.strokeStyle = 'rgba(20,29,35,0.8)';
      ctx.lineWidth = 1;
      ctx.beginPath();
      ctx.moveTo(px - 8, py);
      ctx.lineTo(px + 8, py);
      ctx.moveTo(px, py - 8);
      ctx.lineTo(px, py + 8);
      ctx.stroke();
    }
    if (markedModel.current !== model) {
      // first frame of a new solve's field: a mark the bench measures against 'edgefield:solve-start'
      markedModel.current = model;
      if (typeof performance.mark === 'function') performance.mark('edgefield:field-drawn');
      if (!ready) setReady(true);
    }
  }, [view, width, height, images, model, resolved, mode, cut, probe, tool, volts, ready]);

  // ---- interaction ----
  const onPointerDown = (e: React.PointerEvent<HTMLCanvasElement>) => {
    if (!view) return;
    const r = e.currentTarget.getBoundingClientRect();
    const px = e.clientX - r.left;
    const py = e.clientY - r.top;
    e.currentTarget.setPointerCapture(e.pointerId);
    if (tool === 'cut') {
      const w = toWorld(view, px, py);
      setCut({ x0: w.x, y0: w.y, x1: w.x, y1: w.y });
      drag.current = { kind: 'cut', sx: px, sy: py, v: view };
    } else {
      drag.current = { kind: 'pan', sx: px, sy: py, v: view };
    }
  };
  const onPointerMove = (e: React.PointerEvent<HTMLCanvasElement>) => {
    if (!view) return;
    const r = e.currentTarget.getBoundingClientRect();
    const px = e.clientX - r.left;
    const py = e.clientY - r.top;
    const d = drag.current;
    if (d?.kind === 'pan') {
      setView({ ...d.v, ox: d.v.ox + (px - d.sx), oy: d.v.oy + (py - d.sy) });
    } else if (d?.kind === 'cut') {
      const w = toWorld(view, px, py);
      setCut((c) => (c ? { ...c, x1: w.x, y1: w.y } : c));
    }
    setProbe(toWorld(d?.kind === 'pan' ? d.v : view, px, py));
  };
  const onPointerUp = (e: React.PointerEvent<HTMLCanvasElement>) => {
    const d = drag.current;
    drag.current = null;
    e.currentTarget.releasePointerCapture(e.pointerId);
    if (d?.kind === 'cut') {
      setCut((c) => (c && Math.hypot(c.x1 - c.x0, c.y1 - c.y0) * (view?.scale ?? 1) > 4 ? c : null));
    }
  };
  useEffect(() => {
    const c = canvasRef.current;
    if (!c) return;
    const onWheel = (e: WheelEvent) => {
      e.preventDefault();
      const r = c.getBoundingClientRect();
      const px = e.clientX - r.left;
      const py = e.clientY - r.top;
      const f = Math.exp(-e.deltaY * 0.0015);
      setView((v) => (v ? { scale: v.scale * f, ox: px - (px - v.ox) * f, oy: py - (py - v.oy) * f } : v));
    };
    c.addEventListener('wheel', onWheel, { passive: false });
    return () => c.removeEventListener('wheel', onWheel);
  }, []);

  // ---- probe readout ----
  const probeValue = useMemo(() => {
    if (!probe) return null;
    const xm = probe.x * model.unit;
    const ym = probe.y * model.unit;
    const p = samplePoint(model.grid, model.phi, xm, ym);
    if (!p) return null;
    const lx = locate(model.grid.xs, xm);
    const ly = locate(model.grid.ys, ym);
    const cell = lx && ly ? ly.k * (model.grid.nx - 1) + lx.k : -1;
    const inMetal = cell >= 0 && model.conductorCell[cell] === 1;
    // E as the |E| picture shows it (recovered at the corners, interpolated); φ bilinear as painted
    const e = inMetal ? null : sampleSmooth(model.grid, model.smooth, xm, ym);
    return { phi: p.phi, ex: e?.ex ?? 0, ey: e?.ey ?? 0, mag: e?.mag ?? 0, epsR: cell >= 0 ? fields.cellEpsR[cell] : undefined, inMetal };
  }, [probe, model, fields]);

  const cutSamples: CutSamples | null = useMemo(() => {
    if (!cut || drag.current?.kind === 'cut') return cut && Math.hypot(cut.x1 - cut.x0, cut.y1 - cut.y0) > 0 ? sampleCut(model.grid, model.phi, cut.x0 * model.unit, cut.y0 * model.unit, cut.x1 * model.unit, cut.y1 * model.unit, 200, model.smooth) : null;
    return sampleCut(model.grid, model.phi, cut.x0 * model.unit, cut.y0 * model.unit, cut.x1 * model.unit, cut.y1 * model.unit, 400, model.smooth);
  }, [cut, model]);

  const absV = Math.abs(volts);
  const perVolt = volts === 1;
  const eUnit = perVolt ? 'V/m per volt' : 'V/m';
  const fmtE = (v: number) => withPrefix(v * absV, 'V/m', 3);
  const fmtV = (v: number) => `${sig(v * volts, 3)} V`;
  const netName = result.nets[net] ?? '';
  const drivenLabel = result.nets.length > 1 ? `${netName} at ${sig(volts, 3)} V, other nets at 0 V` : `${sig(volts, 3)} V applied`;

  return (
    <section className="flex flex-col gap-3" aria-label="Field views" data-testid="field-view">
      <div className="flex flex-wrap items-center gap-2">
        <div role="tablist" aria-label="Field view" className="inline-flex rounded-md border border-line-strong bg-surface p-0.5">
          {MODES.map((m) => (
            <button
              key={m.id}
              role="tab"
              type="button"
              aria-selected={mode === m.id}
              data-testid={`field-mode-${m.id}`}
              onClick={() => setMode(m.id)}
              className={cn(
                'h-8 rounded px-3 text-sm font-medium',
                mode === m.id ? 'bg-accent text-white' : 'text-ink-soft hover:bg-grey-100 hover:text-ink',
              )}
            >
              {m.label}
            </button>
          ))}
        </div>
        {result.nets.length > 1 ? (
          <label className="flex items-center gap-1.5 text-sm text-ink-soft">
            Driven net
            <select
              className="h-8 rounded-md border border-line-strong bg-surface px-2 text-sm text-ink"
              value={net}
              onChange={(e) => setNet(Number(e.target.value))}
              data-testid="field-net"
            >
              {result.nets.map((n, k) => (
                <option key={n} value={k}>
                  {n}
                </option>
              ))}
            </select>
          </label>
        ) : null}
        <label className="flex items-center gap-1.5 text-sm text-ink-soft">
          Applied
          <input
            className="h-8 w-20 rounded-md border border-line-strong bg-surface px-2 text-right text-sm tabular-nums text-ink"
            inputMode="decimal"
            value={voltsText}
            onChange={(e) => setVoltsText(e.target.value)}
            aria-label="Applied voltage in volts"
            data-testid="field-volts"
          />
          V
        </label>
        {mode === 'field' ? (
          <label className="flex items-center gap-1.5 text-sm text-ink-soft">
            <input type="checkbox" checked={logScale} onChange={(e) => setLogScale(e.target.checked)} data-testid="field-log" />
            Log scale
          </label>
        ) : null}
        <div className="ml-auto flex items-center gap-1">
          <Button size="sm" variant={tool === 'probe' ? 'secondary' : 'ghost'} onClick={() => setTool('probe')} aria-pressed={tool === 'probe'}>
            <Move className="size-3.5" aria-hidden /> Probe / pan
          </Button>
          <Button size="sm" variant={tool === 'cut' ? 'secondary' : 'ghost'} onClick={() => setTool('cut')} aria-pressed={tool === 'cut'} data-testid="field-tool-cut">
            <Ruler className="size-3.5" aria-hidden /> Cut line
          </Button>
          {cut ? (
            <Button size="sm" variant="ghost" onClick={() => setCut(null)}>
              <X className="size-3.5" aria-hidden /> Clear cut
            </Button>
          ) : null}
          <Button size="sm" variant="ghost" onClick={fitNow} title="Fit the structure in view">
            <Maximize2 className="size-3.5" aria-hidden /> Fit
          </Button>
        </div>
      </div>

      <div className="flex gap-3">
        <div ref={wrapRef} className="relative min-w-0 flex-1 overflow-hidden rounded-md border border-line">
          <canvas
            ref={canvasRef}
            data-testid="field-canvas"
            data-field-ready={ready ? 'true' : 'false'}
            data-mode={mode}
            style={{ width, height, display: 'block', touchAction: 'none', cursor: tool === 'cut' ? 'crosshair' : 'grab' }}
            onPointerDown={onPointerDown}
            onPointerMove={onPointerMove}
            onPointerUp={onPointerUp}
            onPointerLeave={() => !drag.current && setProbe(null)}
            aria-label={`${MODES.find((m) => m.id === mode)?.label} of the solved section`}
            role="img"
          />
          <div className="pointer-events-none absolute left-2 top-2 rounded-md bg-surface/90 px-2.5 py-1.5 text-xs tabular-nums text-ink shadow-sm" data-testid="field-probe">
            {probeValue ? (
              <>
                <div className="flex items-center gap-1 font-medium">
                  <Crosshair className="size-3" aria-hidden /> x {sig(probe!.x, 4)} {unitLabel}, y {sig(probe!.y, 4)} {unitLabel}
                </div>
                <div>φ = {sig(probeValue.phi * volts, 4)} V</div>
                <div>
                  |E| = {probeValue.inMetal ? '0 (inside a conductor)' : fmtE(probeValue.mag)}
                  {!probeValue.inMetal ? ` (Ex ${withPrefix(probeValue.ex * volts, 'V/m', 3)}, Ey ${withPrefix(probeValue.ey * volts, 'V/m', 3)})` : ''}
                </div>
                {probeValue.epsR !== undefined && !probeValue.inMetal ? <div>εr = {sig(probeValue.epsR, 4)}</div> : null}
              </>
            ) : (
              <span className="text-ink-muted">{tool === 'cut' ? 'Drag across the section to draw a cut line.' : 'Point at the section to read φ and E; drag to pan, wheel to zoom.'}</span>
            )}
          </div>
          <div className="pointer-events-none absolute bottom-2 left-2 rounded bg-surface/85 px-2 py-0.5 text-xs text-ink-soft">
            {drivenLabel} · mesh {model.grid.nx} × {model.grid.ny}
          </div>
        </div>
        <aside className="flex w-44 shrink-0 flex-col gap-3">
          {mode === 'field' ? (
            <ColorBar
              map="viridis"
              scale={eScale}
              title={`|E|, ${eUnit}${perVolt ? '' : ` at ${sig(volts, 3)} V`}`}
              format={fmtE}
              clippedTop={!logScale && (model.peak?.mag ?? 0) > model.eClip}
              testId="field-colorbar"
            />
          ) : mode === 'potential' || mode === 'lines' ? (
            <ColorBar map="cividis" scale={potScale} title="Potential φ, V" format={fmtV} testId="field-colorbar" />
          ) : (
            <div className="text-xs text-ink-soft" data-testid="field-mesh-info">
              <p className="font-medium text-ink">Mesh</p>
              <p>
                {model.grid.nx} × {model.grid.ny} = {(model.grid.nx * model.grid.ny).toLocaleString('en-US')} nodes
              </p>
              <p>finest spacing {withPrefix(result.mesh.finestM, 'm', 3)}</p>
              <p>preset {result.mesh.preset}</p>
            </div>
          )}
          {mode === 'field' && model.peak ? (
            <div className="rounded-md border border-line bg-surface p-2 text-xs text-ink" data-testid="field-peak">
              <p className="font-medium">Peak |E| on this mesh</p>
              <p className="text-base font-semibold tabular-nums">{fmtE(model.peak.mag)}</p>
              <p className="text-ink-soft">
                at x {sig(model.peak.x / model.unit, 4)}, y {sig(model.peak.y / model.unit, 4)} {unitLabel}
              </p>
              {!logScale && model.peak.mag > model.eClip ? (
                <p className="mt-1 text-ink-soft">The colours stop at the 99th percentile ({fmtE(model.eClip)}) so the singular corner values do not wash out the rest.</p>
              ) : null}
            </div>
          ) : null}
        </aside>
      </div>
      {mode === 'field' || (probeValue && !probeValue.inMetal) || cutSamples ? <FieldCaution compact /> : null}
      {cutSamples ? <CutPlot samples={cutSamples} unit={model.unit} unitLabel={unitLabel} volts={volts} /> : null}
    </section>
  );
}

// ---------------------------------------------------------------------------------------
// drawing helpers (world: section units, y up; screen: CSS px)

function label(ctx: CanvasRenderingContext2D, text: string, x: number, y: number, color: string) {
  ctx.font = '600 12px ui-sans-serif, system-ui, sans-serif';
  const w = ctx.measureText(text).width;
  ctx.fillStyle = 'rgba(255,255,255,0.85)';
  ctx.fillRect(x - 3, y - 11, w + 6, 15);
  ctx.fillStyle = color;
  ctx.fillText(text, x, y);
}

function shapePath(ctx: CanvasRenderingContext2D, s: ResolvedShape, v: View) {
  const X = (x: number) => v.ox + x * v.scale;
  const Y = (y: number) => v.oy - y * v.scale;
  ctx.beginPath();
  switch (s.type) {
    case 'rect':
      ctx.rect(X(s.x), Y(s.y + s.height), s.width * v.scale, s.height * v.scale);
      break;
    case 'circle':
      ctx.arc(X(s.cx), Y(s.cy), Math.abs(s.r) * v.scale, 0, 2 * Math.PI);
      break;
    case 'ring':
      ctx.arc(X(s.cx), Y(s.cy), Math.abs(s.rOuter) * v.scale, 0, 2 * Math.PI);
      ctx.moveTo(X(s.cx) + Math.abs(s.rInner) * v.scale, Y(s.cy));
      ctx.arc(X(s.cx), Y(s.cy), Math.abs(s.rInner) * v.scale, 0, 2 * Math.PI, true);
      break;
    case 'polygon':
      s.points.forEach(([x, y], k) => (k === 0 ? ctx.moveTo(X(x), Y(y)) : ctx.lineTo(X(x), Y(y))));
      ctx.closePath();
      break;
    case 'strip':
      ctx.moveTo(X(s.x1), Y(s.y1));
      ctx.lineTo(X(s.x2), Y(s.y2));
      break;
  }
}

function drawShapes(ctx: CanvasRenderingContext2D, section: ResolvedSection | null, v: View, mode: FieldMode) {
  if (!section) return;
  const netColor = new Map(section.nets.map((n) => [n.name, n.color ?? (n.role === 'ground' ? '#68767b' : '#bf5f22')]));
  for (const s of section.shapes) {
    if (s.dielectric === undefined) continue;
    shapePath(ctx, s, v);
    if (mode === 'mesh') {
      ctx.fillStyle = 'rgba(63,115,152,0.08)';
      ctx.fill('evenodd');
    }
    ctx.setLineDash([5, 4]);
    ctx.strokeStyle = 'rgba(20,29,35,0.55)';
    ctx.lineWidth = 1;
    ctx.stroke();
    ctx.setLineDash([]);
  }
  for (const s of section.shapes) {
    if (s.conductor === undefined) continue;
    const col = netColor.get(s.conductor) ?? '#bf5f22';
    shapePath(ctx, s, v);
    if (s.type === 'strip') {
      ctx.strokeStyle = col;
      ctx.lineWidth = 3;
      ctx.stroke();
    } else {
      ctx.fillStyle = col;
      ctx.globalAlpha = 0.9;
      ctx.fill('evenodd');
      ctx.globalAlpha = 1;
      ctx.strokeStyle = '#141d23';
      ctx.lineWidth = 1;
      ctx.stroke();
    }
  }
  // boundary planes
  const b = section.boundary;
  const X = (x: number) => v.ox + x * v.scale;
  const Y = (y: number) => v.oy - y * v.scale;
  const W = ctx.canvas.width;
  const H = ctx.canvas.height;
  for (const [side, spec] of Object.entries(b)) {
    if (spec.type === 'open') continue;
    ctx.strokeStyle = spec.type === 'ground' ? '#37434a' : '#2f5e80';
    ctx.lineWidth = spec.type === 'ground' ? 3 : 1.5;
    ctx.setLineDash(spec.type === 'mirror' ? [10, 4, 2, 4] : []);
    ctx.beginPath();
    if (side === 'left' || side === 'right') {
      ctx.moveTo(X(spec.at), 0);
      ctx.lineTo(X(spec.at), H);
    } else {
      ctx.moveTo(0, Y(spec.at));
      ctx.lineTo(W, Y(spec.at));
    }
    ctx.stroke();
    ctx.setLineDash([]);
  }
}

function drawIso(
  ctx: CanvasRenderingContext2D,
  m: FieldModel,
  sx: (x: number) => number,
  sy: (y: number) => number,
  width: number,
  height: number,
  volts: number,
) {
  ctx.lineWidth = 1.2;
  ctx.strokeStyle = 'rgba(255,255,255,0.9)';
  const placed: { x: number; y: number }[] = [];
  const labels: { text: string; x: number; y: number }[] = [];
  // outermost (lowest) level first, so the crowded inner lines give way
  for (const iso of m.iso) {
    let bestScore = -1;
    let best: { x: number; y: number } | null = null;
    for (const line of iso.lines) {
      ctx.beginPath();
      for (let q = 0; q < line.length; q += 2) {
        const x = sx(line[q]!);
        const y = sy(line[q + 1]!);
        if (q === 0) ctx.moveTo(x, y);
        else ctx.lineTo(x, y);
      }
      ctx.stroke();
      if (polylineLength(line) <= 0) continue;
      // candidate label spots along the line: the one farthest from labels already placed
      for (let k = 1; k < 12; k++) {
        const p = pointAlong(line, k / 12);
        const x = sx(p.x);
        const y = sy(p.y);
        if (x < 12 || x > width - 60 || y < 18 || y > height - 8) continue;
        let d = 1e9;
        for (const o of placed) d = Math.min(d, Math.hypot((o.x - x) * 0.6, o.y - y));
        if (d > bestScore) {
          bestScore = d;
          best = { x, y };
        }
      }
    }
    // skip a label that would sit on top of another
    if (best && bestScore > 16) {
      placed.push(best);
      labels.push({ text: `${sig(iso.level * volts, 2)} V`, x: best.x + 3, y: best.y - 3 });
    }
  }
  for (const l of labels) label(ctx, l.text, l.x, l.y, '#141d23');
}

function drawLines(ctx: CanvasRenderingContext2D, m: FieldModel, sx: (x: number) => number, sy: (y: number) => number) {
  ctx.strokeStyle = '#244a66';
  ctx.lineWidth = 1.4;
  for (const line of m.lines) {
    ctx.beginPath();
    for (let q = 0; q < line.length; q += 2) {
      const x = sx(line[q]!);
      const y = sy(line[q + 1]!);
      if (q === 0) ctx.moveTo(x, y);
      else ctx.lineTo(x, y);
    }
    ctx.stroke();
    // an arrowhead a third of the way along, pointing along E
    if (line.length >= 8) {
      const p = pointAlong(line, 0.33);
      const x = sx(p.x);
      const y = sy(p.y);
      const a = -p.angle; // screen y is flipped
      ctx.fillStyle = '#244a66';
      ctx.beginPath();
      ctx.moveTo(x + 6 * Math.cos(a), y + 6 * Math.sin(a));
      ctx.lineTo(x + 6 * Math.cos(a + 2.5), y + 6 * Math.sin(a + 2.5));
      ctx.lineTo(x + 6 * Math.cos(a - 2.5), y + 6 * Math.sin(a - 2.5));
      ctx.closePath();
      ctx.fill();
    }
  }
}

function drawMesh(
  ctx: CanvasRenderingContext2D,
  m: FieldModel,
  sx: (x: number) => number,
  sy: (y: number) => number,
  width: number,
  height: number,
) {
  const { xs, ys } = m.grid;
  const y0 = Math.max(0, sy(ys[ys.length - 1]!));
  const y1 = Math.min(height, sy(ys[0]!));
  const x0 = Math.max(0, sx(xs[0]!));
  const x1 = Math.min(width, sx(xs[xs.length - 1]!));
  ctx.strokeStyle = 'rgba(55,67,74,0.45)';
  ctx.lineWidth = 0.6;
  ctx.beginPath();
  let lastX = -1;
  for (let i = 0; i < xs.length; i++) {
    const x = sx(xs[i]!);
    if (x < 0 || x > width || x - lastX < 1.2) continue; // skip lines closer than a pixel
    lastX = x;
    ctx.moveTo(x, y0);
    ctx.lineTo(x, y1);
  }
  let lastY = -1;
  for (let j = ys.length - 1; j >= 0; j--) {
    const y = sy(ys[j]!);
    if (y < 0 || y > height || y - lastY < 1.2) continue;
    lastY = y;
    ctx.moveTo(x0, y);
    ctx.lineTo(x1, y);
  }
  ctx.stroke();
}

/**
 * Turn an imported drawing into an Edgefield section: each layer becomes the conductor of
 * a net, a dielectric of a material, or is ignored, as chosen in the import dialog. The
 * result is checked with the section schema, resolveSection and checkSection; errors are
 * thrown as one ImportError that names the shapes concerned.
 */
import { z } from 'zod';
import { checkSection } from '../section/check';
import { resolveSection } from '../section/resolve';
import { LIMITS, SECTION_FORMAT, sectionSchema, unitsSchema, type Section } from '../section/schema';
import { ImportError, type ImportedDrawing } from './types';

const netName = z.string().trim().min(1, 'enter a net name').max(LIMITS.nameLength);
const materialId = z
  .string()
  .trim()
  .regex(/^[A-Za-z0-9_.-]{1,64}$/, 'use letters, digits, "_", "-" or "." (at most 64)');

export const layerMappingSchema = z.discriminatedUnion('as', [
  z.strictObject({ as: z.literal('conductor'), net: netName, role: z.enum(['signal', 'ground']) }),
  z.strictObject({
    as: z.literal('dielectric'),
    material: materialId,
    name: z.string().trim().min(1).max(LIMITS.nameLength).optional(),
    epsR: z.number().finite().min(1, 'εr must be at least 1').max(1e4),
  }),
  z.strictObject({ as: z.literal('ignore') }),
]);
export type LayerMapping = z.infer<typeof layerMappingSchema>;

export const importOptionsSchema = z.strictObject({
  /** Section units; one drawing unit times `scale` is one section unit. */
  units: unitsSchema,
  scale: z.number().finite().positive('the scale must be greater than 0').max(1e9).default(1),
  layers: z.record(z.string().max(200), layerMappingSchema),
  title: z.string().max(200).optional(),
});
export type ImportOptions = z.input<typeof importOptionsSchema>;

function slug(s: string): string {
  const t = s.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '');
  return (t || 'layer').slice(0, 40);
}

export interface SectionFromDrawing {
  section: Section;
  warnings: string[];
  /** Shapes per kind, for the summary shown after import. */
  counts: { conductors: number; dielectrics: number; ignored: number };
}

/** Build and check the section. Throws ImportError naming what is wrong. */
export function drawingToSection(drawing: ImportedDrawing, optionsIn: ImportOptions): SectionFromDrawing {
  const opts = importOptionsSchema.parse(optionsIn);
  const missing = drawing.layers.filter((l) => !opts.layers[l.name]).map((l) => `"${l.name}"`);
  if (missing.length) throw new ImportError(`Choose what layer ${missing.join(', ')} ${missing.length === 1 ? 'is' : 'are'} (a net, a material, or ignore).`);
  const nets = new Map<string, 'signal' | 'ground'>();
  const materials = new Map<string, { id: string; name: string; epsR: number }>();
  for (const [layer, m] of Object.entries(opts.layers)) {
    if (m.as === 'conductor') {
      const before = nets.get(m.net);
      if (before && before !== m.role) throw new ImportError(`Net "${m.net}" is chosen as both signal and ground (layer "${layer}").`);
      nets.set(m.net, m.role);
    } else if (m.as === 'dielectric') {
      const before = materials.get(m.material);
      if (before && before.epsR !== m.epsR) throw new ImportError(`Material "${m.material}" is given two permittivities (layer "${layer}").`);
      materials.set(m.material, { id: m.material, name: m.name ?? m.material, epsR: m.epsR });
    }
  }
  const k = opts.scale;
  // Round away floating-point noise (12 significant digits; values below 1e-12 of the
  // drawing's size become 0), so "1.6" stays 1.6 after the y flip.
  const b = drawing.bbox;
  const size = b ? Math.max(b.xmax - b.xmin, b.ymax - b.ymin, Math.abs(b.xmin), Math.abs(b.ymax)) * k : 1;
  const c = (v: number) => {
    const x = v * k;
    return Math.abs(x) < size * 1e-12 ? 0 : Number(x.toPrecision(12));
  };
  const used = new Set<string>();
  const shapes: Section['shapes'] = [];
  const conductorShapes: Section['shapes'] = [];
  let ignored = 0;
  const usedNets = new Set<string>();
  const usedMaterials = new Set<string>();
  const perLayer = new Map<string, number>();
  for (const s of drawing.shapes) {
    const m = opts.layers[s.layer];
    if (!m || m.as === 'ignore') {
      ignored++;
      continue;
    }
    const n = (perLayer.get(s.layer) ?? 0) + 1;
    perLayer.set(s.layer, n);
    let id = `${slug(s.layer)}-${n}`;
    while (used.has(id)) id += '_';
    used.add(id);
    const role = m.as === 'conductor' ? { conductor: m.net } : { dielectric: m.material };
    if (m.as === 'conductor') usedNets.add(m.net);
    else usedMaterials.add(m.material);
    const label = s.source.slice(0, LIMITS.nameLength);
    const shape: Section['shapes'][number] =
      s.type === 'rect'
        ? { id, label, type: 'rect', x: c(s.x), y: c(s.y), width: c(s.width), height: c(s.height), ...role }
        : s.type === 'circle'
          ? { id, label, type: 'circle', cx: c(s.cx), cy: c(s.cy), r: c(s.r), ...role }
          : { id, label, type: 'polygon', points: s.points.map(([x, y]) => [c(x), c(y)] as [number, number]), ...role };
    (m.as === 'conductor' ? conductorShapes : shapes).push(shape);
  }
  // Dielectrics first, conductors after (a conductor lies over the dielectric it sits on).
  const all = [...shapes, ...conductorShapes];
  if (all.length === 0) throw new ImportError('Every layer is ignored: choose at least one layer as a conductor.');
  if (all.length > LIMITS.shapes) throw new ImportError(`The drawing gives ${all.length} shapes; a section may have at most ${LIMITS.shapes}.`);
  const big = all.find((s) => s.type === 'polygon' && s.points.length > LIMITS.polygonVertices);
  if (big) throw new ImportError(`Shape "${big.id}" (${big.label}) has more than ${LIMITS.polygonVertices} points; simplify it in the drawing.`);

  const raw = {
    format: SECTION_FORMAT,
    ...(opts.title ? { title: opts.title } : {}),
    units: opts.units,
    materials: [...materials.values()].filter((m) => usedMaterials.has(m.id)),
    nets: [...nets.entries()].filter(([n]) => usedNets.has(n)).map(([name, role]) => ({ name, role })),
    shapes: all,
  };
  const parsed = sectionSchema.safeParse(raw);
  if (!parsed.success) {
    const i = parsed.error.issues[0]!;
    throw new ImportError(`The imported section is not valid: ${i.path.join('.')}: ${i.message}`);
  }
  const resolved = resolveSection(parsed.data);
  if (!resolved.ok) throw new ImportError(`The imported section is not valid: ${resolved.issues[0]?.message ?? 'unknown problem'}`);
  const issues = checkSection(resolved.section);
  const errors = issues.filter((i) => i.severity === 'error');
  if (errors.length) {
    const shown = errors.slice(0, 3).map((e) => e.message);
    throw new ImportError(
      `The imported drawing cannot be solved as mapped: ${shown.join('; ')}${errors.length > 3 ? ` (and ${errors.length - 3} more)` : ''}.`,
    );
  }
  return {
    section: parsed.data,
    warnings: [...drawing.warnings, ...issues.filter((i) => i.severity === 'warning').map((i) => i.message)],
    counts: { conductors: conductorShapes.length, dielectrics: shapes.length, ignored },
  };
}

/** Which reader fits a file, from its name and first bytes. */
export function drawingKindOf(name: string, text: string): 'svg' | 'dxf' | null {
  const ext = /\.([a-z0-9]+)$/i.exec(name)?.[1]?.toLowerCase();
  if (ext === 'svg') return 'svg';
  if (ext === 'dxf') return 'dxf';
  if (/^\s*(<\?xml[^>]*>\s*)?(<!--[\s\S]*?-->\s*)*<svg[\s>]/.test(text)) return 'svg';
  if (/^\s*0\s*\r?\n\s*SECTION/.test(text)) return 'dxf';
  return null;
}

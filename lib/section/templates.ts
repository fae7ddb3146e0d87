/**
 * Starting sections offered by the editor ("New from a starting section") and used by the
 * demo seed. Each is parametrised by named dimensions so that a designer changes a
 * variable and the drawing follows. Names, drawings and colours are Edgefield's own.
 *
 * Dimensions are plausible engineering values chosen by us (invented, not taken from any
 * product or data sheet).
 */
import { SECTION_FORMAT, type Section } from './schema';
import { libraryMaterial, toSectionMaterial } from './materials-library';

export type TemplateId =
  | 'plate-pair'
  | 'coax'
  | 'twin-lead'
  | 'wire-over-ground'
  | 'microstrip'
  | 'stripline'
  | 'coplanar'
  | 'coplanar-grounded'
  | 'edge-coupled-pair'
  | 'comb-electrodes';

export interface TemplateInfo {
  id: TemplateId;
  name: string;
  description: string;
}

export const TEMPLATES: readonly TemplateInfo[] = [
  { id: 'plate-pair', name: 'Plate pair', description: 'Two thin plates facing across a gap; compare with εw/d.' },
  { id: 'coax', name: 'Coaxial line', description: 'Round core in a filled round shield.' },
  { id: 'twin-lead', name: 'Twin lead', description: 'Two round wires side by side in air.' },
  { id: 'wire-over-ground', name: 'Wire over ground', description: 'One round wire above an infinite ground plane.' },
  { id: 'microstrip', name: 'Microstrip', description: 'Trace on a laminate over a ground plane.' },
  { id: 'stripline', name: 'Stripline', description: 'Thin strip centred between two ground planes.' },
  { id: 'coplanar', name: 'Coplanar waveguide', description: 'Centre strip between two grounds on a substrate, no ground below.' },
  {
    id: 'coplanar-grounded',
    name: 'Coplanar waveguide over ground',
    description: 'Centre strip between two grounds on a substrate with a ground plane below.',
  },
  { id: 'edge-coupled-pair', name: 'Edge-coupled pair', description: 'Two traces side by side over ground: a differential pair.' },
  { id: 'comb-electrodes', name: 'Comb electrodes', description: 'Interdigitated fingers on a glass substrate (sensor electrodes).' },
];

const mat = (id: string) => {
  const m = libraryMaterial(id);
  if (!m) throw new Error(`materials library has no "${id}"`);
  return toSectionMaterial(m);
};

function base(title: string, units: Section['units']): Pick<Section, 'format' | 'title' | 'units' | 'background' | 'boundary'> {
  return {
    format: SECTION_FORMAT,
    title,
    units,
    background: { epsR: 1 },
    boundary: { left: { type: 'open' }, right: { type: 'open' }, bottom: { type: 'open' }, top: { type: 'open' } },
  };
}

const SIG = '#d9480f';
const SIG2 = '#5f3dc4';
const GND = '#495057';

function build(id: TemplateId): Section {
  switch (id) {
    case 'plate-pair':
      return {
        ...base('Plate pair', 'mm'),
        variables: { w: 10, d: 1 },
        materials: [],
        nets: [
          { name: 'upper', role: 'signal', color: SIG },
          { name: 'lower', role: 'ground', color: GND },
        ],
        shapes: [
          { id: 'plate_upper', type: 'strip', conductor: 'upper', x1: '-w/2', y1: 'd/2', x2: 'w/2', y2: 'd/2' },
          { id: 'plate_lower', type: 'strip', conductor: 'lower', x1: '-w/2', y1: '-d/2', x2: 'w/2', y2: '-d/2' },
        ],
      };
    case 'coax':
      return {
        ...base('Coaxial line', 'mm'),
        variables: { a: 0.45, b: 1.5, s: 0.2 },
        materials: [mat('polyethylene')],
        nets: [
          { name: 'core', role: 'signal', color: SIG },
          { name: 'shield', role: 'ground', color: GND },
        ],
        shapes: [
          { id: 'fill', type: 'circle', dielectric: 'polyethylene', cx: 0, cy: 0, r: 'b' },
          { id: 'core', type: 'circle', conductor: 'core', cx: 0, cy: 0, r: 'a' },
          { id: 'shield', type: 'ring', conductor: 'shield', cx: 0, cy: 0, rInner: 'b', rOuter: 'b + s' },
        ],
      };
    case 'twin-lead':
      return {
        ...base('Twin lead', 'mm'),
        variables: { a: 0.5, D: 4 },
        materials: [],
        nets: [
          { name: 'lead_a', role: 'signal', color: SIG },
          { name: 'lead_b', role: 'ground', color: GND },
        ],
        shapes: [
          { id: 'wire_a', type: 'circle', conductor: 'lead_a', cx: '-D/2', cy: 0, r: 'a' },
          { id: 'wire_b', type: 'circle', conductor: 'lead_b', cx: 'D/2', cy: 0, r: 'a' },
        ],
      };
    case 'wire-over-ground':
      return {
        ...base('Wire over ground', 'mm'),
        variables: { a: 0.5, h: 2 },
        materials: [],
        nets: [{ name: 'wire', role: 'signal', color: SIG }],
        shapes: [{ id: 'wire', type: 'circle', conductor: 'wire', cx: 0, cy: 'h', r: 'a' }],
        boundary: { left: { type: 'open' }, right: { type: 'open' }, bottom: { type: 'ground', at: 0 }, top: { type: 'open' } },
      };
    case 'microstrip':
      return {
        ...base('Microstrip', 'mm'),
        variables: { w: 1.9, h: 1, t: 0.035, W: 12 },
        materials: [mat('glass-epoxy')],
        nets: [{ name: 'trace', role: 'signal', color: SIG }],
        shapes: [
          { id: 'laminate', type: 'rect', dielectric: 'glass-epoxy', x: '-W/2', y: 0, width: 'W', height: 'h' },
          { id: 'trace', type: 'rect', conductor: 'trace', x: '-w/2', y: 'h', width: 'w', height: 't' },
        ],
        boundary: { left: { type: 'open' }, right: { type: 'open' }, bottom: { type: 'ground', at: 0 }, top: { type: 'open' } },
      };
    case 'stripline':
      return {
        ...base('Stripline', 'mm'),
        variables: { w: 0.6, b: 1.2, W: 10 },
        materials: [mat('glass-epoxy')],
        nets: [{ name: 'strip', role: 'signal', color: SIG }],
        shapes: [
          { id: 'core', type: 'rect', dielectric: 'glass-epoxy', x: '-W/2', y: 0, width: 'W', height: 'b' },
          { id: 'strip', type: 'strip', conductor: 'strip', x1: '-w/2', y1: 'b/2', x2: 'w/2', y2: 'b/2' },
        ],
        boundary: {
          left: { type: 'open' },
          right: { type: 'open' },
          bottom: { type: 'ground', at: 0 },
          top: { type: 'ground', at: 'b' },
        },
      };
    case 'coplanar':
    case 'coplanar-grounded': {
      const grounded = id === 'coplanar-grounded';
      return {
        ...base(grounded ? 'Coplanar waveguide over ground' : 'Coplanar waveguide', 'mm'),
        variables: { s: 0.5, g: 0.25, wg: 2, h: 0.5 },
        materials: [mat('alumina')],
        nets: [
          { name: 'centre', role: 'signal', color: SIG },
          { name: 'gnd', role: 'ground', color: GND },
        ],
        shapes: [
          { id: 'substrate', type: 'rect', dielectric: 'alumina', x: '-(s/2 + g + wg)', y: 0, width: 's + 2*g + 2*wg', height: 'h' },
          { id: 'centre', type: 'strip', conductor: 'centre', x1: '-s/2', y1: 'h', x2: 's/2', y2: 'h' },
          { id: 'gnd_left', type: 'strip', conductor: 'gnd', x1: '-(s/2 + g + wg)', y1: 'h', x2: '-(s/2 + g)', y2: 'h' },
          { id: 'gnd_right', type: 'strip', conductor: 'gnd', x1: 's/2 + g', y1: 'h', x2: 's/2 + g + wg', y2: 'h' },
        ],
        boundary: {
          left: { type: 'open' },
          right: { type: 'open' },
          bottom: grounded ? { type: 'ground', at: 0 } : { type: 'open' },
          top: { type: 'open' },
        },
      };
    }
    case 'edge-coupled-pair':
      return {
        ...base('Edge-coupled pair', 'mil'),
        variables: { w: 5, s: 6, h: 4, t: 1.4, W: 60 },
        materials: [mat('glass-epoxy')],
        nets: [
          { name: 'p', role: 'signal', color: SIG },
          { name: 'n', role: 'signal', color: SIG2 },
        ],
        shapes: [
          { id: 'laminate', type: 'rect', dielectric: 'glass-epoxy', x: '-W/2', y: 0, width: 'W', height: 'h' },
          { id: 'trace_p', type: 'rect', conductor: 'p', x: '-s/2 - w', y: 'h', width: 'w', height: 't' },
          { id: 'trace_n', type: 'rect', conductor: 'n', x: 's/2', y: 'h', width: 'w', height: 't' },
        ],
        boundary: { left: { type: 'open' }, right: { type: 'open' }, bottom: { type: 'ground', at: 0 }, top: { type: 'open' } },
      };
    case 'comb-electrodes': {
      // Six fingers, alternately on the drive and sense combs, pitch p = f + g.
      const fingers = [0, 1, 2, 3, 4, 5].map((i) => ({
        id: `finger_${i + 1}`,
        type: 'rect' as const,
        conductor: i % 2 === 0 ? 'drive' : 'sense',
        x: `${i - 2.5}*(f + g) - f/2`,
        y: 'hs',
        width: 'f',
        height: 't',
      }));
      return {
        ...base('Comb electrodes', 'um'),
        variables: { f: 10, g: 10, t: 1, hs: 60, W: 200 },
        materials: [mat('fused-silica')],
        nets: [
          { name: 'drive', role: 'signal', color: SIG },
          { name: 'sense', role: 'ground', color: GND },
        ],
        shapes: [{ id: 'glass', type: 'rect', dielectric: 'fused-silica', x: '-W/2', y: 0, width: 'W', height: 'hs' }, ...fingers],
      };
    }
  }
}

/** A fresh copy of a starting section (safe to modify). */
export function templateSection(id: TemplateId): Section {
  return structuredClone(build(id));
}

export function isTemplateId(id: string): id is TemplateId {
  return TEMPLATES.some((t) => t.id === id);
}

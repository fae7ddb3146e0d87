/**
 * Built-in dielectrics offered by the editor's materials panel.
 *
 * Every value is a TYPICAL handbook figure, not a rating: permittivity and loss vary with
 * grade, frequency, temperature and moisture, and dielectric strength is not a material
 * constant at all (it depends on thickness, electrodes and voltage ramp; test methods
 * IEC 60243-1, ASTM D149). The ranges and sources below follow the project's reference
 * notes (../shared/REFERENCES.md §7), which cite:
 *  - CRC Handbook of Chemistry and Physics (permittivity and dielectric-strength tables)
 *  - A. R. von Hippel, Dielectric Materials and Applications (1954)
 *  - S. M. Sze & K. K. Ng, Physics of Semiconductor Devices, 3rd ed. (2007)
 *  - U. Kaatze, J. Chem. Eng. Data 34:371 (1989) for water
 * The single value used for solving is a mid-range pick of ours; the range is shown beside it.
 */
import type { Material } from './schema';

export interface LibraryMaterial {
  /** Stable id used when the material is added to a section. */
  id: string;
  name: string;
  /** Value used in the section (a typical mid-range pick). */
  epsR: number;
  lossTangent?: number;
  /** Typical dielectric strength, kV/mm (laboratory figure, not a rating). */
  breakdownKVPerMm?: number;
  /** Ranges as published, for display. */
  ranges: { epsR: string; lossTangent: string; breakdown: string };
  /** Where the values come from, shown in the editor and copied into the section. */
  source: string;
  /** Extra caution shown in the panel, if any. */
  note?: string;
}

const CRC = 'CRC Handbook of Chemistry and Physics';
const VON_HIPPEL = 'von Hippel, Dielectric Materials and Applications (1954)';

export const MATERIALS_LIBRARY: readonly LibraryMaterial[] = [
  {
    id: 'air',
    name: 'Air',
    epsR: 1.0006,
    lossTangent: 0,
    breakdownKVPerMm: 3,
    ranges: { epsR: '1.0006', lossTangent: '≈0', breakdown: '≈3 (about 1 cm gap, 1 atm, 20 °C; higher for small gaps)' },
    source: `${CRC}; ${VON_HIPPEL}`,
  },
  {
    id: 'ptfe',
    name: 'PTFE',
    epsR: 2.05,
    lossTangent: 2e-4,
    breakdownKVPerMm: 20,
    ranges: { epsR: '2.0 to 2.1', lossTangent: '1e-4 to 4e-4', breakdown: '20 to 60' },
    source: `${CRC}; ${VON_HIPPEL}`,
  },
  {
    id: 'polyethylene',
    name: 'Polyethylene',
    epsR: 2.3,
    lossTangent: 3e-4,
    breakdownKVPerMm: 20,
    ranges: { epsR: '2.25 to 2.35', lossTangent: '2e-4 to 5e-4', breakdown: '20 to 40' },
    source: `${CRC}; ${VON_HIPPEL}`,
  },
  {
    id: 'glass-epoxy',
    name: 'Glass-epoxy laminate (FR-4 class)',
    epsR: 4.4,
    lossTangent: 0.02,
    breakdownKVPerMm: 20,
    ranges: { epsR: '3.8 to 4.8', lossTangent: '0.01 to 0.025', breakdown: '20 to 40 (unsure)' },
    source: `${CRC}; ${VON_HIPPEL}`,
    note: 'Varies strongly with resin content, glass style and frequency; use the laminate maker’s figure for design.',
  },
  {
    id: 'polyimide',
    name: 'Polyimide film',
    epsR: 3.4,
    lossTangent: 0.004,
    breakdownKVPerMm: 100,
    ranges: { epsR: '3.3 to 3.5', lossTangent: '0.002 to 0.008', breakdown: '100 to 300 (25 µm film)' },
    source: `${CRC}; ${VON_HIPPEL}`,
  },
  {
    id: 'alumina',
    name: 'Alumina 96 to 99.5 %',
    epsR: 9.8,
    lossTangent: 3e-4,
    breakdownKVPerMm: 10,
    ranges: { epsR: '9.4 to 9.9', lossTangent: '1e-4 to 6e-4', breakdown: '10 to 35' },
    source: `${CRC}; ${VON_HIPPEL}`,
  },
  {
    id: 'silicon',
    name: 'Silicon',
    epsR: 11.7,
    ranges: { epsR: '11.7 to 11.9', lossTangent: 'set by resistivity', breakdown: 'n/a (semiconductor)' },
    source: 'Sze & Ng, Physics of Semiconductor Devices, 3rd ed. (2007)',
    note: 'A semiconductor: treated here as an ideal dielectric, which holds only for high-resistivity material.',
  },
  {
    id: 'silicon-dioxide',
    name: 'Silicon dioxide (thermal)',
    epsR: 3.9,
    lossTangent: 1e-4,
    breakdownKVPerMm: 1000,
    ranges: { epsR: '3.9 (fused silica 3.8)', lossTangent: '≈1e-4', breakdown: '≈1000 (thin oxide)' },
    source: `Sze & Ng, Physics of Semiconductor Devices, 3rd ed. (2007); ${CRC}`,
  },
  {
    id: 'fused-silica',
    name: 'Fused silica',
    epsR: 3.8,
    lossTangent: 1e-4,
    ranges: { epsR: '3.8', lossTangent: '≈1e-4', breakdown: 'see thin oxide; bulk much lower' },
    source: `${CRC}; ${VON_HIPPEL}`,
  },
  {
    id: 'silicon-nitride',
    name: 'Silicon nitride (film)',
    epsR: 7,
    lossTangent: 1e-3,
    breakdownKVPerMm: 500,
    ranges: { epsR: '6 to 7.5', lossTangent: '≈1e-3 (unsure)', breakdown: '500 to 1000 (thin film)' },
    source: `Sze & Ng, Physics of Semiconductor Devices, 3rd ed. (2007); ${CRC}`,
  },
  {
    id: 'water',
    name: 'Water, 20 °C',
    epsR: 80,
    ranges: { epsR: '≈80', lossTangent: 'frequency dependent', breakdown: 'conducts in practice' },
    source: 'Kaatze, J. Chem. Eng. Data 34:371 (1989)',
    note: 'Ionic conduction dominates at low frequency; a static value only.',
  },
];

export const MATERIAL_CAUTION =
  'Typical handbook values, not design ratings. Permittivity and loss vary with grade, frequency, temperature and moisture; dielectric strength depends on thickness, electrodes and ramp (IEC 60243-1, ASTM D149) and must be derated. Not a substitute for IEC 60664-1 clearance and creepage rules, product standards or local codes.';

export function libraryMaterial(id: string): LibraryMaterial | undefined {
  return MATERIALS_LIBRARY.find((m) => m.id === id);
}

/** The section-format material for a library entry (its id becomes the material id). */
export function toSectionMaterial(m: LibraryMaterial, id: string = m.id): Material {
  const out: Material = { id, name: m.name, epsR: m.epsR, source: `typical value; ${m.source}` };
  if (m.lossTangent !== undefined) out.lossTangent = m.lossTangent;
  if (m.breakdownKVPerMm !== undefined) out.breakdownKVPerMm = m.breakdownKVPerMm;
  return out;
}

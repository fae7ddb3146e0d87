/** First guesses for the import dialog: what a layer probably is, from its name. */
import type { LayerMapping } from '@/lib/import/to-section';

const GROUND = /(^|[^a-z])(gnd|ground|shield|plane|earth|ref|return)/i;
const DIELECTRIC: [RegExp, string, number][] = [
  [/fr-?4|pcb|board|laminate|prepreg|core/i, 'fr4', 4.3],
  [/glass/i, 'glass', 6.7],
  [/ptfe|teflon/i, 'ptfe', 2.1],
  [/polyimide|kapton/i, 'polyimide', 3.4],
  [/air/i, 'air', 1],
  [/sub|diel|insul|mask|coat|fill|pe\b|polyeth/i, 'dielectric', 4],
];

/**
 * εr values above are typical catalogue figures for first guesses only (from memory); the
 * user sees and edits them in the dialog before anything is imported.
 */
export function guessMapping(layer: string): LayerMapping {
  if (/note|text|dim|title|frame|border|hidden/i.test(layer)) return { as: 'ignore' };
  for (const [re, id, epsR] of DIELECTRIC) if (re.test(layer)) return { as: 'dielectric', material: id, name: layer, epsR };
  const net = layer === '(no layer)' ? 'net1' : layer;
  return { as: 'conductor', net, role: GROUND.test(layer) ? 'ground' : 'signal' };
}

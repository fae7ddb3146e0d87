/** Edgefield's own colours for nets and materials on the canvas. */

/** Signal nets get these in turn (warm and saturated, distinct on a light canvas). */
export const SIGNAL_COLORS = ['#d9480f', '#5f3dc4', '#0b7285', '#c2255c', '#2b8a3e', '#e67700', '#1864ab', '#862e9c'] as const;
/** Ground nets: cool greys. */
export const GROUND_COLORS = ['#495057', '#5c6f82', '#3b5249'] as const;

/** Fill colours for dielectrics, picked from the material's εr so that denser media look denser. */
export function dielectricFill(epsR: number): string {
  if (!Number.isFinite(epsR) || epsR <= 1.01) return '#f1f6fb';
  const t = Math.min(1, Math.log(epsR) / Math.log(12));
  // From a pale sand to a deeper olive-green as εr grows.
  const from = [246, 239, 214];
  const to = [170, 196, 150];
  const c = from.map((f, i) => Math.round(f + (to[i]! - f) * t));
  return `#${c.map((v) => v.toString(16).padStart(2, '0')).join('')}`;
}

/** A colour for a new net, avoiding the ones in use where possible. */
export function pickNetColor(role: 'signal' | 'ground', used: readonly (string | undefined)[]): string {
  const list: readonly string[] = role === 'signal' ? SIGNAL_COLORS : GROUND_COLORS;
  const free = list.find((c) => !used.includes(c));
  return free ?? list[used.length % list.length]!;
}

/** The colour a net is drawn in (its own, or a stable default by index and role). */
export function netColor(net: { role: 'signal' | 'ground'; color?: string }, index: number): string {
  if (net.color) return net.color;
  const list: readonly string[] = net.role === 'signal' ? SIGNAL_COLORS : GROUND_COLORS;
  return list[index % list.length]!;
}

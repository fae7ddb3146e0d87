/** Plain-text rendering of the analysis parts of a result (CLI table, report appendix). */
import type { SectionResult } from '../engine/types';

const sig = (v: number, n = 5) => (v === 0 ? "0" : Number.isFinite(v) ? (Math.abs(v) >= 1e-3 && Math.abs(v) < 1e6 ? String(Number(v.toPrecision(n))) : v.toPrecision(n)) : String(v));

function matrix(title: string, names: string[], m: number[][], unit: string, f: number): string[] {
  const cells = m.map((row) => row.map((v) => sig(v / f, 5)));
  const w = Math.max(...cells.flat().map((c) => c.length), ...names.map((n) => n.length)) + 2;
  const w0 = Math.max(...names.map((n) => n.length), 4);
  return [`${title} (${unit})`, `  ${''.padEnd(w0)}${names.map((n) => n.padStart(w)).join('')}`, ...cells.map((row, i) => `  ${names[i]!.padEnd(w0)}${row.map((c) => c.padStart(w)).join('')}`)];
}

export function analysisText(r: SectionResult): string {
  const out: string[] = [];
  if (r.inductancePerM && r.nets.length > 1) out.push(...matrix('Inductance per unit length', r.nets, r.inductancePerM, 'nH/m', 1e-9));
  if (r.modes) {
    const m = r.modes;
    out.push('Coupled pair (quasi-TEM):');
    out.push(`  even mode: Z = ${sig(m.even.z0Ohm)} Ω, εeff = ${sig(m.even.epsEff)}`);
    out.push(`  odd mode:  Z = ${sig(m.odd.z0Ohm)} Ω, εeff = ${sig(m.odd.epsEff)}`);
    out.push(`  differential Z = ${sig(m.differentialOhm)} Ω, common-mode Z = ${sig(m.commonOhm)} Ω`);
  }
  if (r.modal) {
    out.push('Modes (by increasing εeff):');
    r.modal.forEach((m, i) => out.push(`  mode ${i + 1}: Z = ${sig(m.z0Ohm)} Ω, εeff = ${sig(m.epsEff)}`));
  }
  if (r.crosstalk?.length) {
    out.push('Crosstalk (weak coupling, matched lines):');
    for (const x of r.crosstalk)
      out.push(`  ${x.aggressor} → ${x.victim}: near-end ${sig(x.nearEnd, 3)}, far-end ${sig(x.farEndPerLength * 1e9, 3)} ns/m × length / rise time${x.farEnd !== undefined ? ` = ${sig(x.farEnd, 3)}` : ''}`);
  }
  if (r.losses) {
    const l = r.losses;
    out.push(`Losses at ${sig(l.frequencyHz, 4)} Hz:`);
    if (typeof l.gPerM === 'number') out.push(`  G' = ${sig(l.gPerM)} S/m`);
    else out.push(...matrix("  G'", r.nets, l.gPerM, 'S/m', 1));
    if (typeof l.rPerM === 'number') out.push(`  R' = ${sig(l.rPerM)} Ω/m`);
    else out.push(...matrix("  R'", r.nets, l.rPerM, 'Ω/m', 1));
    if (typeof l.alphaDbPerM === 'number') out.push(`  α = ${sig(l.alphaDbPerM)} dB/m`);
    else out.push(`  α per mode = ${l.alphaDbPerM.map((a) => sig(a)).join(', ')} dB/m`);
    if (l.rDcPerM) out.push(`  DC resistance: ${r.nets.map((n, i) => `${n} ${l.rDcPerM![i] === null ? '—' : sig(l.rDcPerM![i]!)} Ω/m`).join(', ')}`);
    if (l.skinDepthM) out.push(`  skin depth: ${Object.entries(l.skinDepthM).map(([n, d]) => `${n} ${sig(d * 1e6, 3)} µm`).join(', ')}`);
    for (const w of l.warnings ?? []) out.push(`  ! ${w}`);
  }
  if (r.peakField) {
    out.push(`Peak field${r.peakFieldInfo ? ` (${Object.entries(r.peakFieldInfo.voltages).map(([n, v]) => `${n} at ${sig(v)} V`).join(', ')}; reference 0 V)` : ''}:`);
    for (const p of r.peakField)
      out.push(
        `  ${p.where.padEnd(12)} ${sig(p.vPerM / 1e6, 4)} kV/mm at (${sig(p.x * 1e3, 4)}, ${sig(p.y * 1e3, 4)}) mm${p.singular ? ' SINGULAR (grows with refinement)' : ''}${p.margin !== undefined ? `, strength ${sig(p.strengthVPerM! / 1e6, 3)} kV/mm, margin ×${sig(p.margin, 3)}` : ''}${p.suggestedCornerRadiusM !== undefined ? `, round the corner to ≥ ${sig(p.suggestedCornerRadiusM * 1e3, 2)} mm` : ''}`,
      );
    if (r.peakFieldInfo) out.push(`  Caution: ${r.peakFieldInfo.caution}`);
  }
  return out.join('\n');
}

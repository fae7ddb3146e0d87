/** Short engineering formatting for list summaries (the results panel has the full tables). */

const PREFIXES: [number, string][] = [
  [1e-15, 'f'],
  [1e-12, 'p'],
  [1e-9, 'n'],
  [1e-6, 'µ'],
  [1e-3, 'm'],
  [1, ''],
];

/** 8.93e-11 F/m → "89.3 pF/m". */
export function formatPerMetre(value: number, unit: string): string {
  if (!Number.isFinite(value)) return '—';
  const a = Math.abs(value);
  let [scale, prefix] = PREFIXES[0]!;
  for (const p of PREFIXES) if (a >= p[0]) [scale, prefix] = p;
  return `${(value / scale).toPrecision(3)} ${prefix}${unit}/m`;
}

interface ResultLike {
  nets?: string[];
  capacitance?: { maxwell?: number[][] };
  line?: { z0Ohm?: number; epsEff?: number };
  plates?: { solvedOverIdeal?: number };
  errorEstimate?: { relative?: number };
}

/** One line that says what a solve found: Z0 for a line, the fringing for plates, else C11. */
export function summariseResult(result: unknown): string | null {
  if (!result || typeof result !== 'object') return null;
  const r = result as ResultLike;
  const err = r.errorEstimate?.relative;
  const pm = typeof err === 'number' && Number.isFinite(err) ? ` ±${(err * 100).toPrecision(2)} %` : '';
  if (r.line && typeof r.line.z0Ohm === 'number') {
    const eps = typeof r.line.epsEff === 'number' ? ` · εeff ${r.line.epsEff.toFixed(3)}` : '';
    return `Z₀ ${r.line.z0Ohm.toPrecision(4)} Ω${eps}`;
  }
  if (r.plates && typeof r.plates.solvedOverIdeal === 'number') {
    return `fringing +${((r.plates.solvedOverIdeal - 1) * 100).toPrecision(3)} %`;
  }
  const c = r.capacitance?.maxwell?.[0]?.[0];
  if (typeof c === 'number') {
    const n = r.nets?.length ?? 1;
    return `C${n > 1 ? '₁₁' : ''} ${formatPerMetre(c, 'F')}${pm}`;
  }
  return null;
}

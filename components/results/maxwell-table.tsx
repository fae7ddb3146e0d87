/** A Maxwell capacitance matrix in pF/m as a plain table (server-renderable; no state). */

/** F/m → pF/m, four significant digits; "—" for a missing or non-finite value. */
export function formatPf(v: number | undefined): string {
  return v === undefined || !Number.isFinite(v) ? '—' : (v * 1e12).toPrecision(4);
}

export function MaxwellTable({
  nets,
  maxwell,
  compact = false,
}: {
  nets: string[];
  maxwell: number[][];
  /** Narrower cells, for side-by-side comparisons. */
  compact?: boolean;
}) {
  const px = compact ? 'px-2' : 'px-3';
  const pr = compact ? 'pr-2' : 'pr-3';
  return (
    <table className="num text-sm">
      <thead>
        <tr>
          <th />
          {nets.map((n) => (
            <th key={n} scope="col" className={`${px} text-left text-xs font-medium text-ink-muted`}>
              {n}
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {maxwell.map((row, i) => (
          <tr key={i}>
            <th scope="row" className={`${pr} text-left text-xs font-medium text-ink-muted`}>
              {nets[i]}
            </th>
            {row.map((v, j) => (
              <td key={j} className={`${px} text-right`}>
                {formatPf(v)}
              </td>
            ))}
          </tr>
        ))}
      </tbody>
    </table>
  );
}

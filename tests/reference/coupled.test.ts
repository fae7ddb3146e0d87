/**
 * Two signal nets: edge-coupled zero-thickness striplines (Cohn 1955, IRE Trans. MTT 3:29;
 * formula from memory, see lib/analytic/formulas.ts). The full 2 × 2 Maxwell matrix must give
 * the even and odd capacitances within 0.1% at the standard preset, inside the per-entry
 * error estimates.
 */
import { describe, expect, it } from 'vitest';
import { solveProblem } from '../../lib/fdm';
import { coupledStriplineCapacitances } from '../../lib/analytic/formulas';
import type { Problem } from '../../lib/fdm/types';

const MM = 1e-3;
const OPEN = { type: 'open' as const };

describe('coupled striplines (Cohn 1955)', () => {
  it('w/b = 0.5, s/b = 0.3, εr = 3: even and odd modes from the Maxwell matrix', () => {
    const w = 0.5, s = 0.3, b = 1;
    const p: Problem = {
      backgroundEpsR: 3,
      dielectrics: [],
      conductors: [
        { geometry: { type: 'strip', x1: -(s / 2 + w) * MM, y1: (b / 2) * MM, x2: (-s / 2) * MM, y2: (b / 2) * MM }, net: 0 },
        { geometry: { type: 'strip', x1: (s / 2) * MM, y1: (b / 2) * MM, x2: (s / 2 + w) * MM, y2: (b / 2) * MM }, net: 1 },
      ],
      nets: [
        { name: 'p', ground: false },
        { name: 'n', ground: false },
      ],
      boundary: { left: OPEN, right: OPEN, bottom: { type: 'ground', at: 0 }, top: { type: 'ground', at: b * MM } },
      mesh: { preset: 'standard' },
    };
    const r = solveProblem(p);
    const C = r.maxwell;
    expect(r.signalNets).toEqual([0, 1]);
    expect(C[0][1]).toBe(C[1][0]);
    expect(C[0][1]).toBeLessThan(0);
    expect(Math.abs(C[0][0] / C[1][1] - 1)).toBeLessThan(1e-6); // mirror symmetry of the pair
    const ex = coupledStriplineCapacitances(w, s, b, 3);
    const even = C[0][0] + C[0][1];
    const odd = C[0][0] - C[0][1];
    const est = Math.max(...r.error.perEntry.flat());
    expect(Math.abs(even / ex.even - 1)).toBeLessThan(1e-3);
    expect(Math.abs(odd / ex.odd - 1)).toBeLessThan(1e-3);
    expect(Math.abs(even / ex.even - 1)).toBeLessThanOrEqual(est);
    expect(Math.abs(odd / ex.odd - 1)).toBeLessThanOrEqual(est);
  });
});

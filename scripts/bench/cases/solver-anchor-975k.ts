/**
 * The performance anchor's system (port of build(n) in amg_anchor.py): graded 1002² grid,
 * εr 4.4 in the lower third, conductor block at 1 V, 0 V outer boundary; 974,728 unknowns,
 * the same count as the anchor's 975k row.
 */
import { measureSolver } from '../solver-case';
import { anchorSystem } from '../systems';

export const name = 'solver-anchor-975k';
export async function run(): Promise<Record<string, unknown>> {
  return measureSolver(anchorSystem(1002));
}

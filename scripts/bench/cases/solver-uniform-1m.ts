/** Microstrip-like system (conductor block over a ground plane on εr 4.4) on a uniform 1001² grid: 998,879 unknowns. */
import { measureSolver } from '../solver-case';
import { uniformMicrostrip } from '../systems';

export const name = 'solver-uniform-1m';
export async function run(): Promise<Record<string, unknown>> {
  return measureSolver(uniformMicrostrip(1001));
}

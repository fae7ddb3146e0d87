/** Microstrip-like system (conductor block over a ground plane on εr 4.4) on a uniform 501² grid: 249,939 unknowns. */
import { measureSolver } from '../solver-case';
import { uniformMicrostrip } from '../systems';

export const name = 'solver-uniform-250k';
export async function run(): Promise<Record<string, unknown>> {
  return measureSolver(uniformMicrostrip(501));
}

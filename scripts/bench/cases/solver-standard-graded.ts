/**
 * The whole capacitance pipeline (lib/fdm solveProblem) on a microstrip at the standard mesh
 * preset: 2 mm trace, 35 µm thick, on 1.6 mm of εr 4.4 over a ground plane, open elsewhere
 * (invented test geometry). solveMs and workUnits cover every linear solve of the pipeline
 * (three members of the mesh family, with and without the dielectric); unknowns are the
 * finest mesh's nodes; matvecMs is one applyOperator on an operator of the finest mesh's size.
 * Skips with a clear reason when lib/fdm/index.ts (solveProblem) is not available.
 */
import { measureSolverPipeline } from '../solver-pipeline';

export const name = 'solver-standard-graded';
export async function run(): Promise<Record<string, unknown>> {
  return measureSolverPipeline('standard');
}

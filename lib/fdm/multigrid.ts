/**
 * Sparse solver of the 5-point operator (temporary first version: Jacobi-preconditioned CG;
 * the multigrid preconditioner replaces it under the same API).
 */
import type { IterativeSolveOptions, IterativeSolveResult, Operator5 } from './types';
import { SolveCancelledError } from './types';
import { applyOperatorKernel } from './operator';

export interface HierarchyOptions {
  /** Reserved. @default undefined */
  reserved?: never;
}

export interface Hierarchy {
  op: Operator5;
  invDiag: Float64Array;
  r: Float64Array;
  z: Float64Array;
  p: Float64Array;
  q: Float64Array;
}

function checkOperator(op: Operator5): void {
  const { nx, ny } = op;
  if (!Number.isInteger(nx) || !Number.isInteger(ny) || nx < 2 || ny < 2) {
    throw new RangeError(`operator size must be integers nx, ny >= 2 (got ${nx} x ${ny})`);
  }
  const size = nx * ny;
  for (const key of ['c', 'w', 'e', 's', 'n'] as const) {
    const a = op[key];
    if (!(a instanceof Float64Array) || a.length !== size) {
      throw new RangeError(`operator array ${key} must be a Float64Array of length nx*ny = ${size}`);
    }
  }
}

export function setupHierarchy(op: Operator5, _opts: HierarchyOptions = {}): Hierarchy {
  checkOperator(op);
  const size = op.nx * op.ny;
  const invDiag = new Float64Array(size);
  for (let k = 0; k < size; k++) {
    if (!(op.c[k] > 0)) throw new RangeError(`operator diagonal must be positive (node ${k})`);
    invDiag[k] = 1 / op.c[k];
  }
  return {
    op,
    invDiag,
    r: new Float64Array(size),
    z: new Float64Array(size),
    p: new Float64Array(size),
    q: new Float64Array(size),
  };
}

function dot(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let k = 0; k < a.length; k++) s += a[k] * b[k];
  return s;
}

export function solve(
  h: Hierarchy,
  rhs: Float64Array,
  opts: IterativeSolveOptions & { x0?: Float64Array } = {},
): IterativeSolveResult {
  const { tolerance = 1e-10, maxIterations = 200, onIteration, isCancelled, x0 } = opts;
  const { op, invDiag, r, z, p, q } = h;
  const { nx, ny, c, w, e, s, n } = op;
  const size = nx * ny;
  if (rhs.length !== size) throw new RangeError(`rhs must have length ${size}`);
  if (x0 && x0.length !== size) throw new RangeError(`x0 must have length ${size}`);
  const x = x0 ? Float64Array.from(x0) : new Float64Array(size);
  const bnorm = Math.sqrt(dot(rhs, rhs));
  const scale = bnorm > 0 ? bnorm : 1;
  applyOperatorKernel(nx, ny, c, w, e, s, n, x, q);
  for (let k = 0; k < size; k++) r[k] = rhs[k] - q[k];
  let rel = Math.sqrt(dot(r, r)) / scale;
  const residualNorms = [rel];
  const rel0 = rel;
  let it = 0;
  if (rel <= tolerance) return { x, converged: true, iterations: 0, residualNorms, convergenceFactor: 0 };
  for (let k = 0; k < size; k++) z[k] = invDiag[k] * r[k];
  p.set(z);
  let rz = dot(r, z);
  let converged = false;
  while (it < maxIterations) {
    if (isCancelled && isCancelled()) throw new SolveCancelledError();
    applyOperatorKernel(nx, ny, c, w, e, s, n, p, q);
    const alpha = rz / dot(p, q);
    for (let k = 0; k < size; k++) {
      x[k] += alpha * p[k];
      r[k] -= alpha * q[k];
    }
    it++;
    rel = Math.sqrt(dot(r, r)) / scale;
    residualNorms.push(rel);
    if (onIteration && onIteration(it, rel) === false) break;
    if (rel <= tolerance) {
      converged = true;
      break;
    }
    for (let k = 0; k < size; k++) z[k] = invDiag[k] * r[k];
    const rzNew = dot(r, z);
    const beta = rzNew / rz;
    rz = rzNew;
    for (let k = 0; k < size; k++) p[k] = z[k] + beta * p[k];
  }
  const convergenceFactor = it > 0 && rel0 > 0 ? Math.pow(rel / rel0, 1 / it) : 0;
  return { x, converged, iterations: it, residualNorms, convergenceFactor };
}

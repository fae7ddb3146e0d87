/**
 * Bracketed root finding (Brent 1973, Algorithms for Minimization without Derivatives,
 * ch. 4: inverse quadratic interpolation safeguarded by bisection). Used by goal seek,
 * where each evaluation is a full solve, so it counts evaluations and accepts an async f.
 */
export interface RootResult {
  x: number;
  fx: number;
  evaluations: number;
  converged: boolean;
}

export class TargetNotReachableError extends Error {
  constructor(
    message: string,
    readonly lo: { x: number; fx: number },
    readonly hi: { x: number; fx: number },
  ) {
    super(message);
    this.name = 'TargetNotReachableError';
  }
}

export interface RootOptions {
  /** Absolute tolerance on x. @default 1e-9 × |hi − lo| */
  xTolerance?: number;
  /** Stop when |f(x)| ≤ this. @default 0 */
  fTolerance?: number;
  /** @default 40 */
  maxEvaluations?: number;
  /** Called after each evaluation (for progress). */
  onEvaluation?: (x: number, fx: number, evaluation: number) => void;
}

/** Finds x in [lo, hi] with f(x) = 0; f(lo) and f(hi) must differ in sign. */
export async function findRoot(
  f: (x: number) => number | Promise<number>,
  lo: number,
  hi: number,
  opts: RootOptions = {},
): Promise<RootResult> {
  if (!Number.isFinite(lo) || !Number.isFinite(hi) || lo === hi) throw new RangeError('the search range needs two different finite ends');
  const { xTolerance = 1e-9 * Math.abs(hi - lo), fTolerance = 0, maxEvaluations = 40, onEvaluation } = opts;
  let evaluations = 0;
  const ev = async (x: number) => {
    const y = await f(x);
    evaluations++;
    if (!Number.isFinite(y)) throw new RangeError(`the result is not a finite number at ${x}`);
    onEvaluation?.(x, y, evaluations);
    return y;
  };
  let a = lo;
  let b = hi;
  let fa = await ev(a);
  let fb = await ev(b);
  if (fa === 0) return { x: a, fx: fa, evaluations, converged: true };
  if (fb === 0) return { x: b, fx: fb, evaluations, converged: true };
  if (Math.sign(fa) === Math.sign(fb)) {
    throw new TargetNotReachableError(
      'the target is not reached anywhere in the range: the result minus the target has the same sign at both ends ' +
        `(${fa.toPrecision(4)} at ${a}, ${fb.toPrecision(4)} at ${b}); widen the range`,
      { x: a, fx: fa },
      { x: b, fx: fb },
    );
  }
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  while (evaluations < maxEvaluations) {
    if (Math.sign(fb) === Math.sign(fc)) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol = 2 * Number.EPSILON * Math.abs(b) + 0.5 * xTolerance;
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= tol || Math.abs(fb) <= fTolerance) return { x: b, fx: fb, evaluations, converged: true };
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb)) {
      let p: number;
      let q: number;
      const s = fb / fa;
      if (a === c) {
        p = 2 * m * s;
        q = 1 - s;
      } else {
        const qq = fa / fc;
        const r = fb / fc;
        p = s * (2 * m * qq * (qq - r) - (b - a) * (r - 1));
        q = (qq - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < Math.min(3 * m * q - Math.abs(tol * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = m;
        e = m;
      }
    } else {
      d = m;
      e = m;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol ? d : m > 0 ? tol : -tol;
    fb = await ev(b);
  }
  return { x: b, fx: fb, evaluations, converged: false };
}

/**
 * The capacitance pipeline: geometry → graded mesh family → finite-volume operator →
 * multigrid-preconditioned CG per signal net → Gauss-law charges → Maxwell matrix, on three
 * members of the mesh family (and again with every εr = 1 when there is a dielectric) →
 * Richardson extrapolation with an error estimate.
 *
 * Lengths are scaled so that the structure size is 1 (2D capacitance per unit length does not
 * depend on the length scale); ε0 is applied at the end.
 */
import type { Geometry, Problem, ProblemSolution, SolveProblemOptions, SolveProgress } from './types';
import { SolveCancelledError } from './types';
import { geometryBox, transformGeometry, type Box } from './geometry';
import { buildMesh, FAMILY_LEVELS, MESH_PRESET_PARAMS, MeshTooLargeError, subsampleAxis, type MeshParams } from './mesh';
import { discretise, type Discretisation } from './discretise';
import { discreteEnergy, netCharges, unitRhs } from './charges';
import { richardson } from './extrapolate';
import { setupHierarchy, solve } from './multigrid';

declare const performance: { now(): number } | undefined;
const now = (): number => (typeof performance !== 'undefined' && performance ? performance.now() : Date.now());

/** Vacuum permittivity, F/m (CODATA 2018). */
export const EPSILON_0 = 8.8541878128e-12;
/** Largest number of nodes on the finest mesh. */
export const MAX_NODES = 4_000_000;

function checkGeometry(g: Geometry, what: string): void {
  const bad = (msg: string) => {
    throw new RangeError(`${what}: ${msg}`);
  };
  const fin = (...v: number[]) => v.every((x) => Number.isFinite(x));
  switch (g.type) {
    case 'rect':
      if (!fin(g.x, g.y, g.width, g.height)) bad('rect values must be finite');
      if (!(g.width > 0 && g.height > 0)) bad('rect width and height must be positive');
      break;
    case 'circle':
      if (!fin(g.cx, g.cy, g.r)) bad('circle values must be finite');
      if (!(g.r > 0)) bad('circle radius must be positive');
      break;
    case 'ring':
      if (!fin(g.cx, g.cy, g.rInner, g.rOuter)) bad('ring values must be finite');
      if (!(g.rInner > 0 && g.rOuter > g.rInner)) bad('ring needs 0 < rInner < rOuter');
      break;
    case 'polygon':
      if (g.points.length < 3) bad('polygon needs at least 3 points');
      if (!g.points.every(([x, y]) => fin(x, y))) bad('polygon points must be finite');
      break;
    case 'strip':
      if (!fin(g.x1, g.y1, g.x2, g.y2)) bad('strip values must be finite');
      if (g.x1 !== g.x2 && g.y1 !== g.y2) bad('strip must be horizontal or vertical');
      if (g.x1 === g.x2 && g.y1 === g.y2) bad('strip must have a length');
      break;
  }
}

interface LevelResult {
  nodes: number;
  maxwell: number[][];
  iterations: number;
  relResidual: number;
  symmetryError: number;
  energyError: number;
  potentials?: Float64Array[];
  disc?: Discretisation;
  lx: Float64Array;
  ly: Float64Array;
}

/**
 * Solve one electrostatic problem: the Maxwell capacitance matrix per unit length over the
 * signal nets with an error estimate. Throws RangeError for invalid problems and
 * SolveCancelledError when isCancelled() turns true.
 */
export function solveProblem(problem: Problem, opts: SolveProblemOptions = {}): ProblemSolution {
  const t0 = now();
  const { onProgress, isCancelled, tolerance = 1e-10, keepFields = false } = opts;
  const progress = (p: SolveProgress) => onProgress?.(p);
  const cancelled = () => {
    if (isCancelled?.()) throw new SolveCancelledError();
  };

  // ---- validation
  if (!problem || !Array.isArray(problem.nets) || problem.nets.length === 0) throw new RangeError('problem has no nets');
  if (!(problem.backgroundEpsR >= 1) || !Number.isFinite(problem.backgroundEpsR)) {
    throw new RangeError(`background relative permittivity must be a finite number ≥ 1 (got ${problem.backgroundEpsR})`);
  }
  problem.conductors.forEach((c, i) => {
    const name = c.shapeId ?? `conductor ${i}`;
    checkGeometry(c.geometry, `shape "${name}"`);
    if (!Number.isInteger(c.net) || c.net < 0 || c.net >= problem.nets.length) throw new RangeError(`shape "${name}": net index ${c.net} out of range`);
  });
  problem.dielectrics.forEach((d, i) => {
    checkGeometry(d.geometry, `dielectric ${i}`);
    if (!(d.epsR >= 1) || !Number.isFinite(d.epsR)) throw new RangeError(`dielectric ${i}: relative permittivity must be a finite number ≥ 1 (got ${d.epsR})`);
  });
  const b = problem.boundary;
  for (const side of ['left', 'right', 'bottom', 'top'] as const) {
    const s = b[side];
    if (s.type !== 'open' && !Number.isFinite(s.at)) throw new RangeError(`boundary ${side}: "at" must be finite`);
  }
  if (b.left.type !== 'open' && b.right.type !== 'open' && !(b.right.at > b.left.at)) throw new RangeError('boundary: right plane must lie right of the left plane');
  if (b.bottom.type !== 'open' && b.top.type !== 'open' && !(b.top.at > b.bottom.at)) throw new RangeError('boundary: top plane must lie above the bottom plane');
  const hasGroundPlane = (['left', 'right', 'bottom', 'top'] as const).some((s) => b[s].type === 'ground');
  const conductorNets = new Set(problem.conductors.map((c) => c.net));
  const hasGroundNet = problem.nets.some((n, i) => n.ground && conductorNets.has(i));
  if (!hasGroundPlane && !hasGroundNet) throw new RangeError('no reference: add a ground net with conductors or a ground boundary');
  const signalNets: number[] = [];
  problem.nets.forEach((n, i) => {
    if (n.ground) return;
    if (!conductorNets.has(i)) throw new RangeError(`signal net "${n.name}" has no conductors`);
    signalNets.push(i);
  });
  if (signalNets.length === 0) throw new RangeError('no signal net: at least one non-ground net with conductors is needed');

  // ---- scaling: structure box of conductors and planes, size 1
  const box: Box = { x0: Infinity, y0: Infinity, x1: -Infinity, y1: -Infinity };
  for (const c of problem.conductors) {
    const q = geometryBox(c.geometry);
    box.x0 = Math.min(box.x0, q.x0);
    box.y0 = Math.min(box.y0, q.y0);
    box.x1 = Math.max(box.x1, q.x1);
    box.y1 = Math.max(box.y1, q.y1);
  }
  for (const side of ['left', 'right'] as const) {
    const s = b[side];
    if (s.type !== 'open') {
      box.x0 = Math.min(box.x0, s.at);
      box.x1 = Math.max(box.x1, s.at);
    }
  }
  for (const side of ['bottom', 'top'] as const) {
    const s = b[side];
    if (s.type !== 'open') {
      box.y0 = Math.min(box.y0, s.at);
      box.y1 = Math.max(box.y1, s.at);
    }
  }
  const size = Math.max(box.x1 - box.x0, box.y1 - box.y0);
  if (!(size > 0) || !Number.isFinite(size)) throw new RangeError('the conductors have no extent');
  const ox = 0.5 * (box.x0 + box.x1);
  const oy = 0.5 * (box.y0 + box.y1);
  const sc = 1 / size;
  const X = (x: number) => (x - ox) * sc;
  const Y = (y: number) => (y - oy) * sc;
  const conductors = problem.conductors.map((c) => ({ geometry: transformGeometry(c.geometry, ox, oy, sc), net: c.net }));
  const dielectrics = problem.dielectrics.map((d) => ({ geometry: transformGeometry(d.geometry, ox, oy, sc), epsR: d.epsR }));
  const structure: Box = { x0: X(box.x0), y0: Y(box.y0), x1: X(box.x1), y1: Y(box.y1) };
  const limit = (s: Problem['boundary']['left'], f: (v: number) => number) => (s.type === 'open' ? undefined : f(s.at));

  // ---- mesh parameters
  const preset = problem.mesh?.preset ?? 'standard';
  const base = MESH_PRESET_PARAMS[preset];
  if (!base) throw new RangeError(`unknown mesh preset "${String(preset)}"`);
  const params: MeshParams = { ...base };
  const m = problem.mesh;
  if (m?.finest !== undefined) {
    if (!(m.finest > 0)) throw new RangeError('mesh.finest must be positive');
    params.hSing = m.finest * sc;
    params.hDiel = Math.max(params.hDiel, params.hSing);
  }
  if (m?.growth !== undefined) {
    if (!(m.growth > 1 && m.growth <= 2)) throw new RangeError('mesh.growth must lie in (1, 2]');
    params.growth = m.growth;
    params.growthFar = Math.max(params.growthFar, m.growth);
  }
  if (m?.extent !== undefined) {
    if (!(m.extent >= 1 && m.extent <= 10000)) throw new RangeError('mesh.extent must lie in [1, 10000]');
    params.extent = m.extent;
  }

  progress({ stage: 'mesh', fraction: 0 });
  const tooLarge = (n?: number) =>
    new RangeError(
      `the mesh would need ${n === undefined ? 'more than' : n.toLocaleString('en-US') + ' nodes, more than'} the limit of ${MAX_NODES.toLocaleString('en-US')} nodes: use a coarser preset or a larger finest spacing`,
    );
  let mesh: { xs: Float64Array; ys: Float64Array };
  try {
    mesh = buildMesh(
      {
        conductors: conductors.map((c) => c.geometry),
        dielectrics: dielectrics.map((d) => d.geometry),
        limits: { left: limit(b.left, X), right: limit(b.right, X), bottom: limit(b.bottom, Y), top: limit(b.top, Y) },
        structure,
      },
      params,
      MAX_NODES,
    );
  } catch (e) {
    if (e instanceof MeshTooLargeError) throw tooLarge();
    throw e;
  }
  const { xs, ys } = mesh;
  const nodes = xs.length * ys.length;
  if (nodes > MAX_NODES) throw tooLarge(nodes);

  const planeNet = problem.nets.length;
  const groundSides = {
    left: b.left.type === 'ground',
    right: b.right.type === 'ground',
    bottom: b.bottom.type === 'ground',
    top: b.top.type === 'ground',
  };
  const eps = problem.backgroundEpsR;
  const dielectricVaries = dielectrics.some((d) => d.epsR !== eps);
  const needVacuum = dielectricVaries;
  const uniformEps = !dielectricVaries ? eps : 1;

  const warnings: string[] = [];
  let setupMs = now() - t0;
  let solveMs = 0;
  let totalIterations = 0;
  let worstResidual = 0;
  const passes = (needVacuum ? 2 : 1) * FAMILY_LEVELS;
  let passDone = 0;

  // First guesses: the coarser family member's solution interpolated to this mesh (the family
  // is nested, every 2nd node), and the dielectric solution of the same mesh for the vacuum solve.
  const runLevel = (level: number, vacuum: boolean, keep: boolean, guess?: (a: number, lx: Float64Array, ly: Float64Array) => Float64Array | undefined): LevelResult => {
    cancelled();
    const step = 1 << level;
    const lx = subsampleAxis(xs, step);
    const ly = subsampleAxis(ys, step);
    const ts = now();
    progress({ stage: 'setup', level, fraction: passDone / passes });
    const disc = discretise({
      xs: lx,
      ys: ly,
      conductors,
      dielectrics,
      backgroundEpsR: eps,
      groundSides,
      planeNet,
      vacuum,
    });
    if (level === FAMILY_LEVELS - 1 && !vacuum) {
      // every signal net must own nodes inside the domain (not clipped away by a plane)
      const count = new Int32Array(planeNet + 1);
      for (let k = 0; k < disc.nodeNet.length; k++) if (disc.nodeNet[k] >= 0) count[disc.nodeNet[k]]++;
      for (const s of signalNets) {
        if (count[s] === 0) throw new RangeError(`signal net "${problem.nets[s].name}" lies entirely outside the domain (beyond a ground or mirror boundary)`);
      }
    }
    const hier = setupHierarchy(disc.op);
    const tsolve = now();
    setupMs += tsolve - ts;
    const nNets = planeNet + 1;
    const S = signalNets.length;
    const charges: Float64Array[] = [];
    const potentials: Float64Array[] = [];
    const rhs = new Float64Array(lx.length * ly.length);
    const V = new Float64Array(nNets);
    let energyError = 0;
    let iterations = 0;
    let relResidual = 0;
    for (let a = 0; a < S; a++) {
      cancelled();
      unitRhs(disc, signalNets[a], rhs);
      const x0 = guess?.(a, lx, ly);
      const res = solve(hier, rhs, {
        tolerance,
        x0,
        maxIterations: 500,
        isCancelled,
        onIteration: (iteration, r) => {
          progress({ stage: 'solve', level, iteration, relResidual: r, fraction: (passDone + (a + 0.5) / S) / passes });
        },
      });
      iterations += res.iterations;
      // residual relative to the residual of a zero start (rhs off the fixed nodes), as without a first guess
      let free = 0, all = 0;
      for (let k = 0; k < rhs.length; k++) {
        all += rhs[k] * rhs[k];
        if (disc.op.w[k] !== 0 || disc.op.e[k] !== 0 || disc.op.s[k] !== 0 || disc.op.n[k] !== 0) free += rhs[k] * rhs[k];
      }
      const start = all > 0 ? Math.sqrt(free / all) : 1;
      const last = res.residualNorms.length ? res.residualNorms[res.residualNorms.length - 1] / (start || 1) : 0;
      relResidual = Math.max(relResidual, last);
      if (!res.converged) warnings.push(`linear solve did not reach the tolerance ${tolerance} (level ${level}, net ${problem.nets[signalNets[a]].name})`);
      V.fill(0);
      V[signalNets[a]] = 1;
      const q = netCharges(disc, res.x, V);
      const w = discreteEnergy(disc, res.x, V);
      energyError = Math.max(energyError, Math.abs(w - q[signalNets[a]]) / Math.abs(q[signalNets[a]]));
      charges.push(q);
      potentials.push(res.x);
    }
    solveMs += now() - tsolve;
    totalIterations += iterations;
    worstResidual = Math.max(worstResidual, relResidual);
    passDone++;
    const factor = EPSILON_0 * (vacuum ? 1 : uniformEps === 1 ? 1 : 1);
    const C: number[][] = [];
    for (let r = 0; r < S; r++) {
      C.push([]);
      for (let col = 0; col < S; col++) C[r].push(charges[col][signalNets[r]] * factor);
    }
    let symmetryError = 0;
    for (let r = 0; r < S; r++) {
      for (let col = r + 1; col < S; col++) {
        const d = Math.abs(C[r][col] - C[col][r]) / Math.sqrt(Math.abs(C[r][r] * C[col][col]));
        symmetryError = Math.max(symmetryError, d);
        const avg = 0.5 * (C[r][col] + C[col][r]);
        C[r][col] = avg;
        C[col][r] = avg;
      }
    }
    return {
      nodes: lx.length * ly.length,
      maxwell: C,
      iterations,
      relResidual,
      symmetryError,
      energyError,
      potentials,
      disc: keep ? disc : undefined,
      lx,
      ly,
    };
  };

  const levels: LevelResult[] = [];
  const vacLevels: LevelResult[] = [];
  const fromCoarser = (coarser: LevelResult | undefined) =>
    coarser?.potentials === undefined
      ? undefined
      : (a: number, lx: Float64Array, ly: Float64Array) => prolongNested(coarser.potentials![a], coarser.lx, coarser.ly, lx, ly);
  for (let level = FAMILY_LEVELS - 1; level >= 0; level--) {
    levels[level] = runLevel(level, false, keepFields && level === 0, fromCoarser(levels[level + 1]));
    if (needVacuum) {
      const diel = levels[level];
      const coarseVac = vacLevels[level + 1], coarseDiel = levels[level + 1];
      // vacuum ≈ dielectric solution of this mesh + the coarser member's (vacuum − dielectric)
      // difference interpolated (fewer iterations than either part alone on the bench microstrip)
      let guess: ((a: number, lx: Float64Array, ly: Float64Array) => Float64Array | undefined) | undefined = (a) => diel.potentials![a];
      if (coarseVac) guess = (a, lx, ly) => {
        const d = coarseVac.potentials![a].slice();
        const cd = coarseDiel.potentials![a];
        for (let k = 0; k < d.length; k++) d[k] -= cd[k];
        const g = prolongNested(d, coarseVac.lx, coarseVac.ly, lx, ly);
        const f = diel.potentials![a];
        for (let k = 0; k < g.length; k++) g[k] += f[k];
        return g;
      };
      vacLevels[level] = runLevel(level, true, keepFields && level === 0, guess);
    }
    // only the next finer member needs these
    if (level + 1 < FAMILY_LEVELS) {
      levels[level + 1].potentials = undefined;
      if (needVacuum) vacLevels[level + 1].potentials = undefined;
    }
  }
  if (!keepFields) {
    levels[0].potentials = undefined;
    if (needVacuum) vacLevels[0].potentials = undefined;
  }
  progress({ stage: 'refine', fraction: 1 });

  const S = signalNets.length;
  const fin = levels[0];
  if (fin.symmetryError > 1e-6) warnings.push(`capacitance matrix asymmetric by ${fin.symmetryError.toExponential(2)} before symmetrising`);
  if (fin.energyError > 1e-6) warnings.push(`energy identity off by ${fin.energyError.toExponential(2)}`);

  const scaleVac = (C: number[][]) => C.map((row) => row.map((v) => v / eps));
  const family = levels.map((l) => l.maxwell);
  const vacFamily = needVacuum ? vacLevels.map((l) => l.maxwell) : family.map(scaleVac);

  const maxwell: number[][] = [];
  const vacuumM: number[][] = [];
  const perEntry: number[][] = [];
  let relative = 0;
  let monotone = true;
  let anyExtrapolated = false;
  let observedOrder: number | undefined;
  for (let r = 0; r < S; r++) {
    maxwell.push([]);
    vacuumM.push([]);
    perEntry.push([]);
    for (let c = 0; c < S; c++) {
      const ex = richardson(family.map((F) => F[r][c]));
      const ev = richardson(vacFamily.map((F) => F[r][c]));
      maxwell[r].push(ex.value);
      vacuumM[r].push(ev.value);
      const rel = Math.max(ex.error / Math.abs(ex.value || 1e-300), needVacuum ? ev.error / Math.abs(ev.value || 1e-300) : 0);
      perEntry[r].push(rel);
      const matters = r === c || Math.abs(family[0][r][c]) >= 0.01 * Math.sqrt(family[0][r][r] * family[0][c][c]);
      if (matters) {
        relative = Math.max(relative, rel);
        if (!ex.monotone || (needVacuum && !ev.monotone)) monotone = false;
        if (ex.extrapolated) anyExtrapolated = true;
      }
      if (r === 0 && c === 0) observedOrder = ex.order;
    }
  }
  // the reported matrix stays symmetric
  for (let r = 0; r < S; r++) {
    for (let c = r + 1; c < S; c++) {
      const a = 0.5 * (maxwell[r][c] + maxwell[c][r]);
      maxwell[r][c] = maxwell[c][r] = a;
      const v = 0.5 * (vacuumM[r][c] + vacuumM[c][r]);
      vacuumM[r][c] = vacuumM[c][r] = v;
    }
  }
  const note = monotone
    ? anyExtrapolated
      ? `Richardson-extrapolated from three meshes (spacings h, 2h, 4h; ${levels.map((l) => l.nodes).join(', ')} nodes)${observedOrder !== undefined ? `, observed order ${observedOrder.toFixed(2)}` : ''}; the estimate is the larger of the spread between extrapolating with the observed order and with order 2, and half the extrapolation step.`
      : `finest-mesh values (convergence monotone but the order was not plausible for extrapolation); the estimate is 1.25 times the last change.`
    : `convergence over the mesh family was not monotone: finest-mesh values are reported and the estimate is the largest change between members; refine the mesh (a finer preset) to tighten it.`;
  if (!monotone) warnings.push('convergence over the mesh family was not monotone; the error estimate is cruder');

  const finestSpacing = Math.min(minStep(xs), minStep(ys)) * size;
  const out: ProblemSolution = {
    signalNets,
    maxwell,
    vacuum: vacuumM,
    finest: { maxwell: fin.maxwell, vacuum: vacFamily[0] },
    error: {
      relative,
      perEntry,
      observedOrder,
      monotone,
      family: levels.map((l) => ({ nodes: l.nodes, maxwell: l.maxwell })),
      note,
    },
    mesh: {
      xs: xs.map((x) => x * size + ox),
      ys: ys.map((y) => y * size + oy),
      nx: xs.length,
      ny: ys.length,
      nodes,
      finestSpacing,
      preset,
    },
    solver: { iterations: totalIterations, relResidual: worstResidual, method: 'multigrid-preconditioned conjugate gradients' },
    timing: { setupMs, solveMs, totalMs: now() - t0 },
    warnings,
  };
  if (keepFields && fin.potentials && fin.disc) {
    // ground-plane nodes carry −2 (they belong to no net); conductor nodes their net; free −1
    const nodeNet = fin.disc.nodeNet;
    for (let k = 0; k < nodeNet.length; k++) if (nodeNet[k] === planeNet) nodeNet[k] = -2;
    out.fields = { potentials: fin.potentials, cellEpsR: fin.disc.cellEpsR, nodeNet };
    // vacuum solve of the finest mesh (only when a dielectric differs from the background)
    if (needVacuum && vacLevels[0]?.potentials) out.fields.vacuumPotentials = vacLevels[0].potentials;
  }
  return out;
}

/**
 * Bilinear interpolation of a potential from a nested coarser tensor mesh (cx ⊂ fx, cy ⊂ fy,
 * every 2nd node from the first) to the finer one; fine nodes beyond the last coarse line take
 * its value. Used only as a first guess for the iterative solve.
 */
export function prolongNested(u: Float64Array, cx: Float64Array, cy: Float64Array, fx: Float64Array, fy: Float64Array): Float64Array {
  const ncx = cx.length, ncy = cy.length, nfx = fx.length, nfy = fy.length;
  const ix = new Int32Array(nfx), tx = new Float64Array(nfx);
  for (let i = 0; i < nfx; i++) {
    const i0 = Math.min(i >> 1, ncx - 1);
    ix[i] = i0;
    tx[i] = (i & 1) === 1 && i0 + 1 < ncx ? (fx[i] - cx[i0]) / (cx[i0 + 1] - cx[i0]) : 0;
  }
  const out = new Float64Array(nfx * nfy);
  for (let j = 0; j < nfy; j++) {
    const j0 = Math.min(j >> 1, ncy - 1);
    const ty = (j & 1) === 1 && j0 + 1 < ncy ? (fy[j] - cy[j0]) / (cy[j0 + 1] - cy[j0]) : 0;
    const r0 = j0 * ncx, r1 = (ty > 0 ? j0 + 1 : j0) * ncx;
    const o = j * nfx;
    for (let i = 0; i < nfx; i++) {
      const i0 = ix[i], t = tx[i], i1 = t > 0 ? i0 + 1 : i0;
      const a = u[r0 + i0] + t * (u[r0 + i1] - u[r0 + i0]);
      const b = u[r1 + i0] + t * (u[r1 + i1] - u[r1 + i0]);
      out[o + i] = a + ty * (b - a);
    }
  }
  return out;
}

function minStep(a: Float64Array): number {
  let m = Infinity;
  for (let i = 1; i < a.length; i++) m = Math.min(m, a[i] - a[i - 1]);
  return m;
}

/**
 * Charges by the discrete Gauss law: the flux through every link that leaves a conductor,
 * Q_m = Σ over links from a free node i to net m of a·(V_m − φ_i) + Σ over links between
 * fixed nodes of nets m and l of a·(V_m − V_l). In finite volumes this is exactly the
 * residual of the full operator summed over the conductor's nodes, so Σ V_m Q_m equals the
 * discrete energy φᵀAφ (checked by discreteEnergy).
 */
import type { Discretisation } from './discretise';

/** Charges per net (scaled: multiply by ε0 for C/m at 1 V). `potentials[net]` is each net's potential. */
export function netCharges(d: Discretisation, phi: Float64Array, potentials: Float64Array): Float64Array {
  const q = new Float64Array(potentials.length);
  const { cutNode, cutCoef, cutNet, pairA, pairB, pairCoef } = d;
  for (let t = 0; t < cutNode.length; t++) {
    const m = cutNet[t];
    q[m] += cutCoef[t] * (potentials[m] - phi[cutNode[t]]);
  }
  for (let t = 0; t < pairA.length; t++) {
    const a = pairA[t], b = pairB[t];
    const f = pairCoef[t] * (potentials[a] - potentials[b]);
    q[a] += f;
    q[b] -= f;
  }
  return q;
}

/** Discrete field energy Σ over links a·(Δφ)² (twice the stored energy per ε0). */
export function discreteEnergy(d: Discretisation, phi: Float64Array, potentials: Float64Array): number {
  const { nx, ny, e, n } = d.op;
  let w = 0;
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const k = j * nx + i;
      if (i < nx - 1) {
        const a = e[k];
        if (a !== 0) {
          const g = phi[k] - phi[k + 1];
          w += a * g * g;
        }
      }
      if (j < ny - 1) {
        const a = n[k];
        if (a !== 0) {
          const g = phi[k] - phi[k + nx];
          w += a * g * g;
        }
      }
    }
  }
  for (let t = 0; t < d.cutNode.length; t++) {
    const g = potentials[d.cutNet[t]] - phi[d.cutNode[t]];
    w += d.cutCoef[t] * g * g;
  }
  for (let t = 0; t < d.pairA.length; t++) {
    const g = potentials[d.pairA[t]] - potentials[d.pairB[t]];
    w += d.pairCoef[t] * g * g;
  }
  return w;
}

/** Right-hand side with net `net` at 1 V and every other net at 0 V. */
export function unitRhs(d: Discretisation, net: number, out: Float64Array): Float64Array {
  out.fill(0);
  const { nodeNet, cutNode, cutCoef, cutNet } = d;
  for (let k = 0; k < nodeNet.length; k++) if (nodeNet[k] === net) out[k] = 1;
  for (let t = 0; t < cutNode.length; t++) if (cutNet[t] === net) out[cutNode[t]] += cutCoef[t];
  return out;
}

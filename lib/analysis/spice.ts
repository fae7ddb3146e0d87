/**
 * SPICE netlists of a solved section: the capacitance matrix as a subcircuit, and a line
 * of given length as cascaded RLGC sections (lumped π-free "L-section" ladder). Element
 * syntax per the SPICE netlist convention (R, L, C, K cards, .SUBCKT/.ENDS).
 */
export interface NetlistOptions {
  /** Subcircuit name. @default "EDGEFIELD_SECTION" */
  name?: string;
  /** Title comment line. */
  title?: string;
}

function spiceName(s: string): string {
  const cleaned = s.replace(/[^A-Za-z0-9_]/g, '_');
  return /^[A-Za-z_]/.test(cleaned) ? cleaned : `N_${cleaned}`;
}

/** Unique SPICE node names for the nets, in order ("rx+" and "rx-" must not both become "rx_"). */
export function spiceNodeNames(nets: string[]): string[] {
  const used = new Set<string>();
  return nets.map((net) => {
    const base = spiceName(net);
    let name = base;
    for (let k = 2; used.has(name.toUpperCase()) || name.toUpperCase() === 'REF'; k++) name = `${base}_${k}`;
    used.add(name.toUpperCase());
    return name;
  });
}

function num(v: number): string {
  return v.toPrecision(9).replace(/\.?0+e/, 'e');
}

/**
 * Capacitance matrix for a length (m) as a subcircuit: one capacitor from every signal
 * net to the reference (mutual-form diagonal = Maxwell row sum) and one between every pair
 * (−C_ij). Nodes: the signal nets in matrix order, then REF.
 */
export function capacitanceSubcircuit(nets: string[], maxwell: number[][], lengthM: number, opts: NetlistOptions = {}): string {
  if (!(lengthM > 0)) throw new RangeError('length must be positive');
  const n = nets.length;
  if (maxwell.length !== n) throw new RangeError('matrix size differs from the number of nets');
  const nodes = spiceNodeNames(nets);
  const name = spiceName(opts.name ?? 'EDGEFIELD_SECTION');
  const lines: string[] = [];
  lines.push(`* ${opts.title ?? 'Edgefield capacitance matrix'}`);
  lines.push(`* length ${num(lengthM)} m; values = per-unit-length matrix x length`);
  lines.push(`.SUBCKT ${name} ${nodes.join(' ')} REF`);
  for (let i = 0; i < n; i++) {
    let rowSum = 0;
    for (let j = 0; j < n; j++) rowSum += maxwell[i][j];
    lines.push(`C_${nodes[i]}_REF ${nodes[i]} REF ${num(rowSum * lengthM)}`);
  }
  for (let i = 0; i < n; i++)
    for (let j = i + 1; j < n; j++) {
      const c = -0.5 * (maxwell[i][j] + maxwell[j][i]);
      if (c !== 0) lines.push(`C_${nodes[i]}_${nodes[j]} ${nodes[i]} ${nodes[j]} ${num(c * lengthM)}`);
    }
  lines.push(`.ENDS ${name}`);
  return lines.join('\n') + '\n';
}

export interface Rlgc {
  /** Maxwell capacitance, F/m */
  c: number[][];
  /** Inductance, H/m */
  l: number[][];
  /** Series resistance per conductor, Ω/m (diagonal), default 0 */
  r?: number[];
  /** Shunt conductance, Maxwell form, S/m, default 0 */
  g?: number[][];
}

/**
 * A line of `lengthM` as `sections` cascaded RLGC cells. Ports: IN_<net> ..., OUT_<net> ..., REF.
 * Coupled inductors use K cards with k_ij = L_ij/√(L_ii L_jj). Choose sections so that each
 * cell is short against the shortest wavelength of interest (≥ 10 per wavelength).
 */
export function rlgcLadder(nets: string[], p: Rlgc, lengthM: number, sections: number, opts: NetlistOptions = {}): string {
  if (!(lengthM > 0)) throw new RangeError('length must be positive');
  if (!Number.isInteger(sections) || sections < 1 || sections > 10000) throw new RangeError('sections must be a whole number from 1 to 10000');
  const n = nets.length;
  const nodes = spiceNodeNames(nets);
  const dz = lengthM / sections;
  const name = spiceName(opts.name ?? 'EDGEFIELD_LINE');
  const out: string[] = [];
  out.push(`* ${opts.title ?? 'Edgefield transmission line'}`);
  out.push(`* length ${num(lengthM)} m in ${sections} RLGC sections of ${num(dz)} m`);
  out.push(`.SUBCKT ${name} ${nodes.map((x) => `IN_${x}`).join(' ')} ${nodes.map((x) => `OUT_${x}`).join(' ')} REF`);
  const node = (k: number, i: number) => (k === 0 ? `IN_${nodes[i]}` : k === sections ? `OUT_${nodes[i]}` : `X${k}_${nodes[i]}`);
  for (let k = 0; k < sections; k++) {
    for (let i = 0; i < n; i++) {
      const a = node(k, i);
      const r = p.r?.[i] ?? 0;
      const mid = `M${k + 1}_${nodes[i]}`;
      if (r > 0) out.push(`R${k + 1}_${nodes[i]} ${a} ${mid} ${num(r * dz)}`);
      out.push(`L${k + 1}_${nodes[i]} ${r > 0 ? mid : a} ${node(k + 1, i)} ${num(p.l[i][i] * dz)}`);
    }
    for (let i = 0; i < n; i++)
      for (let j = i + 1; j < n; j++) {
        const kij = p.l[i][j] / Math.sqrt(p.l[i][i] * p.l[j][j]);
        if (kij !== 0) out.push(`K${k + 1}_${nodes[i]}_${nodes[j]} L${k + 1}_${nodes[i]} L${k + 1}_${nodes[j]} ${num(kij)}`);
      }
    for (let i = 0; i < n; i++) {
      const b = node(k + 1, i);
      let rowC = 0;
      let rowG = 0;
      for (let j = 0; j < n; j++) {
        rowC += p.c[i][j];
        rowG += p.g?.[i][j] ?? 0;
      }
      out.push(`C${k + 1}_${nodes[i]} ${b} REF ${num(rowC * dz)}`);
      if (rowG > 0) out.push(`G${k + 1}_${nodes[i]} ${b} REF ${b} REF ${num(rowG * dz)}`);
      for (let j = i + 1; j < n; j++) {
        const cij = -p.c[i][j];
        if (cij !== 0) out.push(`C${k + 1}_${nodes[i]}_${nodes[j]} ${b} ${node(k + 1, j)} ${num(cij * dz)}`);
        const gij = -(p.g?.[i][j] ?? 0);
        if (gij > 0) out.push(`G${k + 1}_${nodes[i]}_${nodes[j]} ${b} ${node(k + 1, j)} ${b} ${node(k + 1, j)} ${num(gij * dz)}`);
      }
    }
  }
  out.push(`.ENDS ${name}`);
  return out.join('\n') + '\n';
}

/**
 * Reads the capacitor cards of a netlist back into a Maxwell matrix per unit length over
 * the given nets (REF is the reference). For checking our own output; not a general parser.
 */
export function parseCapacitanceSubcircuit(text: string, nets: string[], lengthM: number): number[][] {
  const idx = new Map(spiceNodeNames(nets).map((n, i) => [n.toUpperCase(), i]));
  const n = nets.length;
  const m = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (const raw of text.split('\n')) {
    const line = raw.trim();
    if (!/^C/i.test(line)) continue;
    const [, a, b, v] = line.split(/\s+/);
    const value = Number(v) / lengthM;
    if (!Number.isFinite(value)) throw new RangeError(`bad capacitor value in line: ${line}`);
    const ia = idx.get(a.toUpperCase());
    const ib = idx.get(b.toUpperCase());
    if (ia !== undefined && ib === undefined) m[ia][ia] += value;
    else if (ib !== undefined && ia === undefined) m[ib][ib] += value;
    else if (ia !== undefined && ib !== undefined) {
      m[ia][ia] += value;
      m[ib][ib] += value;
      m[ia][ib] -= value;
      m[ib][ia] -= value;
    }
  }
  return m;
}

import { describe, expect, it } from 'vitest';
import { makeGrid } from '@/lib/field/grid';
import { cellField } from '@/lib/field/gradient';
import { fieldLines } from '@/lib/field/field-lines';

describe('field lines', () => {
  // Known fact: between parallel plates the field is uniform and normal to them, so every
  // line of force runs straight from the driven plate to the grounded one.
  it('run straight across a uniform gap, from the driven plate to the grounded one', () => {
    const nx = 21;
    const ny = 11;
    const xs = new Float64Array(nx).map((_, i) => i / (nx - 1));
    const ys = new Float64Array(ny).map((_, j) => j / (ny - 1));
    const g = makeGrid(xs, ys);
    const phi = new Float64Array(nx * ny);
    const nodeNet = new Int16Array(nx * ny).fill(-1);
    for (let j = 0; j < ny; j++) {
      for (let i = 0; i < nx; i++) {
        phi[j * nx + i] = ys[j]!;
        if (j === ny - 1) nodeNet[j * nx + i] = 0; // driven plate at y = 1, 1 V
        if (j === 0) nodeNet[j * nx + i] = 1; // grounded plate at y = 0
      }
    }
    const lines = fieldLines(g, phi, cellField(g, phi), nodeNet, [1, 0], { linesPerNet: 8 });
    expect(lines).toHaveLength(8);
    for (const l of lines) {
      const x0 = l[0]!;
      for (let q = 0; q < l.length; q += 2) expect(l[q]).toBeCloseTo(x0, 9);
      expect(l[1]).toBeGreaterThan(0.9); // starts next to the driven plate
      expect(l[l.length - 1]).toBeLessThan(0.11); // ends at the grounded plate
    }
    // equal flux per line in a uniform field: evenly spread along the plate
    const starts = lines.map((l) => l[0]!).sort((a, b) => a - b);
    expect(starts[0]).toBeLessThan(0.15);
    expect(starts[7]).toBeGreaterThan(0.85);
  });
});

import { describe, expect, it } from 'vitest';
import { capacitanceSubcircuit, parseCapacitanceSubcircuit, rlgcLadder } from '@/lib/analysis/spice';

describe('SPICE netlists', () => {
  const nets = ['rx+', 'rx-', 'guard'];
  const maxwell = [
    [95e-12, -21e-12, -4e-12],
    [-21e-12, 95e-12, -4e-12],
    [-4e-12, -4e-12, 60e-12],
  ];

  it('the capacitance subcircuit parsed back gives the same Maxwell matrix', () => {
    // Mutual (branch) form ↔ Maxwell form: Paul 2008, Analysis of Multiconductor
    // Transmission Lines, 2nd ed., ch. 3.
    const text = capacitanceSubcircuit(nets, maxwell, 0.025);
    expect(text).toMatch(/^\.SUBCKT EDGEFIELD_SECTION rx_ rx__2 guard REF$/m);
    expect(text).toMatch(/^\.ENDS EDGEFIELD_SECTION$/m);
    const back = parseCapacitanceSubcircuit(text, nets, 0.025);
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expect(back[i][j] / maxwell[i][j]).toBeCloseTo(1, 7);
  });

  it('a line ladder has one L and one shunt C per net and section, coupled by K cards', () => {
    const l = [
      [400e-9, 90e-9],
      [90e-9, 400e-9],
    ];
    const c = [
      [95e-12, -21e-12],
      [-21e-12, 95e-12],
    ];
    const text = rlgcLadder(['a', 'b'], { c, l, r: [5, 5] }, 0.1, 8);
    expect(text.match(/^L\d+_/gm)?.length).toBe(16);
    expect(text.match(/^K\d+_/gm)?.length).toBe(8);
    expect(text.match(/^R\d+_/gm)?.length).toBe(16);
    const k = Number(text.match(/^K1_a_b \S+ \S+ (\S+)/m)![1]);
    expect(k).toBeCloseTo(90 / 400, 8);
    expect(() => rlgcLadder(['a'], { c: [[1e-10]], l: [[1e-7]] }, 0.1, 0)).toThrow(RangeError);
  });
});

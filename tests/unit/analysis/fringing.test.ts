import { describe, expect, it } from 'vitest';
import { hammerstadJensenPlates, idealPlates, palmerPlates } from '@/lib/analysis/fringing';

describe('plate-pair approximations', () => {
  it('Hammerstad–Jensen homogeneous microstrip gives Z0 ≈ 126.4 Ω at w/h = 1 in air', () => {
    // Source: Hammerstad & Jensen 1980, IEEE MTT-S Digest pp. 407–409 (their Z01(u));
    // the value 126 Ω for w/h = 1 in air is a known fact of the trade (from memory).
    // C_half/ε = 2·plates(w/d) with h = d/2, and Z = η0/(C/ε).
    const cOverEps = 2 * hammerstadJensenPlates(0.5);
    const z = 376.730313668 / cOverEps;
    expect(z).toBeGreaterThan(126);
    expect(z).toBeLessThan(126.8);
  });

  it('Palmer 1937 falls below the near-exact value by about 10%, 4%, 1.2%, 0.4% at w/d = 1, 2, 5, 10', () => {
    // Source: ../shared/REFERENCES.md §6 ("from one check of ours"), here reproduced
    // against Hammerstad & Jensen 1980 as the near-exact reference.
    const expected: [number, number][] = [
      [1, 0.1],
      [2, 0.043],
      [5, 0.012],
      [10, 0.004],
    ];
    for (const [r, low] of expected) {
      const rel = 1 - palmerPlates(r) / hammerstadJensenPlates(r);
      expect(Math.abs(rel - low)).toBeLessThan(0.15 * low);
    }
  });

  it('both approach the ideal w/d as the plates get wide (common practice, no published source)', () => {
    expect(hammerstadJensenPlates(1e4) / idealPlates(1e4)).toBeLessThan(1.0005);
    expect(hammerstadJensenPlates(1e4) / idealPlates(1e4)).toBeGreaterThan(1);
    expect(palmerPlates(1e4) / idealPlates(1e4)).toBeLessThan(1.0005);
  });
});

/**
 * The solver worker's warm-up section (workers/warm-up.ts) must stay a valid section that
 * exercises what typical sections use, or the warm-up would compile the wrong code or fail
 * silently (the worker ignores its errors).
 */
import { describe, expect, it } from 'vitest';
import { solveSection } from '@/lib/engine/solve-section';
import { WARM_UP_SECTION } from '@/workers/warm-up';

describe('worker warm-up section', () => {
  it('is valid and solves at the quick preset: two signal nets over a ground boundary, a dielectric, a rectangle and a circle', () => {
    const { result } = solveSection(WARM_UP_SECTION, { preset: 'quick', keepFields: true });
    expect(result.nets).toEqual(['trace', 'wire']);
    expect(result.capacitance.maxwell).toHaveLength(2);
    // Maxwell matrix signs (common practice, no published source): positive diagonal, negative coupling
    expect(result.capacitance.maxwell[0]![0]!).toBeGreaterThan(0);
    expect(result.capacitance.maxwell[0]![1]!).toBeLessThan(0);
    const types = new Set(WARM_UP_SECTION.shapes.map((s) => `${s.type}:${'conductor' in s ? 'conductor' : 'dielectric'}`));
    expect(types).toEqual(new Set(['rect:dielectric', 'rect:conductor', 'circle:conductor']));
  });
});

/**
 * An exported section file (what the editor's Export button writes) solves exactly like the
 * same section written by hand with plain numbers (issue 4 acceptance; common practice, no
 * published source: the solver sees only the resolved numbers).
 */
import { describe, expect, it } from 'vitest';
import { templateSection } from '@/lib/section/templates';
import { parseSectionFile } from '@/lib/section/parse';
import { solveSection } from '@/lib/engine/solve-section';
import { moveShapes, setVariable } from '@/lib/editor/commands';

const byHand = `{
  "format": "edgefield.section/1",
  "units": "mm",
  "materials": [{ "id": "fr4", "name": "laminate", "epsR": 4.4 }],
  "nets": [{ "name": "trace", "role": "signal" }],
  "shapes": [
    { "id": "board", "type": "rect", "dielectric": "fr4", "x": -6, "y": 0, "width": 12, "height": 1 },
    { "id": "t", "type": "rect", "conductor": "trace", "x": -0.7, "y": 1, "width": 1.6, "height": 0.035 }
  ],
  "boundary": { "bottom": { "type": "ground", "at": 0 } },
  "mesh": { "preset": "quick" }
}`;

describe('export', () => {
  it('an edited starting section, exported as the editor does, solves like the hand-written file', () => {
    // Edit as a user would: w = 1.6 by a variable, then move the trace 0.1 mm right.
    let doc = templateSection('microstrip');
    doc = setVariable(doc, 'w', 1.6);
    doc = moveShapes(doc, ['trace'], 0.1, 0);
    doc = { ...doc, materials: doc.materials.map((m) => ({ ...m, epsR: 4.4 })), mesh: { preset: 'quick' } };
    const exported = JSON.stringify(doc, null, 2) + '\n';
    const a = parseSectionFile(exported);
    const b = parseSectionFile(byHand);
    if (!a.ok || !b.ok) throw new Error('both files must parse');
    const ra = solveSection(a.section, {}).result;
    const rb = solveSection(b.section, {}).result;
    expect(ra.capacitance.maxwell[0]![0]!).toBeGreaterThan(0);
    expect(Math.abs(ra.capacitance.maxwell[0]![0]! / rb.capacitance.maxwell[0]![0]! - 1)).toBeLessThan(1e-9);
    expect(Math.abs(ra.line!.z0Ohm / rb.line!.z0Ohm - 1)).toBeLessThan(1e-9);
  }, 120_000);
});

/**
 * The editor runs resolveSection + checkSection on every change: time both on a section
 * of 200 shapes (100 dielectric blocks and 100 conductors of two nets, circles and rects,
 * none touching across nets), median of repeated runs after a warm-up. Target: well under
 * 20 ms for the checks (reported, not asserted).
 */
import { checkSection } from '../../../lib/section/check';
import { resolveSection } from '../../../lib/section/resolve';
import { sectionSchema, type Section } from '../../../lib/section/schema';

export const name = 'check-section-200-shapes';

export function section200(): Section {
  const shapes: unknown[] = [];
  for (let i = 0; i < 100; i++) {
    shapes.push({ id: `d${i}`, type: 'rect', x: (i % 10) * 2, y: Math.floor(i / 10) * 2, width: 2, height: 1, dielectric: i % 2 ? 'fr4' : 'mask' });
    const cx = (i % 10) * 2 + 1,
      cy = Math.floor(i / 10) * 2 + 1.4;
    shapes.push(
      i % 3 === 0
        ? { id: `c${i}`, type: 'circle', cx, cy, r: 0.3, conductor: i % 2 ? 'sig' : 'gnd' }
        : { id: `c${i}`, type: 'rect', x: cx - 0.5, y: cy - 0.2, width: 1, height: 0.05, conductor: i % 2 ? 'sig' : 'gnd' },
    );
  }
  return sectionSchema.parse({
    format: 'edgefield.section/1',
    units: 'mm',
    variables: { w: 1 },
    materials: [
      { id: 'fr4', name: 'laminate', epsR: 4.4 },
      { id: 'mask', name: 'mask', epsR: 3.5 },
    ],
    nets: [
      { name: 'sig', role: 'signal' },
      { name: 'gnd', role: 'ground' },
    ],
    shapes,
  });
}

const median = (v: number[]) => {
  const s = [...v].sort((a, b) => a - b);
  return s.length % 2 ? s[s.length >> 1]! : (s[s.length / 2 - 1]! + s[s.length / 2]!) / 2;
};

/** Process CPU time in ms (less disturbed by other processes on a shared machine than wall time). */
const cpuMs = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};

export async function run(): Promise<Record<string, unknown>> {
  const s = section200();
  const wall: number[] = [];
  const cpu: number[] = [];
  const resolveWall: number[] = [];
  let issues = 0;
  for (let k = 0; k < 40; k++) {
    const c0 = cpuMs();
    const t0 = performance.now();
    const r = resolveSection(s);
    const t1 = performance.now();
    if (!r.ok) throw new Error('the bench section does not resolve');
    issues = checkSection(r.section).length;
    const t2 = performance.now();
    const c1 = cpuMs();
    if (k >= 10) {
      resolveWall.push(t1 - t0);
      wall.push(t2 - t0);
      cpu.push(c1 - c0);
    }
  }
  const r3 = (v: number) => Number(v.toFixed(3));
  return {
    shapes: s.shapes.length,
    issues,
    /** resolve + check, wall time, median. */
    ms: r3(median(wall)),
    resolveMs: r3(median(resolveWall)),
    /** resolve + check, process CPU time, median (coarse: the clock ticks in ms steps on some systems). */
    cpuMs: r3(median(cpu)),
  };
}

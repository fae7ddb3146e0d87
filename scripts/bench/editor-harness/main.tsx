/**
 * Static harness for the editor-drag bench: the real SectionEditor with a section of
 * 200 shapes (invented layout: a grid of traces, pads and dielectric blocks), no server.
 */
import { createRoot } from 'react-dom/client';
import '../../../app/globals.css';
import { SectionEditor } from '../../../components/canvas/section-editor';
import type { Section } from '../../../lib/section/schema';
import { isTemplateId, templateSection } from '../../../lib/section/templates';

function manyShapes(n: number): Section {
  const shapes: Section['shapes'] = [];
  const cols = 20;
  for (let i = 0; i < n; i++) {
    const c = i % cols;
    const r = Math.floor(i / cols);
    const x = c * 3;
    const y = r * 3;
    const kind = i % 4;
    if (kind === 0) shapes.push({ id: `d${i}`, type: 'rect', dielectric: 'laminate', x, y, width: 2.4, height: 2.4 });
    else if (kind === 1) shapes.push({ id: `c${i}`, type: 'circle', conductor: i % 8 === 1 ? 'a' : 'gnd', cx: x + 1.2, cy: y + 1.2, r: 0.8 });
    else if (kind === 2) shapes.push({ id: `r${i}`, type: 'rect', conductor: 'b', x: x + 0.2, y: y + 0.6, width: 2, height: 1.2 });
    else shapes.push({ id: `p${i}`, type: 'polygon', conductor: 'gnd', points: [[x, y], [x + 2.4, y], [x + 1.2, y + 2.2]] });
  }
  return {
    format: 'edgefield.section/1',
    title: 'Drag bench',
    units: 'mm',
    background: { epsR: 1 },
    materials: [{ id: 'laminate', name: 'Laminate', epsR: 4.4 }],
    nets: [
      { name: 'a', role: 'signal' },
      { name: 'b', role: 'signal' },
      { name: 'gnd', role: 'ground' },
    ],
    shapes,
    boundary: { left: { type: 'open' }, right: { type: 'open' }, bottom: { type: 'open' }, top: { type: 'open' } },
  };
}

const params = new URLSearchParams(location.search);
const count = Number(params.get('shapes') ?? 200);
const template = params.get('template') ?? '';
const initial = isTemplateId(template) ? templateSection(template) : manyShapes(count);
createRoot(document.getElementById('root')!).render(<SectionEditor initialSection={initial} className="h-[880px]" />);
(window as unknown as { __harnessReady: boolean }).__harnessReady = true;

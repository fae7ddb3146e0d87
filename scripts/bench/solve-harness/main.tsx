/**
 * Static harness for the solve-to-field bench: the real solve controls, solver worker, results
 * panel and field view of the section page, with the demo microstrip (the "Front-end
 * microstrip feed" of the demo seed: the microstrip starting section with w = 1.85 mm),
 * no server.
 */
import { createRoot } from 'react-dom/client';
import '../../../app/globals.css';
import { SolveWorkbench } from '../../../components/results/solve-workbench';
import { templateSection } from '../../../lib/section/templates';

const section = templateSection('microstrip');
section.variables = { ...(section.variables ?? {}), w: 1.85 };
section.mesh = { preset: 'standard' };

createRoot(document.getElementById('root')!).render(
  <SolveWorkbench workspaceId="bench" sectionId="bench" section={section} canSolve canEdit={false} layout="split" />,
);

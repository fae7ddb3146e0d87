/**
 * A small world for the server tests: workspace A (owner, editor, viewer) and workspace B
 * (an outsider who owns it), each with a section, a revision and a solve. All fictional.
 */
import type { Db } from '@/db/client';
import { files, invitations, shareLinks, memberships, sectionRevisions, sections, solves, users, workspaces } from '@/db/schema';
import { RESULT_FORMAT } from '@/lib/engine/types';
import { sectionSchema, type Section } from '@/lib/section/schema';
import { eq } from 'drizzle-orm';

export type Who = 'owner' | 'editor' | 'viewer' | 'outsider';

export interface World {
  users: Record<Who, { id: string; email: string; name: string }>;
  wsA: string;
  wsB: string;
  sectionA: string;
  revisionA: string;
  solveA: string;
  sectionB: string;
  revisionB: string;
  solveB: string;
  /** Pending invitations (issue 7), one per workspace; token hashes are placeholders. */
  invitationA: string;
  invitationB: string;
  /** A measured-data CSV kept with each section (issue 7). */
  fileA: string;
  fileB: string;
  /** Active read-only links to each section (issue 7). */
  shareLinkA: string;
  shareLinkB: string;
}

/** A small valid measured-data CSV (numbers invented for storage tests). */
export const MEASURED_CSV = 'w (mm),C (pF/m)\n0.5,61.0\n1.0,84.5\n2.0,121.0\n';

/** A valid coax section (the shared sample shape), units mm. */
export function coaxSection(r = 0.6): Section {
  return sectionSchema.parse({
    format: 'edgefield.section/1',
    units: 'mm',
    materials: [{ id: 'fill', name: 'Solid fill', epsR: 2.1 }],
    nets: [
      { name: 'core', role: 'signal' },
      { name: 'shield', role: 'ground' },
    ],
    shapes: [
      { id: 'fill', type: 'circle', cx: 0, cy: 0, r: 1.8, dielectric: 'fill' },
      { id: 'core', type: 'circle', cx: 0, cy: 0, r, conductor: 'core' },
      { id: 'shield', type: 'ring', cx: 0, cy: 0, rInner: 1.8, rOuter: 2.2, conductor: 'shield' },
    ],
  });
}

/** A structurally valid result JSON (numbers are placeholders for storage tests, not physics). */
export function fakeResult(c = 1e-10) {
  return {
    format: RESULT_FORMAT,
    reference: ['shield'],
    nets: ['core'],
    capacitance: { maxwell: [[c]], mutual: [[c]], vacuum: [[c / 2.1]] },
    errorEstimate: { relative: 1e-4, perEntry: [[1e-4]], monotone: true, family: [], note: 'test' },
    mesh: { nodes: 1000, nx: 40, ny: 25, preset: 'standard', finestM: 1e-5 },
    solver: { iterations: 10, relResidual: 1e-10, method: 'test' },
    timing: { ms: 1, setupMs: 0.5, solveMs: 0.5 },
    warnings: [],
  };
}

export async function buildWorld(db: Db): Promise<World> {
  const mk = async (who: Who) => {
    const email = `${who}@test.example`;
    const [u] = await db.insert(users).values({ email, name: `Test ${who}` }).returning();
    return { id: u!.id, email, name: u!.name! };
  };
  const u = { owner: await mk('owner'), editor: await mk('editor'), viewer: await mk('viewer'), outsider: await mk('outsider') };
  const [a] = await db.insert(workspaces).values({ name: 'Workspace A' }).returning();
  const [b] = await db.insert(workspaces).values({ name: 'Workspace B' }).returning();
  await db.insert(memberships).values([
    { workspaceId: a!.id, userId: u.owner.id, role: 'owner' },
    { workspaceId: a!.id, userId: u.editor.id, role: 'editor' },
    { workspaceId: a!.id, userId: u.viewer.id, role: 'viewer' },
    { workspaceId: b!.id, userId: u.outsider.id, role: 'owner' },
  ]);
  const mkSection = async (ws: string, author: string, name: string) => {
    const [s] = await db.insert(sections).values({ workspaceId: ws, name, createdBy: author }).returning();
    const [r] = await db
      .insert(sectionRevisions)
      .values({ sectionId: s!.id, number: 1, content: coaxSection(), authorId: author })
      .returning();
    await db.update(sections).set({ latestRevisionId: r!.id }).where(eq(sections.id, s!.id));
    const [v] = await db
      .insert(solves)
      .values({
        workspaceId: ws,
        sectionId: s!.id,
        revisionId: r!.id,
        settings: { preset: 'standard' },
        settingsHash: 'fixture',
        result: fakeResult(),
        status: 'done',
        authorId: author,
      })
      .returning();
    return { section: s!.id, revision: r!.id, solve: v!.id };
  };
  const sa = await mkSection(a!.id, u.editor.id, 'Section in A');
  const sb = await mkSection(b!.id, u.outsider.id, 'Section in B');
  const week = new Date(Date.now() + 7 * 86400e3);
  const [ia] = await db
    .insert(invitations)
    .values({ workspaceId: a!.id, email: 'invited-a@test.example', role: 'editor', tokenHash: 'fixture-a', invitedBy: u.owner.id, expiresAt: week })
    .returning();
  const [ib] = await db
    .insert(invitations)
    .values({ workspaceId: b!.id, email: 'invited-b@test.example', role: 'editor', tokenHash: 'fixture-b', invitedBy: u.outsider.id, expiresAt: week })
    .returning();
  const mkFile = async (ws: string, section: string, by: string) => {
    const data = new TextEncoder().encode(MEASURED_CSV);
    const [f] = await db
      .insert(files)
      .values({ workspaceId: ws, sectionId: section, kind: 'measured-csv', name: 'bench.csv', mediaType: 'text/csv', bytes: data.byteLength, data, uploadedBy: by })
      .returning();
    return f!.id;
  };
  const fileA = await mkFile(a!.id, sa.section, u.editor.id);
  const fileB = await mkFile(b!.id, sb.section, u.outsider.id);
  const [la] = await db.insert(shareLinks).values({ workspaceId: a!.id, targetType: 'section', targetId: sa.section, tokenHash: 'fixture-share-a', createdBy: u.editor.id }).returning();
  const [lb] = await db.insert(shareLinks).values({ workspaceId: b!.id, targetType: 'section', targetId: sb.section, tokenHash: 'fixture-share-b', createdBy: u.outsider.id }).returning();
  return {
    users: u,
    wsA: a!.id,
    wsB: b!.id,
    sectionA: sa.section,
    revisionA: sa.revision,
    solveA: sa.solve,
    sectionB: sb.section,
    revisionB: sb.revision,
    solveB: sb.solve,
    invitationA: ia!.id,
    invitationB: ib!.id,
    fileA,
    fileB,
    shareLinkA: la!.id,
    shareLinkB: lb!.id,
  };
}

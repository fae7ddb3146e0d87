/**
 * Demo data, seeded on first start with an empty database (demo mode). The scenario is
 * invented: Harrow Lane Instruments, a small fictional instruments team, and a second
 * fictional team (Fenwick Ridge Controls) whose workspace the first team must never see.
 * Sections are real, valid section files built from the editor's starting sections.
 */
import bcrypt from 'bcryptjs';
import { sql } from 'drizzle-orm';
import type { Db } from '@/db/client';
import { auditEvents, memberships, sectionRevisions, sections, users, workspaces } from '@/db/schema';
import { sectionSchema, type Section } from '@/lib/section/schema';
import { templateSection, type TemplateId } from '@/lib/section/templates';
import { DEMO_ACCOUNTS, DEMO_WORKSPACE_NAME, OTHER_DEMO_ACCOUNT, OTHER_WORKSPACE_NAME, type DemoAccount } from './accounts';

interface DemoSection {
  name: string;
  description: string;
  template: TemplateId;
  title: string;
  /** Later revisions: variable changes, each with a message. */
  edits?: { vars: Record<string, number>; message: string }[];
  author: string;
}

const MAIN_SECTIONS: DemoSection[] = [
  {
    name: 'Probe lead coax',
    description: 'Flexible coax from the probe head to the front-end board. Checking C′ for the cable-length budget.',
    template: 'coax',
    title: 'Probe lead coax',
    author: 'maren.holt@harrowlane.example',
  },
  {
    name: 'Front-end microstrip feed',
    description: 'Feed line from the connector to the input amplifier on 1 mm glass-epoxy laminate; target about 50 Ω.',
    template: 'microstrip',
    title: 'Front-end microstrip feed',
    author: 'tobias.quill@harrowlane.example',
    edits: [
      { vars: { w: 1.8 }, message: 'Narrower trace after the first impedance check' },
      { vars: { w: 1.85 }, message: 'Split the difference; matches the fab house line width grid' },
    ],
  },
  {
    name: 'Humidity sensor plate pair',
    description: 'Parallel sensing plates of the humidity cell. How far off is εw/d at this gap?',
    template: 'plate-pair',
    title: 'Humidity sensor plate pair',
    author: 'tobias.quill@harrowlane.example',
    edits: [{ vars: { d: 0.5 }, message: 'Halved the gap for more signal' }],
  },
  {
    name: 'Bench twin lead',
    description: 'Unshielded twin lead used on the calibration bench.',
    template: 'twin-lead',
    title: 'Bench twin lead',
    author: 'maren.holt@harrowlane.example',
  },
  {
    name: 'Level sensor comb electrodes',
    description: 'Interdigitated electrodes on glass for the liquid-level sensor.',
    template: 'comb-electrodes',
    title: 'Level sensor comb electrodes',
    author: 'tobias.quill@harrowlane.example',
  },
];

const OTHER_SECTIONS: DemoSection[] = [
  {
    name: 'Gate drive stripline',
    description: 'Inner-layer gate drive route.',
    template: 'stripline',
    title: 'Gate drive stripline',
    author: OTHER_DEMO_ACCOUNT.email,
  },
];

function withVars(section: Section, vars: Record<string, number>): Section {
  const next = structuredClone(section);
  next.variables = { ...(next.variables ?? {}), ...vars };
  return next;
}

/** Seed the demo when the database has no users. Returns false when it was not empty. */
export async function seedDemo(db: Db): Promise<boolean> {
  const [count] = await db.select({ n: sql<number>`count(*)::int` }).from(users);
  if (Number(count?.n ?? 0) > 0) return false;

  const all: DemoAccount[] = [...DEMO_ACCOUNTS, OTHER_DEMO_ACCOUNT];
  const hashes = new Map<string, string>();
  for (const a of all) hashes.set(a.email, await bcrypt.hash(a.password, 12));

  await db.transaction(async (tx) => {
    const ids = new Map<string, string>();
    for (const a of all) {
      const [u] = await tx
        .insert(users)
        .values({ email: a.email, name: a.name, passwordHash: hashes.get(a.email)!, emailVerified: new Date() })
        .returning({ id: users.id });
      ids.set(a.email, u!.id);
    }
    const [main] = await tx.insert(workspaces).values({ name: DEMO_WORKSPACE_NAME }).returning({ id: workspaces.id });
    const [other] = await tx.insert(workspaces).values({ name: OTHER_WORKSPACE_NAME }).returning({ id: workspaces.id });
    for (const a of all) {
      await tx.insert(memberships).values({
        workspaceId: a.workspace === 'main' ? main!.id : other!.id,
        userId: ids.get(a.email)!,
        role: a.role,
      });
    }

    // Stagger the times so "recently updated" has a meaningful order.
    const now = Date.now();
    let minutesAgo = 60 * 24 * 6;
    const addSections = async (workspaceId: string, list: DemoSection[]) => {
      for (const s of list) {
        const authorId = ids.get(s.author) ?? null;
        const base = templateSection(s.template);
        base.title = s.title;
        const versions: { content: Section; message: string }[] = [
          { content: base, message: `Started from the “${s.template}” starting section` },
        ];
        for (const e of s.edits ?? []) versions.push({ content: withVars(versions[versions.length - 1]!.content, e.vars), message: e.message });
        const created = new Date(now - minutesAgo * 60_000);
        const [row] = await tx
          .insert(sections)
          .values({ workspaceId, name: s.name, description: s.description, createdBy: authorId, createdAt: created, updatedAt: created })
          .returning({ id: sections.id });
        let latest = '';
        let at = created;
        for (let i = 0; i < versions.length; i++) {
          at = new Date(created.getTime() + i * 47 * 60_000);
          const content = sectionSchema.parse(versions[i]!.content);
          const [rev] = await tx
            .insert(sectionRevisions)
            .values({ sectionId: row!.id, number: i + 1, content, message: versions[i]!.message, authorId, createdAt: at })
            .returning({ id: sectionRevisions.id });
          latest = rev!.id;
        }
        await tx.update(sections).set({ latestRevisionId: latest, updatedAt: at }).where(sql`${sections.id} = ${row!.id}`);
        await tx.insert(auditEvents).values({
          workspaceId,
          actorId: authorId,
          action: 'section.create',
          targetType: 'section',
          targetId: row!.id,
          data: { name: s.name, seeded: true },
          createdAt: created,
        });
        minutesAgo -= 60 * 11;
      }
    };
    await addSections(main!.id, MAIN_SECTIONS);
    await addSections(other!.id, OTHER_SECTIONS);
  });
  return true;
}

/** The lines printed when the demo starts. */
export function demoSignInBanner(baseUrl: string): string {
  const pad = (s: string, n: number) => s + ' '.repeat(Math.max(0, n - s.length));
  const lines = [
    '',
    `Edgefield demo at ${baseUrl}  (demo mailbox: ${baseUrl}/demo/mailbox)`,
    `Demo sign-ins for "${DEMO_WORKSPACE_NAME}" (fictional):`,
    ...DEMO_ACCOUNTS.map((a) => `  ${pad(a.role, 7)} ${pad(a.email, 36)} password: ${a.password}`),
    `Another team's workspace "${OTHER_WORKSPACE_NAME}": ${OTHER_DEMO_ACCOUNT.email} / ${OTHER_DEMO_ACCOUNT.password}`,
    '',
  ];
  return lines.join('\n');
}

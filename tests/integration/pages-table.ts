/**
 * The authorisation matrix of the pages and layouts that read data on the server (issue 8):
 * one row per page.tsx / layout.tsx that imports from db/ or lib/server/, with the expected
 * outcome per actor (tests/integration/routes-table.ts ACTORS, same order):
 *
 *   signed out | viewer | editor | owner | member of another workspace |
 *   share-link holder signed out | share-link holder signed in (member of no workspace)
 *
 * Outcomes: 'render' (the component returns), 'login' (redirect to /login), 'redirect'
 * (elsewhere, never to another team's workspace), 'not_found' (Next's not-found page, so
 * another workspace's ids are not revealed). tests/integration/page-roles.test.ts calls each
 * page's default export as each actor (a rendered tree and a redirect must carry nothing of a
 * workspace the caller is not in), and fails when a page or layout reading data on the
 * server is not listed here.
 */
import type { World } from './helpers/fixtures';

export type PageOutcome = 'render' | 'login' | 'redirect' | 'not_found';
export type PageMatrix = readonly [PageOutcome, PageOutcome, PageOutcome, PageOutcome, PageOutcome, PageOutcome, PageOutcome];

export interface PageRow {
  /** Path relative to app/. */
  file: string;
  expect: PageMatrix;
  params?: (w: World) => Record<string, string>;
  /** Another workspace's object under workspace A's id: not_found for an owner of A. */
  foreignParams?: (w: World) => Record<string, string>;
  searchParams?: Record<string, string>;
  /** Query strings naming workspace B's objects, opened by an owner of A: the page renders without B's data. */
  crossQueries?: { what: string; searchParams: (w: World) => Record<string, string> }[];
  /** Set EDGEFIELD_DEMO=1 for the call (demo-only pages). */
  demo?: boolean;
  note?: string;
}

const W = '(workspace)/w/[workspaceId]';
// Columns: signed out, viewer, editor, owner, other workspace, share holder, share holder signed in.
const MEMBER: PageMatrix = ['login', 'render', 'render', 'render', 'not_found', 'login', 'not_found'];

export const PAGES: PageRow[] = [
  { file: '(workspace)/layout.tsx', expect: ['login', 'render', 'render', 'render', 'render', 'login', 'render'] },
  { file: `${W}/layout.tsx`, expect: MEMBER, params: (w) => ({ workspaceId: w.wsA }) },
  { file: `${W}/page.tsx`, expect: MEMBER, params: (w) => ({ workspaceId: w.wsA }) },
  { file: `${W}/activity/page.tsx`, expect: MEMBER, params: (w) => ({ workspaceId: w.wsA }) },
  { file: `${W}/notifications/page.tsx`, expect: MEMBER, params: (w) => ({ workspaceId: w.wsA }) },
  { file: `${W}/settings/page.tsx`, expect: MEMBER, params: (w) => ({ workspaceId: w.wsA }) },
  {
    file: `${W}/solves/page.tsx`,
    expect: MEMBER,
    params: (w) => ({ workspaceId: w.wsA }),
    crossQueries: [
      { what: 'a section of B as filter', searchParams: (w) => ({ section: w.sectionB }) },
      { what: 'a member of B as author filter', searchParams: (w) => ({ author: w.users.outsider.id }) },
    ],
  },
  {
    file: `${W}/sections/[sectionId]/page.tsx`,
    expect: MEMBER,
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB }),
  },
  {
    file: `${W}/sections/[sectionId]/history/page.tsx`,
    expect: MEMBER,
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA }),
    crossQueries: [{ what: 'revisions of B to compare', searchParams: (w) => ({ a: w.revisionB, b: w.revisionB }) }],
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB }),
  },
  {
    file: `${W}/solves/[solveId]/page.tsx`,
    expect: MEMBER,
    params: (w) => ({ workspaceId: w.wsA, solveId: w.solveA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, solveId: w.solveB }),
  },
  {
    file: 'page.tsx',
    note: 'The start page sends a signed-in person to their first workspace; someone in none sees an empty state.',
    expect: ['login', 'redirect', 'redirect', 'redirect', 'redirect', 'login', 'render'],
  },
  {
    file: '(auth)/login/page.tsx',
    note: 'Signed-in people are sent on (callbackUrl, path only).',
    expect: ['render', 'redirect', 'redirect', 'redirect', 'redirect', 'render', 'redirect'],
  },
  { file: '(auth)/signup/page.tsx', expect: ['render', 'redirect', 'redirect', 'redirect', 'redirect', 'render', 'redirect'] },
  {
    file: '(auth)/invite/[token]/page.tsx',
    note: 'Opened by the invitation token; an unknown token shows "not valid" to everyone (teamwork-members tests the valid ones).',
    expect: ['render', 'render', 'render', 'render', 'render', 'render', 'render'],
    params: () => ({ token: 'x'.repeat(43) }),
  },
  {
    file: 's/[token]/page.tsx',
    note: 'Opened by the share token; what it shows per link and visitor is in share-view.test.ts.',
    expect: ['render', 'render', 'render', 'render', 'render', 'render', 'render'],
    params: () => ({ token: 'x'.repeat(43) }),
  },
  { file: 'demo/mailbox/page.tsx', demo: true, note: 'Demo mode only (not_found otherwise).', expect: ['render', 'render', 'render', 'render', 'render', 'render', 'render'] },
];

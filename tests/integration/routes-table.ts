/**
 * THE authorisation matrix of the API route handlers (issue 8): one row per (route file,
 * method), and for each row the expected answer for every actor, written out in `expect`
 * in the order of ACTORS:
 *
 *   signed out | viewer | editor | owner | member of another workspace |
 *   share-link holder signed out | share-link holder signed in (member of no workspace)
 *
 * A number is the exact status; OK means "got past the access check", i.e. one of the row's
 * `ok` statuses. The share-link holder holds a valid token of a link of workspace A (while A
 * allows public links) and presents it every way a client could (query, header, cookie): the
 * API must give them nothing more than the same person without the token (the token opens only
 * the read-only page /s/[token]).
 *
 * tests/integration/route-roles.test.ts generates one test per row × actor, named
 * "<METHOD> /api/<route> as <actor> → <status>", plus: a member of B holding A's token (the
 * B member's column), another workspace's ids in the path, body or query → 404 (`crossIds`),
 * malformed ids → 404, and no answer carrying a workspace the caller is not in; it checks that the columns are consistent (roles monotone, a token
 * adds nothing), and fails when a route file under app/api exports a method this table does
 * not list. Server actions have their own table: tests/integration/actions-table.ts.
 */
import type { World } from './helpers/fixtures';
import { MEASURED_CSV, coaxSection, fakeResult } from './helpers/fixtures';
import { multipartBody } from './helpers/multipart';

export type Role = 'owner' | 'editor' | 'viewer';
export type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

export const ACTORS = ['signedOut', 'viewer', 'editor', 'owner', 'otherWorkspace', 'shareHolder', 'shareHolderSignedIn'] as const;
export type Actor = (typeof ACTORS)[number];
export const ACTOR_LABEL: Record<Actor, string> = {
  signedOut: 'signed out',
  viewer: 'viewer',
  editor: 'editor',
  owner: 'owner',
  otherWorkspace: 'member of another workspace',
  shareHolder: 'share-link holder (signed out)',
  shareHolderSignedIn: 'share-link holder (signed in, no membership)',
};

/** "Got past the access check": one of the row's `ok` statuses. */
export const OK = 'ok' as const;
export type Expected = number | typeof OK;
/** One expectation per actor, in ACTORS order. */
export type Matrix = readonly [Expected, Expected, Expected, Expected, Expected, Expected, Expected];

export function expectedFor(m: Matrix, actor: Actor): Expected {
  return m[ACTORS.indexOf(actor)]!;
}

interface RouteSpec {
  /** Route file relative to app/api, without "/route.ts". */
  file: string;
  method: Method;
  /** The expected answer per actor (see the header). */
  expect: Matrix;
  params?: (w: World) => Record<string, string>;
  /** The same call aimed at another workspace's object, from a member of workspace A (expects 404). */
  foreignParams?: (w: World) => Record<string, string>;
  body?: (w: World, n: number) => unknown;
  /** Raw body (e.g. octet-stream uploads). */
  rawBody?: (w: World) => { contentType: string; data: Uint8Array };
  query?: string;
  /** Statuses that show the caller got past the access check. */
  ok: number[];
  /**
   * Ids of workspace B carried in the body or the query, sent by an owner of A: the exact
   * status, nothing of B in the answer, nothing stored changed. (Path ids are swapped one at a
   * time automatically from `foreignParams`.)
   */
  crossIds?: CrossIdCase[];
}

export interface CrossIdCase {
  what: string;
  body?: (w: World) => unknown;
  query?: (w: World) => string;
  status: number;
}

export interface RouteRow extends RouteSpec {
  /**
   * Summary of `expect` (derived, never written): 'public' (no session needed), 'user' (any
   * signed-in user) or the least workspace role that gets past the check.
   */
  access: 'public' | 'user' | Role;
}

function accessOf(m: Matrix): RouteRow['access'] {
  if (expectedFor(m, 'signedOut') === OK) return 'public';
  if (expectedFor(m, 'otherWorkspace') === OK) return 'user';
  for (const r of ['viewer', 'editor', 'owner'] as const) if (expectedFor(m, r) === OK) return r;
  throw new Error('a row that nobody may call');
}

const WS = 'workspaces/[workspaceId]';

/** A solve body naming the given section and revision. */
function crossSolve(sectionId: string, revisionId: string, n: string) {
  return { sectionId, revisionId, settings: { preset: 'quick' }, settingsHash: `cross-${n}`, result: fakeResult(), status: 'done' };
}
const SEC = `${WS}/sections/[sectionId]`;
const SOL = `${WS}/solves/[solveId]`;

// Columns: signed out, viewer, editor, owner, other workspace, share holder, share holder signed in.
const SPECS: RouteSpec[] = [
  { file: 'workspaces', method: 'GET', expect: [401, OK, OK, OK, OK, 401, OK], ok: [200] },
  {
    file: WS,
    method: 'GET',
    expect: [401, OK, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA }),
    ok: [200],
  },
  {
    file: WS,
    method: 'PATCH',
    expect: [401, 403, 403, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA }),
    body: (_w, n) => ({ name: `Workspace A (${n})` }),
    ok: [200],
  },
  { file: `${WS}/members`, method: 'GET', expect: [401, OK, OK, OK, 404, 401, 404], params: (w) => ({ workspaceId: w.wsA }), ok: [200] },
  {
    file: `${WS}/sections`,
    method: 'GET',
    expect: [401, OK, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA }),
    query: '?q=sec&sort=name&dir=asc',
    ok: [200],
  },
  {
    file: `${WS}/sections`,
    method: 'POST',
    expect: [401, 403, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA }),
    body: (_w, n) => ({ name: `New section ${n}`, content: coaxSection() }),
    ok: [201],
  },
  {
    file: SEC,
    method: 'GET',
    expect: [401, OK, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB }),
    ok: [200],
  },
  {
    file: SEC,
    method: 'PATCH',
    expect: [401, 403, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB }),
    body: (_w, n) => ({ name: `Renamed ${n}` }),
    ok: [200],
  },
  {
    file: SEC,
    method: 'DELETE',
    expect: [401, 403, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB }),
    ok: [200],
  },
  {
    file: `${SEC}/restore`,
    method: 'POST',
    expect: [401, 403, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB }),
    ok: [200],
  },
  {
    file: `${SEC}/revisions`,
    method: 'GET',
    expect: [401, OK, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB }),
    ok: [200],
  },
  {
    file: `${SEC}/revisions`,
    method: 'POST',
    expect: [401, 403, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB }),
    body: (_w, n) => ({ content: coaxSection(0.5 + n / 100), message: `edit ${n}` }),
    // 409 when the section is deleted at that moment is not expected: restore runs right after delete.
    ok: [201],
    crossIds: [{ what: 'a base revision of B', body: (w) => ({ content: coaxSection(0.7), baseRevisionId: w.revisionB }), status: 409 }],
  },
  {
    file: `${SEC}/revisions/[revisionId]`,
    method: 'GET',
    expect: [401, OK, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA, revisionId: w.revisionA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB, revisionId: w.revisionB }),
    ok: [200],
  },
  {
    file: `${WS}/solves`,
    method: 'GET',
    expect: [401, OK, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA }),
    query: '?sort=created&dir=desc',
    ok: [200],
    crossIds: [
      { what: 'solves of a section of B', query: (w) => `?sectionId=${w.sectionB}`, status: 200 },
      { what: 'solves by a member of B', query: (w) => `?authorId=${w.users.outsider.id}`, status: 200 },
    ],
  },
  {
    file: `${WS}/solves`,
    method: 'POST',
    expect: [401, 403, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA }),
    body: (w, n) => ({
      sectionId: w.sectionA,
      revisionId: w.revisionA,
      settings: { preset: 'quick', n },
      settingsHash: `roles-${n}`,
      result: fakeResult(),
      status: 'done',
    }),
    ok: [201],
    crossIds: [
      { what: 'section and revision of B', body: (w) => crossSolve(w.sectionB, w.revisionB, 'bb'), status: 404 },
      { what: 'section of A, revision of B', body: (w) => crossSolve(w.sectionA, w.revisionB, 'ab'), status: 404 },
      { what: 'section of B, revision of A', body: (w) => crossSolve(w.sectionB, w.revisionA, 'ba'), status: 404 },
    ],
  },
  {
    file: SOL,
    method: 'GET',
    expect: [401, OK, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA, solveId: w.solveA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, solveId: w.solveB }),
    ok: [200],
  },
  // RESULTS helper's routes (shared-interfaces.md): checked here once their files exist.
  {
    file: `${SOL}/field`,
    method: 'GET',
    expect: [401, OK, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA, solveId: w.solveA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, solveId: w.solveB }),
    // route-roles.test.ts stores a field on solveA before the run.
    ok: [200],
  },
  {
    file: `${SOL}/field`,
    method: 'PUT',
    expect: [401, 403, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA, solveId: w.solveA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, solveId: w.solveB }),
    rawBody: () => ({ contentType: 'application/octet-stream', data: new Uint8Array([1, 2, 3, 4]) }),
    // Past the access check the content is judged: solveA already holds a field (409) or the
    // bytes are not a field blob (422). Either proves the role was accepted.
    ok: [409, 422],
  },
  {
    file: `${SOL}/comments`,
    method: 'GET',
    expect: [401, OK, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA, solveId: w.solveA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, solveId: w.solveB }),
    ok: [200],
  },
  {
    file: `${SOL}/comments`,
    method: 'POST',
    expect: [401, OK, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA, solveId: w.solveA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, solveId: w.solveB }),
    body: (_w, n) => ({ body: `Comment ${n}` }),
    ok: [201],
  },
  // Members and invitations (issue 7, TEAMWORK).
  { file: `${WS}/invitations`, method: 'GET', expect: [401, 403, 403, OK, 404, 401, 404], params: (w) => ({ workspaceId: w.wsA }), ok: [200] },
  {
    file: `${WS}/invitations`,
    method: 'POST',
    expect: [401, 403, 403, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA }),
    body: (_w, n) => ({ email: `invitee-${n}@test.example`, role: 'viewer' }),
    ok: [201],
  },
  {
    file: `${WS}/invitations/[invitationId]`,
    method: 'DELETE',
    expect: [401, 403, 403, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA, invitationId: w.invitationA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, invitationId: w.invitationB }),
    ok: [200],
  },
  {
    file: `${WS}/members/[userId]`,
    method: 'PATCH',
    expect: [401, 403, 403, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA, userId: w.users.editor.id }),
    foreignParams: (w) => ({ workspaceId: w.wsA, userId: w.users.outsider.id }),
    body: () => ({ role: 'editor' }),
    ok: [200],
  },
  {
    // Removing someone else needs an owner (a member may remove only themselves: leaving).
    // Here the owner removes themselves while being the only owner: refused with 409,
    // which proves the call got past the access check without changing the world.
    file: `${WS}/members/[userId]`,
    method: 'DELETE',
    expect: [401, 403, 403, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA, userId: w.users.owner.id }),
    foreignParams: (w) => ({ workspaceId: w.wsA, userId: w.users.outsider.id }),
    ok: [409],
  },
  // Custom materials per workspace (issue 4, EDITOR).
  { file: `${WS}/materials`, method: 'GET', expect: [401, OK, OK, OK, 404, 401, 404], params: (w) => ({ workspaceId: w.wsA }), ok: [200] },
  {
    file: `${WS}/materials`,
    method: 'POST',
    expect: [401, 403, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA }),
    body: (_w, n) => ({ material: { id: `lab-resin-${n}`, name: `Lab resin ${n}`, epsR: 3.1 } }),
    ok: [201],
  },
  // PDF report of a solve, sweep or fringing study computed in the browser (issue 6, ANALYSIS).
  {
    file: `${WS}/report`,
    method: 'POST',
    expect: [401, OK, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA }),
    body: (_w, n) => ({ kind: 'solve', title: `Report ${n}`, tables: [{ id: 't', title: 'Values', columns: ['quantity', 'value'], rows: [['C', 1.5]] }] }),
    ok: [200],
  },
  // Drawing import and files kept with a section (issue 7, TEAMWORK).
  {
    file: `${WS}/imports`,
    method: 'POST',
    expect: [401, 403, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA }),
    rawBody: () =>
      multipartBody({
        file: { name: 'plate.svg', type: 'image/svg+xml', text: '<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 10 10"><rect data-layer="top" x="0" y="0" width="4" height="0.2"/><rect data-layer="bottom" x="0" y="1" width="4" height="0.2"/></svg>' },
        options: JSON.stringify({ name: 'Imported plates', units: 'mm', layers: { top: { as: 'conductor', net: 'top', role: 'signal' }, bottom: { as: 'conductor', net: 'bottom', role: 'ground' } } }),
      }),
    ok: [201],
  },
  {
    file: `${SEC}/files`,
    method: 'GET',
    expect: [401, OK, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB }),
    ok: [200],
  },
  {
    file: `${SEC}/files/[fileId]`,
    method: 'GET',
    expect: [401, OK, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA, fileId: w.fileA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB, fileId: w.fileB }),
    ok: [200],
  },
  {
    file: `${SEC}/measurements`,
    method: 'GET',
    expect: [401, OK, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB }),
    ok: [200],
  },
  {
    file: `${SEC}/measurements`,
    method: 'POST',
    expect: [401, 403, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB }),
    query: '?name=bench.csv',
    rawBody: () => ({ contentType: 'text/csv', data: new TextEncoder().encode(MEASURED_CSV) }),
    ok: [201],
  },
  // Read-only share links and the public-links setting (issue 7, TEAMWORK).
  {
    file: `${WS}/share-links`,
    method: 'GET',
    expect: [401, OK, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA }),
    query: '?targetType=section',
    ok: [200],
    crossIds: [{ what: 'links of a section of B', query: (w) => `?targetType=section&targetId=${w.sectionB}`, status: 200 }],
  },
  {
    file: `${WS}/share-links`,
    method: 'POST',
    expect: [401, 403, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA }),
    body: (w) => ({ targetType: 'section', targetId: w.sectionA, expiresInDays: 7 }),
    ok: [201],
    crossIds: [
      { what: 'a section of B', body: (w) => ({ targetType: 'section', targetId: w.sectionB, expiresInDays: 7 }), status: 404 },
      { what: 'a solve of B', body: (w) => ({ targetType: 'solve', targetId: w.solveB, expiresInDays: 7 }), status: 404 },
    ],
  },
  {
    // Idempotent: the editor revokes, the owner's second revoke also answers 200.
    file: `${WS}/share-links/[linkId]`,
    method: 'DELETE',
    expect: [401, 403, OK, OK, 404, 401, 404],
    params: (w) => ({ workspaceId: w.wsA, linkId: w.shareLinkA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, linkId: w.shareLinkB }),
    ok: [200],
  },
  { file: `${WS}/public-links`, method: 'PUT', expect: [401, 403, 403, OK, 404, 401, 404], params: (w) => ({ workspaceId: w.wsA }), body: () => ({ allow: false }), ok: [200] },
  // Notifications of the signed-in person (issue 7, TEAMWORK): any signed-in user.
  { file: 'notifications', method: 'GET', expect: [401, OK, OK, OK, OK, 401, OK], ok: [200] },
  { file: 'notifications/read', method: 'POST', expect: [401, OK, OK, OK, OK, 401, OK], ok: [200] },
  { file: 'notifications/settings', method: 'PUT', expect: [401, OK, OK, OK, OK, 401, OK], body: () => ({ emailEnabled: true }), ok: [200] },
  // Plans and payment (issue 7, TEAMWORK). The fake payment service starts on first use in demo mode.
  { file: `${WS}/billing`, method: 'GET', expect: [401, 403, 403, OK, 404, 401, 404], params: (w) => ({ workspaceId: w.wsA }), ok: [200] },
  { file: `${WS}/billing/checkout`, method: 'POST', expect: [401, 403, 403, OK, 404, 401, 404], params: (w) => ({ workspaceId: w.wsA }), ok: [200] },
  // 200 once the checkout row above made a billing account, 409 when run alone (no account yet):
  // either proves the owner got past the access check.
  { file: `${WS}/billing/portal`, method: 'POST', expect: [401, 403, 403, OK, 404, 401, 404], params: (w) => ({ workspaceId: w.wsA }), ok: [200, 409] },
  // Public (the payment service calls it); without a valid signature: 400, nothing changes.
  { file: 'billing/webhook', method: 'POST', expect: [OK, OK, OK, OK, OK, OK, OK], body: () => ({ id: 'evt_x', type: 'checkout.session.completed' }), ok: [400] },
  // Auth and demo routes: not workspace data.
  { file: 'demo/mailbox', method: 'GET', expect: [OK, OK, OK, OK, OK, OK, OK], ok: [200] },
];

export const ROUTES: RouteRow[] = SPECS.map((s) => ({ ...s, access: accessOf(s.expect) }));

/** Route files whose methods are not role-checked by design (next-auth's own endpoints). */
export const UNCHECKED_ROUTES: { file: string; reason: string }[] = [
  { file: 'auth/[...nextauth]', reason: 'next-auth endpoints (sign-in, callback, session, CSRF)' },
];

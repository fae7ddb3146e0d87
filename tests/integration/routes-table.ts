/**
 * THE table of API route handlers and who may call them. One row per (route file, method).
 * tests/integration/route-roles.test.ts generates from it, for every row:
 *   signed out → 401; member of another workspace → 404; each role below `minRole` → 403;
 *   each role at or above → a success status; and ids of another workspace → 404.
 * Another test fails when a route file under app/api exports a method this table does not
 * list, so a new route cannot ship unchecked. Issue 8 extends this table (share links ...).
 */
import type { World } from './helpers/fixtures';
import { MEASURED_CSV, coaxSection, fakeResult } from './helpers/fixtures';
import { multipartBody } from './helpers/multipart';

export type Role = 'owner' | 'editor' | 'viewer';
export type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

export interface RouteRow {
  /** Route file relative to app/api, without "/route.ts". */
  file: string;
  method: Method;
  /** 'public' (no session needed), 'user' (any signed-in user), or the least workspace role. */
  access: 'public' | 'user' | Role;
  params?: (w: World) => Record<string, string>;
  /** The same call aimed at another workspace's object, from a member of workspace A (expects 404). */
  foreignParams?: (w: World) => Record<string, string>;
  body?: (w: World, n: number) => unknown;
  /** Raw body (e.g. octet-stream uploads). */
  rawBody?: (w: World) => { contentType: string; data: Uint8Array };
  query?: string;
  /** Statuses that show the caller got past the access check. */
  ok: number[];
}

const WS = 'workspaces/[workspaceId]';
const SEC = `${WS}/sections/[sectionId]`;
const SOL = `${WS}/solves/[solveId]`;

export const ROUTES: RouteRow[] = [
  { file: 'workspaces', method: 'GET', access: 'user', ok: [200] },
  {
    file: WS,
    method: 'GET',
    access: 'viewer',
    params: (w) => ({ workspaceId: w.wsA }),
    ok: [200],
  },
  {
    file: WS,
    method: 'PATCH',
    access: 'owner',
    params: (w) => ({ workspaceId: w.wsA }),
    body: (_w, n) => ({ name: `Workspace A (${n})` }),
    ok: [200],
  },
  { file: `${WS}/members`, method: 'GET', access: 'viewer', params: (w) => ({ workspaceId: w.wsA }), ok: [200] },
  {
    file: `${WS}/sections`,
    method: 'GET',
    access: 'viewer',
    params: (w) => ({ workspaceId: w.wsA }),
    query: '?q=sec&sort=name&dir=asc',
    ok: [200],
  },
  {
    file: `${WS}/sections`,
    method: 'POST',
    access: 'editor',
    params: (w) => ({ workspaceId: w.wsA }),
    body: (_w, n) => ({ name: `New section ${n}`, content: coaxSection() }),
    ok: [201],
  },
  {
    file: SEC,
    method: 'GET',
    access: 'viewer',
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB }),
    ok: [200],
  },
  {
    file: SEC,
    method: 'PATCH',
    access: 'editor',
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB }),
    body: (_w, n) => ({ name: `Renamed ${n}` }),
    ok: [200],
  },
  {
    file: SEC,
    method: 'DELETE',
    access: 'editor',
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB }),
    ok: [200],
  },
  {
    file: `${SEC}/restore`,
    method: 'POST',
    access: 'editor',
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB }),
    ok: [200],
  },
  {
    file: `${SEC}/revisions`,
    method: 'GET',
    access: 'viewer',
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB }),
    ok: [200],
  },
  {
    file: `${SEC}/revisions`,
    method: 'POST',
    access: 'editor',
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB }),
    body: (_w, n) => ({ content: coaxSection(0.5 + n / 100), message: `edit ${n}` }),
    // 409 when the section is deleted at that moment is not expected: restore runs right after delete.
    ok: [201],
  },
  {
    file: `${SEC}/revisions/[revisionId]`,
    method: 'GET',
    access: 'viewer',
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA, revisionId: w.revisionA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB, revisionId: w.revisionB }),
    ok: [200],
  },
  {
    file: `${WS}/solves`,
    method: 'GET',
    access: 'viewer',
    params: (w) => ({ workspaceId: w.wsA }),
    query: '?sort=created&dir=desc',
    ok: [200],
  },
  {
    file: `${WS}/solves`,
    method: 'POST',
    access: 'editor',
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
  },
  {
    file: SOL,
    method: 'GET',
    access: 'viewer',
    params: (w) => ({ workspaceId: w.wsA, solveId: w.solveA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, solveId: w.solveB }),
    ok: [200],
  },
  // RESULTS helper's routes (shared-interfaces.md): checked here once their files exist.
  {
    file: `${SOL}/field`,
    method: 'GET',
    access: 'viewer',
    params: (w) => ({ workspaceId: w.wsA, solveId: w.solveA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, solveId: w.solveB }),
    // route-roles.test.ts stores a field on solveA before the run.
    ok: [200],
  },
  {
    file: `${SOL}/field`,
    method: 'PUT',
    access: 'editor',
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
    access: 'viewer',
    params: (w) => ({ workspaceId: w.wsA, solveId: w.solveA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, solveId: w.solveB }),
    ok: [200],
  },
  {
    file: `${SOL}/comments`,
    method: 'POST',
    access: 'viewer',
    params: (w) => ({ workspaceId: w.wsA, solveId: w.solveA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, solveId: w.solveB }),
    body: (_w, n) => ({ body: `Comment ${n}` }),
    ok: [201],
  },
  // Members and invitations (issue 7, TEAMWORK).
  { file: `${WS}/invitations`, method: 'GET', access: 'owner', params: (w) => ({ workspaceId: w.wsA }), ok: [200] },
  {
    file: `${WS}/invitations`,
    method: 'POST',
    access: 'owner',
    params: (w) => ({ workspaceId: w.wsA }),
    body: (_w, n) => ({ email: `invitee-${n}@test.example`, role: 'viewer' }),
    ok: [201],
  },
  {
    file: `${WS}/invitations/[invitationId]`,
    method: 'DELETE',
    access: 'owner',
    params: (w) => ({ workspaceId: w.wsA, invitationId: w.invitationA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, invitationId: w.invitationB }),
    ok: [200],
  },
  {
    file: `${WS}/members/[userId]`,
    method: 'PATCH',
    access: 'owner',
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
    access: 'owner',
    params: (w) => ({ workspaceId: w.wsA, userId: w.users.owner.id }),
    foreignParams: (w) => ({ workspaceId: w.wsA, userId: w.users.outsider.id }),
    ok: [409],
  },
  // Custom materials per workspace (issue 4, EDITOR).
  { file: `${WS}/materials`, method: 'GET', access: 'viewer', params: (w) => ({ workspaceId: w.wsA }), ok: [200] },
  {
    file: `${WS}/materials`,
    method: 'POST',
    access: 'editor',
    params: (w) => ({ workspaceId: w.wsA }),
    body: (_w, n) => ({ material: { id: `lab-resin-${n}`, name: `Lab resin ${n}`, epsR: 3.1 } }),
    ok: [201],
  },
  // PDF report of a solve, sweep or fringing study computed in the browser (issue 6, ANALYSIS).
  {
    file: `${WS}/report`,
    method: 'POST',
    access: 'viewer',
    params: (w) => ({ workspaceId: w.wsA }),
    body: (_w, n) => ({ kind: 'solve', title: `Report ${n}`, tables: [{ id: 't', title: 'Values', columns: ['quantity', 'value'], rows: [['C', 1.5]] }] }),
    ok: [200],
  },
  // Drawing import and files kept with a section (issue 7, TEAMWORK).
  {
    file: `${WS}/imports`,
    method: 'POST',
    access: 'editor',
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
    access: 'viewer',
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB }),
    ok: [200],
  },
  {
    file: `${SEC}/files/[fileId]`,
    method: 'GET',
    access: 'viewer',
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA, fileId: w.fileA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB, fileId: w.fileB }),
    ok: [200],
  },
  {
    file: `${SEC}/measurements`,
    method: 'GET',
    access: 'viewer',
    params: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, sectionId: w.sectionB }),
    ok: [200],
  },
  {
    file: `${SEC}/measurements`,
    method: 'POST',
    access: 'editor',
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
    access: 'viewer',
    params: (w) => ({ workspaceId: w.wsA }),
    query: '?targetType=section',
    ok: [200],
  },
  {
    file: `${WS}/share-links`,
    method: 'POST',
    access: 'editor',
    params: (w) => ({ workspaceId: w.wsA }),
    body: (w) => ({ targetType: 'section', targetId: w.sectionA, expiresInDays: 7 }),
    ok: [201],
  },
  {
    // Idempotent: the editor revokes, the owner's second revoke also answers 200.
    file: `${WS}/share-links/[linkId]`,
    method: 'DELETE',
    access: 'editor',
    params: (w) => ({ workspaceId: w.wsA, linkId: w.shareLinkA }),
    foreignParams: (w) => ({ workspaceId: w.wsA, linkId: w.shareLinkB }),
    ok: [200],
  },
  { file: `${WS}/public-links`, method: 'PUT', access: 'owner', params: (w) => ({ workspaceId: w.wsA }), body: () => ({ allow: false }), ok: [200] },
  // Notifications of the signed-in person (issue 7, TEAMWORK): any signed-in user.
  { file: 'notifications', method: 'GET', access: 'user', ok: [200] },
  { file: 'notifications/read', method: 'POST', access: 'user', ok: [200] },
  { file: 'notifications/settings', method: 'PUT', access: 'user', body: () => ({ emailEnabled: true }), ok: [200] },
  // Plans and payment (issue 7, TEAMWORK). The fake payment service starts on first use in demo mode.
  { file: `${WS}/billing`, method: 'GET', access: 'owner', params: (w) => ({ workspaceId: w.wsA }), ok: [200] },
  { file: `${WS}/billing/checkout`, method: 'POST', access: 'owner', params: (w) => ({ workspaceId: w.wsA }), ok: [200] },
  // 200 once the checkout row above made a billing account, 409 when run alone (no account yet):
  // either proves the owner got past the access check.
  { file: `${WS}/billing/portal`, method: 'POST', access: 'owner', params: (w) => ({ workspaceId: w.wsA }), ok: [200, 409] },
  // Public (the payment service calls it); without a valid signature: 400, nothing changes.
  { file: 'billing/webhook', method: 'POST', access: 'public', body: () => ({ id: 'evt_x', type: 'checkout.session.completed' }), ok: [400] },
  // Auth and demo routes: not workspace data.
  { file: 'demo/mailbox', method: 'GET', access: 'public', ok: [200] },
];

/** Route files whose methods are not role-checked by design (next-auth's own endpoints). */
export const UNCHECKED_ROUTES: { file: string; reason: string }[] = [
  { file: 'auth/[...nextauth]', reason: 'next-auth endpoints (sign-in, callback, session, CSRF)' },
];

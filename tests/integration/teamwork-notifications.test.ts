/**
 * Notifications (issue 7): a comment on someone's solve notifies its author, @mentions notify
 * the mentioned member, in-app and by e-mail unless turned off; the commenter is never
 * notified about their own comment.
 */
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';

vi.mock('server-only', () => ({}));
const auth = vi.hoisted(() => ({ user: null as null | { id: string; email: string; name: string } }));
vi.mock('@/lib/server/session', () => ({
  getSessionUser: async () => auth.user,
  requireUser: async () => {
    if (!auth.user) throw new Error('redirect /login');
    return auth.user;
  },
}));
const mails = vi.hoisted(() => [] as { to: string; subject: string; text: string }[]);
vi.mock('@/lib/server/mail', async (importOriginal) => ({
  ...(await importOriginal<typeof import('@/lib/server/mail')>()),
  sendMail: async (m: { to: string; subject: string; text: string }) => {
    mails.push(m);
  },
}));

import { setDbForTesting, type DbHandle } from '@/db/client';
import { createTestDb } from './helpers/db';
import { buildWorld, type World } from './helpers/fixtures';
import * as commentsRoute from '@/app/api/workspaces/[workspaceId]/solves/[solveId]/comments/route';
import * as notificationsRoute from '@/app/api/notifications/route';
import * as readRoute from '@/app/api/notifications/read/route';
import * as settingsRoute from '@/app/api/notifications/settings/route';

let handle: DbHandle;
let w: World;
beforeAll(async () => {
  handle = await createTestDb();
  setDbForTesting(handle);
  w = await buildWorld(handle.db); // solveA's author is the editor ("Test editor")
});
afterAll(async () => {
  setDbForTesting(undefined);
  await handle?.close();
});

type Fn = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
async function call(fn: Fn, method: string, params: Record<string, string> = {}, body?: unknown) {
  const res = await fn(
    new Request('http://localhost/api/x', { method, body: body === undefined ? undefined : JSON.stringify(body), headers: { 'content-type': 'application/json' } }),
    { params: Promise.resolve(params) },
  );
  return { status: res.status, json: (await res.json()) as Record<string, any> };
}
const comment = (who: keyof World['users'], text: string) => {
  auth.user = w.users[who];
  return call(commentsRoute.POST as Fn, 'POST', { workspaceId: w.wsA, solveId: w.solveA }, { body: text });
};
const inbox = async (who: keyof World['users']) => {
  auth.user = w.users[who];
  return (await call(notificationsRoute.GET as Fn, 'GET')).json;
};

describe('comment notifications', () => {
  it('a comment on your solve: in-app and by e-mail; none for the commenter', async () => {
    expect((await comment('viewer', 'The fringing looks high here.')).status).toBe(201);
    const ed = await inbox('editor');
    expect(ed.unread).toBe(1);
    expect(ed.notifications[0]).toMatchObject({ kind: 'comment', data: { actorName: 'Test viewer', sectionName: 'Section in A', excerpt: 'The fringing looks high here.' } });
    expect(mails.at(-1)).toMatchObject({ to: 'editor@test.example', subject: 'Test viewer commented on your solve of Section in A' });
    expect(mails.at(-1)!.text).toContain(`/w/${w.wsA}/solves/${w.solveA}`);
    expect((await inbox('viewer')).unread).toBe(0);
    // The author commenting on their own solve notifies nobody.
    const before = mails.length;
    expect((await comment('editor', 'Agreed, I will refine the mesh.')).status).toBe(201);
    expect(mails.length).toBe(before);
  });

  it('@mentions notify the mentioned member', async () => {
    const before = mails.length;
    await comment('editor', '@Test owner could you check the plate spacing?');
    const ow = await inbox('owner');
    expect(ow.notifications[0]).toMatchObject({ kind: 'mention', data: { actorName: 'Test editor' } });
    expect(mails.slice(before).map((m) => m.to)).toEqual(['owner@test.example']);
    expect(mails.at(-1)!.subject).toBe('Test editor mentioned you in a comment of Section in A');
  });

  it('e-mails can be turned off; the in-app list keeps working; mark read clears the count', async () => {
    auth.user = w.users.editor;
    expect((await call(settingsRoute.PUT as Fn, 'PUT', {}, { emailEnabled: false })).json).toEqual({ emailEnabled: false });
    const before = mails.length;
    await comment('owner', 'One more thought on the guard trace.');
    expect(mails.length).toBe(before);
    const ed = await inbox('editor');
    expect(ed.emailEnabled).toBe(false);
    expect(ed.unread).toBeGreaterThanOrEqual(2);
    auth.user = w.users.editor;
    expect((await call(readRoute.POST as Fn, 'POST')).status).toBe(200);
    expect((await inbox('editor')).unread).toBe(0);
  });

  it('signed out → 401', async () => {
    auth.user = null;
    expect((await call(notificationsRoute.GET as Fn, 'GET')).status).toBe(401);
    expect((await call(settingsRoute.PUT as Fn, 'PUT', {}, { emailEnabled: 'yes' })).status).toBe(401);
  });
});

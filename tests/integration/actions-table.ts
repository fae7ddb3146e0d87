/**
 * THE authorisation matrix of the server actions (issue 8): one row per exported function of
 * a 'use server' module, and for each row the expected outcome for every actor of the route
 * table (tests/integration/routes-table.ts ACTORS, same order):
 *
 *   signed out | viewer | editor | owner | member of another workspace |
 *   share-link holder signed out | share-link holder signed in (member of no workspace)
 *
 * Actions answer with a discriminated state, not an HTTP status, so an outcome is 'ok' or the
 * error `code` the action returns. Anyone can post to an action once its id is in a page's
 * bundle, so each one must check for itself who calls it.
 *
 * tests/integration/action-roles.test.ts calls every row as every actor (test names
 * "<action> as <actor> → <outcome>"), checks that a refused call changes nothing stored, and
 * fails when the source holds a 'use server' module export or an inline 'use server'
 * function this table does not list.
 */
import type { Db } from '@/db/client';
import type { World } from './helpers/fixtures';
import type { ShareHolders } from './helpers/share-holders';
import type { Actor } from './routes-table';

export interface ActionCtx {
  db: Db;
  w: World;
  holders: ShareHolders;
  /** A pending invitation of workspace A for `email` (a new address when omitted): its token. */
  invite(opts?: { email?: string; role?: 'viewer' | 'editor' | 'owner' }): Promise<{ token: string; email: string }>;
  /** A new address no account uses yet. */
  freshEmail(prefix: string): string;
  /** The share token the actor holds (a section link of A); undefined for other actors. */
  shareToken(actor: Actor): string | undefined;
}

/** 'ok' or the error code the action answers with. */
export type Outcome = string;
/** One expected outcome per actor, in ACTORS order. */
export type ActionMatrix = readonly [Outcome, Outcome, Outcome, Outcome, Outcome, Outcome, Outcome];

export interface ActionRow {
  /** Module path from the repository root. */
  file: string;
  /** The exported function. */
  name: string;
  /** Why the columns are what they are. */
  why: string;
  expect: ActionMatrix;
  /** The arguments of one call by `actor`. */
  args: (ctx: ActionCtx, actor: Actor) => Promise<unknown[]>;
}

function form(fields: Record<string, string>): FormData {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) f.set(k, v);
  return f;
}

const PASSWORD = 'a-long-enough-password';

// Columns: signed out, viewer, editor, owner, other workspace, share holder, share holder signed in.
export const ACTIONS: ActionRow[] = [
  {
    file: 'lib/server/actions/auth.ts',
    name: 'signUp',
    why: 'Creating an account is open to everyone (a signed-in person may make a second one); it touches no existing workspace.',
    expect: ['ok', 'ok', 'ok', 'ok', 'ok', 'ok', 'ok'],
    args: async (ctx) => [{ status: 'idle' }, form({ name: 'New Person', email: ctx.freshEmail('signup'), password: PASSWORD })],
  },
  {
    file: 'lib/server/actions/invitations.ts',
    name: 'acceptInvitation',
    why:
      'Joining needs a session whose e-mail is the invited one: a forwarded link is refused (wrong_account) for members of A and ' +
      'of other workspaces alike; a share token is not an invitation token (not_found once signed in).',
    expect: ['unauthorized', 'wrong_account', 'wrong_account', 'wrong_account', 'wrong_account', 'unauthorized', 'not_found'],
    args: async (ctx, actor) => [ctx.shareToken(actor) ?? (await ctx.invite({ role: 'owner' })).token],
  },
  {
    file: 'lib/server/actions/invitations.ts',
    name: 'signUpWithInvitation',
    why:
      'The link is the credential for a new account at the invited address, whoever follows it (the mail proved the address); ' +
      'a share token does not create accounts or memberships.',
    expect: ['ok', 'ok', 'ok', 'ok', 'ok', 'not_found', 'not_found'],
    args: async (ctx, actor) => [ctx.shareToken(actor) ?? (await ctx.invite({ role: 'viewer' })).token, { name: 'Invited Person', password: PASSWORD }],
  },
];

/** Inline 'use server' functions (inside components or pages), with how they are checked. None yet. */
export const INLINE_ACTIONS: { file: string; line: number; checkedBy: string }[] = [];

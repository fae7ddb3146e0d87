/**
 * Text that identifies each workspace of the test world (ids, names, member and invitee
 * addresses): finding one in an answer given to someone outside that workspace is a leak.
 */
import type { World } from './fixtures';

export function workspaceMarkers(w: World, ws: 'A' | 'B'): string[] {
  return ws === 'A'
    ? [w.wsA, w.sectionA, w.revisionA, w.solveA, w.fileA, w.invitationA, w.shareLinkA, 'Workspace A', 'Section in A', w.users.owner.email, w.users.editor.email, w.users.viewer.email, 'invited-a@']
    : [w.wsB, w.sectionB, w.revisionB, w.solveB, w.fileB, w.invitationB, w.shareLinkB, 'Workspace B', 'Section in B', w.users.outsider.email, 'invited-b@'];
}

/** The workspaces whose data an actor of the authorisation matrix must never receive. */
export function notTheirs(actor: string): ('A' | 'B')[] {
  if (actor === 'viewer' || actor === 'editor' || actor === 'owner') return ['B'];
  if (actor === 'otherWorkspace') return ['A'];
  return ['A', 'B'];
}

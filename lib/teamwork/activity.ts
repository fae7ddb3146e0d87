/**
 * One sentence per audit event for the workspace activity feed. Pure: the page passes the
 * event and the names it knows (sections by id); unknown actions get a neutral sentence.
 */
export interface ActivityEvent {
  action: string;
  targetType: string;
  targetId: string | null;
  data: Record<string, unknown>;
}

export interface ActivityLine {
  /** The sentence without the actor ("renamed the workspace to …"). */
  text: string;
  /** Where the item leads, relative to the workspace (e.g. "sections/<id>"), when it does. */
  href?: string;
  kind: 'section' | 'solve' | 'member' | 'workspace' | 'file' | 'share' | 'plan' | 'other';
}

const str = (v: unknown) => (typeof v === 'string' ? v : typeof v === 'number' ? String(v) : '');

export function describeActivity(e: ActivityEvent, sectionNames: Map<string, string>): ActivityLine {
  const d = e.data;
  const sec = e.targetType === 'section' && e.targetId ? sectionNames.get(e.targetId) ?? 'a section that no longer exists' : '';
  const secHref = e.targetType === 'section' && e.targetId && sectionNames.has(e.targetId) ? `sections/${e.targetId}` : undefined;
  const q = (s: string) => `“${s}”`;
  switch (e.action) {
    case 'workspace.create':
      return { text: `created the workspace ${q(str(d.name))}`, kind: 'workspace' };
    case 'workspace.rename':
      return { text: `renamed the workspace to ${q(str(d.name))}`, kind: 'workspace' };
    case 'workspace.settings':
      return { text: `changed the workspace settings`, kind: 'workspace' };
    case 'section.create':
      return { text: `created the section ${q(str(d.name) || sec)}`, href: secHref, kind: 'section' };
    case 'section.revision':
      return { text: `saved r${str(d.number)} of ${q(sec)}`, href: secHref, kind: 'section' };
    case 'section.update':
      return { text: `renamed or re-described ${q(sec)}`, href: secHref, kind: 'section' };
    case 'section.delete':
      return { text: `deleted the section ${q(sec)}`, kind: 'section' };
    case 'section.restore':
      return { text: `restored the deleted section ${q(sec)}`, href: secHref, kind: 'section' };
    case 'section.import':
      return { text: `imported ${q(str(d.name))} into ${q(sec)}`, href: secHref ? `${secHref}/history` : undefined, kind: 'file' };
    case 'section.measurements':
      return { text: `added measured data ${q(str(d.name))} to ${q(sec)}`, href: secHref ? `${secHref}/history` : undefined, kind: 'file' };
    case 'solve.create':
      return { text: `saved a solve`, href: e.targetId ? `solves/${e.targetId}` : undefined, kind: 'solve' };
    case 'solve.field':
      return { text: `stored the field of a solve`, href: e.targetId ? `solves/${e.targetId}` : undefined, kind: 'solve' };
    case 'comment.create':
      return { text: `commented on a solve`, href: str(d.solveId) ? `solves/${str(d.solveId)}` : undefined, kind: 'solve' };
    case 'member.invite':
      return { text: `invited ${str(d.email)} as ${str(d.role)}`, kind: 'member' };
    case 'invitation.revoke':
      return { text: `revoked the invitation to ${str(d.email)}`, kind: 'member' };
    case 'member.join':
      return { text: `joined as ${str(d.role)}`, kind: 'member' };
    case 'member.role':
      return { text: `changed a member's role from ${str(d.from)} to ${str(d.to)}`, kind: 'member' };
    case 'member.remove':
      return { text: `removed ${str(d.email) || 'a member'} from the workspace`, kind: 'member' };
    case 'member.leave':
      return { text: `left the workspace`, kind: 'member' };
    case 'share.create':
      return { text: `made a read-only link to a ${str(d.targetType) || 'item'}`, kind: 'share' };
    case 'share.revoke':
      return { text: `revoked a read-only link`, kind: 'share' };
    case 'plan.change':
      return { text: `changed the plan to ${str(d.plan)}`, kind: 'plan' };
    default:
      return { text: `did ${e.action.replace(/\./g, ' ')}`, kind: 'other' };
  }
}

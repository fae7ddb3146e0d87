/** Activity feed sentences from audit events (issue 7). */
import { describe, expect, it } from 'vitest';
import { describeActivity } from '@/lib/teamwork/activity';

const names = new Map([['s1', 'Probe feed']]);
const ev = (action: string, data: Record<string, unknown> = {}, targetType = 'section', targetId: string | null = 's1') => ({ action, data, targetType, targetId });

describe('describeActivity', () => {
  it('names the section and links to it', () => {
    expect(describeActivity(ev('section.revision', { number: 3 }), names)).toEqual({ text: 'saved r3 of “Probe feed”', href: 'sections/s1', kind: 'section' });
    expect(describeActivity(ev('section.import', { name: 'a.svg' }), names).href).toBe('sections/s1/history');
  });
  it('a section that is gone gets no link', () => {
    const l = describeActivity(ev('section.revision', { number: 2 }, 'section', 'gone'), names);
    expect(l.text).toContain('no longer exists');
    expect(l.href).toBeUndefined();
  });
  it('member events and unknown actions', () => {
    expect(describeActivity(ev('member.invite', { email: 'a@b.example', role: 'editor' }, 'invitation', 'i1'), names).text).toBe('invited a@b.example as editor');
    expect(describeActivity(ev('member.role', { from: 'editor', to: 'viewer' }, 'user', 'u1'), names).text).toBe("changed a member's role from editor to viewer");
    expect(describeActivity(ev('x.y', {}, 'z', null), names)).toEqual({ text: 'did x y', kind: 'other' });
  });
});

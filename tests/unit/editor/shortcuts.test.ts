import { describe, expect, it } from 'vitest';
import { actionForKey, SHORTCUTS } from '@/lib/editor/shortcuts';

const key = (k: string, mods: Partial<{ ctrlKey: boolean; metaKey: boolean; shiftKey: boolean; altKey: boolean }> = {}) => ({
  key: k,
  ctrlKey: false,
  metaKey: false,
  shiftKey: false,
  altKey: false,
  ...mods,
});

describe('keyboard shortcuts (common practice, no published source)', () => {
  it('maps keys to actions, with Ctrl or ⌘ as Mod', () => {
    expect(actionForKey(key('z', { ctrlKey: true }))).toBe('undo');
    expect(actionForKey(key('z', { metaKey: true }))).toBe('undo');
    expect(actionForKey(key('Z', { ctrlKey: true, shiftKey: true }))).toBe('redo');
    expect(actionForKey(key('r'))).toBe('tool.rect');
    expect(actionForKey(key('ArrowLeft', { shiftKey: true }))).toBe('bigNudgeLeft');
    expect(actionForKey(key('ArrowLeft'))).toBe('nudgeLeft');
    expect(actionForKey(key('}', { shiftKey: true }))).toBe('front');
    expect(actionForKey(key('?', { shiftKey: true }))).toBe('help');
    expect(actionForKey(key('q'))).toBeUndefined();
  });
  it('never gives one key combination two actions', () => {
    const seen = new Map<string, string>();
    for (const s of SHORTCUTS) {
      for (const k of s.keys) {
        expect(seen.get(k), `${k} is bound twice`).toBeUndefined();
        seen.set(k, s.action);
      }
    }
  });
});

/** @mentions in comments (issue 7 notifications). */
import { describe, expect, it } from 'vitest';
import { findMentions } from '@/lib/teamwork/mentions';

const members = [
  { id: 'm', name: 'Maren Holt', email: 'maren.holt@harrowlane.example' },
  { id: 't', name: 'Tobias Quill', email: 'tobias.quill@harrowlane.example' },
  { id: 'i', name: 'Ines Varga', email: 'ines.varga@harrowlane.example' },
  { id: 'i2', name: 'Ines Roth', email: 'iroth@harrowlane.example' },
];

describe('findMentions', () => {
  it('full names, unique first names and e-mail local parts', () => {
    expect(findMentions('@Maren Holt please check', members)).toEqual(['m']);
    expect(findMentions('thanks @tobias!', members)).toEqual(['t']);
    expect(findMentions('cc @ines.varga, @iroth.', members)).toEqual(['i', 'i2']);
  });
  it('a shared first name is not enough; e-mail addresses and words are not mentions', () => {
    expect(findMentions('@Ines can you look', members)).toEqual([]);
    expect(findMentions('mail maren.holt@harrowlane.example', members)).toEqual([]);
    expect(findMentions('@marenx and @tobiasquill', members)).toEqual([]);
    expect(findMentions('no at sign', members)).toEqual([]);
  });
});

import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { parseSectionFile } from '@/lib/section/parse';
import { sectionSchemaJson } from '@/lib/section/json-schema';

const root = path.resolve(import.meta.dirname, '../../..');

describe('docs/section-format.md', () => {
  const md = readFileSync(path.join(root, 'docs/section-format.md'), 'utf8');
  const blocks = [...md.matchAll(/```json\n([\s\S]*?)```/g)].map((m) => m[1]!);

  it('has at least five complete examples', () => {
    expect(blocks.length).toBeGreaterThanOrEqual(5);
  });

  blocks.forEach((text, k) => {
    const title = /"title":\s*"([^"]*)"/.exec(text)?.[1] ?? `block ${k + 1}`;
    it(`example ${k + 1} (${title}) is a valid section with no warning`, () => {
      const r = parseSectionFile(text);
      expect(r.ok ? r.warnings : r.message).toEqual([]);
    });
  });

  it('covers every shape type and boundary kind', () => {
    const all = blocks.join('\n');
    for (const t of ['rect', 'circle', 'ring', 'polygon', 'strip']) expect(all).toContain(`"type": "${t}"`);
    for (const b of ['ground', 'mirror']) expect(all).toContain(`"type": "${b}"`);
  });
});

describe('docs/section.schema.json', () => {
  it('equals a fresh generation from the zod schema (run npm run gen:schema)', () => {
    expect(readFileSync(path.join(root, 'docs/section.schema.json'), 'utf8')).toBe(sectionSchemaJson());
  });
});

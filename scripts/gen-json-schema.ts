/**
 * Generates docs/section.schema.json from the zod schema of the section format
 * (lib/section/schema.ts) with zod's own z.toJSONSchema, in "input" mode (fields with
 * defaults are optional, as in a file written by hand).
 *
 *   npm run gen:schema            writes docs/section.schema.json
 *   npm run gen:schema -- --check exits 1 when the committed file differs
 */
import { readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { sectionSchemaJson } from '../lib/section/json-schema';

const target = path.resolve(import.meta.dirname, '..', 'docs', 'section.schema.json');
const text = sectionSchemaJson();
if (process.argv.includes('--check')) {
  let current = '';
  try {
    current = readFileSync(target, 'utf8');
  } catch {
    /* missing counts as different */
  }
  if (current !== text) {
    process.stderr.write('docs/section.schema.json is out of date: run npm run gen:schema\n');
    process.exit(1);
  }
  process.stdout.write('docs/section.schema.json is up to date\n');
} else {
  writeFileSync(target, text);
  process.stdout.write(`wrote ${path.relative(process.cwd(), target)}\n`);
}

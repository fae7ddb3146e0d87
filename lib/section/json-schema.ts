/**
 * The JSON Schema of "edgefield.section/1", generated from the zod schema (the single
 * source of truth). Structure only: expressions, references between nets/materials/
 * shapes and geometric checks are described in docs/section-format.md and enforced by
 * parseSectionFile.
 */
import { z } from 'zod';
import { sectionSchema } from './schema';

export const SECTION_SCHEMA_ID = 'https://edgefield.invalid/schemas/section-1.json';

export function sectionJsonSchema(): Record<string, unknown> {
  const generated = z.toJSONSchema(sectionSchema, { io: 'input', target: 'draft-2020-12', unrepresentable: 'any' }) as Record<string, unknown>;
  return {
    $schema: generated.$schema,
    $id: SECTION_SCHEMA_ID,
    title: 'Edgefield section (edgefield.section/1)',
    description:
      'A conductor cross-section for Edgefield: units, variables, materials, nets, shapes, boundary and mesh settings. Generated from lib/section/schema.ts by scripts/gen-json-schema.ts; see docs/section-format.md.',
    ...Object.fromEntries(Object.entries(generated).filter(([k]) => k !== '$schema')),
  };
}

/** The schema as the text committed in docs/section.schema.json. */
export function sectionSchemaJson(): string {
  return `${JSON.stringify(sectionJsonSchema(), null, 2)}\n`;
}

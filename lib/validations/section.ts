/** zod schemas for section and revision requests (the content itself is lib/section/schema.ts). */
import { z } from 'zod';
import { sectionSchema } from '@/lib/section/schema';

/** Largest accepted section body (JSON), bytes. */
export const MAX_SECTION_BODY_BYTES = 2 * 1024 * 1024;

export const sectionNameSchema = z
  .string()
  .trim()
  .min(1, 'Enter a name.')
  .max(120, 'Use at most 120 characters.');
export const sectionDescriptionSchema = z.string().trim().max(2000, 'Use at most 2000 characters.');
export const revisionMessageSchema = z.string().trim().max(500, 'Use at most 500 characters.');

export const createSectionSchema = z.strictObject({
  name: sectionNameSchema,
  description: sectionDescriptionSchema.optional(),
  content: sectionSchema,
  message: revisionMessageSchema.optional(),
});
export type CreateSectionInput = z.infer<typeof createSectionSchema>;

export const updateSectionSchema = z
  .strictObject({
    name: sectionNameSchema.optional(),
    description: sectionDescriptionSchema.optional(),
  })
  .refine((v) => v.name !== undefined || v.description !== undefined, {
    message: 'Send a name or a description to change.',
  });
export type UpdateSectionInput = z.infer<typeof updateSectionSchema>;

export const saveRevisionSchema = z.strictObject({
  content: sectionSchema,
  /** The revision the edit started from; 409 when it is no longer the latest. */
  baseRevisionId: z.string().min(1).max(64).optional(),
  message: revisionMessageSchema.optional(),
});
export type SaveRevisionInput = z.infer<typeof saveRevisionSchema>;

export const SECTION_SORTS = ['updated', 'name', 'created'] as const;
export const listSectionsQuerySchema = z.object({
  q: z.string().max(200).optional(),
  sort: z.enum(SECTION_SORTS).default('updated'),
  dir: z.enum(['asc', 'desc']).optional(),
  /** "1": list only deleted sections (the trash), for restoring. */
  deleted: z.enum(['0', '1']).optional(),
});
export type ListSectionsQuery = z.infer<typeof listSectionsQuerySchema>;

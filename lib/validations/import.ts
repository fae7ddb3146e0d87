/** zod schemas for drawing import and measured data (issue 7), shared by the dialog and the handlers. */
import { z } from 'zod';
import { importOptionsSchema } from '@/lib/import/to-section';
import { sectionDescriptionSchema, sectionNameSchema } from './section';

/** The "options" part of the import form: the new section's name plus the mapping. */
export const importRequestSchema = importOptionsSchema.extend({
  name: sectionNameSchema,
  description: sectionDescriptionSchema.optional(),
});
export type ImportRequest = z.input<typeof importRequestSchema>;

export const fileNameSchema = z
  .string()
  .trim()
  .min(1, 'The file has no name.')
  .max(200, 'The file name is longer than 200 characters.')
  .refine((s) => !/[\u0000-\u001f/\\]/.test(s), 'The file name holds characters that are not allowed.');

export const measurementQuerySchema = z.object({ name: fileNameSchema });

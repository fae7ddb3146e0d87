/** zod schemas for read-only share links (issue 7). */
import { z } from 'zod';

export const SHARE_EXPIRY_DAYS = [1, 7, 30, 90] as const;

export const createShareLinkSchema = z.strictObject({
  targetType: z.enum(['solve', 'section']),
  targetId: z.string().regex(/^[A-Za-z0-9_-]{1,64}$/, 'not a valid id'),
  /** Days until the link stops working; null for no expiry. */
  expiresInDays: z.union([z.literal(1), z.literal(7), z.literal(30), z.literal(90), z.null()]),
});
export type CreateShareLinkInput = z.infer<typeof createShareLinkSchema>;

export const listShareLinksQuerySchema = z.object({
  targetType: z.enum(['solve', 'section']).optional(),
  targetId: z.string().regex(/^[A-Za-z0-9_-]{1,64}$/, 'not a valid id').optional(),
});

export const publicLinksSchema = z.strictObject({ allow: z.boolean() });

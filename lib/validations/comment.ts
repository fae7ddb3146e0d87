/** zod schema for a comment on a solve. */
import { z } from 'zod';

export const commentBodySchema = z.string().trim().min(1, 'Write something first.').max(5000, 'Use at most 5000 characters.');
export const createCommentSchema = z.strictObject({ body: commentBodySchema });
export type CreateCommentInput = z.infer<typeof createCommentSchema>;

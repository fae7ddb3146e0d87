/** zod schemas for workspace requests. */
import { z } from 'zod';

export const workspaceNameSchema = z
  .string()
  .trim()
  .min(1, 'Enter a name.')
  .max(120, 'Use at most 120 characters.');

export const updateWorkspaceSchema = z.strictObject({ name: workspaceNameSchema });
export type UpdateWorkspaceInput = z.infer<typeof updateWorkspaceSchema>;

export const roleSchema = z.enum(['owner', 'editor', 'viewer']);

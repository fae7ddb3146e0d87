/** zod schema for a custom material kept per workspace (numbers only; section-format ids). */
import { z } from 'zod';

export const workspaceMaterialSchema = z.strictObject({
  id: z.string().regex(/^[A-Za-z0-9_.-]{1,64}$/, 'an id holds letters, digits, "_", "-" or "." (at most 64)'),
  name: z.string().trim().min(1, 'Enter a name.').max(120),
  epsR: z.number().finite().min(1, 'εr must be at least 1').max(1e5),
  lossTangent: z.number().finite().min(0).max(10).optional(),
  breakdownKVPerMm: z.number().finite().min(0).max(1e5).optional(),
  source: z.string().max(300).optional(),
});
export type WorkspaceMaterialInput = z.infer<typeof workspaceMaterialSchema>;

export const saveWorkspaceMaterialSchema = z.strictObject({ material: workspaceMaterialSchema });

/** zod schemas for members and invitations (issue 7), shared by the settings forms and the handlers. */
import { z } from 'zod';
import { emailSchema } from './auth';
import { roleSchema } from './workspace';

export const inviteSchema = z.strictObject({
  email: emailSchema,
  role: roleSchema,
});
export type InviteInput = z.infer<typeof inviteSchema>;

export const memberRoleSchema = z.strictObject({ role: roleSchema });
export type MemberRoleInput = z.infer<typeof memberRoleSchema>;

/** Sign-up through an invitation link: the e-mail is the invited one, not typed. */
export const inviteSignUpSchema = z.object({
  name: z.string().trim().min(1, 'Enter your name.').max(120, 'Use at most 120 characters.'),
  password: z.string().min(10, 'Use at least 10 characters.').max(200, 'Use at most 200 characters.'),
});
export type InviteSignUpInput = z.infer<typeof inviteSignUpSchema>;

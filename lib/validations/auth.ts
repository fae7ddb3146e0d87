/** zod schemas for sign-up and sign-in, shared by the forms and the server. */
import { z } from 'zod';

export const emailSchema = z
  .string()
  .trim()
  .min(1, 'Enter your e-mail address.')
  .max(254, 'That e-mail address is too long.')
  .email('Enter a valid e-mail address.')
  .transform((s) => s.toLowerCase());

export const passwordSchema = z
  .string()
  .min(10, 'Use at least 10 characters.')
  .max(200, 'Use at most 200 characters.');

export const signUpSchema = z.object({
  name: z.string().trim().min(1, 'Enter your name.').max(120, 'Use at most 120 characters.'),
  email: emailSchema,
  password: passwordSchema,
});
export type SignUpInput = z.infer<typeof signUpSchema>;

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string().min(1, 'Enter your password.').max(200),
});
export type SignInInput = z.infer<typeof signInSchema>;

export const magicLinkSchema = z.object({ email: emailSchema });

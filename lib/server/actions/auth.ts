'use server';
/**
 * Sign-up server action. Validates with the shared zod schema, refuses a known e-mail with a
 * field error, stores a bcrypt hash (never the password) and gives the new person a
 * workspace of their own as owner. The form then signs in with the credentials provider
 * (`signIn('credentials', { email, password })` from next-auth/react).
 */
import { getDb } from '@/db/client';
import { getUserByEmail, insertUser } from '@/db/queries/users';
import { insertWorkspace } from '@/db/queries/workspaces';
import { signUpSchema } from '@/lib/validations/auth';
import { hashPassword } from '../auth-options';
import { RATE_LIMIT_MESSAGE, takeForAction } from '../rate-limit';

export type SignUpState =
  | { status: 'idle' }
  | { status: 'ok'; email: string }
  | { status: 'error'; message: string; fieldErrors: Partial<Record<'name' | 'email' | 'password', string>> };

export async function signUp(_prev: SignUpState, formData: FormData): Promise<SignUpState> {
  // Rate limit per client address (lib/server/rate-limit.ts); a server action answers with the form state.
  if (!(await takeForAction('sign-up:ip')).ok) return { status: 'error', message: RATE_LIMIT_MESSAGE, fieldErrors: {} };
  const parsed = signUpSchema.safeParse({
    name: formData.get('name') ?? '',
    email: formData.get('email') ?? '',
    password: formData.get('password') ?? '',
  });
  if (!parsed.success) {
    const fieldErrors: Partial<Record<'name' | 'email' | 'password', string>> = {};
    for (const issue of parsed.error.issues) {
      const k = issue.path[0];
      if ((k === 'name' || k === 'email' || k === 'password') && !fieldErrors[k]) fieldErrors[k] = issue.message;
    }
    return { status: 'error', message: 'Please correct the marked fields.', fieldErrors };
  }
  const { name, email, password } = parsed.data;
  if (await getUserByEmail(email)) {
    return {
      status: 'error',
      message: 'An account with this e-mail already exists.',
      fieldErrors: { email: 'An account with this e-mail already exists. Sign in instead.' },
    };
  }
  const passwordHash = await hashPassword(password);
  const db = await getDb();
  try {
    await db.transaction(async (tx) => {
      const user = await insertUser({ email, name, passwordHash }, tx);
      await insertWorkspace({ name: `${name}'s workspace`, ownerId: user.id }, tx);
    });
  } catch (e) {
    // Two sign-ups with one address at the same moment: the unique index refuses the second.
    if (await getUserByEmail(email)) {
      return {
        status: 'error',
        message: 'An account with this e-mail already exists.',
        fieldErrors: { email: 'An account with this e-mail already exists. Sign in instead.' },
      };
    }
    console.error('Edgefield sign-up failed:', e);
    return { status: 'error', message: 'Could not create the account. Please try again.', fieldErrors: {} };
  }
  return { status: 'ok', email };
}

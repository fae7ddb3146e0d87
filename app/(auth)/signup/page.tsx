import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { getSessionUser } from '@/lib/server/session';
import { SignupForm } from './signup-form';

export const metadata: Metadata = { title: 'Create an account' };
export const dynamic = 'force-dynamic';

export default async function SignupPage() {
  if (await getSessionUser()) redirect('/');
  return <SignupForm />;
}

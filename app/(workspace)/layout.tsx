import type { ReactNode } from 'react';
import { requireUser } from '@/lib/server/session';

export const dynamic = 'force-dynamic';

/** Every page under /w needs a signed-in user; signed-out visitors go to /login. */
export default async function SignedInLayout({ children }: { children: ReactNode }) {
  await requireUser();
  return children;
}

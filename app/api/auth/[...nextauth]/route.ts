import NextAuth from 'next-auth';
import { getAuthOptions } from '@/lib/server/auth-options';

export const dynamic = 'force-dynamic';

async function handler(req: Request, ctx: { params: Promise<{ nextauth: string[] }> }) {
  // next-auth 4 reads params synchronously; Next 16 passes them as a promise.
  return NextAuth(req as never, { params: await ctx.params } as never, getAuthOptions()) as Promise<Response>;
}

export { handler as GET, handler as POST };

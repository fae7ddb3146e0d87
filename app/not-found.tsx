import type { Metadata } from 'next';
import { ButtonLink } from '@/components/ui/button';
import { LogoMark } from '@/components/app-shell/logo';

export const metadata: Metadata = { title: 'Not found' };

export default function NotFound() {
  return (
    <main id="main" className="flex min-h-screen items-center justify-center px-6" data-testid="not-found">
      <div className="max-w-md text-center">
        <LogoMark className="mx-auto size-10" title="" />
        <p className="num mt-5 text-sm font-medium text-accent">404</p>
        <h1 className="mt-1 text-2xl font-semibold text-ink">Nothing here</h1>
        <p className="mt-2 text-sm text-ink-muted">
          The page does not exist, or it belongs to a workspace you are not a member of.
        </p>
        <ButtonLink href="/" variant="primary" className="mt-6">
          Go to your workspace
        </ButtonLink>
      </div>
    </main>
  );
}

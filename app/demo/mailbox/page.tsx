import { Inbox } from 'lucide-react';
import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { Logo } from '@/components/app-shell/logo';
import { Card } from '@/components/ui/card';
import { EmptyState } from '@/components/ui/empty-state';
import { Time } from '@/components/ui/time';
import { listDemoMails } from '@/db/queries/demo-mails';
import { isDemoMode } from '@/lib/server/secret';
import { MailboxRefresh } from './mailbox-refresh';

export const metadata: Metadata = { title: 'Demo mailbox' };
export const dynamic = 'force-dynamic';

const URL_RE = /(https?:\/\/[^\s<>"']+)/g;

/** Plain text with its http(s) links made clickable (the mail's HTML is never rendered). */
function Linkified({ text }: { text: string }) {
  const parts = text.split(URL_RE);
  return (
    <>
      {parts.map((p, i) =>
        i % 2 === 1 ? (
          <a key={i} href={p} className="break-all font-medium text-accent underline" data-testid="mail-link">
            {p}
          </a>
        ) : (
          <span key={i}>{p}</span>
        ),
      )}
    </>
  );
}

/** Demo mode only: the mails the built-in fake SMTP server caught, newest first. */
export default async function DemoMailboxPage() {
  if (!isDemoMode()) notFound();
  const mails = await listDemoMails(50);
  return (
    <div className="min-h-screen">
      <header className="border-b border-line bg-surface">
        <div className="mx-auto flex h-header max-w-4xl items-center gap-3 px-6">
          <Link href="/" aria-label="Edgefield home">
            <Logo />
          </Link>
          <span aria-hidden className="text-line-strong">
            /
          </span>
          <span className="font-medium text-ink">Demo mailbox</span>
          <div className="ml-auto flex items-center gap-3">
            <MailboxRefresh />
            <Link href="/login" className="text-sm font-medium text-accent hover:underline">
              Sign in
            </Link>
          </div>
        </div>
      </header>
      <main id="main" className="mx-auto max-w-4xl px-6 py-6">
        <h1 className="text-xl font-semibold text-ink">Demo mailbox</h1>
        <p className="mt-1 max-w-2xl text-sm text-ink-muted">
          In demo mode Edgefield sends its mails to a small SMTP server that runs inside the app and keeps them here instead
          of delivering them. Sign-in links work from this page. A real mail server is configured with the SMTP settings.
        </p>
        <div className="mt-5 space-y-3" data-testid="mailbox">
          {mails.length === 0 ? (
            <Card>
              <EmptyState icon={Inbox} title="No mail yet" data-testid="mailbox-empty">
                Ask for a sign-in link on the{' '}
                <Link href="/login" className="font-medium text-accent underline">
                  sign-in page
                </Link>
                ; it shows up here within a few seconds.
              </EmptyState>
            </Card>
          ) : (
            mails.map((m) => (
              <Card key={m.id} className="overflow-hidden" data-testid="mail">
                <div className="flex items-start justify-between gap-4 border-b border-line bg-surface-muted px-5 py-2.5">
                  <div className="min-w-0">
                    <p className="truncate font-semibold text-ink" data-testid="mail-subject">
                      {m.subject || '(no subject)'}
                    </p>
                    <p className="truncate text-sm text-ink-muted">
                      To <span data-testid="mail-to">{m.to}</span> · from {m.from}
                    </p>
                  </div>
                  <span className="shrink-0 text-sm text-ink-muted">
                    <Time value={m.createdAt} />
                  </span>
                </div>
                <pre className="whitespace-pre-wrap break-words px-5 py-3 font-sans text-sm text-ink-soft">
                  <Linkified text={m.text || '(this mail has no plain-text part)'} />
                </pre>
              </Card>
            ))
          )}
        </div>
      </main>
    </div>
  );
}

'use client';

import { RefreshCw } from 'lucide-react';
import { useRouter } from 'next/navigation';
import { useEffect, useTransition } from 'react';
import { Button } from '@/components/ui/button';

/** Refresh button; the page also refreshes itself every 5 s while open. */
export function MailboxRefresh() {
  const router = useRouter();
  const [pending, start] = useTransition();
  useEffect(() => {
    const t = setInterval(() => start(() => router.refresh()), 5000);
    return () => clearInterval(t);
  }, [router]);
  return (
    <Button size="sm" variant="ghost" onClick={() => start(() => router.refresh())} data-testid="mailbox-refresh">
      <RefreshCw className={pending ? 'size-3.5 animate-spin' : 'size-3.5'} aria-hidden />
      Refresh
    </Button>
  );
}

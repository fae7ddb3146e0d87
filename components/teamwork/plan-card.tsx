'use client';

import { useMutation, useQuery } from '@tanstack/react-query';
import { CreditCard } from 'lucide-react';
import { Alert } from '@/components/ui/alert';
import { apiFetch, errorMessage } from '@/components/ui/api';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Card, CardHeader } from '@/components/ui/card';

interface Billing {
  plan: 'free' | 'team';
  limits: { members: number; solves: number };
  usage: { members: number; solves: number };
  invoices: { id: string; number: string | null; amount: number; currency: string; status: string | null; created: string }[];
}

/** An invoice amount in minor units as money ("€29.00"); an unknown currency code as "29.00 XYZ". */
function money(minor: number, currency: string): string {
  try {
    return new Intl.NumberFormat('en', { style: 'currency', currency: currency.toUpperCase() }).format(minor / 100);
  } catch {
    return `${(minor / 100).toFixed(2)} ${currency.toUpperCase()}`;
  }
}

/** Settings → Plan (owners): current plan, usage against its limits, upgrade, billing portal, invoices. */
export function PlanCard({ workspaceId, notice }: { workspaceId: string; notice?: 'success' | 'cancelled' }) {
  const q = useQuery({ queryKey: ['billing', workspaceId], queryFn: () => apiFetch<Billing>(`/api/workspaces/${workspaceId}/billing`) });
  const go = useMutation({
    mutationFn: (what: 'checkout' | 'portal') => apiFetch<{ url: string }>(`/api/workspaces/${workspaceId}/billing/${what}`, { method: 'POST' }),
    onSuccess: (d) => window.location.assign(d.url),
  });
  const b = q.data;
  return (
    <Card aria-labelledby="ws-plan" data-testid="plan-card" data-plan={b?.plan}>
      <CardHeader
        id="ws-plan"
        title={
          <span className="flex items-center gap-2">
            Plan {b ? <Badge tone={b.plan === 'team' ? 'accent' : 'neutral'} >{b.plan === 'team' ? 'Team' : 'Free'}</Badge> : null}
          </span>
        }
        description="Free: 5 members (with pending invitations) and 50 stored solves. Team: 50 members and 10,000 solves, €29.00 a month."
        actions={
          b ? (
            b.plan === 'free' ? (
              <Button variant="primary" size="sm" pending={go.isPending} onClick={() => go.mutate('checkout')} data-testid="plan-upgrade">
                <CreditCard className="size-4" aria-hidden />
                Upgrade to Team
              </Button>
            ) : (
              <Button variant="secondary" size="sm" pending={go.isPending} onClick={() => go.mutate('portal')} data-testid="plan-portal">
                Manage billing
              </Button>
            )
          ) : null
        }
      />
      <div className="space-y-3 px-5 py-4 text-sm">
        {notice === 'success' ? (
          <Alert tone="success">{b?.plan === 'team' ? 'Payment received. The workspace is on the Team plan.' : 'Payment received. The plan changes as soon as the payment service confirms it.'}</Alert>
        ) : null}
        {notice === 'cancelled' ? <Alert tone="info">Checkout was cancelled; nothing was charged.</Alert> : null}
        {go.isError ? <Alert tone="danger">{errorMessage(go.error)}</Alert> : null}
        {q.isError ? <Alert tone="danger">{errorMessage(q.error)}</Alert> : null}
        {b ? (
          <>
            <dl className="grid max-w-md grid-cols-2 gap-2" data-testid="plan-usage">
              <dt className="text-ink-muted">Members and invitations</dt>
              <dd className="num text-ink">
                {b.usage.members} of {b.limits.members}
              </dd>
              <dt className="text-ink-muted">Stored solves</dt>
              <dd className="num text-ink">
                {b.usage.solves} of {b.limits.solves}
              </dd>
            </dl>
            {b.invoices.length ? (
              <div className="max-w-xl overflow-x-auto">
                <table className="w-full text-left tabular-nums" data-testid="invoices">
                  <caption className="pb-1 text-left font-medium text-ink-soft">Invoices</caption>
                  <thead>
                    <tr className="border-b border-line text-xs text-ink-muted">
                      <th scope="col" className="py-1.5 pr-4 font-medium">Invoice</th>
                      <th scope="col" className="py-1.5 pr-4 font-medium">Date</th>
                      <th scope="col" className="py-1.5 pr-4 text-right font-medium">Amount</th>
                      <th scope="col" className="py-1.5 font-medium">Status</th>
                    </tr>
                  </thead>
                  <tbody className="divide-y divide-line">
                    {b.invoices.map((i) => (
                      <tr key={i.id} data-testid="invoice">
                        <td className="py-1.5 pr-4 whitespace-nowrap">{i.number ?? i.id}</td>
                        <td className="py-1.5 pr-4 whitespace-nowrap text-ink-muted">{i.created.slice(0, 10)}</td>
                        <td className="py-1.5 pr-4 text-right whitespace-nowrap">{money(i.amount, i.currency)}</td>
                        <td className="py-1.5">
                          <Badge tone={i.status === 'paid' ? 'success' : 'neutral'}>{i.status ?? '—'}</Badge>
                        </td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
            ) : (
              <p className="text-ink-muted">No invoices yet.</p>
            )}
          </>
        ) : null}
      </div>
    </Card>
  );
}

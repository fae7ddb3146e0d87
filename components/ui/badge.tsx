import type { ReactNode } from 'react';
import { cn } from './cn';

type Tone = 'neutral' | 'accent' | 'info' | 'success' | 'warning' | 'danger';

const tones: Record<Tone, string> = {
  neutral: 'bg-grey-100 text-ink-soft',
  accent: 'bg-copper-50 text-copper-700 ring-1 ring-inset ring-copper-100',
  info: 'bg-steel-50 text-steel-700',
  success: 'bg-green-50 text-green-700',
  warning: 'bg-amber-50 text-amber-700',
  danger: 'bg-red-50 text-red-700',
};

export function Badge({ tone = 'neutral', children, className }: { tone?: Tone; children: ReactNode; className?: string }) {
  return (
    <span className={cn('inline-flex items-center rounded-sm px-1.5 py-px text-xs font-medium', tones[tone], className)}>
      {children}
    </span>
  );
}

export type RoleName = 'owner' | 'editor' | 'viewer';

const roleTone: Record<RoleName, Tone> = { owner: 'accent', editor: 'info', viewer: 'neutral' };
const roleLabel: Record<RoleName, string> = { owner: 'Owner', editor: 'Editor', viewer: 'Viewer' };

export function RoleBadge({ role }: { role: RoleName }) {
  return (
    <Badge tone={roleTone[role]} className="capitalize">
      {roleLabel[role]}
    </Badge>
  );
}

import { CircleAlert, CircleCheck, Info, TriangleAlert } from 'lucide-react';
import type { ReactNode } from 'react';
import { cn } from './cn';

type Tone = 'info' | 'success' | 'warning' | 'danger';

const tones: Record<Tone, { box: string; Icon: typeof Info }> = {
  info: { box: 'border-steel-100 bg-steel-50 text-steel-700', Icon: Info },
  success: { box: 'border-green-100 bg-green-50 text-green-700', Icon: CircleCheck },
  warning: { box: 'border-amber-100 bg-amber-50 text-amber-700', Icon: TriangleAlert },
  danger: { box: 'border-red-100 bg-red-50 text-red-700', Icon: CircleAlert },
};

/** A message box. Errors use role="alert" so they are announced at once; the rest role="status". */
export function Alert({
  tone = 'info',
  title,
  children,
  className,
  ...rest
}: {
  tone?: Tone;
  title?: ReactNode;
  children?: ReactNode;
  className?: string;
  'data-testid'?: string;
}) {
  const { box, Icon } = tones[tone];
  return (
    <div
      role={tone === 'danger' ? 'alert' : 'status'}
      className={cn('flex gap-2.5 rounded-md border px-3 py-2.5 text-sm', box, className)}
      {...rest}
    >
      <Icon className="mt-0.5 size-4 shrink-0" aria-hidden />
      <div className="min-w-0">
        {title ? <p className="font-semibold">{title}</p> : null}
        {children ? <div className={title ? 'mt-0.5' : undefined}>{children}</div> : null}
      </div>
    </div>
  );
}

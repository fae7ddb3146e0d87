import { cn } from '@/components/ui/cn';

/**
 * The Edgefield mark: a copper trace edge over a ground plane, with field lines straight
 * under the trace and bending round its edge (the fringing field the product measures).
 */
export function LogoMark({ className, title = 'Edgefield' }: { className?: string; title?: string }) {
  return (
    <svg
      viewBox="0 0 32 32"
      role={title ? 'img' : undefined}
      aria-label={title || undefined}
      aria-hidden={title ? undefined : true}
      className={cn('size-7 shrink-0', className)}>
      <rect x="0" y="0" width="32" height="32" rx="7" fill="#1d2830" />
      <g fill="none" stroke="#8fb3cb" strokeWidth="1.6" strokeLinecap="round">
        <path d="M6.5 15v9" />
        <path d="M11.5 15v9" />
        <path d="M16.8 13.4c2.6 0.6 3.7 4.6 3.7 10.6" />
      </g>
      <path d="M16.8 10.9c5.2 0.1 7.8 5 7.9 13.1" fill="none" stroke="#8fb3cb" strokeOpacity="0.8" strokeWidth="1.5" strokeLinecap="round" />
      <path d="M14.6 9.6c2.4-4.4 13.6-4.2 14 14.4" fill="none" stroke="#8fb3cb" strokeOpacity="0.55" strokeWidth="1.4" strokeLinecap="round" />
      <rect x="3" y="9.8" width="14" height="4.8" rx="1.1" fill="#d5773b" />
      <rect x="3" y="24" width="26" height="2.6" rx="1.1" fill="#d6dcdc" />
    </svg>
  );
}

/** Mark plus the word "Edgefield". */
export function Logo({ className, markClassName }: { className?: string; markClassName?: string }) {
  return (
    <span className={cn('inline-flex items-center gap-2', className)}>
      <LogoMark className={markClassName} title="" />
      <span className="text-md font-semibold tracking-tight text-ink">
        Edge<span className="text-accent">field</span>
      </span>
    </span>
  );
}

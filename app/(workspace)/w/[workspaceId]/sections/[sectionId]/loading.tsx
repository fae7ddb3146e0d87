import { LoadingNote, Skeleton } from '@/components/ui/skeleton';

export default function LoadingSection() {
  return (
    <div className="flex min-h-0 flex-1 flex-col" data-testid="section-loading">
      <LoadingNote label="Loading the section…" />
      <div className="border-b border-line bg-surface px-5 py-3">
        <Skeleton className="h-3.5 w-40" />
        <div className="mt-2 flex items-center gap-4">
          <Skeleton className="h-6 w-72" />
          <Skeleton className="h-4 w-48" />
        </div>
      </div>
      <div className="flex-1 bg-grey-50" />
    </div>
  );
}

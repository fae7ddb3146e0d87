import { LoadingNote, Skeleton } from '@/components/ui/skeleton';

export default function LoadingMailbox() {
  return (
    <div className="mx-auto max-w-4xl px-6 py-20">
      <LoadingNote label="Loading the demo mailbox…" />
      <Skeleton className="h-7 w-48" />
      <Skeleton className="mt-3 h-4 w-full max-w-2xl" />
      <Skeleton className="mt-6 h-32 w-full" />
      <Skeleton className="mt-3 h-32 w-full" />
    </div>
  );
}

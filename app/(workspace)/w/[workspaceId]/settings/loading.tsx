import { Card } from '@/components/ui/card';
import { LoadingNote, Skeleton, SkeletonRows } from '@/components/ui/skeleton';

export default function LoadingSettings() {
  return (
    <div className="mx-auto w-full max-w-page space-y-5 px-6 py-6">
      <LoadingNote label="Loading settings…" />
      <Skeleton className="h-4 w-40" />
      <Skeleton className="h-7 w-64" />
      <Card className="p-5">
        <Skeleton className="h-4 w-20" />
        <Skeleton className="mt-2 h-9 w-96" />
      </Card>
      <Card>
        <SkeletonRows rows={3} />
      </Card>
    </div>
  );
}

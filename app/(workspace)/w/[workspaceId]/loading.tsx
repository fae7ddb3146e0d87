import { Card } from '@/components/ui/card';
import { LoadingNote, Skeleton, SkeletonRows } from '@/components/ui/skeleton';

export default function LoadingWorkspace() {
  return (
    <div className="mx-auto w-full max-w-page px-6 py-6" data-testid="workspace-loading">
      <LoadingNote label="Loading the workspace…" />
      <Skeleton className="h-4 w-32" />
      <Skeleton className="mt-2 h-7 w-80" />
      <Skeleton className="mt-2 h-4 w-64" />
      <div className="mt-6 grid grid-cols-1 gap-5 lg:grid-cols-[minmax(0,1fr)_20rem] xl:grid-cols-[minmax(0,1fr)_24rem]">
        <Card>
          <div className="flex items-center gap-3 border-b border-line px-5 py-3.5">
            <Skeleton className="h-5 w-24" />
            <Skeleton className="ml-auto h-8 w-64" />
          </div>
          <SkeletonRows rows={5} />
        </Card>
        <Card>
          <div className="border-b border-line px-5 py-3.5">
            <Skeleton className="h-5 w-32" />
          </div>
          <SkeletonRows rows={4} />
        </Card>
      </div>
    </div>
  );
}

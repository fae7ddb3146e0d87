import { LoadingNote, SkeletonRows } from '@/components/ui/skeleton';

export default function Loading() {
  return (
    <div className="mx-auto w-full max-w-page px-6 py-6">
      <LoadingNote label="Loading solves…" />
      <SkeletonRows rows={6} className="mt-4" />
    </div>
  );
}

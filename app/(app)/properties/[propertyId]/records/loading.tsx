import { LoadingBlock, Skeleton } from '@/components/ui/skeleton';

export default function Loading() {
  return (
    <div className="space-y-6">
      <Skeleton className="h-9 w-64" />
      <LoadingBlock label="Loading the application records" rows={4} />
    </div>
  );
}

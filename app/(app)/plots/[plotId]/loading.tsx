import { LoadingBlock } from '@/components/ui/skeleton';
import { Skeleton } from '@/components/ui/skeleton';

export default function Loading() {
  return (
    <div className="space-y-6">
      <Skeleton className="h-9 w-64" />
      <LoadingBlock label="Loading the plot and its plan" rows={5} />
    </div>
  );
}

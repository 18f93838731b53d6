import { LoadingBlock } from '@/components/ui/skeleton';

export default function CostsLoading() {
  return (
    <div className="mx-auto max-w-5xl">
      <LoadingBlock label="Loading the costs" rows={6} />
    </div>
  );
}

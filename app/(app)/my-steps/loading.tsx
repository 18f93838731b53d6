import { PageHeader } from '@/components/ui/page-header';
import { LoadingBlock } from '@/components/ui/skeleton';

export default function Loading() {
  return (
    <div className="mx-auto max-w-2xl">
      <PageHeader title="My steps" />
      <LoadingBlock label="Loading your steps" rows={4} />
    </div>
  );
}

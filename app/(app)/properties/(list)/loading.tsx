import { LoadingBlock } from '@/components/ui/skeleton';

export default function Loading() {
  return <LoadingBlock label="Loading" rows={4} />;
}

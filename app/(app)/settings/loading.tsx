import { LoadingBlock } from '@/components/ui/skeleton';

export default function SettingsLoading() {
  return (
    <div className="mx-auto max-w-3xl">
      <LoadingBlock label="Loading your settings" rows={5} />
    </div>
  );
}

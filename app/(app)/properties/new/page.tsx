import type { Metadata } from 'next';
import { PropertyForm } from '@/components/properties/property-form';
import { PageHeader } from '@/components/ui/page-header';
import { timeZoneNames } from '@/lib/validations/property';

export const metadata: Metadata = { title: 'New property' };

export default function NewPropertyPage() {
  return (
    <div className="mx-auto max-w-3xl">
      <PageHeader
        title="New property"
        description="Where the ground is and who holds it. You can add its plots next."
        back={{ href: '/properties', label: 'Properties' }}
      />
      <PropertyForm timeZones={timeZoneNames()} />
    </div>
  );
}

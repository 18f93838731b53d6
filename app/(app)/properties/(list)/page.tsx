import type { Metadata } from 'next';
import { Plus } from 'lucide-react';
import { PropertyList } from '@/components/properties/property-list';
import { ButtonLink } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';

export const metadata: Metadata = { title: 'Properties' };

export default function PropertiesPage() {
  return (
    <>
      <PageHeader
        title="Properties"
        description="The ground you plant, and the ground you were invited to."
        actions={
          <ButtonLink href="/properties/new">
            <Plus className="size-5" aria-hidden="true" />
            New property
          </ButtonLink>
        }
      />
      <PropertyList />
    </>
  );
}

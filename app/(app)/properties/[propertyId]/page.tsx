import type { Metadata } from 'next';
import { ClipboardList, Pencil, Receipt } from 'lucide-react';
import { notFound } from 'next/navigation';
import { InvitationsSection } from '@/components/members/invitations-section';
import { MembersSection } from '@/components/members/members-section';
import { PlotsSection } from '@/components/plots/plots-table';
import { DeleteProperty } from '@/components/properties/delete-property';
import { PropertyFacts } from '@/components/properties/property-facts';
import { RoleBadge } from '@/components/properties/role-badge';
import { ButtonLink } from '@/components/ui/button';
import { Card, CardHeader } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { WeatherPanel } from '@/components/weather/weather-panel';
import { roleAtLeast } from '@/lib/validations/membership';
import { propertyAccess } from '../../_lib/access';
import { loadProperty } from '../../_lib/property';

type Params = Promise<{ propertyId: string }>;

export async function generateMetadata({ params }: { params: Params }): Promise<Metadata> {
  const { propertyId } = await params;
  const result = await propertyAccess(propertyId, 'viewer', `/properties/${propertyId}`);
  const property = result.ok ? await loadProperty(propertyId) : null;
  return { title: property?.name ?? 'Property' };
}

export default async function PropertyPage({ params }: { params: Params }) {
  const { propertyId } = await params;
  const result = await propertyAccess(propertyId, 'viewer', `/properties/${propertyId}`);
  // Every role may view; a 403 cannot happen here, but the type still asks.
  if (!result.ok) notFound();
  const { role, user } = result.access;
  const property = await loadProperty(propertyId);
  if (!property) notFound();
  const canEdit = roleAtLeast(role, 'manager');
  const isOwner = role === 'owner';

  return (
    <div className="space-y-6">
      <PageHeader
        title={property.name}
        back={{ href: '/properties', label: 'Properties' }}
        description={
          <span className="inline-flex items-center gap-2 text-sm">
            <span>Your role:</span> <RoleBadge role={role} />
          </span>
        }
        actions={
          <>
            <ButtonLink href={`/properties/${propertyId}/records`} variant="secondary">
              <ClipboardList className="size-4" aria-hidden="true" />
              Records
            </ButtonLink>
            {canEdit ? (
              <ButtonLink href={`/properties/${propertyId}/costs`} variant="secondary">
                <Receipt className="size-4" aria-hidden="true" />
                Costs
              </ButtonLink>
            ) : null}
            {canEdit ? (
              <ButtonLink href={`/properties/${propertyId}/edit`} variant="secondary">
                <Pencil className="size-4" aria-hidden="true" />
                Edit property
              </ButtonLink>
            ) : null}
          </>
        }
      />

      <Card aria-labelledby="facts-heading">
        <CardHeader id="facts-heading" title="About the ground" />
        <PropertyFacts property={property} />
      </Card>

      <WeatherPanel propertyId={propertyId} />

      <PlotsSection propertyId={propertyId} canEdit={canEdit} />

      <Card aria-labelledby="people-heading">
        <CardHeader
          id="people-heading"
          title="People"
          description={isOwner ? 'Who can see and work this property, and what each may do.' : 'Who can see and work this property.'}
        />
        <MembersSection propertyId={propertyId} propertyName={property.name} currentUserId={user.id} isOwner={isOwner} />
        {isOwner ? (
          <div className="mt-6 border-t border-ground-line pt-6">
            <InvitationsSection propertyId={propertyId} />
          </div>
        ) : null}
      </Card>

      {isOwner ? <DeleteProperty propertyId={propertyId} propertyName={property.name} /> : null}
    </div>
  );
}

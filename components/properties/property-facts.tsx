import { CalendarDays, Clock, FileCheck, Handshake, MapPin, Mountain, Phone, Snowflake, UserRound } from 'lucide-react';
import type { ReactNode } from 'react';
import { formatCoordinates, formatLocalDate, formatMonthDay, formatNumber } from '@/lib/client/format';
import type { PropertyDto } from '@/lib/data/properties';
import { TENURE_LABELS } from '@/lib/validations/property';

function Fact({ icon, label, children }: { icon: ReactNode; label: string; children: ReactNode }) {
  return (
    <div className="flex gap-3">
      <span className="mt-0.5 text-loam-faint">{icon}</span>
      <div className="min-w-0">
        <dt className="text-sm text-loam-soft">{label}</dt>
        <dd className="break-words font-medium">{children}</dd>
      </div>
    </div>
  );
}

const notSet = <span className="font-normal text-loam-faint">Not set</span>;
const iconClass = 'size-5';

export function PropertyFacts({ property }: { property: PropertyDto }) {
  const held = property.tenure !== 'owned';
  return (
    <dl className="grid gap-x-6 gap-y-4 sm:grid-cols-2 lg:grid-cols-3">
      <Fact icon={<MapPin className={iconClass} aria-hidden="true" />} label="Location">
        <span className="tabular">{formatCoordinates(property.latitude, property.longitude)}</span>
      </Fact>
      <Fact icon={<Clock className={iconClass} aria-hidden="true" />} label="Time zone">
        {property.timeZone}
      </Fact>
      <Fact icon={<Mountain className={iconClass} aria-hidden="true" />} label="Elevation">
        <span className="tabular">{formatNumber(property.elevationM)} m</span>
      </Fact>
      <Fact icon={<Snowflake className={`${iconClass} text-frost`} aria-hidden="true" />} label="Average last spring frost">
        {property.avgLastSpringFrost ? <span className="tabular">{formatMonthDay(property.avgLastSpringFrost)}</span> : notSet}
      </Fact>
      <Fact icon={<Snowflake className={`${iconClass} text-frost`} aria-hidden="true" />} label="Average first fall frost">
        {property.avgFirstFallFrost ? <span className="tabular">{formatMonthDay(property.avgFirstFallFrost)}</span> : notSet}
      </Fact>
      <Fact icon={<Snowflake className={`${iconClass} text-frost`} aria-hidden="true" />} label="Average first hard freeze (28 °F)">
        {property.avgFirstHardFreeze ? <span className="tabular">{formatMonthDay(property.avgFirstHardFreeze)}</span> : notSet}
      </Fact>
      <Fact icon={<CalendarDays className={iconClass} aria-hidden="true" />} label="Season opens">
        {property.seasonOpensOn ? <span className="tabular">{formatLocalDate(property.seasonOpensOn)}</span> : notSet}
      </Fact>
      <Fact icon={<Handshake className={iconClass} aria-hidden="true" />} label="Tenure">
        {TENURE_LABELS[property.tenure]}
      </Fact>
      {held ? (
        <>
          <Fact icon={<UserRound className={iconClass} aria-hidden="true" />} label="Landowner">
            {property.landownerName ?? notSet}
          </Fact>
          <Fact icon={<Phone className={iconClass} aria-hidden="true" />} label="Landowner contact">
            {property.landownerContact ?? notSet}
          </Fact>
          <Fact icon={<FileCheck className={iconClass} aria-hidden="true" />} label="Permission granted on">
            {property.permissionGrantedOn ? <span className="tabular">{formatLocalDate(property.permissionGrantedOn)}</span> : notSet}
          </Fact>
        </>
      ) : null}
    </dl>
  );
}

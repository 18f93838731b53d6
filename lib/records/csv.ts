// The application records as CSV (RFC 4180, written by papaparse): one row per record — corrected originals
// included and marked — and every stored field, so the file is the record a regulator or a landowner keeps.
import { formatInTimeZone } from 'date-fns-tz';
import { toCsv, type CsvCell } from '@/lib/csv';
import type { ApplicationRecordDto } from '@/lib/data/application-records';

export interface CsvColumn {
  header: string;
  value: (r: ApplicationRecordDto) => CsvCell;
}

/** The columns, in order. Instants are ISO 8601; the local date and time are given with the zone they are in. */
export const RECORD_CSV_COLUMNS: readonly CsvColumn[] = [
  { header: 'record_id', value: (r) => r.id },
  { header: 'status', value: (r) => (r.supersededBy ? 'corrected' : 'current') },
  { header: 'supersedes_record_id', value: (r) => r.supersedesId },
  { header: 'correction_reason', value: (r) => r.correctionReason },
  { header: 'corrected_by_record_id', value: (r) => r.supersededBy?.id ?? null },
  { header: 'kind', value: (r) => r.kind },
  { header: 'applied_at_utc', value: (r) => r.appliedAt },
  { header: 'applied_at_local', value: (r) => formatInTimeZone(new Date(r.appliedAt), r.timeZone, "yyyy-MM-dd'T'HH:mm:ssXXX") },
  { header: 'applied_date_local', value: (r) => r.appliedOn },
  { header: 'applied_time_local', value: (r) => r.appliedTime },
  { header: 'time_zone', value: (r) => r.timeZone },
  { header: 'plot', value: (r) => r.plotName },
  { header: 'plot_id', value: (r) => r.plotId },
  { header: 'location', value: (r) => r.location },
  { header: 'crop_or_site', value: (r) => r.site },
  { header: 'area_acres', value: (r) => r.areaAcres },
  { header: 'product_name', value: (r) => r.productName },
  { header: 'epa_reg_no', value: (r) => r.epaRegNo },
  { header: 'restricted_use', value: (r) => r.restrictedUse },
  { header: 'active_ingredient_pct', value: (r) => r.activeIngredientPct },
  { header: 'rate_value', value: (r) => r.rateValue },
  { header: 'rate_unit', value: (r) => r.rateUnit },
  { header: 'total_product_value', value: (r) => r.totalProductValue },
  { header: 'total_product_unit', value: (r) => r.totalProductUnit },
  { header: 'water_gal', value: (r) => r.waterGal },
  { header: 'sprayer', value: (r) => r.sprayer },
  { header: 'applicator_name', value: (r) => r.applicatorName },
  { header: 'applicator_certification_no', value: (r) => r.applicatorLicense },
  { header: 'wind_mph', value: (r) => r.windMph },
  { header: 'wind_direction', value: (r) => r.windDirection },
  { header: 'air_temp_f', value: (r) => r.airTempF },
  { header: 'humidity_pct', value: (r) => r.humidityPct },
  { header: 'weather_source', value: (r) => r.weatherSource },
  { header: 'notes', value: (r) => r.notes },
  { header: 'recorded_by', value: (r) => r.recordedBy?.name ?? null },
  { header: 'recorded_at_utc', value: (r) => r.recordedAt },
];

/** The CSV text; a text cell that starts like a formula is escaped (lib/csv.ts, after OWASP "CSV Injection"). */
export function recordsToCsv(records: readonly ApplicationRecordDto[]): string {
  return toCsv(
    RECORD_CSV_COLUMNS.map((c) => c.header),
    records.map((r) => RECORD_CSV_COLUMNS.map((c) => c.value(r))),
  );
}

/** A file name that says what and when: sowcast-records-<property>-<date>.csv (ASCII only, for every browser). */
export function recordsCsvFilename(propertyName: string, localDate: string): string {
  const slug = propertyName
    .normalize('NFKD')
    .replace(/[^\x20-\x7e]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60);
  return `sowcast-records-${slug || 'property'}-${localDate}.csv`;
}

import type { Migration, MigrationProvider } from 'kysely';
import * as m0001 from './0001_foundation';
import * as m0002 from './0002_plantings';
import * as m0003 from './0003_forecasts_notifications';
import * as m0004 from './0004_blends';
import * as m0005 from './0005_field_records';
import * as m0006g from './0006_germination';
import * as m0007 from './0007_calendar_indexes';
import * as m0008 from './0008_hard_freeze';
import * as m0009 from './0009_soil_test_acidity';
import * as m0010 from './0010_account_security';

// Listed here rather than read from disk, so the same list works under tsx, vitest and Next's bundler.
// A new migration: add a file `NNNN_name.ts` with `up`/`down`, then one line below.
export const migrations: Record<string, Migration> = {
  '0001_foundation': m0001,
  '0002_plantings': m0002,
  '0003_forecasts_notifications': m0003,
  '0004_blends': m0004,
  '0005_field_records': m0005,
  '0006_germination': m0006g,
  '0007_calendar_indexes': m0007,
  '0008_hard_freeze': m0008,
  '0009_soil_test_acidity': m0009,
  '0010_account_security': m0010,
};

export const migrationProvider: MigrationProvider = {
  async getMigrations() {
    return migrations;
  },
};

import type { ColumnType, Generated, Insertable, Selectable, Updateable } from 'kysely';

export type PropertyRole = 'owner' | 'manager' | 'member' | 'viewer';
export type LandTenure = 'owned' | 'leased' | 'permission';
export type PlotCover = 'grass-weeds' | 'brush' | 'bare-soil' | 'tilled' | 'existing-stand';
export type PlotSun = 'full' | 'partial' | 'shade';

type CreatedAt = ColumnType<Date, Date | string | undefined, never>;
type UpdatedAt = ColumnType<Date, Date | string | undefined, Date | string>;
/** A local calendar date (`date` column), always handled as 'YYYY-MM-DD' text. */
type LocalDate = string;

export interface UsersTable {
  id: Generated<string>;
  email: string;
  name: string;
  password_hash: string;
  created_at: CreatedAt;
  last_seen_at: ColumnType<Date | null, never, Date | string | null>;
  /** Null until the person follows the link in the verification e-mail. */
  email_verified_at: ColumnType<Date | null, Date | string | null | undefined, Date | string | null>;
  /** Embedded in each session token; bumping it ends every session of the account. */
  session_version: ColumnType<number, number | undefined, number>;
}

export interface EmailVerificationsTable {
  id: Generated<string>;
  user_id: string;
  token_hash: string;
  created_at: CreatedAt;
  expires_at: Date | string;
  used_at: Date | string | null;
}

export interface SignedOutSessionsTable {
  session_id: string;
  user_id: string;
  expires_at: Date | string;
}

/** rate-limiter-flexible's store: points used in the window, window end in epoch milliseconds. */
export interface RateLimitsTable {
  key: string;
  points: number;
  expire: number | null;
}

export interface SignInAttemptsTable {
  id: Generated<string>;
  email: string;
  ip: string | null;
  succeeded: boolean;
  attempted_at: ColumnType<Date, Date | string | undefined, never>;
}

export interface PropertiesTable {
  id: Generated<string>;
  name: string;
  latitude: number;
  longitude: number;
  time_zone: string;
  elevation_m: ColumnType<number, number | undefined, number>;
  avg_last_spring_frost: string | null;
  avg_first_fall_frost: string | null;
  avg_first_hard_freeze: ColumnType<string | null, string | null | undefined, string | null>;
  season_opens_on: LocalDate | null;
  tenure: ColumnType<LandTenure, LandTenure | undefined, LandTenure>;
  landowner_name: string | null;
  landowner_contact: string | null;
  permission_granted_on: LocalDate | null;
  created_at: CreatedAt;
  updated_at: UpdatedAt;
}

export interface MembershipsTable {
  property_id: string;
  user_id: string;
  role: PropertyRole;
  created_at: CreatedAt;
}

export interface InvitationsTable {
  id: Generated<string>;
  property_id: string;
  email: string;
  role: PropertyRole;
  token_hash: string;
  invited_by: string | null;
  created_at: CreatedAt;
  expires_at: Date | string;
  accepted_at: Date | null;
  accepted_by: string | null;
  revoked_at: Date | null;
}

export interface PlotsTable {
  id: Generated<string>;
  property_id: string;
  name: string;
  acres: number;
  cover: PlotCover;
  sun: PlotSun;
  soil_ph: number | null;
  notes: string | null;
  boundary: Json<unknown> | null;
  boundary_acres: number | null;
  boundary_upload_id: string | null;
  created_at: CreatedAt;
  updated_at: UpdatedAt;
}

export type PlantingMethodColumn = 'spray-and-seed' | 'prepared-seedbed' | 'frost-seeding';
export type PlantingStatus = 'active' | 'finished' | 'abandoned';
export type StepKindColumn =
  | 'clear-brush' | 'spray' | 'kill-wait' | 'burn' | 'rake-till' | 'seed' | 'cover-seed' | 'fertilize' | 'lime'
  | 'check-germination' | 'mow' | 'spot-spray-grass' | 'frost-seed' | 'soil-test';
export type StepStatus = 'planned' | 'done' | 'skipped';
type Json<T> = ColumnType<T, string, string>;

export interface PlantingsTable {
  id: Generated<string>;
  plot_id: string;
  season: 'spring' | 'fall';
  year: number;
  method: PlantingMethodColumn;
  status: ColumnType<PlantingStatus, PlantingStatus | undefined, PlantingStatus>;
  target_seed_date: LocalDate;
  ready_by: LocalDate | null;
  input: Json<unknown>;
  warnings: Json<string[]>;
  created_by: string | null;
  created_at: CreatedAt;
  updated_at: UpdatedAt;
}

export interface StepsTable {
  id: Generated<string>;
  planting_id: string;
  key: string;
  kind: StepKindColumn;
  title: string;
  position: number;
  local_date: LocalDate;
  window_start: LocalDate | null;
  window_end: LocalDate | null;
  hours: Json<{ start: string; end: string } | null> | null;
  pinned: ColumnType<boolean, boolean | undefined, boolean>;
  status: ColumnType<StepStatus, StepStatus | undefined, StepStatus>;
  done_on: LocalDate | null;
  done_at: Date | null;
  done_by: string | null;
  assignee_id: string | null;
  after: Json<string[]>;
  quantities: Json<unknown[]>;
  cautions: Json<unknown[]>;
  rules: Json<unknown[]>;
  warnings: Json<string[]>;
  reason: string;
  recurrence: string | null;
  notes: string | null;
  done_record: Json<unknown> | null;
  updated_at: UpdatedAt;
}

export interface StepMovesTable {
  id: Generated<string>;
  step_id: string;
  from_date: LocalDate;
  to_date: LocalDate;
  reason: string;
  moved_by: string | null;
  forecast_fetched_at: Date | string | null;
  created_at: CreatedAt;
}

export type NotificationChannel = 'email' | 'push';

export interface ForecastsTable {
  id: Generated<string>;
  grid_key: string;
  latitude: number;
  longitude: number;
  provider: string;
  fetched_at: Date | string;
  first_hour: Date | string;
  last_hour: Date | string;
  hours: Json<unknown[]>;
}

export interface ForecastStatusTable {
  grid_key: string;
  last_attempt_at: Date | string | null;
  last_success_at: Date | string | null;
  failing_since: Date | string | null;
  last_error: string | null;
  consecutive_failures: ColumnType<number, number | undefined, number>;
}

export interface NotificationSettingsTable {
  user_id: string;
  email_enabled: ColumnType<boolean, boolean | undefined, boolean>;
  push_enabled: ColumnType<boolean, boolean | undefined, boolean>;
  reminder_hour: ColumnType<number, number | undefined, number>;
  quiet_start_hour: number | null;
  quiet_end_hour: number | null;
  due_reminders: ColumnType<boolean, boolean | undefined, boolean>;
  digest: ColumnType<boolean, boolean | undefined, boolean>;
  updated_at: UpdatedAt;
}

export interface PushSubscriptionsTable {
  id: Generated<string>;
  user_id: string;
  endpoint: string;
  p256dh: string;
  auth: string;
  label: string | null;
  created_at: CreatedAt;
  last_sent_at: Date | string | null;
}

export interface NotificationsTable {
  id: Generated<string>;
  dedupe_key: string;
  user_id: string | null;
  email_to: string | null;
  property_id: string | null;
  step_id: string | null;
  kind: string;
  channel: NotificationChannel;
  message: Json<unknown>;
  send_after: Date | string;
  claimed_at: Date | string | null;
  claimed_by: string | null;
  sent_at: Date | string | null;
  failed_at: Date | string | null;
  attempts: ColumnType<number, number | undefined, number>;
  last_error: string | null;
  created_at: CreatedAt;
  /** The invitation an invitation e-mail carries; the sender re-checks it is still open. */
  invitation_id: ColumnType<string | null, string | null | undefined, string | null>;
}

export interface BlendsTable {
  id: Generated<string>;
  property_id: string;
  name: string;
  parts: Json<{ speciesId: string; share: number }[]>;
  notes: string | null;
  created_by: string | null;
  created_at: CreatedAt;
}

export type UploadKind = 'photo' | 'soil-test' | 'boundary';

export interface UploadsTable {
  id: Generated<string>;
  property_id: string;
  plot_id: string | null;
  observation_id: string | null;
  kind: UploadKind;
  filename: string;
  content_type: string;
  size_bytes: number;
  sha256: string;
  storage_key: string;
  thumb_key: string | null;
  width: number | null;
  height: number | null;
  caption: string | null;
  uploaded_by: string | null;
  created_at: CreatedAt;
}

export type WeedPressure = 'none' | 'light' | 'moderate' | 'heavy';
export type StandVerdict = 'good' | 'fair' | 'poor';

export interface ObservationsTable {
  id: Generated<string>;
  planting_id: string;
  plot_id: string;
  step_id: string | null;
  observed_on: LocalDate;
  observed_at: Date | string;
  observer_id: string | null;
  stand_rating: number;
  frame_counts: Json<number[]>;
  frame_sq_ft: ColumnType<number, number | undefined, number>;
  plants_per_sq_ft: number;
  expected_per_sq_ft: number | null;
  expected_source: string | null;
  weed_pressure: WeedPressure;
  verdict: StandVerdict;
  notes: string | null;
  /** The planting made when a manager accepted the reseeding this check proposed. */
  reseed_planting_id: ColumnType<string | null, string | null | undefined, string | null>;
  created_at: CreatedAt;
}

export type ApplicationKind = 'herbicide' | 'fertilizer' | 'lime';

/** Append-only (a trigger refuses UPDATE): a correction is a new row with supersedes_id. */
export interface ApplicationRecordsTable {
  id: Generated<string>;
  property_id: string;
  plot_id: string | null;
  plot_name: string;
  step_id: string | null;
  supersedes_id: string | null;
  correction_reason: string | null;
  kind: ApplicationKind;
  applied_at: Date | string;
  applied_on: LocalDate;
  time_zone: string;
  area_acres: number;
  location: string | null;
  site: string | null;
  product_name: string;
  epa_reg_no: string | null;
  restricted_use: ColumnType<boolean, boolean | undefined, never>;
  active_ingredient_pct: number | null;
  rate_value: number;
  rate_unit: string;
  total_product_value: number;
  total_product_unit: string;
  water_gal: number | null;
  sprayer: string | null;
  applicator_name: string;
  applicator_license: string | null;
  wind_mph: number | null;
  wind_direction: string | null;
  air_temp_f: number | null;
  humidity_pct: number | null;
  weather_source: 'forecast' | 'observation' | 'entered' | null;
  notes: string | null;
  recorded_by: string | null;
  recorded_at: CreatedAt;
}

export interface SoilTestsTable {
  id: Generated<string>;
  property_id: string;
  plot_id: string;
  sampled_on: LocalDate | null;
  lab_name: string | null;
  ph: number | null;
  buffer_ph: number | null;
  /** The buffer the buffer pH was read with; null when the report does not say. */
  buffer_method: 'smp' | 'mehlich' | null;
  /** Exchangeable acidity, meq/100 cm³ (the Mehlich "Ac" of the North Carolina lab). */
  acidity_meq: number | null;
  p_ppm: number | null;
  k_ppm: number | null;
  organic_matter_pct: number | null;
  lime_tons_per_acre: number | null;
  n_lb_per_acre: number | null;
  p2o5_lb_per_acre: number | null;
  k2o_lb_per_acre: number | null;
  recommendation: string | null;
  upload_id: string | null;
  created_by: string | null;
  created_at: CreatedAt;
}

export type ExpenseCategory = 'seed' | 'herbicide' | 'fertilizer' | 'lime' | 'fuel' | 'equipment' | 'labour' | 'other';

export interface ExpensesTable {
  id: Generated<string>;
  property_id: string;
  plot_id: string | null;
  season: 'spring' | 'fall';
  year: number;
  spent_on: LocalDate;
  category: ExpenseCategory;
  description: string;
  amount_cents: number;
  labour_hours: number | null;
  paid_by: string | null;
  split_among: ColumnType<string[], string | undefined, string>;
  created_by: string | null;
  created_at: CreatedAt;
}

export interface CalendarFeedsTable {
  id: Generated<string>;
  user_id: string;
  token_hash: string;
  label: string | null;
  created_at: CreatedAt;
  last_used_at: Date | null;
  revoked_at: Date | null;
}

export interface Database {
  users: UsersTable;
  email_verifications: EmailVerificationsTable;
  signed_out_sessions: SignedOutSessionsTable;
  rate_limits: RateLimitsTable;
  sign_in_attempts: SignInAttemptsTable;
  properties: PropertiesTable;
  memberships: MembershipsTable;
  invitations: InvitationsTable;
  plots: PlotsTable;
  plantings: PlantingsTable;
  steps: StepsTable;
  step_moves: StepMovesTable;
  forecasts: ForecastsTable;
  forecast_status: ForecastStatusTable;
  notification_settings: NotificationSettingsTable;
  push_subscriptions: PushSubscriptionsTable;
  notifications: NotificationsTable;
  blends: BlendsTable;
  uploads: UploadsTable;
  observations: ObservationsTable;
  application_records: ApplicationRecordsTable;
  soil_tests: SoilTestsTable;
  expenses: ExpensesTable;
  calendar_feeds: CalendarFeedsTable;
}

export type User = Selectable<UsersTable>;
export type Property = Selectable<PropertiesTable>;
export type NewProperty = Insertable<PropertiesTable>;
export type PropertyUpdate = Updateable<PropertiesTable>;
export type Plot = Selectable<PlotsTable>;
export type NewPlot = Insertable<PlotsTable>;
export type PlotUpdate = Updateable<PlotsTable>;
export type Invitation = Selectable<InvitationsTable>;

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
  created_at: CreatedAt;
  updated_at: UpdatedAt;
}

export interface Database {
  users: UsersTable;
  sign_in_attempts: SignInAttemptsTable;
  properties: PropertiesTable;
  memberships: MembershipsTable;
  invitations: InvitationsTable;
  plots: PlotsTable;
}

export type User = Selectable<UsersTable>;
export type Property = Selectable<PropertiesTable>;
export type NewProperty = Insertable<PropertiesTable>;
export type PropertyUpdate = Updateable<PropertiesTable>;
export type Plot = Selectable<PlotsTable>;
export type NewPlot = Insertable<PlotsTable>;
export type PlotUpdate = Updateable<PlotsTable>;
export type Invitation = Selectable<InvitationsTable>;

import type { ColumnType, Generated, Insertable, Selectable, Updateable } from "kysely";

// The typed database interface; kept by hand beside the migrations in db/migrations.
type Timestamp = ColumnType<Date, Date | string, Date | string>;
type Json = ColumnType<unknown, string, string>;

export type SiteRole = "member" | "admin";
export type UserStatus = "pending" | "active" | "disabled";
export type MemberRole = "corresponding" | "coauthor" | "contributor" | "observer";

export interface AppUserTable {
  id: Generated<string>;
  email: string;
  name: string;
  password_hash: string | null;
  site_role: Generated<SiteRole>;
  status: Generated<UserStatus>;
  email_confirmed_at: Timestamp | null;
  is_demo: Generated<boolean>;
  created_at: Generated<Timestamp>;
}

export interface ManuscriptTable {
  id: Generated<string>;
  title: string;
  journal: string | null;
  is_demo: Generated<boolean>;
  created_by: string;
  created_at: Generated<Timestamp>;
}

export interface MembershipTable {
  manuscript_id: string;
  user_id: string;
  role: MemberRole;
  added_at: Generated<Timestamp>;
}

export interface InvitationTable {
  id: Generated<string>;
  manuscript_id: string;
  email: string;
  role: MemberRole;
  token_hash: string;
  invited_by: string;
  created_at: Generated<Timestamp>;
  expires_at: Timestamp;
  accepted_at: Timestamp | null;
  accepted_by: string | null;
}

export interface OneTimeTokenTable {
  id: Generated<string>;
  user_id: string;
  purpose: "confirm-email" | "reset-password";
  token_hash: string;
  created_at: Generated<Timestamp>;
  expires_at: Timestamp;
  used_at: Timestamp | null;
}

export interface ApiTokenTable {
  id: Generated<string>;
  user_id: string;
  name: string;
  token_hash: string;
  prefix: string;
  created_at: Generated<Timestamp>;
  last_used_at: Timestamp | null;
  revoked_at: Timestamp | null;
}

export interface SignInAttemptTable {
  id: Generated<number>;
  email: string;
  ip: string;
  succeeded: boolean;
  at: Generated<Timestamp>;
}

export interface AuditEventTable {
  id: Generated<number>;
  at: Generated<Timestamp>;
  actor_id: string | null;
  manuscript_id: string | null;
  action: string;
  detail: Generated<Json>;
  ip: string | null;
}

export interface DatasetTable {
  id: Generated<string>;
  manuscript_id: string;
  name: string;
  quantity: Json;
  mapping: Json | null;
  process: string | null;
  beam_energy_gev: number | null;
  target: string | null;
  description: Generated<string>;
  is_demo: Generated<boolean>;
  created_by: string;
  created_at: Generated<Timestamp>;
}

export interface DatasetRevisionTable {
  id: Generated<string>;
  dataset_id: string;
  number: number;
  content_hash: string;
  raw_sha256: string;
  raw_key: string;
  raw_filename: string;
  raw_bytes: number;
  row_count: number;
  quantity: Json;
  mapping: Json;
  created_by: string;
  created_at: Generated<Timestamp>;
}

export interface DatasetRowTable {
  revision_id: string;
  idx: number;
  x: number;
  x_low: number | null;
  x_high: number | null;
  y: number;
  stat_minus: number | null;
  stat_plus: number | null;
  syst_minus: number | null;
  syst_plus: number | null;
}

export interface Database {
  app_user: AppUserTable;
  manuscript: ManuscriptTable;
  membership: MembershipTable;
  invitation: InvitationTable;
  one_time_token: OneTimeTokenTable;
  api_token: ApiTokenTable;
  sign_in_attempt: SignInAttemptTable;
  audit_event: AuditEventTable;
  dataset: DatasetTable;
  dataset_revision: DatasetRevisionTable;
  dataset_row: DatasetRowTable;
}

export type AppUser = Selectable<AppUserTable>;
export type NewAppUser = Insertable<AppUserTable>;
export type AppUserUpdate = Updateable<AppUserTable>;
export type Manuscript = Selectable<ManuscriptTable>;
export type Membership = Selectable<MembershipTable>;
export type Invitation = Selectable<InvitationTable>;
export type ApiToken = Selectable<ApiTokenTable>;
export type AuditEvent = Selectable<AuditEventTable>;
export type Dataset = Selectable<DatasetTable>;
export type DatasetRevision = Selectable<DatasetRevisionTable>;
export type DatasetRow = Selectable<DatasetRowTable>;

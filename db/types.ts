import type { ColumnType, Generated, Insertable, Selectable, Updateable } from "kysely";
import type { MemberRole } from "../app/permissions";

// The typed database interface; kept by hand beside the migrations in db/migrations, and
// compared with the migrated schema by tests/integration/db-types.test.ts.
// Kysely's Generated<> does not unwrap a ColumnType, so the variants are spelled out.
type Timestamp = ColumnType<Date, Date | string, Date | string>;
type GeneratedTimestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type NullableTimestamp = ColumnType<Date | null, Date | string | null | undefined, Date | string | null>;
type Json = ColumnType<unknown, string, string>;
type GeneratedJson = ColumnType<unknown, string | undefined, string>;
type NullableJson = ColumnType<unknown, string | null | undefined, string | null>;

export type SiteRole = "member" | "admin";
export type UserStatus = "pending" | "active" | "disabled";
// The member roles are defined once, beside the permission matrix that gives them meaning.
export type { MemberRole };

export interface AppUserTable {
  id: Generated<string>;
  email: string;
  name: string;
  password_hash: string | null;
  site_role: Generated<SiteRole>;
  status: Generated<UserStatus>;
  email_confirmed_at: NullableTimestamp;
  is_demo: Generated<boolean>;
  created_at: GeneratedTimestamp;
}

export interface ManuscriptTable {
  id: Generated<string>;
  title: string;
  journal: string | null;
  is_demo: Generated<boolean>;
  created_by: string;
  created_at: GeneratedTimestamp;
}

export interface MembershipTable {
  manuscript_id: string;
  user_id: string;
  role: MemberRole;
  added_at: GeneratedTimestamp;
}

export interface InvitationTable {
  id: Generated<string>;
  manuscript_id: string;
  email: string;
  role: MemberRole;
  token_hash: string;
  invited_by: string;
  created_at: GeneratedTimestamp;
  expires_at: Timestamp;
  accepted_at: NullableTimestamp;
  accepted_by: string | null;
}

export interface OneTimeTokenTable {
  id: Generated<string>;
  user_id: string;
  purpose: "confirm-email" | "reset-password";
  token_hash: string;
  created_at: GeneratedTimestamp;
  expires_at: Timestamp;
  used_at: NullableTimestamp;
}

export interface ApiTokenTable {
  id: Generated<string>;
  user_id: string;
  name: string;
  token_hash: string;
  prefix: string;
  created_at: GeneratedTimestamp;
  last_used_at: NullableTimestamp;
  revoked_at: NullableTimestamp;
}

/** A signed-in browser; deleting the row ends the session (docs/decisions/0012-hardening.md). */
export interface UserSessionTable {
  id: Generated<string>;
  user_id: string;
  created_at: GeneratedTimestamp;
  expires_at: Timestamp;
}

export interface SignInAttemptTable {
  id: Generated<number>;
  email: string;
  ip: string;
  succeeded: boolean;
  at: GeneratedTimestamp;
}

export interface AuditEventTable {
  id: Generated<number>;
  at: GeneratedTimestamp;
  actor_id: string | null;
  manuscript_id: string | null;
  action: string;
  detail: GeneratedJson;
  ip: string | null;
}

export interface DatasetTable {
  id: Generated<string>;
  manuscript_id: string;
  name: string;
  quantity: Json;
  mapping: NullableJson;
  process: string | null;
  beam_energy_gev: number | null;
  target: string | null;
  description: Generated<string>;
  is_demo: Generated<boolean>;
  created_by: string;
  created_at: GeneratedTimestamp;
  retired_at: NullableTimestamp;
  retired_by: string | null;
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
  created_at: GeneratedTimestamp;
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

export interface FigureTable {
  id: Generated<string>;
  manuscript_id: string;
  title: string;
  draft: Json;
  draft_revision: Generated<number>;
  is_demo: Generated<boolean>;
  created_by: string;
  created_at: GeneratedTimestamp;
  updated_by: string;
  updated_at: GeneratedTimestamp;
}

export type VersionEventKind = "requested" | "signed-off" | "returned" | "superseded" | "comment";
export type NotificationKind = "requested" | "signed-off" | "returned" | "superseded";

export interface FigureVersionTable {
  id: Generated<string>;
  figure_id: string;
  manuscript_id: string;
  number: number;
  draft_revision: number;
  snapshot: Json;
  svg: string;
  svg_sha256: string;
  fingerprint: string;
  sealed_by: string;
  sealed_at: Timestamp;
}

export interface FigureVersionInputTable {
  version_id: string;
  revision_id: string;
  dataset_id: string;
  revision_number: number;
  content_hash: string;
}

export interface ReviewRequestTable {
  version_id: string;
  reviewer_id: string;
  requested_by: string;
  requested_at: GeneratedTimestamp;
}

export interface VersionEventTable {
  id: Generated<number>;
  version_id: string;
  kind: VersionEventKind;
  actor_id: string;
  reviewer_id: string | null;
  superseded_by: string | null;
  comment: string | null;
  at: GeneratedTimestamp;
}

export interface NotificationTable {
  id: Generated<string>;
  user_id: string;
  kind: NotificationKind;
  manuscript_id: string;
  figure_id: string;
  version_id: string;
  actor_id: string | null;
  subject: string;
  body: string;
  link: string;
  created_at: GeneratedTimestamp;
  read_at: NullableTimestamp;
}

export type ExportState = "queued" | "rendering" | "done" | "failed";

export interface FigureExportTable {
  id: Generated<string>;
  version_id: string;
  manuscript_id: string;
  requested_by: string;
  requested_at: GeneratedTimestamp;
  state: Generated<ExportState>;
  reason: string | null;
  override_reason: string | null;
  preflight: NullableJson;
  files: NullableJson;
  bundle_key: string | null;
  bundle_sha256: string | null;
  attempts: Generated<number>;
  started_at: NullableTimestamp;
  finished_at: NullableTimestamp;
}

export interface Database {
  app_user: AppUserTable;
  manuscript: ManuscriptTable;
  membership: MembershipTable;
  invitation: InvitationTable;
  one_time_token: OneTimeTokenTable;
  api_token: ApiTokenTable;
  user_session: UserSessionTable;
  sign_in_attempt: SignInAttemptTable;
  audit_event: AuditEventTable;
  dataset: DatasetTable;
  dataset_revision: DatasetRevisionTable;
  dataset_row: DatasetRowTable;
  figure: FigureTable;
  figure_version: FigureVersionTable;
  figure_version_input: FigureVersionInputTable;
  review_request: ReviewRequestTable;
  version_event: VersionEventTable;
  notification: NotificationTable;
  figure_export: FigureExportTable;
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
export type Figure = Selectable<FigureTable>;
export type FigureVersion = Selectable<FigureVersionTable>;
export type VersionEvent = Selectable<VersionEventTable>;
export type Notification = Selectable<NotificationTable>;
export type FigureExport = Selectable<FigureExportTable>;

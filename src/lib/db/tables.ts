// One typed row per table, as Knex returns them (snake_case columns).

export type StaffRole = 'admin' | 'therapist';
export type Diagnosis = 'sci' | 'ms' | 'stroke' | 'cerebral_palsy' | 'other';
export type AdRisk = 'at_risk' | 'not_at_risk' | 'unknown';
export type InvitationRole = StaffRole | 'client' | 'carer';

export interface ClinicRow {
  id: string;
  name: string;
  time_zone: string;
  /** Gross efficiency behind energy estimates; null: Kinloop's default. */
  fes_efficiency_pct: string | null;
  /** BCP 47; null takes the default from the time zone (src/lib/time/locale.ts). */
  locale: string | null;
  created_at: Date;
}

export interface UserRow {
  id: string;
  email: string;
  name: string;
  password_hash: string | null;
  disabled_at: Date | null;
  created_at: Date;
  updated_at: Date;
}

export interface MembershipRow {
  id: string;
  user_id: string;
  clinic_id: string;
  role: StaffRole;
  created_at: Date;
}

export interface ClientRow {
  id: string;
  clinic_id: string;
  display_name: string;
  date_of_birth: string | null;
  diagnosis: Diagnosis;
  injury_level: string | null;
  ais_grade: string | null;
  ad_risk: AdRisk;
  time_zone: string;
  body_mass_kg: string | null;
  /** Whether the rider also pedals by their own effort; null when not recorded. */
  volitional_control: boolean | null;
  program_start: string | null;
  user_id: string | null;
  primary_therapist_id: string | null;
  baseline_systolic: number | null;
  archived_at: Date | null;
  created_at: Date;
  updated_at: Date;
}

export interface CarerLinkRow {
  id: string;
  carer_user_id: string;
  client_id: string;
  relationship: string;
  active: boolean;
  created_at: Date;
}

export interface InvitationRow {
  id: string;
  email: string;
  name: string | null;
  role: InvitationRole;
  clinic_id: string;
  client_id: string | null;
  relationship: string | null;
  token_hash: string;
  invited_by: string;
  expires_at: Date;
  accepted_at: Date | null;
  accepted_user_id: string | null;
  revoked_at: Date | null;
  created_at: Date;
}

export interface PasswordResetRow {
  id: string;
  user_id: string;
  token_hash: string;
  expires_at: Date;
  used_at: Date | null;
  /** Withdrawn by a newer link or a new password. */
  revoked_at: Date | null;
  created_at: Date;
}

export interface AuthSessionRow {
  id: string;
  user_id: string;
  created_at: Date;
  last_seen_at: Date;
  expires_at: Date;
  revoked_at: Date | null;
  ip: string | null;
  user_agent: string | null;
}

export interface SignInAttemptRow {
  id: string;
  email: string;
  ip: string;
  succeeded: boolean;
  /** The trusted device of the account the attempt came from, if any. */
  device: string | null;
  attempted_at: Date;
}

export interface AuditRow {
  id: string;
  at: Date;
  actor_user_id: string | null;
  action: string;
  clinic_id: string | null;
  client_id: string | null;
  record_type: string | null;
  record_id: string | null;
  ip: string | null;
  user_agent: string | null;
  detail: Record<string, unknown>;
}

export interface OutboxEmailRow {
  id: string;
  kind: string;
  user_id: string | null;
  to_address: string;
  subject: string;
  text_body: string;
  html_body: string;
  headers: Record<string, string>;
  attempts: number;
  next_attempt_at: Date;
  last_error: string | null;
  sent_at: Date | null;
  dedupe_key: string | null;
  created_at: Date;
}

export type UploadStatus = 'queued' | 'accepted' | 'duplicate' | 'rejected' | 'failed';

export interface UploadRow {
  id: string;
  client_id: string;
  clinic_id: string;
  uploaded_by: string;
  original_name: string;
  byte_size: string;
  sha256: string;
  storage_key: string;
  status: UploadStatus;
  error: { code: string; message: string; line?: number } | null;
  warnings: string[];
  duplicate_of_upload_id: string | null;
  duplicate_of_ride_id: string | null;
  ride_id: string | null;
  import_profile_id: string | null;
  fallback_started_at: Date | null;
  uploaded_at: Date;
  enqueued_at: Date | null;
  processed_at: Date | null;
  attempts: number;
}

export type StartedAtSource = 'file' | 'file_modified' | 'upload_time';

export interface RideRow {
  id: string;
  client_id: string;
  clinic_id: string;
  upload_id: string;
  device_id: string | null;
  started_at: Date;
  started_at_source: StartedAtSource;
  duration_s: number;
  active_s: number;
  passive_s: number;
  cooldown_s: number;
  distance_m: number | null;
  mean_power_w: number | null;
  peak_power_5s_w: number | null;
  work_kj: number | null;
  mean_cadence_rpm: number | null;
  current_per_watt_ma_per_w: number | null;
  pulse_width_us: number | null;
  frequency_hz: number | null;
  samples: number;
  channels: Record<string, { meanCurrentMa: number | null; maxCurrentMa: number | null }>;
  warnings: string[];
  created_at: Date;
  updated_at: Date;
}

export interface ImportProfileRow {
  id: string;
  clinic_id: string;
  name: string;
  device_name: string | null;
  mapping: import('../rides/types').ImportProfile;
  created_by: string | null;
  created_at: Date;
  updated_at: Date;
  archived_at: Date | null;
}

export interface DeviceRow {
  id: string;
  clinic_id: string;
  serial: string;
  name: string | null;
  import_profile_id: string | null;
  created_at: Date;
}

export interface ChannelLimits {
  maxCurrentMa?: number;
  pulseWidthUs?: number;
  frequencyHz?: number;
}

export interface PrescriptionRow {
  id: string;
  client_id: string;
  version: number;
  effective_from: string;
  sessions_per_week: number;
  minutes_per_session: number;
  warmup_minutes: number | null;
  target_cadence_rpm: number | null;
  cadence_tolerance_rpm: number | null;
  resistance: number | null;
  channels: Record<string, ChannelLimits>;
  notes: string | null;
  created_by: string;
  created_at: Date;
}

export interface PauseRow {
  id: string;
  client_id: string;
  starts_on: string;
  ends_on: string;
  reason: string;
  created_by: string;
  created_at: Date;
  ended_at: Date | null;
  ended_by: string | null;
  cancelled_at: Date | null;
}

export interface FlagRow {
  id: string;
  client_id: string;
  clinic_id: string;
  kind: import('../flags/types').FlagKind;
  severity: import('../flags/types').FlagSeverity;
  state: import('../flags/types').FlagState;
  anchor: string;
  reason: string;
  evidence: unknown;
  raised_at: Date;
  updated_at: Date;
  cleared_at: Date | null;
  snoozed_until: string | null;
  closed_at: Date | null;
}

export interface FlagEventRow {
  id: string;
  flag_id: string;
  at: Date;
  actor_user_id: string | null;
  action: string;
  note: string | null;
  detail: Record<string, unknown>;
}

export interface ClientNoteRow {
  id: string;
  client_id: string;
  author_id: string;
  body: string;
  created_at: Date;
}

export interface CheckRow {
  id: string;
  client_id: string;
  clinic_id: string;
  recorded_by: string;
  taken_at: Date;
  ride_id: string | null;
  bp_before_systolic: number | null;
  bp_before_diastolic: number | null;
  bp_during_systolic: number | null;
  bp_during_diastolic: number | null;
  bp_after_systolic: number | null;
  bp_after_diastolic: number | null;
  bp_after_minutes: number | null;
  heart_rate_before: number | null;
  heart_rate_after: number | null;
  ad_symptoms: string[];
  other_events: string[];
  skin: { site: string; state: string }[];
  effort: number | null;
  comment: string | null;
  evaluation: Record<string, unknown>;
  created_at: Date;
}

export interface DistanceGoalRow {
  id: string;
  client_id: string;
  builtin_route_id: string | null;
  custom_route: import('../goals/route').Route | null;
  count_from: string;
  chosen_by: string;
  created_at: Date;
  replaced_at: Date | null;
}

export interface NotificationPreferencesRow {
  user_id: string;
  reminders: boolean;
  weekly_summary: boolean;
  daily_digest: boolean;
  urgent_alerts: boolean;
  unsubscribe_token: string;
  updated_at: Date;
}

export type MonitoringActivity = 'review' | 'phone_call' | 'message' | 'report';

export interface MonitoringEntryRow {
  id: string;
  clinic_id: string;
  client_id: string;
  staff_user_id: string;
  activity: MonitoringActivity;
  source: 'timer' | 'manual';
  started_at: Date;
  seconds: number;
  note: string | null;
  created_at: Date;
}

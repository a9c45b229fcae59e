/**
 * Table shapes as Kysely sees them. The same schema serves SQLite and PostgreSQL, so it keeps to
 * types both store alike: text, bigint (integer in SQLite), double precision (real in SQLite).
 * Times are epoch milliseconds in `*_ms` columns: integers order and compare the same everywhere.
 * Flags are integers 0/1 because SQLite has no boolean.
 */
import type { Generated } from 'kysely';

export interface ChannelsTable {
  id: string;
  platform: string;
  team_id: string;
  channel_id: string;
  unit_system: string;
  summary_local_time: string | null;
  active: number;
  created_at_ms: number;
  updated_at_ms: number;
}

export interface PlacesTable {
  id: string;
  channel_ref: string;
  name: string;
  /** Normalised name; unique per channel so "Ridge Camp" and "ridge camp" are one place. */
  name_key: string;
  latitude_deg: number;
  longitude_deg: number;
  elevation_m: number | null;
  time_zone: string | null;
  created_at_ms: number;
}

export interface WatchesTable {
  id: string;
  channel_ref: string;
  location_key: string;
  place_name: string | null;
  latitude_deg: number;
  longitude_deg: number;
  elevation_m: number | null;
  time_zone: string | null;
  created_by: string;
  created_at_ms: number;
  active: number;
  last_alert_check_at_ms: number | null;
  last_summary_local_date: string | null;
}

export interface RuleOverridesTable {
  channel_ref: string;
  rule_id: string;
  threshold_value: number;
  hysteresis_value: number | null;
  updated_at_ms: number;
}

export interface MutesTable {
  channel_ref: string;
  rule_id: string;
  location_key: string;
  until_ms: number;
  created_at_ms: number;
}

export interface AlertHistoryTable {
  crossing_key: string;
  location_key: string;
  rule_id: string;
  valid_local_day: string;
  direction: string;
  valid_time: string;
  value: number;
  effective_depth_m: number | null;
  revision: number;
  first_announced_at_ms: number;
  last_announced_at_ms: number;
}

export interface OutboxTable {
  id: string;
  dedupe_key: string;
  kind: string;
  platform: string;
  team_id: string;
  channel_id: string;
  payload_json: string;
  created_at_ms: number;
  attempts: Generated<number>;
  next_attempt_at_ms: number;
  claimed_by: string | null;
  claim_expires_at_ms: number | null;
  sent_at_ms: number | null;
  platform_message_id: string | null;
  last_error: string | null;
  abandoned_at_ms: number | null;
}

export interface JobClaimsTable {
  job_key: string;
  claimed_by: string;
  claim_expires_at_ms: number;
  done_at_ms: number | null;
  created_at_ms: number;
}

export interface StoreDatabase {
  channels: ChannelsTable;
  places: PlacesTable;
  watches: WatchesTable;
  rule_overrides: RuleOverridesTable;
  mutes: MutesTable;
  alert_history: AlertHistoryTable;
  outbox: OutboxTable;
  job_claims: JobClaimsTable;
}

/** Database rows to API records: snake_case to camelCase, 0/1 to booleans, JSON text to values. */
import type { Selectable } from 'kysely';
import type {
  AlertHistoryTable,
  ChannelsTable,
  JobClaimsTable,
  MutesTable,
  OutboxTable,
  PlacesTable,
  RuleOverridesTable,
  WatchesTable,
} from './databaseSchema.ts';
import type {
  AlertRecord,
  Channel,
  CrossingDirection,
  Mute,
  OutboxItem,
  OutboxKind,
  Platform,
  RuleOverride,
  SavedPlace,
  UnitSystem,
  Watch,
} from './storeTypes.ts';

export function toChannel(row: Selectable<ChannelsTable>): Channel {
  return {
    id: row.id,
    platform: row.platform as Platform,
    teamId: row.team_id,
    channelId: row.channel_id,
    unitSystem: row.unit_system as UnitSystem,
    summaryLocalTime: row.summary_local_time,
    active: Number(row.active) === 1,
    createdAtMs: Number(row.created_at_ms),
    updatedAtMs: Number(row.updated_at_ms),
  };
}

export function toSavedPlace(row: Selectable<PlacesTable>): SavedPlace {
  return {
    id: row.id,
    channelRef: row.channel_ref,
    name: row.name,
    latitudeDeg: row.latitude_deg,
    longitudeDeg: row.longitude_deg,
    elevationM: row.elevation_m,
    timeZone: row.time_zone,
    createdAtMs: Number(row.created_at_ms),
  };
}

export function toWatch(row: Selectable<WatchesTable>): Watch {
  return {
    id: row.id,
    channelRef: row.channel_ref,
    locationKey: row.location_key,
    placeName: row.place_name,
    latitudeDeg: row.latitude_deg,
    longitudeDeg: row.longitude_deg,
    elevationM: row.elevation_m,
    timeZone: row.time_zone,
    createdBy: row.created_by,
    createdAtMs: Number(row.created_at_ms),
    active: Number(row.active) === 1,
    lastAlertCheckAtMs: row.last_alert_check_at_ms === null ? null : Number(row.last_alert_check_at_ms),
    lastSummaryLocalDate: row.last_summary_local_date,
  };
}

export function toRuleOverride(row: Selectable<RuleOverridesTable>): RuleOverride {
  return {
    channelRef: row.channel_ref,
    ruleId: row.rule_id,
    thresholdValue: row.threshold_value,
    hysteresisValue: row.hysteresis_value,
    updatedAtMs: Number(row.updated_at_ms),
  };
}

export function toMute(row: Selectable<MutesTable>): Mute {
  return {
    channelRef: row.channel_ref,
    ruleId: row.rule_id,
    locationKey: row.location_key,
    untilMs: Number(row.until_ms),
    createdAtMs: Number(row.created_at_ms),
  };
}

export function toAlertRecord(row: Selectable<AlertHistoryTable>): AlertRecord {
  return {
    crossingKey: row.crossing_key,
    locationKey: row.location_key,
    ruleId: row.rule_id,
    validLocalDay: row.valid_local_day,
    direction: row.direction as CrossingDirection,
    validTime: row.valid_time,
    value: row.value,
    effectiveDepthM: row.effective_depth_m,
    revision: Number(row.revision),
    firstAnnouncedAtMs: Number(row.first_announced_at_ms),
    lastAnnouncedAtMs: Number(row.last_announced_at_ms),
  };
}

export function toOutboxItem(row: Selectable<OutboxTable>): OutboxItem {
  return {
    id: row.id,
    dedupeKey: row.dedupe_key,
    kind: row.kind as OutboxKind,
    target: { platform: row.platform as Platform, teamId: row.team_id, channelId: row.channel_id },
    payload: JSON.parse(row.payload_json) as unknown,
    createdAtMs: Number(row.created_at_ms),
    attempts: Number(row.attempts),
    nextAttemptAtMs: Number(row.next_attempt_at_ms),
    claimedBy: row.claimed_by,
    claimExpiresAtMs: row.claim_expires_at_ms === null ? null : Number(row.claim_expires_at_ms),
    sentAtMs: row.sent_at_ms === null ? null : Number(row.sent_at_ms),
    platformMessageId: row.platform_message_id,
    lastError: row.last_error,
    abandonedAtMs: row.abandoned_at_ms === null ? null : Number(row.abandoned_at_ms),
  };
}

export type JobClaimRow = Selectable<JobClaimsTable>;

/** Version 1: every table of the store. Written once the same way for SQLite and PostgreSQL. */
import { sql, type Expression, type Kysely, type Migration } from 'kysely';

export const migration001InitialSchema: Migration = {
  async up(db: Kysely<any>): Promise<void> {
    await db.schema
      .createTable('channels')
      .addColumn('id', 'text', (c) => c.primaryKey())
      .addColumn('platform', 'text', (c) => c.notNull())
      .addColumn('team_id', 'text', (c) => c.notNull())
      .addColumn('channel_id', 'text', (c) => c.notNull())
      .addColumn('unit_system', 'text', (c) => c.notNull().check(sqlIn('unit_system', ['metric', 'us'])))
      .addColumn('summary_local_time', 'text')
      .addColumn('active', 'integer', (c) => c.notNull().defaultTo(1))
      .addColumn('created_at_ms', 'bigint', (c) => c.notNull())
      .addColumn('updated_at_ms', 'bigint', (c) => c.notNull())
      .addUniqueConstraint('channels_target_unique', ['platform', 'team_id', 'channel_id'])
      .execute();

    await db.schema
      .createTable('places')
      .addColumn('id', 'text', (c) => c.primaryKey())
      .addColumn('channel_ref', 'text', (c) => c.notNull().references('channels.id'))
      .addColumn('name', 'text', (c) => c.notNull())
      .addColumn('name_key', 'text', (c) => c.notNull())
      .addColumn('latitude_deg', 'double precision', (c) => c.notNull())
      .addColumn('longitude_deg', 'double precision', (c) => c.notNull())
      .addColumn('elevation_m', 'double precision')
      .addColumn('time_zone', 'text')
      .addColumn('created_at_ms', 'bigint', (c) => c.notNull())
      .addUniqueConstraint('places_name_unique', ['channel_ref', 'name_key'])
      .execute();

    await db.schema
      .createTable('watches')
      .addColumn('id', 'text', (c) => c.primaryKey())
      .addColumn('channel_ref', 'text', (c) => c.notNull().references('channels.id'))
      .addColumn('location_key', 'text', (c) => c.notNull())
      .addColumn('place_name', 'text')
      .addColumn('latitude_deg', 'double precision', (c) => c.notNull())
      .addColumn('longitude_deg', 'double precision', (c) => c.notNull())
      .addColumn('elevation_m', 'double precision')
      .addColumn('time_zone', 'text')
      .addColumn('created_by', 'text', (c) => c.notNull())
      .addColumn('created_at_ms', 'bigint', (c) => c.notNull())
      .addColumn('active', 'integer', (c) => c.notNull().defaultTo(1))
      .addColumn('last_alert_check_at_ms', 'bigint')
      .addColumn('last_summary_local_date', 'text')
      .addUniqueConstraint('watches_location_unique', ['channel_ref', 'location_key'])
      .execute();
    await db.schema.createIndex('watches_by_location').on('watches').columns(['location_key', 'active']).execute();

    await db.schema
      .createTable('rule_overrides')
      .addColumn('channel_ref', 'text', (c) => c.notNull().references('channels.id'))
      .addColumn('rule_id', 'text', (c) => c.notNull())
      .addColumn('threshold_value', 'double precision', (c) => c.notNull())
      .addColumn('hysteresis_value', 'double precision')
      .addColumn('updated_at_ms', 'bigint', (c) => c.notNull())
      .addPrimaryKeyConstraint('rule_overrides_pk', ['channel_ref', 'rule_id'])
      .execute();

    await db.schema
      .createTable('mutes')
      .addColumn('channel_ref', 'text', (c) => c.notNull().references('channels.id'))
      .addColumn('rule_id', 'text', (c) => c.notNull())
      .addColumn('location_key', 'text', (c) => c.notNull())
      .addColumn('until_ms', 'bigint', (c) => c.notNull())
      .addColumn('created_at_ms', 'bigint', (c) => c.notNull())
      .addPrimaryKeyConstraint('mutes_pk', ['channel_ref', 'rule_id', 'location_key'])
      .execute();

    await db.schema
      .createTable('alert_history')
      .addColumn('crossing_key', 'text', (c) => c.primaryKey())
      .addColumn('location_key', 'text', (c) => c.notNull())
      .addColumn('rule_id', 'text', (c) => c.notNull())
      .addColumn('valid_local_day', 'text', (c) => c.notNull())
      .addColumn('direction', 'text', (c) => c.notNull())
      .addColumn('valid_time', 'text', (c) => c.notNull())
      .addColumn('value', 'double precision', (c) => c.notNull())
      .addColumn('effective_depth_m', 'double precision')
      .addColumn('revision', 'integer', (c) => c.notNull().defaultTo(0))
      .addColumn('first_announced_at_ms', 'bigint', (c) => c.notNull())
      .addColumn('last_announced_at_ms', 'bigint', (c) => c.notNull())
      .execute();

    await db.schema
      .createTable('outbox')
      .addColumn('id', 'text', (c) => c.primaryKey())
      .addColumn('dedupe_key', 'text', (c) => c.notNull().unique())
      .addColumn('kind', 'text', (c) => c.notNull())
      .addColumn('platform', 'text', (c) => c.notNull())
      .addColumn('team_id', 'text', (c) => c.notNull())
      .addColumn('channel_id', 'text', (c) => c.notNull())
      .addColumn('payload_json', 'text', (c) => c.notNull())
      .addColumn('created_at_ms', 'bigint', (c) => c.notNull())
      .addColumn('attempts', 'integer', (c) => c.notNull().defaultTo(0))
      .addColumn('next_attempt_at_ms', 'bigint', (c) => c.notNull())
      .addColumn('claimed_by', 'text')
      .addColumn('claim_expires_at_ms', 'bigint')
      .addColumn('sent_at_ms', 'bigint')
      .addColumn('platform_message_id', 'text')
      .addColumn('last_error', 'text')
      .addColumn('abandoned_at_ms', 'bigint')
      .execute();
    // The claim query scans unsent rows by due time; sent rows pile up and must not slow it.
    await db.schema
      .createIndex('outbox_due')
      .on('outbox')
      .columns(['sent_at_ms', 'abandoned_at_ms', 'next_attempt_at_ms'])
      .execute();

    await db.schema
      .createTable('job_claims')
      .addColumn('job_key', 'text', (c) => c.primaryKey())
      .addColumn('claimed_by', 'text', (c) => c.notNull())
      .addColumn('claim_expires_at_ms', 'bigint', (c) => c.notNull())
      .addColumn('done_at_ms', 'bigint')
      .addColumn('created_at_ms', 'bigint', (c) => c.notNull())
      .execute();
  },

  async down(db: Kysely<any>): Promise<void> {
    for (const table of ['job_claims', 'outbox', 'alert_history', 'mutes', 'rule_overrides', 'watches', 'places', 'channels']) {
      await db.schema.dropTable(table).ifExists().execute();
    }
  },
};

/** A CHECK expression `column IN ('a', 'b')`, with the values as literals both dialects accept. */
function sqlIn(column: string, values: string[]): Expression<any> {
  return sql`${sql.ref(column)} in (${sql.join(values.map((v) => sql.lit(v)))})`;
}

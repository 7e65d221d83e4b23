import type { Knex } from 'knex';

// Daily range partitions for the time-partitioned signal tables (samples, histogram_points),
// made on demand before a write and ahead of time by the maintenance job. The advisory lock makes
// two sessions creating the same day at once wait for each other instead of failing.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE FUNCTION signals_ensure_day_partition(parent text, day date) RETURNS boolean
    LANGUAGE plpgsql AS $$
    DECLARE part text := parent || '_p' || to_char(day, 'YYYYMMDD');
    BEGIN
      IF to_regclass(part) IS NOT NULL THEN RETURN false; END IF;
      PERFORM pg_advisory_xact_lock(hashtext('signals_partition:' || part));
      IF to_regclass(part) IS NOT NULL THEN RETURN false; END IF;
      EXECUTE format('CREATE TABLE %I PARTITION OF %I FOR VALUES FROM (%L) TO (%L)',
        part, parent, (day::timestamp AT TIME ZONE 'UTC'), ((day + 1)::timestamp AT TIME ZONE 'UTC'));
      RETURN true;
    END $$`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP FUNCTION signals_ensure_day_partition(text, date)');
}

import type { Knex } from 'knex';

// Runs and their step results, range-partitioned by slot time (one partition a day, made on
// demand by ensure_run_partitions) so retention is dropping whole partitions.
// (journey, vantage, slot) is unique: a retried or duplicated job cannot store a second run.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TABLE runs (
      id bigint GENERATED ALWAYS AS IDENTITY,
      journey_id bigint NOT NULL,
      version integer NOT NULL,
      vantage text NOT NULL,
      slot_at timestamptz NOT NULL,
      trigger text NOT NULL DEFAULT 'schedule' CHECK (trigger IN ('schedule', 'missed')),
      started_at timestamptz,
      finished_at timestamptz,
      verdict text NOT NULL CHECK (verdict IN ('pass', 'fail', 'void')),
      failure_class text,
      failed_step integer,
      void_reason text,
      duration_ms double precision,
      lateness_ms double precision,
      PRIMARY KEY (id, slot_at),
      UNIQUE (journey_id, vantage, slot_at)
    ) PARTITION BY RANGE (slot_at)`);
  await knex.raw('CREATE INDEX runs_journey_slot_idx ON runs (journey_id, slot_at DESC)');
  await knex.raw(`
    CREATE TABLE step_results (
      run_id bigint NOT NULL,
      slot_at timestamptz NOT NULL,
      idx integer NOT NULL,
      name text NOT NULL,
      method text NOT NULL,
      url text NOT NULL,
      passed boolean NOT NULL,
      http_status integer,
      timings jsonb NOT NULL,
      total_ms double precision NOT NULL,
      redirects jsonb NOT NULL DEFAULT '[]',
      trace_id text NOT NULL,
      assertions jsonb NOT NULL DEFAULT '[]',
      captures jsonb NOT NULL DEFAULT '{}',
      failure_class text,
      error text,
      response_excerpt text,
      PRIMARY KEY (run_id, idx, slot_at)
    ) PARTITION BY RANGE (slot_at)`);
  // Creates the daily partitions covering [from_ts, to_ts) for both tables; safe to call twice.
  await knex.raw(`
    CREATE FUNCTION ensure_run_partitions(from_ts timestamptz, to_ts timestamptz) RETURNS void
    LANGUAGE plpgsql AS $$
    DECLARE d date := (from_ts AT TIME ZONE 'UTC')::date;
    BEGIN
      WHILE d <= (to_ts AT TIME ZONE 'UTC')::date LOOP
        EXECUTE format('CREATE TABLE IF NOT EXISTS %I PARTITION OF runs FOR VALUES FROM (%L) TO (%L)',
          'runs_' || to_char(d, 'YYYYMMDD'), (d::timestamp AT TIME ZONE 'UTC'), ((d + 1)::timestamp AT TIME ZONE 'UTC'));
        EXECUTE format('CREATE TABLE IF NOT EXISTS %I PARTITION OF step_results FOR VALUES FROM (%L) TO (%L)',
          'step_results_' || to_char(d, 'YYYYMMDD'), (d::timestamp AT TIME ZONE 'UTC'), ((d + 1)::timestamp AT TIME ZONE 'UTC'));
        d := d + 1;
      END LOOP;
    END $$`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP FUNCTION ensure_run_partitions(timestamptz, timestamptz)');
  await knex.raw('DROP TABLE step_results');
  await knex.raw('DROP TABLE runs');
}

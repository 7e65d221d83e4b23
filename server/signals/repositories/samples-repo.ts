// Writing samples and histogram points. Samples travel as PostgreSQL's binary COPY format
// (pg-copy-streams): nothing to turn into text and back for 10 000 ids, timestamps and values.
// Measured from Node on a quiet machine with bench/ingest.ts's batches, a batch took 25–29 ms by
// COPY against 47–50 ms by the INSERT … SELECT FROM unnest(text arrays) it replaced, and 44–56 ms
// through a staging table. PostgreSQL's own CPU time per batch hardly moved (37–39 ms before,
// 32–42 ms after: the rows, index entries and WAL are the same); what went is mostly Node's work
// of writing 30 000 values as text. COPY has no ON CONFLICT, so new rows are copied straight
// into samples inside a savepoint, and only a batch that turns out to hold stored points goes
// through a temporary staging table and one INSERT … ON CONFLICT DO NOTHING on (series_id, t),
// which makes a re-sent point change nothing. Histogram points (arrays of arrays) are one
// multi-row INSERT from unnest.
import type { Knex } from 'knex';
import type { PoolClient } from 'pg';
import { from as copyFrom } from 'pg-copy-streams';

export interface SampleRows {
  seriesIds: number[];
  /** ms since the epoch (fractions keep microseconds). */
  times: number[];
  values: number[];
}

export interface HistogramRows {
  seriesIds: number[];
  times: number[];
  bounds: number[][];
  counts: number[][];
  sums: (number | null)[];
  totals: number[];
}

export interface LastSample {
  seriesId: number;
  t: number;
  value: number;
}

export interface LastHistogram {
  seriesId: number;
  t: number;
  bounds: number[];
  counts: number[];
  sum: number | null;
  count: number;
}

const pgArray = (xs: number[]) => `{${xs.join(',')}}`;

// PostgreSQL binary COPY ("COPY", File Formats, Binary Format): an 11-byte signature, 32-bit flags
// and header-extension length, then per row a 16-bit field count and per field a 32-bit length and
// the value in network byte order; a field count of -1 ends the data. bigint and float8 are 8 bytes;
// timestamptz is 8 bytes of microseconds since 2000-01-01 00:00 UTC.
const COPY_SIGNATURE = Buffer.from('PGCOPY\n\xff\r\n\0', 'latin1');
const PG_EPOCH_S = 946_684_800;
const TWO_32 = 4_294_967_296;

/**
 * ms → microseconds since 2000 with the same float8 arithmetic as SQL's to_timestamp(ms / 1000.0)
 * (PostgreSQL's float8_timestamptz: seconds minus the epoch difference, times 10^6, rint), so a
 * point written here and one compared or written through to_timestamp (delta accumulation,
 * histograms) land on the same instant, to the last microsecond.
 */
function pgMicros(ms: number): number {
  const x = (ms / 1000 - PG_EPOCH_S) * 1_000_000;
  let r = Math.round(x);
  // rint rounds halves to even; Math.round rounds them up.
  if (r - x === 0.5 && r % 2 !== 0) r -= 1;
  return r;
}

const SAMPLE_ROW_BYTES = 2 + 3 * (4 + 8);

/** Rows as binary COPY data for (series_id bigint, t timestamptz, value float8). */
export function encodeSampleCopy(rows: SampleRows): Buffer {
  const n = rows.seriesIds.length;
  const buf = Buffer.allocUnsafe(COPY_SIGNATURE.length + 8 + n * SAMPLE_ROW_BYTES + 2);
  let o = COPY_SIGNATURE.copy(buf, 0);
  o = buf.writeInt32BE(0, o);
  o = buf.writeInt32BE(0, o);
  for (let i = 0; i < n; i++) {
    o = buf.writeInt16BE(3, o);
    // Two 32-bit halves: ids and microsecond times stay below 2^53, so no BigInt per row.
    const id = rows.seriesIds[i]!;
    o = buf.writeInt32BE(8, o);
    o = buf.writeInt32BE(Math.floor(id / TWO_32), o);
    o = buf.writeUInt32BE(id % TWO_32, o);
    const us = pgMicros(rows.times[i]!);
    const hi = Math.floor(us / TWO_32);
    o = buf.writeInt32BE(8, o);
    o = buf.writeInt32BE(hi, o);
    o = buf.writeUInt32BE(us - hi * TWO_32, o);
    o = buf.writeInt32BE(8, o);
    o = buf.writeDoubleBE(rows.values[i]!, o);
  }
  buf.writeInt16BE(-1, o);
  return buf;
}

/** The connection a Knex transaction runs on (pg-copy-streams needs the pg client itself). */
async function connectionOf(tx: Knex.Transaction): Promise<PoolClient> {
  return (await tx.client.acquireConnection()) as PoolClient;
}

/** COPY … FROM STDIN with the whole data in one write; resolves with the rows copied. */
async function copyIn(tx: Knex.Transaction, sql: string, data: Buffer): Promise<number> {
  const conn = await connectionOf(tx);
  const stream = conn.query(copyFrom(sql));
  await new Promise<void>((resolve, reject) => {
    stream.on('finish', resolve);
    stream.on('error', reject);
    stream.end(data);
  });
  return stream.rowCount;
}

const copySamples = (tx: Knex.Transaction, data: Buffer) => copyIn(tx, 'COPY samples (series_id, t, value) FROM STDIN (FORMAT binary)', data);

/**
 * COPY has no ON CONFLICT: the rows go into a temporary table dropped at commit, then one INSERT
 * skips the (series_id, t) pairs already stored.
 */
async function insertSkippingExisting(tx: Knex.Transaction, data: Buffer): Promise<number> {
  // IF NOT EXISTS + TRUNCATE: a second call in the same transaction finds the table still there.
  await tx.raw(
    'CREATE TEMP TABLE IF NOT EXISTS samples_staging (series_id bigint NOT NULL, t timestamptz NOT NULL, value double precision NOT NULL) ON COMMIT DROP; TRUNCATE samples_staging',
  );
  await copyIn(tx, 'COPY samples_staging (series_id, t, value) FROM STDIN (FORMAT binary)', data);
  const r = await tx.raw('INSERT INTO samples (series_id, t, value) SELECT series_id, t, value FROM samples_staging ON CONFLICT DO NOTHING');
  return r.rowCount ?? 0;
}

export const samplesRepo = {
  /**
   * Stores the rows inside the caller's transaction and returns how many were new. Points are
   * almost always new, so they are first copied straight into samples inside a savepoint; only
   * when some already exist (a retried export, a re-uploaded file) is that undone and the rows
   * stored skipping them.
   */
  async insertSamples(tx: Knex.Transaction, rows: SampleRows): Promise<number> {
    if (rows.seriesIds.length === 0) return 0;
    const data = encodeSampleCopy(rows);
    await tx.raw('SAVEPOINT samples_copy');
    try {
      const n = await copySamples(tx, data);
      await tx.raw('RELEASE SAVEPOINT samples_copy');
      return n;
    } catch (e) {
      if ((e as { code?: string }).code !== '23505') throw e;
      await tx.raw('ROLLBACK TO SAVEPOINT samples_copy');
      return insertSkippingExisting(tx, data);
    }
  },

  /** COPY straight into samples; fails with a unique violation (23505) if any point is stored. */
  async copySamples(tx: Knex.Transaction, rows: SampleRows): Promise<number> {
    return rows.seriesIds.length ? copySamples(tx, encodeSampleCopy(rows)) : 0;
  },

  /** The rows through a staging table and INSERT … ON CONFLICT DO NOTHING; returns how many were new. */
  async insertSamplesSkippingExisting(tx: Knex.Transaction, rows: SampleRows): Promise<number> {
    return rows.seriesIds.length ? insertSkippingExisting(tx, encodeSampleCopy(rows)) : 0;
  },

  async insertHistograms(db: Knex, rows: HistogramRows): Promise<number> {
    if (rows.seriesIds.length === 0) return 0;
    // Arrays of arrays cannot be unnested one level, so each row's arrays travel as array literals.
    const r = await db.raw(
      `INSERT INTO histogram_points (series_id, t, bounds, counts, sum, count)
       SELECT s, to_timestamp(ms / 1000.0), b::float8[], c::bigint[], sm, n
       FROM unnest(?::bigint[], ?::float8[], ?::text[], ?::text[], ?::float8[], ?::bigint[]) AS u(s, ms, b, c, sm, n)
       ON CONFLICT DO NOTHING`,
      [rows.seriesIds, rows.times, rows.bounds.map(pgArray), rows.counts.map(pgArray), rows.sums as number[], rows.totals],
    );
    return r.rowCount ?? 0;
  },

  /** The newest sample of each series (for accumulating delta points). */
  async lastSamples(db: Knex, seriesIds: number[]): Promise<Map<number, LastSample>> {
    if (seriesIds.length === 0) return new Map();
    const rows = (
      await db.raw(
        `SELECT u.id AS series_id, extract(epoch FROM x.t) * 1000 AS ms, x.value
         FROM unnest(?::bigint[]) AS u(id)
         CROSS JOIN LATERAL (SELECT t, value FROM samples WHERE series_id = u.id ORDER BY t DESC LIMIT 1) x`,
        [seriesIds],
      )
    ).rows as { series_id: number; ms: string; value: number }[];
    return new Map(rows.map((r) => [r.series_id, { seriesId: r.series_id, t: Number(r.ms), value: r.value }]));
  },

  async lastHistograms(db: Knex, seriesIds: number[]): Promise<Map<number, LastHistogram>> {
    if (seriesIds.length === 0) return new Map();
    const rows = (
      await db.raw(
        `SELECT u.id AS series_id, extract(epoch FROM x.t) * 1000 AS ms, x.bounds, x.counts, x.sum, x.count
         FROM unnest(?::bigint[]) AS u(id)
         CROSS JOIN LATERAL (SELECT * FROM histogram_points WHERE series_id = u.id ORDER BY t DESC LIMIT 1) x`,
        [seriesIds],
      )
    ).rows as { series_id: number; ms: string; bounds: number[]; counts: (string | number)[]; sum: number | null; count: number }[];
    return new Map(
      rows.map((r) => [
        r.series_id,
        { seriesId: r.series_id, t: Number(r.ms), bounds: r.bounds, counts: r.counts.map(Number), sum: r.sum, count: Number(r.count) },
      ]),
    );
  },

  /** Which (series, t) pairs are already stored, as `${seriesId}:${ms}` keys. */
  async existingTimes(db: Knex, table: 'samples' | 'histogram_points', seriesIds: number[], times: number[]): Promise<Set<string>> {
    if (seriesIds.length === 0) return new Set();
    const rows = (
      await db.raw(
        `SELECT u.s AS series_id, u.ms FROM unnest(?::bigint[], ?::float8[]) AS u(s, ms)
         WHERE EXISTS (SELECT 1 FROM ${table} x WHERE x.series_id = u.s AND x.t = to_timestamp(u.ms / 1000.0))`,
        [seriesIds, times],
      )
    ).rows as { series_id: number; ms: number }[];
    return new Set(rows.map((r) => `${r.series_id}:${r.ms}`));
  },
};

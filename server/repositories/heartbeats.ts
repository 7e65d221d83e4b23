import type { Knex } from 'knex';

export interface HeartbeatRow {
  name: string;
  host: string;
  pid: number;
  startedAt: Date;
  lastBeatAt: Date;
  beatSeconds: number;
}

export const heartbeatsRepo = {
  async beat(db: Knex, hb: HeartbeatRow): Promise<void> {
    await db('worker_heartbeats')
      .insert({
        name: hb.name,
        host: hb.host,
        pid: hb.pid,
        started_at: hb.startedAt,
        last_beat_at: hb.lastBeatAt,
        beat_seconds: hb.beatSeconds,
      })
      .onConflict('name')
      .merge();
  },
  async list(db: Knex): Promise<HeartbeatRow[]> {
    const rows = await db('worker_heartbeats').orderBy('name');
    return rows.map((r) => ({
      name: r.name,
      host: r.host,
      pid: r.pid,
      startedAt: r.started_at,
      lastBeatAt: r.last_beat_at,
      beatSeconds: r.beat_seconds,
    }));
  },
};

import type { Knex } from 'knex';
import { replaceSecrets } from '../../shared/journey/redact';
import type { RunResult } from '../../shared/journey/run-result';
import type { RunSummary } from '../../shared/schemas/journeys';

export interface RunKey {
  journeyId: number;
  version: number;
  vantage: string;
  slotAt: Date;
}

function toSummary(r: Record<string, any>): RunSummary {
  return {
    id: r.id,
    journeyId: r.journey_id,
    version: r.version,
    vantage: r.vantage,
    slotAt: r.slot_at.toISOString(),
    startedAt: r.started_at?.toISOString() ?? null,
    finishedAt: r.finished_at?.toISOString() ?? null,
    verdict: r.verdict,
    failureClass: r.failure_class,
    failedStep: r.failed_step,
    voidReason: r.void_reason,
    durationMs: r.duration_ms,
    latenessMs: r.lateness_ms,
    trigger: r.trigger,
  };
}

const ensuredDays = new Set<string>();

/**
 * Captured values are often session tokens: only their names and lengths are kept, so the run
 * history shows a capture happened without becoming a store of live credentials.
 */
export function maskCaptures(captures: Record<string, string>): Record<string, string> {
  return Object.fromEntries(Object.entries(captures).map(([k, v]) => [k, `•••• (${v.length} characters)`]));
}

/** The same values are hidden where a later step's response or URL repeats them. */
function hideCaptured(text: string | null, captured: Record<string, string>): string | null {
  if (text === null) return null;
  const worth = Object.fromEntries(Object.entries(captured).filter(([, v]) => v.length >= 6));
  return replaceSecrets(text, worth, (name) => `[captured:${name}]`);
}

export const runsRepo = {
  /** Daily partitions for [from, to]; remembered per database so the hot path skips the DDL. */
  async ensurePartitions(db: Knex, from: Date, to: Date): Promise<void> {
    const dbName = String((db.client.config.connection as { database?: string })?.database ?? '');
    const days: string[] = [];
    for (let t = Date.UTC(from.getUTCFullYear(), from.getUTCMonth(), from.getUTCDate()); t <= to.getTime(); t += 86_400_000) {
      days.push(`${dbName}|${new Date(t).toISOString().slice(0, 10)}`);
    }
    if (days.every((d) => ensuredDays.has(d))) return;
    await db.raw('SELECT ensure_run_partitions(?, ?)', [from, to]);
    for (const d of days) ensuredDays.add(d);
  },

  /**
   * Stores a run and its steps once per (journey, vantage, slot): a second attempt for the same
   * slot (a retried job, a second scheduler) changes nothing and returns null.
   */
  async insertOnce(db: Knex, key: RunKey, result: RunResult, latenessMs: number | null, trigger: 'schedule' | 'missed' = 'schedule'): Promise<number | null> {
    const [id] = await runsRepo.insertManyOnce(db, [{ key, result, latenessMs, trigger }]);
    return id ?? null;
  },

  /** insertOnce for many runs in one transaction and two statements (the prober batches its writes). */
  async insertManyOnce(
    db: Knex,
    items: { key: RunKey; result: RunResult; latenessMs: number | null; trigger?: 'schedule' | 'missed' }[],
  ): Promise<(number | null)[]> {
    if (!items.length) return [];
    const times = items.map((i) => i.key.slotAt.getTime());
    return db.transaction(async (tx) => {
      await runsRepo.ensurePartitions(tx, new Date(Math.min(...times)), new Date(Math.max(...times)));
      const rows: { id: number; journey_id: number; vantage: string; slot_at: Date }[] = await tx('runs')
        .insert(
          items.map(({ key, result, latenessMs, trigger }) => ({
            journey_id: key.journeyId,
            version: key.version,
            vantage: key.vantage,
            slot_at: key.slotAt,
            trigger: trigger ?? 'schedule',
            started_at: result.startedAt,
            finished_at: result.finishedAt,
            verdict: result.verdict,
            failure_class: result.failureClass,
            failed_step: result.failedStep,
            void_reason: result.voidReason,
            duration_ms: result.durationMs,
            lateness_ms: latenessMs,
          })),
        )
        .onConflict(['journey_id', 'vantage', 'slot_at'])
        .ignore()
        .returning(['id', 'journey_id', 'vantage', 'slot_at']);
      const idOf = new Map(rows.map((r) => [`${r.journey_id}|${r.vantage}|${r.slot_at.getTime()}`, r.id]));
      const ids = items.map(({ key }) => idOf.get(`${key.journeyId}|${key.vantage}|${key.slotAt.getTime()}`) ?? null);
      const steps = items.flatMap(({ key, result }, i) => {
        if (ids[i] === null) return [];
        const captured = Object.assign({}, ...result.steps.map((s) => s.captures)) as Record<string, string>;
        return result.steps.map((s) => ({
              run_id: ids[i],
              slot_at: key.slotAt,
              idx: s.index,
              name: s.name,
              method: s.method,
              url: hideCaptured(s.url, captured)!,
              passed: s.passed,
              http_status: s.httpStatus,
              timings: JSON.stringify(s.timings),
              total_ms: s.timings.totalMs,
              redirects: JSON.stringify(s.redirects),
              trace_id: s.traceId,
              assertions: JSON.stringify(s.assertions),
              captures: JSON.stringify(maskCaptures(s.captures)),
              failure_class: s.failureClass,
              error: hideCaptured(s.error, captured),
              response_excerpt: hideCaptured(s.responseExcerpt, captured),
            }));
      });
      if (steps.length) await tx('step_results').insert(steps);
      return ids;
    });
  },

  /** Void runs for slots nobody ran (scheduler down): recorded once, never replayed. */
  async insertMissed(db: Knex, keys: RunKey[], reason: string): Promise<number> {
    if (!keys.length) return 0;
    const min = new Date(Math.min(...keys.map((k) => k.slotAt.getTime())));
    const max = new Date(Math.max(...keys.map((k) => k.slotAt.getTime())));
    await runsRepo.ensurePartitions(db, min, max);
    const rows = await db('runs')
      .insert(
        keys.map((k) => ({
          journey_id: k.journeyId,
          version: k.version,
          vantage: k.vantage,
          slot_at: k.slotAt,
          trigger: 'missed',
          verdict: 'void',
          void_reason: reason,
        })),
      )
      .onConflict(['journey_id', 'vantage', 'slot_at'])
      .ignore()
      .returning('id');
    return rows.length;
  },

  async page(
    db: Knex,
    journeyId: number,
    opts: { limit: number; before?: { slotAt: Date; id: number }; verdict?: string; vantage?: string },
  ): Promise<RunSummary[]> {
    const q = db('runs').where({ journey_id: journeyId }).orderBy([{ column: 'slot_at', order: 'desc' }, { column: 'id', order: 'desc' }]).limit(opts.limit);
    if (opts.verdict) q.where('verdict', opts.verdict);
    if (opts.vantage) q.where('vantage', opts.vantage);
    if (opts.before) q.whereRaw('(slot_at, id) < (?, ?)', [opts.before.slotAt, opts.before.id]);
    return (await q).map(toSummary);
  },

  async byId(db: Knex, id: number): Promise<(RunSummary & { steps: Record<string, unknown>[] }) | null> {
    const r = await db('runs').where({ id }).first();
    if (!r) return null;
    const steps = await db('step_results').where({ run_id: id, slot_at: r.slot_at }).orderBy('idx');
    return {
      ...toSummary(r),
      steps: steps.map((s) => ({
        index: s.idx,
        name: s.name,
        method: s.method,
        url: s.url,
        passed: s.passed,
        httpStatus: s.http_status,
        timings: s.timings,
        redirects: s.redirects,
        traceId: s.trace_id,
        assertions: s.assertions,
        captures: s.captures,
        failureClass: s.failure_class,
        error: s.error,
        responseExcerpt: s.response_excerpt,
      })),
    };
  },

  /** Per-journey figures for the list screen over [since, now]: one grouped query, no N+1. */
  async stats(db: Knex, since: Date) {
    const rows = await db.raw(
      `SELECT journey_id,
              count(*) FILTER (WHERE verdict = 'pass')::int AS passed,
              count(*) FILTER (WHERE verdict <> 'void')::int AS total,
              percentile_cont(0.95) WITHIN GROUP (ORDER BY duration_ms) FILTER (WHERE verdict <> 'void') AS p95
         FROM runs WHERE slot_at >= ? GROUP BY journey_id`,
      [since],
    );
    const last = await db.raw(
      `SELECT DISTINCT ON (journey_id) journey_id, verdict, slot_at, vantage
         FROM runs ORDER BY journey_id, slot_at DESC, id DESC`,
    );
    return {
      byJourney: new Map<number, { passed: number; total: number; p95: number | null }>(
        rows.rows.map((r: any) => [Number(r.journey_id), { passed: r.passed, total: r.total, p95: r.p95 === null ? null : Number(r.p95) }]),
      ),
      last: new Map<number, { verdict: 'pass' | 'fail' | 'void'; slotAt: string; vantage: string }>(
        last.rows.map((r: any) => [Number(r.journey_id), { verdict: r.verdict, slotAt: r.slot_at.toISOString(), vantage: r.vantage }]),
      ),
    };
  },

  /** Per-vantage latest verdict of one journey. */
  async vantageStates(db: Knex, journeyId: number) {
    const r = await db.raw(
      `SELECT DISTINCT ON (vantage) vantage, verdict, slot_at FROM runs WHERE journey_id = ? ORDER BY vantage, slot_at DESC, id DESC`,
      [journeyId],
    );
    return r.rows.map((x: any) => ({ vantage: x.vantage, verdict: x.verdict, slotAt: x.slot_at.toISOString() }));
  },

  /** Step timings over a period for the journey chart. */
  async timings(db: Knex, journeyId: number, since: Date) {
    const r = await db.raw(
      `SELECT r.id, r.slot_at, r.verdict, r.vantage, s.idx, s.name, s.total_ms
         FROM runs r LEFT JOIN step_results s ON s.run_id = r.id AND s.slot_at = r.slot_at
        WHERE r.journey_id = ? AND r.slot_at >= ? ORDER BY r.slot_at, s.idx`,
      [journeyId, since],
    );
    return r.rows.map((x: any) => ({
      runId: Number(x.id),
      slotAt: x.slot_at.toISOString(),
      verdict: x.verdict,
      vantage: x.vantage,
      step: x.idx,
      stepName: x.name,
      totalMs: x.total_ms,
    }));
  },

  /** Drops whole daily partitions older than the cutoff (retention). */
  async dropPartitionsBefore(db: Knex, cutoff: Date): Promise<string[]> {
    const r = await db.raw(
      `SELECT c.relname FROM pg_inherits i JOIN pg_class c ON c.oid = i.inhrelid JOIN pg_class p ON p.oid = i.inhparent
        WHERE p.relname IN ('runs', 'step_results')`,
    );
    const day = cutoff.toISOString().slice(0, 10).replace(/-/g, '');
    const old = (r.rows as { relname: string }[]).map((x) => x.relname).filter((n) => /_(\d{8})$/.exec(n)![1]! < day);
    for (const name of old) await db.raw('DROP TABLE IF EXISTS ??', [name]);
    if (old.length) ensuredDays.clear();
    return old;
  },
};

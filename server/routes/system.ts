// Health (public, for load balancers) and the state of worker processes (everyone signed in, and
// tokens with the read scope).
import { Router } from 'express';
import type { Knex } from 'knex';
import type { HealthView, WorkerView } from '../../shared/api-types';
import { pageQuerySchema } from '../../shared/schemas/pagination';
import { allow } from '../auth/access';
import { ValidationError } from '../errors';
import { validate } from '../http/validate';
import { auditRepo } from '../repositories/audit';
import { heartbeatsRepo } from '../repositories/heartbeats';

export function systemRoutes(db: Knex, now: () => Date): Router {
  const r = Router();

  r.get('/health', async (_req, res) => {
    let database: HealthView['database'] = 'ok';
    try {
      await db.raw('select 1');
    } catch {
      database = 'down';
    }
    const body: HealthView = { status: database === 'ok' ? 'ok' : 'degraded', database, time: now().toISOString() };
    res.setHeader('Cache-Control', 'no-store');
    res.status(database === 'ok' ? 200 : 503).json(body);
  });

  r.get('/workers', allow({ roles: 'any', scopes: ['read'] }), async (_req, res) => {
    const t = now().getTime();
    const items: WorkerView[] = (await heartbeatsRepo.list(db)).map((h) => ({
      name: h.name,
      kind: 'worker',
      lastBeatAt: h.lastBeatAt.toISOString(),
      startedAt: h.startedAt.toISOString(),
      up: t - h.lastBeatAt.getTime() <= 3 * h.beatSeconds * 1000,
    }));
    res.json({ items });
  });

  r.get('/audit-events', allow({ roles: ['admin'] }), validate('query', pageQuerySchema), async (_req, res) => {
    const { limit, cursor } = res.locals.query as { limit: number; cursor?: string };
    if (cursor !== undefined && !/^\d+$/.test(cursor)) throw new ValidationError('query.cursor: not a cursor from this list', 'query.cursor');
    const items = await auditRepo.page(db, limit, cursor ? Number(cursor) : undefined);
    res.json({ items, nextCursor: items.length === limit ? String(items[items.length - 1]!.id) : null });
  });

  return r;
}

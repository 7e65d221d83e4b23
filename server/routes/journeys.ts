import { Router } from 'express';
import type { Knex } from 'knex';
import multer from 'multer';
import type PgBoss from 'pg-boss';
import { z } from 'zod';
import { importHar, HarImportError } from '../../shared/journey/har-import';
import { nextSlots } from '../../shared/journey/schedule';
import { probeQueue, type TryProbeJob } from '../../shared/jobs';
import { runsQuerySchema, saveJourneySchema, schedulePreviewSchema, tryJourneySchema } from '../../shared/schemas/journeys';
import { idParamSchema } from '../../shared/schemas/users';
import { allow } from '../auth/access';
import { AppError, NotFoundError, UnavailableError, ValidationError } from '../errors';
import { validate } from '../http/validate';
import { runsRepo } from '../repositories/runs';
import { vantagesRepo } from '../repositories/vantages';
import { journeysService } from '../services/journeys';
import { secretsService } from '../services/secrets';

export interface JourneyRouteDeps {
  db: Knex;
  secretKey: Buffer;
  /** Queue access for "try it now"; without it the route answers 503. */
  boss?: PgBoss;
  now: () => Date;
  tryTimeoutMs?: number;
}

const HAR_LIMIT_BYTES = 20 * 1024 * 1024;

export function journeysRoutes(deps: JourneyRouteDeps): Router {
  const r = Router();
  const svc = journeysService(deps.db, deps.now);
  const read = allow({ roles: 'any', scopes: ['read'] });
  const write = allow({ roles: ['admin', 'engineer'] });

  r.get('/', read, async (_req, res) => {
    res.json({ items: await svc.list() });
  });
  r.post('/', write, validate('body', saveJourneySchema), async (_req, res) => {
    const { document, serviceIds } = res.locals.body as z.infer<typeof saveJourneySchema>;
    res.status(201).json(await svc.create(res.locals.principal!, document, serviceIds));
  });

  r.post('/schedule-preview', read, validate('body', schedulePreviewSchema), (_req, res) => {
    const { schedule, journeyId, count } = res.locals.body as z.infer<typeof schedulePreviewSchema>;
    res.json({ times: nextSlots(schedule, journeyId, deps.now(), count).map((d) => d.toISOString()) });
  });

  // "Try it now": the draft runs once on the chosen vantage's queue; the result comes back here
  // and nothing is stored as a scheduled run.
  r.post('/try', write, validate('body', tryJourneySchema), async (_req, res) => {
    const { document, vantage } = res.locals.body as z.infer<typeof tryJourneySchema>;
    if (!deps.boss) throw new UnavailableError('No queue connection on this server', 5);
    const v = (await vantagesRepo.list(deps.db)).find((x) => x.name === vantage);
    if (!v) throw new ValidationError(`vantage: no vantage named ${vantage}`, 'vantage');
    const beat = v.lastBeatAt ? deps.now().getTime() - v.lastBeatAt.getTime() : Infinity;
    if (beat > 3 * (v.beatSeconds ?? 15) * 1000) throw new UnavailableError(`Vantage ${vantage} is down: no worker has reported from it recently`, 15);
    const queue = probeQueue(vantage);
    await deps.boss.createQueue(queue, { name: queue, retryLimit: 2, retryDelay: 1, expireInSeconds: 60 } as PgBoss.Queue);
    const id = await deps.boss.send(queue, { kind: 'try', document, vantage } satisfies TryProbeJob, { retryLimit: 0, expireInSeconds: 180 });
    if (!id) throw new AppError(500, 'internal', 'The run could not be queued');
    const deadline = Date.now() + (deps.tryTimeoutMs ?? 90_000);
    while (Date.now() < deadline) {
      const job = await deps.boss.getJobById(queue, id);
      if (job?.state === 'completed') return res.json({ result: job.output });
      if (job?.state === 'failed' || job?.state === 'cancelled') throw new AppError(502, 'internal', 'The vantage could not run the draft');
      await new Promise((ok) => setTimeout(ok, 250));
    }
    await deps.boss.cancel(queue, id).catch(() => {});
    throw new UnavailableError(`Vantage ${vantage} did not answer in time`, 15);
  });

  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: HAR_LIMIT_BYTES, files: 1 } });
  r.post('/import-har', write, (req, res, next) => {
    upload.single('file')(req, res, (err: unknown) => {
      if ((err as { code?: string })?.code === 'LIMIT_FILE_SIZE') return next(new AppError(413, 'payload_too_large', `file: a HAR file may be at most ${HAR_LIMIT_BYTES / 1024 / 1024} MiB`, 'file'));
      next(err);
    });
  }, async (req, res) => {
    if (!req.file) throw new ValidationError('file: attach a .har file in the form field "file"', 'file');
    let result;
    try {
      result = importHar(req.file.buffer.toString('utf8'), { name: typeof req.body?.name === 'string' ? req.body.name : undefined });
    } catch (e) {
      if (e instanceof HarImportError) throw new ValidationError(`file: ${e.message}`, 'file');
      throw e;
    }
    // Credentials found in the recording are stored encrypted at once; the draft and this answer
    // carry only their names.
    // A name already used by a stored secret gets a suffix, so an import never overwrites one.
    const secrets = secretsService(deps.db, deps.secretKey);
    let draftJson = JSON.stringify(result.draft);
    const stored: { name: string; source: string }[] = [];
    await deps.db.transaction(async (tx) => {
      const taken = new Set((await tx('secrets').select('name')).map((x) => x.name as string));
      for (const s of result.secrets) {
        let name = s.name;
        for (let n = 2; taken.has(name); n++) name = `${s.name}_${n}`;
        taken.add(name);
        if (name !== s.name) draftJson = draftJson.split(`{{secret.${s.name}}}`).join(`{{secret.${name}}}`);
        await secrets.save(res.locals.principal!, name, s.value, tx);
        stored.push({ name, source: s.source });
      }
    });
    res.json({ entries: result.entries, draft: JSON.parse(draftJson), warnings: result.warnings, secrets: stored });
  });

  r.get('/:id', read, validate('params', idParamSchema), validate('query', z.object({ version: z.coerce.number().int().positive().optional() })), async (_req, res) => {
    res.json(await svc.get(res.locals.params.id, res.locals.query.version));
  });
  r.put('/:id', write, validate('params', idParamSchema), validate('body', saveJourneySchema), async (_req, res) => {
    const { document, serviceIds } = res.locals.body as z.infer<typeof saveJourneySchema>;
    res.json(await svc.update(res.locals.principal!, res.locals.params.id, document, serviceIds));
  });
  r.delete('/:id', write, validate('params', idParamSchema), async (_req, res) => {
    await svc.remove(res.locals.principal!, res.locals.params.id);
    res.status(204).end();
  });

  r.get('/:id/runs', read, validate('params', idParamSchema), validate('query', runsQuerySchema), async (_req, res) => {
    const q = res.locals.query as z.infer<typeof runsQuerySchema>;
    let before: { slotAt: Date; id: number } | undefined;
    if (q.cursor) {
      const [at, id] = q.cursor.split('|');
      before = { slotAt: new Date(at!), id: Number(id) };
    }
    const items = await runsRepo.page(deps.db, res.locals.params.id, { limit: q.limit, before, verdict: q.verdict, vantage: q.vantage });
    const last = items[items.length - 1];
    res.json({ items, nextCursor: items.length === q.limit && last ? `${last.slotAt}|${last.id}` : null });
  });
  r.get('/:id/timings', read, validate('params', idParamSchema), validate('query', z.object({ hours: z.coerce.number().min(1).max(24 * 14).default(24) })), async (_req, res) => {
    const since = new Date(deps.now().getTime() - res.locals.query.hours * 3600_000);
    res.json({ items: await runsRepo.timings(deps.db, res.locals.params.id, since) });
  });
  return r;
}

export function runsRoutes(db: Knex): Router {
  const r = Router();
  r.get('/:id', allow({ roles: 'any', scopes: ['read'] }), validate('params', idParamSchema), async (_req, res) => {
    const run = await runsRepo.byId(db, res.locals.params.id);
    if (!run) throw new NotFoundError('Run');
    res.json(run);
  });
  return r;
}

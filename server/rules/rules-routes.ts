// /api/rules: alert rules CRUD, enable/disable, duplicate, and replay of a draft over history.
import { Router } from 'express';
import type { Knex } from 'knex';
import { replayRequestSchema, rulesListQuerySchema } from '../../shared/rules/api-schemas';
import { ruleDocumentSchema } from '../../shared/rules/rule-schema';
import { idParamSchema } from '../../shared/schemas/users';
import { validate } from '../http/validate';
import { readers, writers } from './access';
import { replayService } from './replay-service';
import { rulesService } from './rules-service';

export function rulesRoutes(db: Knex, now: () => Date = () => new Date()): Router {
  const r = Router();
  const rules = rulesService(db, now);
  const replay = replayService(db, now);

  r.get('/', readers, validate('query', rulesListQuerySchema), async (_req, res) => {
    const q = res.locals.query as { service?: string; enabled?: 'true' | 'false' };
    res.json({ items: await rules.list({ service: q.service, enabled: q.enabled === undefined ? undefined : q.enabled === 'true' }) });
  });
  r.post('/', writers, validate('body', ruleDocumentSchema), async (_req, res) => {
    res.status(201).json(await rules.create(res.locals.principal!, res.locals.body));
  });
  // Replay computes, it changes nothing; it is the editor's tool, so it is the editors' route.
  r.post('/replay', writers, validate('body', replayRequestSchema), async (_req, res) => {
    res.json(await replay.replay(res.locals.body));
  });
  r.get('/:id', readers, validate('params', idParamSchema), async (_req, res) => {
    res.json(await rules.get(res.locals.params.id));
  });
  r.put('/:id', writers, validate('params', idParamSchema), validate('body', ruleDocumentSchema), async (_req, res) => {
    res.json(await rules.update(res.locals.principal!, res.locals.params.id, res.locals.body));
  });
  r.post('/:id/enable', writers, validate('params', idParamSchema), async (_req, res) => {
    res.json(await rules.setEnabled(res.locals.principal!, res.locals.params.id, true));
  });
  r.post('/:id/disable', writers, validate('params', idParamSchema), async (_req, res) => {
    res.json(await rules.setEnabled(res.locals.principal!, res.locals.params.id, false));
  });
  r.post('/:id/duplicate', writers, validate('params', idParamSchema), async (_req, res) => {
    res.status(201).json(await rules.duplicate(res.locals.principal!, res.locals.params.id));
  });
  r.delete('/:id', writers, validate('params', idParamSchema), async (_req, res) => {
    await rules.remove(res.locals.principal!, res.locals.params.id);
    res.status(204).end();
  });
  return r;
}

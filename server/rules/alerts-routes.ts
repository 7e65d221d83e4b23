// /api/alerts: open alerts then history (each with its responder note), and one alert's detail.
import { Router } from 'express';
import type { Knex } from 'knex';
import { alertsListQuerySchema } from '../../shared/rules/api-schemas';
import { idParamSchema } from '../../shared/schemas/users';
import { validate } from '../http/validate';
import { readers } from './access';
import { alertsService } from './alerts-service';

export function alertsRoutes(db: Knex, now: () => Date = () => new Date()): Router {
  const r = Router();
  const alerts = alertsService(db, now);
  r.get('/', readers, validate('query', alertsListQuerySchema), async (_req, res) => {
    res.json(await alerts.list(res.locals.query));
  });
  r.get('/:id', readers, validate('params', idParamSchema), async (_req, res) => {
    res.json(await alerts.detail(res.locals.params.id));
  });
  return r;
}

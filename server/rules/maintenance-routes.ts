// /api/maintenance-windows: planned periods per service.
import { Router } from 'express';
import type { Knex } from 'knex';
import { maintenanceListQuerySchema, maintenanceWindowSchema, updateMaintenanceWindowSchema } from '../../shared/rules/api-schemas';
import { idParamSchema } from '../../shared/schemas/users';
import { validate } from '../http/validate';
import { readers, writers } from './access';
import { maintenanceService } from './maintenance-service';

export function maintenanceWindowsRoutes(db: Knex, now: () => Date = () => new Date()): Router {
  const r = Router();
  const windows = maintenanceService(db, now);
  r.get('/', readers, validate('query', maintenanceListQuerySchema), async (_req, res) => {
    const q = res.locals.query as { service?: string; current?: 'true' | 'false' };
    res.json({ items: await windows.list({ service: q.service, current: q.current === 'true' }) });
  });
  r.get('/:id', readers, validate('params', idParamSchema), async (_req, res) => {
    res.json(await windows.get(res.locals.params.id));
  });
  r.post('/', writers, validate('body', maintenanceWindowSchema), async (_req, res) => {
    res.status(201).json(await windows.create(res.locals.principal!, res.locals.body));
  });
  r.patch('/:id', writers, validate('params', idParamSchema), validate('body', updateMaintenanceWindowSchema), async (_req, res) => {
    res.json(await windows.update(res.locals.principal!, res.locals.params.id, res.locals.body));
  });
  r.delete('/:id', writers, validate('params', idParamSchema), async (_req, res) => {
    await windows.remove(res.locals.principal!, res.locals.params.id);
    res.status(204).end();
  });
  return r;
}

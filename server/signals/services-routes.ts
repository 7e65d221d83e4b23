// /api/services: the Services list (everyone signed in, tokens with scope read); engineers
// describe services (services are otherwise created on first sight by the intake).
import { Router } from 'express';
import type { Knex } from 'knex';
import { createServiceSchema, updateServiceSchema } from '../../shared/schemas/signals';
import { idParamSchema } from '../../shared/schemas/users';
import { allow } from '../auth/access';
import { validate } from '../http/validate';
import { servicesService } from './services-service';

export function servicesRoutes(db: Knex): Router {
  const r = Router();
  const svc = servicesService(db);
  const engineers = allow({ roles: ['engineer', 'admin'] });

  r.get('/', allow({ roles: 'any', scopes: ['read'] }), async (_req, res) => {
    res.json({ items: await svc.list() });
  });
  r.post('/', engineers, validate('body', createServiceSchema), async (_req, res) => {
    res.status(201).json(await svc.create(res.locals.principal!, res.locals.body));
  });
  r.patch('/:id', engineers, validate('params', idParamSchema), validate('body', updateServiceSchema), async (_req, res) => {
    res.json(await svc.update(res.locals.principal!, res.locals.params.id, res.locals.body));
  });
  return r;
}

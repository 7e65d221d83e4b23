import { Router } from 'express';
import type { Knex } from 'knex';
import { createUserSchema, idParamSchema, updateUserSchema } from '../../shared/schemas/users';
import { allow } from '../auth/access';
import { validate } from '../http/validate';
import { usersService } from '../services/users';

export function usersRoutes(db: Knex): Router {
  const r = Router();
  const svc = usersService(db);
  const admin = allow({ roles: ['admin'] });

  r.get('/', admin, async (_req, res) => {
    res.json({ items: await svc.list() });
  });
  r.post('/', admin, validate('body', createUserSchema), async (_req, res) => {
    res.status(201).json(await svc.create(res.locals.principal!, res.locals.body));
  });
  r.patch('/:id', admin, validate('params', idParamSchema), validate('body', updateUserSchema), async (_req, res) => {
    res.json(await svc.update(res.locals.principal!, res.locals.params.id, res.locals.body));
  });
  return r;
}

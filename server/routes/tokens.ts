import { Router } from 'express';
import type { Knex } from 'knex';
import { createTokenSchema } from '../../shared/schemas/tokens';
import { idParamSchema } from '../../shared/schemas/users';
import { allow } from '../auth/access';
import { validate } from '../http/validate';
import { tokensService } from '../services/tokens';

export function tokensRoutes(db: Knex): Router {
  const r = Router();
  const svc = tokensService(db);
  const admin = allow({ roles: ['admin'] });

  r.get('/', admin, async (_req, res) => {
    res.json({ items: await svc.list() });
  });
  r.post('/', admin, validate('body', createTokenSchema), async (_req, res) => {
    res.setHeader('Cache-Control', 'no-store');
    res.status(201).json(await svc.create(res.locals.principal!, res.locals.body));
  });
  r.delete('/:id', admin, validate('params', idParamSchema), async (_req, res) => {
    await svc.revoke(res.locals.principal!, res.locals.params.id);
    res.status(204).end();
  });
  return r;
}

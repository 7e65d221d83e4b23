// /api/channels: webhook channels (URL + signing secret, the secret shown once).
import { Router } from 'express';
import type { Knex } from 'knex';
import { channelSchema, updateChannelSchema } from '../../shared/rules/api-schemas';
import { idParamSchema } from '../../shared/schemas/users';
import { validate } from '../http/validate';
import { readers, writers } from './access';
import { channelsService } from './channels-service';

export function channelsRoutes(db: Knex, secretKey: Buffer): Router {
  const r = Router();
  const channels = channelsService(db, secretKey);
  r.get('/', readers, async (_req, res) => {
    res.json({ items: await channels.list() });
  });
  r.get('/:id', readers, validate('params', idParamSchema), async (_req, res) => {
    res.json(await channels.get(res.locals.params.id));
  });
  r.post('/', writers, validate('body', channelSchema), async (_req, res) => {
    res.status(201).json(await channels.create(res.locals.principal!, res.locals.body));
  });
  r.patch('/:id', writers, validate('params', idParamSchema), validate('body', updateChannelSchema), async (_req, res) => {
    res.json(await channels.update(res.locals.principal!, res.locals.params.id, res.locals.body));
  });
  r.delete('/:id', writers, validate('params', idParamSchema), async (_req, res) => {
    await channels.remove(res.locals.principal!, res.locals.params.id);
    res.status(204).end();
  });
  return r;
}

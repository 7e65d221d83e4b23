// Settings → Secrets, Vantages, Target rules, Retention. Secrets are admin-only and their values
// never leave the server; vantages are readable by everyone.
import { Router } from 'express';
import type { Knex } from 'knex';
import { z } from 'zod';
import { targetPolicySchema } from '../../shared/journey/target-policy-schema';
import { retentionSchema, saveSecretSchema, saveVantageSchema, secretNameSchema } from '../../shared/schemas/journeys';
import { vantageNameSchema } from '../../shared/journey/journey-schema';
import { allow } from '../auth/access';
import { NotFoundError } from '../errors';
import { validate } from '../http/validate';
import { auditRepo } from '../repositories/audit';
import { vantagesRepo } from '../repositories/vantages';
import { probeSettingsService } from '../services/probe-settings';
import { secretsService } from '../services/secrets';

export function probeAdminRoutes(db: Knex, secretKey: Buffer, now: () => Date): Router {
  const r = Router();
  const admin = allow({ roles: ['admin'] });
  const everyone = allow({ roles: 'any', scopes: ['read'] });
  const secrets = secretsService(db, secretKey);
  const settings = probeSettingsService(db);

  r.get('/secrets', admin, async (_req, res) => {
    res.json({ items: await secrets.list() });
  });
  r.put('/secrets/:name', admin, validate('params', z.object({ name: secretNameSchema })), validate('body', saveSecretSchema.pick({ value: true })), async (_req, res) => {
    const outcome = await secrets.save(res.locals.principal!, res.locals.params.name, res.locals.body.value);
    res.status(outcome === 'created' ? 201 : 200).json({ name: res.locals.params.name, outcome });
  });
  r.delete('/secrets/:name', admin, validate('params', z.object({ name: secretNameSchema })), async (_req, res) => {
    await secrets.remove(res.locals.principal!, res.locals.params.name);
    res.status(204).end();
  });

  r.get('/vantages', everyone, async (_req, res) => {
    const t = now().getTime();
    const items = (await vantagesRepo.list(db)).map((v) => ({
      name: v.name,
      region: v.region,
      createdAt: v.createdAt,
      lastBeatAt: v.lastBeatAt?.toISOString() ?? null,
      up: v.lastBeatAt !== null && t - v.lastBeatAt.getTime() <= 3 * (v.beatSeconds ?? 15) * 1000,
    }));
    res.json({ items });
  });
  r.post('/vantages', admin, validate('body', saveVantageSchema), async (_req, res) => {
    const { name, region } = res.locals.body as z.infer<typeof saveVantageSchema>;
    await db.transaction(async (tx) => {
      await vantagesRepo.upsert(tx, name, region);
      await auditRepo.record(tx, res.locals.principal!, { action: 'vantage.save', subjectType: 'vantage', subjectId: name, detail: { region } });
    });
    res.status(201).json({ name, region });
  });
  r.delete('/vantages/:name', admin, validate('params', z.object({ name: vantageNameSchema })), async (_req, res) => {
    await db.transaction(async (tx) => {
      if (!(await vantagesRepo.remove(tx, res.locals.params.name))) throw new NotFoundError('Vantage');
      await auditRepo.record(tx, res.locals.principal!, { action: 'vantage.delete', subjectType: 'vantage', subjectId: res.locals.params.name });
    });
    res.status(204).end();
  });

  r.get('/target-rules', admin, async (_req, res) => {
    res.json(await settings.targetPolicy());
  });
  r.put('/target-rules', admin, validate('body', targetPolicySchema), async (_req, res) => {
    await settings.setTargetPolicy(res.locals.principal!, res.locals.body);
    res.json(await settings.targetPolicy());
  });

  r.get('/retention', admin, async (_req, res) => {
    res.json({ runRetentionDays: await settings.runRetentionDays() });
  });
  r.put('/retention', admin, validate('body', retentionSchema), async (_req, res) => {
    await settings.setRunRetentionDays(res.locals.principal!, res.locals.body.runRetentionDays);
    res.json({ runRetentionDays: res.locals.body.runRetentionDays });
  });
  return r;
}

// The demo seeded by `npm start` must really pass against the demo target, with its secret.
import crypto from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { journeysRepo } from '../../server/repositories/journeys';
import { secretsService } from '../../server/services/secrets';
import { probeSettingsService } from '../../server/services/probe-settings';
import { referencedSecretNames } from '../../shared/journey/template';
import { startDemoTarget, type DemoTarget } from '../../scripts/demo-target';
import { seedDemo } from '../../scripts/seed-demo';
import { runJourney } from '../../worker/prober';
import { createTestDb, type TestDb } from '../helpers/db';

let db: TestDb;
let target: DemoTarget;
const key = crypto.randomBytes(32);

beforeAll(async () => {
  db = await createTestDb();
  target = await startDemoTarget({ port: 0 });
});
afterAll(async () => {
  await target.close();
  await db.drop();
});

describe('demo seed', () => {
  it('creates two journeys once, and both pass against the demo target; failures switch them to fail', async () => {
    expect(await seedDemo(db.knex, { targetUrl: target.url, vantage: 'local', secretKey: key })).toBe(true);
    expect(await seedDemo(db.knex, { targetUrl: target.url, vantage: 'local', secretKey: key })).toBe(false);
    const journeys = await journeysRepo.listCurrent(db.knex);
    expect(journeys.map((j) => j.name).sort()).toEqual(['Buy a tea', 'Find a tea']);
    const policy = await probeSettingsService(db.knex).targetPolicy();
    const secrets = secretsService(db.knex, key);
    for (const j of journeys) {
      const result = await runJourney(j.document, { vantage: 'local', secrets: await secrets.reveal(referencedSecretNames(j.document.steps)), targetPolicy: policy });
      expect(result.verdict, JSON.stringify(result)).toBe('pass');
      expect(result.steps).toHaveLength(j.document.steps.length);
    }
    await target.control({ wrongBody: true });
    const find = journeys.find((j) => j.name === 'Find a tea')!;
    const broken = await runJourney(find.document, { vantage: 'local', secrets: {}, targetPolicy: policy });
    expect(broken.verdict).toBe('fail');
    expect(broken.failureClass).toBe('assertion');
  });
});

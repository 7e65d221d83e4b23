// Demo data for an empty database: the invented Quillmoor Tea Company (scripts/demo-target.ts)
// on loopback, two journeys against it and the secret they use. Runs only when no journey exists.
import type { Knex } from 'knex';
import type { JourneyDocumentInput } from '../shared/journey/journey-schema';
import { journeyDocumentSchema } from '../shared/journey/journey-schema';
import { journeysService } from '../server/services/journeys';
import { probeSettingsService } from '../server/services/probe-settings';
import fs from 'node:fs';
import path from 'node:path';
import { secretsService } from '../server/services/secrets';
import { tokensService } from '../server/services/tokens';
import { z } from 'zod';
import { ruleDocumentSchema } from '../shared/rules/rule-schema';

type RuleDocumentInput = z.input<typeof ruleDocumentSchema>;
import { settingsRepo } from '../server/repositories/settings';
import { rulesService } from '../server/rules/rules-service';
import { DEMO_SERVICE } from './demo-metrics';
import { DEMO_ACCOUNT } from './demo-target';

const SYSTEM = { type: 'token' as const, id: 0, name: 'demo-seed', scopes: [] };

export function demoJourneys(targetUrl: string, vantage: string): JourneyDocumentInput[] {
  return [
    {
      name: 'Find a tea',
      steps: [
        {
          name: 'Search for oolong',
          method: 'GET',
          url: `${targetUrl}/api/search?q=oolong`,
          assertions: [
            { kind: 'status', in: [200] },
            { kind: 'json', path: '$.count', op: 'gt', value: 0 },
            { kind: 'latency', underMs: 800 },
          ],
        },
      ],
      schedule: { kind: 'interval', everySeconds: 20 },
      vantages: [vantage],
    },
    {
      name: 'Buy a tea',
      steps: [
        {
          name: 'Sign in',
          method: 'POST',
          url: `${targetUrl}/api/sign-in`,
          headers: [{ name: 'Content-Type', value: 'application/json' }],
          body: `{"email": "${DEMO_ACCOUNT.email}", "password": "{{secret.QUILLMOOR_PASSWORD}}"}`,
          assertions: [{ kind: 'status', in: [200] }],
          captures: [{ from: 'json', name: 'token', path: '$.token' }],
        },
        {
          name: 'Add to basket',
          method: 'POST',
          url: `${targetUrl}/api/basket`,
          headers: [
            { name: 'Content-Type', value: 'application/json' },
            { name: 'Authorization', value: 'Bearer {{token}}' },
          ],
          body: '{"itemId": "tea-101", "quantity": 1}',
          assertions: [{ kind: 'status', in: [201] }],
        },
        {
          name: 'Check out',
          method: 'POST',
          url: `${targetUrl}/api/checkout`,
          headers: [{ name: 'Authorization', value: 'Bearer {{token}}' }],
          assertions: [
            { kind: 'status', in: [201] },
            { kind: 'json', path: '$.status', op: 'eq', value: 'confirmed' },
          ],
        },
      ],
      schedule: { kind: 'interval', everySeconds: 30 },
      vantages: [vantage],
    },
  ];
}

export async function seedDemo(db: Knex, opts: { targetUrl: string; vantage: string; secretKey: Buffer }): Promise<boolean> {
  if (Number((await db('journeys').count({ n: '*' }).first())!.n) > 0) return false;
  await db('vantages').insert({ name: opts.vantage, region: 'this machine' }).onConflict('name').ignore();
  // The demo target lives on loopback, which probes may not reach by default.
  const settings = probeSettingsService(db);
  await settings.setTargetPolicy(SYSTEM, { ...(await settings.targetPolicy()), allowLoopback: true });
  await secretsService(db, opts.secretKey).save(SYSTEM, 'QUILLMOOR_PASSWORD', DEMO_ACCOUNT.password);
  const journeys = journeysService(db);
  for (const doc of demoJourneys(opts.targetUrl, opts.vantage)) await journeys.create(SYSTEM, journeyDocumentSchema.parse(doc), []);
  return true;
}

/**
 * The demo shop needs an ingest token to send its metrics. Tokens are stored hashed, so the
 * secret is kept in the data directory (private, like the database password) and re-made if it
 * was revoked.
 */
export async function demoIngestToken(db: Knex, dataDir: string): Promise<string> {
  const file = path.join(dataDir, 'demo-ingest-token');
  const tokens = tokensService(db);
  if (fs.existsSync(file)) {
    const secret = fs.readFileSync(file, 'utf8').trim();
    if (await tokens.authenticate(secret)) return secret;
  }
  const created = await tokens.create(SYSTEM, { name: 'Demo shop metrics', scopes: ['ingest'] });
  fs.writeFileSync(file, created.secret + '\n', { mode: 0o600 });
  return created.secret;
}

/** Alert rules on the demo shop's own metrics; they can only be made once those signals exist. */
export function demoRules(): RuleDocumentInput[] {
  const common = {
    service: DEMO_SERVICE,
    groupBy: [],
    severity: 'page' as const,
    recipients: ['oncall@quillmoor.example'],
    runbookUrl: null,
  };
  return [
    {
      ...common,
      kind: 'error_ratio',
      name: 'Shop errors above 10 %',
      signal: 'http.server.errors',
      requestsSignal: 'http.server.requests',
      window: '2m',
      sustain: '30s',
      clear: '1m',
      op: '>',
      threshold: 0.1,
      responderNote:
        'Check the shop’s error switch and its most recent release first; if errors are confined to one route, look at that route’s dependency.',
    },
    {
      ...common,
      kind: 'latency_quantile',
      name: 'Shop p95 latency above 500 ms',
      signal: 'http.server.duration',
      window: '2m',
      sustain: '30s',
      clear: '1m',
      quantile: 0.95,
      op: '>',
      threshold: 500,
      severity: 'ticket',
      responderNote: 'Look for added latency on the shop (the demo switch addedLatencyMs) and for slow database calls behind search.',
    },
  ];
}

/** Creates the demo rules once, when the shop's signals have arrived; true when done (or not needed). */
export async function seedDemoRules(db: Knex): Promise<boolean> {
  if (await settingsRepo.get(db, 'demo_rules_seeded')) return true;
  const have = await db('signals as s').join('services as v', 'v.id', 's.service_id').where('v.name', DEMO_SERVICE).pluck('s.name');
  if (!['http.server.errors', 'http.server.requests', 'http.server.duration'].every((n) => have.includes(n))) return false;
  const rules = rulesService(db);
  for (const doc of demoRules()) await rules.create(SYSTEM, ruleDocumentSchema.parse(doc));
  await settingsRepo.put(db, 'demo_rules_seeded', true);
  return true;
}

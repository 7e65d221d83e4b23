// /api/signals: signal lists, the JSON batch intake, the query API, CSV upload and collection
// targets. People by role, machines by token scope (ingest to write samples, read to query).
import { Router, type Request } from 'express';
import type { Knex } from 'knex';
import { z } from 'zod';
import { idParamSchema } from '../../shared/schemas/users';
import {
  collectionTargetSchema,
  csvMappingSchema,
  samplesBatchSchema,
  signalQuerySchema,
  signalsListQuerySchema,
  updateCollectionTargetSchema,
  type CsvImportResult,
  type CsvPreview,
  type IngestResult,
  type SamplesBatch,
} from '../../shared/schemas/signals';
import { allow } from '../auth/access';
import { ValidationError } from '../errors';
import { validate, zodToValidationError } from '../http/validate';
import { batchPointToIngest } from './batch-points';
import { collectionTargetsService } from './collection-targets-service';
import { csvImportService } from './csv/csv-import-service';
import { streamingUpload, uploadResult } from './csv/csv-upload';
import { ingestService } from './ingest-service';
import { queryService } from './query-service';
import { servicesService } from './services-service';

const csvQuerySchema = z.object({ preview: z.enum(['0', '1', 'true', 'false']).optional() });

export function signalsRoutes(db: Knex, now: () => Date = () => new Date()): Router {
  const r = Router();
  const readers = allow({ roles: 'any', scopes: ['read'] });
  const engineers = allow({ roles: ['engineer', 'admin'] });
  const services = servicesService(db);
  const ingest = ingestService(db);
  const query = queryService(db, now);
  const csv = csvImportService(db);
  const targets = collectionTargetsService(db);

  r.get('/', readers, validate('query', signalsListQuerySchema), async (_req, res) => {
    res.json({ items: await services.signals(res.locals.query.service) });
  });

  r.post('/samples', allow({ roles: ['engineer', 'admin'], scopes: ['ingest'] }), validate('body', samplesBatchSchema), async (_req, res) => {
    const batch = res.locals.body as SamplesBatch;
    const out = await ingest.write(batch.points.map(batchPointToIngest));
    const body: IngestResult = { accepted: out.accepted, duplicates: out.duplicates, rejected: out.rejected.length, errors: out.rejected };
    res.json(body);
  });

  r.get('/query', readers, validate('query', signalQuerySchema), async (_req, res) => {
    res.json(await query.run(res.locals.query));
  });

  const isPreview = (req: Request) => ['1', 'true'].includes(String(req.query.preview ?? ''));
  r.post(
    '/csv',
    engineers,
    validate('query', csvQuerySchema),
    streamingUpload('file', async (req, file, name) => {
      if (isPreview(req)) return csv.preview(file);
      const text = (req.body as Record<string, unknown> | undefined)?.mapping;
      if (typeof text !== 'string') throw new ValidationError('Send the column mapping as the form field "mapping" (JSON), before the file', 'mapping');
      let json: unknown;
      try {
        json = JSON.parse(text);
      } catch {
        throw new ValidationError('mapping: not valid JSON', 'mapping');
      }
      const parsed = csvMappingSchema.safeParse(json);
      if (!parsed.success) throw zodToValidationError(parsed.error, 'mapping');
      return csv.import(principalOf(req), file, parsed.data, name);
    }),
    async (req, res) => {
      const result = uploadResult<CsvPreview | CsvImportResult>(req);
      if (result === undefined) throw new ValidationError('Attach the CSV file as the form field "file"', 'file');
      res.json(result);
    },
  );

  const t = Router();
  t.get('/', readers, async (_req, res) => {
    res.json({ items: await targets.list() });
  });
  t.post('/', engineers, validate('body', collectionTargetSchema), async (_req, res) => {
    res.status(201).json(await targets.create(res.locals.principal!, res.locals.body));
  });
  t.patch('/:id', engineers, validate('params', idParamSchema), validate('body', updateCollectionTargetSchema), async (_req, res) => {
    res.json(await targets.update(res.locals.principal!, res.locals.params.id, res.locals.body));
  });
  t.delete('/:id', engineers, validate('params', idParamSchema), async (_req, res) => {
    await targets.remove(res.locals.principal!, res.locals.params.id);
    res.status(204).end();
  });
  r.use('/collection-targets', t);
  return r;
}

// The storage engine sees the request, not the response: the principal rides on req.res.
function principalOf(req: Request) {
  return req.res!.locals.principal!;
}

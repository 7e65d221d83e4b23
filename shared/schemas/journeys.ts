import { z } from 'zod';
import { journeyDocumentSchema, vantageNameSchema } from '../journey/journey-schema';
import { scheduleSchema } from '../journey/schedule-schema';
import { VERDICTS } from '../journey/run-result';

export const saveJourneySchema = z.object({
  document: journeyDocumentSchema,
  serviceIds: z.array(z.number().int().positive()).max(50).default([]),
});
export type SaveJourneyInput = z.input<typeof saveJourneySchema>;

export const tryJourneySchema = z.object({
  document: journeyDocumentSchema,
  vantage: vantageNameSchema,
});

export const schedulePreviewSchema = z.object({
  schedule: scheduleSchema,
  journeyId: z.union([z.number(), z.string()]).default('draft'),
  count: z.number().int().min(1).max(20).default(5),
});

export const runsQuerySchema = z.object({
  limit: z.coerce.number().int().min(1, 'limit must be at least 1').max(200, 'limit must be at most 200').default(50),
  cursor: z
    .string()
    .regex(/^\d{4}-\d\d-\d\dT[\d:.]+Z\|\d+$/, 'cursor must come from a previous page')
    .optional(),
  verdict: z.enum(VERDICTS).optional(),
  vantage: vantageNameSchema.optional(),
});

export const secretNameSchema = z
  .string()
  .regex(/^[A-Za-z_][A-Za-z0-9_]{0,63}$/, 'secret names start with a letter or _ and use letters, digits and _ (at most 64)');
export const saveSecretSchema = z.object({
  name: secretNameSchema,
  value: z.string().min(1, 'a secret needs a value').max(8192, 'at most 8192 characters'),
});

export const saveVantageSchema = z.object({
  name: vantageNameSchema,
  region: z.string().trim().max(80, 'region label at most 80 characters').default(''),
});

export const retentionSchema = z.object({
  runRetentionDays: z.number().int().min(1, 'keep runs at least 1 day').max(3650, 'at most 3650 days'),
});

export interface JourneySummary {
  id: number;
  name: string;
  version: number;
  enabled: boolean;
  vantages: string[];
  schedule: z.infer<typeof scheduleSchema>;
  lastRun: { verdict: 'pass' | 'fail' | 'void'; slotAt: string; vantage: string } | null;
  /** Over the last 24 h, void runs excluded (missing data, not failures). */
  passRate: { passed: number; total: number; rate: number | null; low: number | null; high: number | null };
  p95TotalMs: number | null;
}

export interface RunSummary {
  id: number;
  journeyId: number;
  version: number;
  vantage: string;
  slotAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  verdict: 'pass' | 'fail' | 'void';
  failureClass: string | null;
  failedStep: number | null;
  voidReason: string | null;
  durationMs: number | null;
  latenessMs: number | null;
  trigger: 'schedule' | 'missed';
}

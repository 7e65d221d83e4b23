import { z } from 'zod';
import { CronError, checkCronExpression } from './cron';

export const SCHEDULE_LIMITS = { minIntervalSeconds: 10, maxIntervalSeconds: 7 * 24 * 3600 } as const;

export const scheduleSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({
      kind: z.literal('interval'),
      everySeconds: z
        .number({ error: 'schedule everySeconds must be a number of seconds' })
        .int('schedule everySeconds must be a whole number of seconds')
        .min(SCHEDULE_LIMITS.minIntervalSeconds, `schedule everySeconds must be at least ${SCHEDULE_LIMITS.minIntervalSeconds}`)
        .max(SCHEDULE_LIMITS.maxIntervalSeconds, 'schedule everySeconds must be at most one week (604800)'),
    }),
    z.object({
      kind: z.literal('cron'),
      expression: z
        .string({ error: 'schedule expression must be a cron expression' })
        .max(200, 'schedule expression must be at most 200 characters')
        .superRefine((expression, ctx) => {
          try {
            checkCronExpression(expression);
          } catch (error) {
            ctx.addIssue({ code: 'custom', message: error instanceof CronError ? error.message : String(error) });
          }
        }),
    }),
  ],
  { error: 'schedule kind must be interval or cron' },
);
export type Schedule = z.infer<typeof scheduleSchema>;

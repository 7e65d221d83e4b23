import { z } from 'zod';
import { scheduleSchema } from './schedule-schema';
import { stepSchema } from './step-schema';
import { templateRefs } from './template';

export const JOURNEY_LIMITS = { maxSteps: 25, maxVantages: 50 } as const;

export const vantageNameSchema = z
  .string({ error: 'vantage name must be text' })
  .regex(/^[a-z0-9][a-z0-9._-]{0,62}$/, 'vantage name must be 1–63 lowercase letters, digits, ., _ or -, starting with a letter or digit');

/**
 * A journey as the editor saves it and the prober runs it. `failureQuorum` is k in "k of n
 * vantages must fail for a slot to count as failing"; n is the number of vantages.
 */
export const journeyDocumentSchema = z
  .object({
    name: z.string({ error: 'name is required' }).trim().min(1, 'name is required').max(120, 'name must be at most 120 characters'),
    steps: z
      .array(stepSchema, { error: 'steps must be a list' })
      .min(1, 'a journey needs at least one step')
      .max(JOURNEY_LIMITS.maxSteps, `a journey has at most ${JOURNEY_LIMITS.maxSteps} steps`),
    schedule: scheduleSchema,
    vantages: z
      .array(vantageNameSchema, { error: 'vantages must be a list of vantage names' })
      .min(1, 'choose at least one vantage')
      .max(JOURNEY_LIMITS.maxVantages, `at most ${JOURNEY_LIMITS.maxVantages} vantages`)
      .refine((v) => new Set(v).size === v.length, 'each vantage once'),
    failureQuorum: z
      .number({ error: 'failureQuorum must be a number of vantages' })
      .int('failureQuorum must be a whole number')
      .min(1, 'failureQuorum must be at least 1')
      .default(1),
    enabled: z.boolean({ error: 'enabled must be true or false' }).default(true),
  })
  .superRefine((doc, ctx) => {
    if (doc.failureQuorum > doc.vantages.length) {
      ctx.addIssue({
        code: 'custom',
        path: ['failureQuorum'],
        message: `failureQuorum (${doc.failureQuorum}) cannot exceed the number of vantages (${doc.vantages.length})`,
      });
    }
    // A {{variable}} must be captured by an earlier step; otherwise the run could never render it.
    const captured = new Set<string>();
    doc.steps.forEach((step, index) => {
      const fields: Array<{ path: (string | number)[]; template: string }> = [
        { path: ['url'], template: step.url },
        ...step.headers.map((h, i) => ({ path: ['headers', i, 'value'], template: h.value })),
        ...(step.body ? [{ path: ['body'], template: step.body }] : []),
      ];
      for (const { path, template } of fields) {
        let refs;
        try {
          refs = templateRefs(template);
        } catch {
          continue; // already reported by the step schema
        }
        for (const ref of refs) {
          if (ref.kind === 'variable' && !captured.has(ref.name)) {
            ctx.addIssue({
              code: 'custom',
              path: ['steps', index, ...path],
              message: `{{${ref.name}}} is not captured by an earlier step`,
            });
          }
        }
      }
      for (const capture of step.captures) captured.add(capture.name);
    });
  });

export type JourneyDocument = z.infer<typeof journeyDocumentSchema>;
export type JourneyDocumentInput = z.input<typeof journeyDocumentSchema>;

/** One line per problem, each starting with the field's path (`steps.0.timeoutMs: ...`). */
export function describeIssues(error: z.ZodError): string[] {
  return error.issues.map((issue) => {
    const path = issue.path.map(String).join('.');
    return path ? `${path}: ${issue.message}` : issue.message;
  });
}

// Job names and payload schemas shared by whoever queues a job and the worker that runs it.
import { z } from 'zod';

export const JOBS = {
  heartbeat: 'worker.heartbeat',
} as const;

export const heartbeatJobSchema = z.object({
  name: z.string().min(1).max(120),
  host: z.string().max(255),
  pid: z.number().int().nonnegative(),
  startedAt: z.string().datetime(),
  beatSeconds: z.number().int().positive(),
});
export type HeartbeatJob = z.infer<typeof heartbeatJobSchema>;

/** One queue per vantage, so each vantage's workers take only their own runs. */
export const probeQueue = (vantage: string) => `probe.${vantage}`;

export const scheduledProbeJobSchema = z.object({
  kind: z.literal('scheduled'),
  journeyId: z.number().int().positive(),
  version: z.number().int().positive(),
  vantage: z.string().min(1),
  slotAt: z.string().datetime(),
});
export type ScheduledProbeJob = z.infer<typeof scheduledProbeJobSchema>;

/** "Try it now": a draft document run once, its result returned as the job's output, nothing stored. */
export const tryProbeJobSchema = z.object({
  kind: z.literal('try'),
  document: z.unknown(),
  vantage: z.string().min(1),
});
export type TryProbeJob = z.infer<typeof tryProbeJobSchema>;

export const probeJobSchema = z.discriminatedUnion('kind', [scheduledProbeJobSchema, tryProbeJobSchema]);
export type ProbeJob = z.infer<typeof probeJobSchema>;

/** Internal signals (issue 4): collection from JSON endpoints, and partition upkeep/retention/rollups. */
export const SIGNAL_JOBS = {
  collect: 'signals.collect',
  maintain: 'signals.maintain',
} as const;

export const collectJobSchema = z.object({
  targetId: z.number().int().positive(),
  /** The claimed slot (ms epoch): the samples' time, so a retried job writes the same points. */
  slotMs: z.number().int().nonnegative(),
});
export type CollectJob = z.infer<typeof collectJobSchema>;

/**
 * Alert notifications (issue 5): one job per outbox row, queued in the same transaction as the
 * alert's state change; the notifier delivers the row by mail or webhook, at most once.
 */
export const RULE_JOBS = {
  notifyMail: 'rules.notify-mail',
  notifyWebhook: 'rules.notify-webhook',
} as const;

export const notifyJobSchema = z.object({
  outboxId: z.number().int().positive(),
});
export type NotifyJob = z.infer<typeof notifyJobSchema>;

// The notification queues and their retry policy. pg-boss copies a queue's policy into each job
// when it is queued, so the policy is set when the queues are made (evaluator or notifier,
// whichever starts first) and updated by the notifier, which owns it.
import type PgBoss from 'pg-boss';
import { RULE_JOBS } from '../../shared/jobs';
import type { OutboxChannel } from '../../server/rules/repositories/outbox-repo';

export const NOTIFY_QUEUE: Record<OutboxChannel, string> = {
  mail: RULE_JOBS.notifyMail,
  webhook: RULE_JOBS.notifyWebhook,
};

export interface RetryPolicy {
  /** Retries after the first attempt. */
  retryLimit: number;
  /** First retry after 1–2 × this many seconds, doubling each time (pg-boss backoff with jitter). */
  retryDelaySeconds: number;
}

/** 10 s doubling over 8 retries: a relay or webhook down for up to about an hour still gets the message. */
export const DEFAULT_RETRY: RetryPolicy = { retryLimit: 8, retryDelaySeconds: 10 };

export async function ensureNotifyQueues(boss: PgBoss, policy: RetryPolicy = DEFAULT_RETRY, update = false): Promise<void> {
  for (const name of Object.values(NOTIFY_QUEUE)) {
    const options = { name, retryLimit: policy.retryLimit, retryDelay: policy.retryDelaySeconds, retryBackoff: true, expireInSeconds: 120 };
    await boss.createQueue(name, options as PgBoss.Queue);
    if (update) await boss.updateQueue(name, options as PgBoss.Queue);
  }
}

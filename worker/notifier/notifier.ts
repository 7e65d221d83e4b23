// The notifier: takes notification jobs (one per outbox row) from pg-boss and delivers each row by
// mail (nodemailer → the SMTP relay; the local sink in development and tests) or by signed
// webhook. A failed attempt throws, and pg-boss retries it with backoff (queues.ts).
import type { Knex } from 'knex';
import nodemailer from 'nodemailer';
import type PgBoss from 'pg-boss';
import { notifyJobSchema, type NotifyJob } from '../../shared/jobs';
import { mailSettingsFromEnv, type MailSettings } from '../../server/mail';
import { channelsService } from '../../server/rules/channels-service';
import { publicUrlFromEnv } from '../../server/rules/notification-payload';
import type { OutboxRow } from '../../server/rules/repositories/outbox-repo';
import { deliverOnce, type DeliveryOutcome } from './deliver';
import { mailMessage } from './message';
import { DEFAULT_RETRY, ensureNotifyQueues, NOTIFY_QUEUE, type RetryPolicy } from './queues';
import { sendWebhook } from './send-webhook';
import { assertWebhookTarget, RefusedTargetError } from './webhook-guard';

export interface NotifierOptions {
  /** The server's AES-256-GCM key (loadSecretKey()), to open webhook secrets. */
  secretKey: Buffer;
  /** SMTP relay; default from PARALLAX_SMTP_HOST / _PORT / PARALLAX_MAIL_FROM. */
  mail?: MailSettings;
  /** Base of the links in messages; default PARALLAX_PUBLIC_URL or http://127.0.0.1:8080. */
  publicUrl?: string;
  retry?: RetryPolicy;
  webhookTimeoutMs?: number;
  /** Jobs in flight per queue. */
  concurrency?: number;
  now?: () => Date;
  log?: (msg: string) => void;
}

export interface Notifier {
  /** Delivers one outbox row now (what a job does); a row already sent is not sent again. */
  deliver(outboxId: number, opts?: { final?: boolean }): Promise<DeliveryOutcome>;
  stop(): Promise<void>;
}

export async function startNotifier(boss: PgBoss, db: Knex, opts: NotifierOptions): Promise<Notifier> {
  const now = opts.now ?? (() => new Date());
  const log = opts.log ?? ((m: string) => console.log(`[notifier] ${m}`));
  const publicUrl = (opts.publicUrl ?? publicUrlFromEnv()).replace(/\/+$/, '');
  const mail = opts.mail ?? mailSettingsFromEnv();
  // server/mail.ts's mailer has no way to set a Message-ID, which is this message's idempotency key.
  const transport = nodemailer.createTransport({ host: mail.host, port: mail.port, secure: false, ignoreTLS: !mail.secure, requireTLS: !!mail.secure });
  const channels = channelsService(db, opts.secretKey);
  const timeoutMs = opts.webhookTimeoutMs ?? 10_000;

  async function send(row: OutboxRow): Promise<'sent' | 'skipped'> {
    if (row.channel === 'mail') {
      if (row.recipients.length === 0) return 'skipped';
      const m = mailMessage(row.payload, row.id, publicUrl);
      await transport.sendMail({ from: mail.from, to: row.recipients, subject: m.subject, text: m.text, messageId: m.messageId });
      return 'sent';
    }
    const channel = row.channelId === null ? null : await channels.forDelivery(row.channelId);
    if (!channel || !channel.enabled) {
      log(`outbox ${row.id}: webhook channel ${row.channelId} is gone or disabled; not sent`);
      return 'skipped';
    }
    await assertWebhookTarget(db, channel.url);
    await sendWebhook(channel, row.payload, row.id, { publicUrl, timeoutMs, now });
    return 'sent';
  }

  const deliver = (outboxId: number, o: { final?: boolean } = {}) =>
    deliverOnce(db, outboxId, send, { final: o.final ?? false, now, isFinal: (e) => e instanceof RefusedTargetError });

  await ensureNotifyQueues(boss, opts.retry ?? DEFAULT_RETRY, true);
  const concurrency = opts.concurrency ?? 2;
  for (const queue of Object.values(NOTIFY_QUEUE)) {
    for (let i = 0; i < concurrency; i++) {
      await boss.work<NotifyJob>(queue, { pollingIntervalSeconds: 0.5, batchSize: 1, includeMetadata: true }, async (jobs) => {
        for (const job of jobs) {
          const { outboxId } = notifyJobSchema.parse(job.data);
          try {
            const outcome = await deliver(outboxId, { final: job.retryCount >= job.retryLimit });
            if (outcome === 'sent') log(`outbox ${outboxId} delivered (${queue})`);
          } catch (e) {
            log(`outbox ${outboxId}: attempt ${job.retryCount + 1} of ${job.retryLimit + 1} failed: ${(e as Error).message}`);
            // A refused target stays refused: the row is marked failed and the job is not retried.
            if (!(e instanceof RefusedTargetError)) throw e;
          }
        }
      });
    }
  }

  return {
    deliver,
    async stop() {
      for (const queue of Object.values(NOTIFY_QUEUE)) await boss.offWork(queue).catch(() => {});
      transport.close();
    },
  };
}

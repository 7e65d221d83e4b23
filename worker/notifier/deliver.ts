// Delivering one outbox row at most once: the row is locked, sent, and marked sent in one
// transaction, so a retried or duplicated job waits for the lock and then finds it sent. (If the
// process dies between the send and the commit, the retry sends again: the message then carries
// the same Message-ID / X-Parallax-Delivery id, by which receivers can drop it.)
import type { Knex } from 'knex';
import { outboxRepo, type OutboxRow } from '../../server/rules/repositories/outbox-repo';

export type DeliveryOutcome = 'sent' | 'already_sent' | 'missing' | 'skipped';

export class DeliveryError extends Error {}

export async function deliverOnce(
  db: Knex,
  outboxId: number,
  send: (row: OutboxRow) => Promise<'sent' | 'skipped'>,
  opts: { final: boolean; now: () => Date; isFinal?: (e: unknown) => boolean },
): Promise<DeliveryOutcome> {
  try {
    return await db.transaction(async (tx) => {
      const row = await outboxRepo.lockForDelivery(tx, outboxId);
      if (!row) return 'missing';
      if (row.status === 'sent') return 'already_sent';
      const outcome = await send(row);
      await outboxRepo.markSent(tx, outboxId, opts.now());
      return outcome;
    });
  } catch (e) {
    await outboxRepo.recordFailure(db, outboxId, (e as Error).message, opts.final || (opts.isFinal?.(e) ?? false)).catch(() => {});
    throw e;
  }
}

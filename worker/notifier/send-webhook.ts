// One signed JSON POST to a webhook channel. Anything but a 2xx answer (a redirect too: the
// signature is for this URL) fails the attempt, and the job is retried with backoff.
import type { NotificationPayload } from '../../server/rules/notification-payload';
import { deliveryId, webhookBody } from './message';
import { DeliveryError } from './deliver';
import { DELIVERY_HEADER, EVENT_HEADER, SIGNATURE_HEADER, signWebhook, TIMESTAMP_HEADER } from './webhook-signature';

export async function sendWebhook(
  channel: { url: string; secret: string },
  payload: NotificationPayload,
  outboxId: number,
  opts: { publicUrl: string; timeoutMs: number; now: () => Date },
): Promise<void> {
  const body = webhookBody(payload, outboxId, opts.publicUrl);
  const timestamp = String(Math.floor(opts.now().getTime() / 1000));
  let res: Response;
  try {
    res = await fetch(channel.url, {
      method: 'POST',
      redirect: 'manual',
      signal: AbortSignal.timeout(opts.timeoutMs),
      headers: {
        'content-type': 'application/json',
        'user-agent': 'Parallax-Webhook/1',
        [TIMESTAMP_HEADER]: timestamp,
        [SIGNATURE_HEADER]: signWebhook(channel.secret, timestamp, body),
        [DELIVERY_HEADER]: deliveryId(outboxId),
        [EVENT_HEADER]: `alert.${payload.transition}`,
      },
      body,
    });
  } catch (e) {
    throw new DeliveryError(`webhook unreachable: ${(e as Error).message}`);
  }
  // The answer's body is not needed; reading it frees the connection.
  await res.arrayBuffer().catch(() => undefined);
  if (res.status < 200 || res.status >= 300) throw new DeliveryError(`webhook answered ${res.status}`);
}

// Webhook signing: HMAC-SHA256 (hex) of "<timestamp>.<body>" with the channel's secret, sent as
// X-Parallax-Signature: sha256=<hex> beside X-Parallax-Timestamp. Signing the timestamp with the
// body lets a receiver refuse replays of an old delivery.
import crypto from 'node:crypto';

export const SIGNATURE_HEADER = 'X-Parallax-Signature';
export const TIMESTAMP_HEADER = 'X-Parallax-Timestamp';
export const DELIVERY_HEADER = 'X-Parallax-Delivery';
export const EVENT_HEADER = 'X-Parallax-Event';

export function signWebhook(secret: string, timestamp: string, body: string): string {
  return `sha256=${crypto.createHmac('sha256', secret).update(`${timestamp}.${body}`).digest('hex')}`;
}

/** For receivers (and tests): constant-time comparison. */
export function verifyWebhook(secret: string, timestamp: string, body: string, signature: string): boolean {
  const expected = Buffer.from(signWebhook(secret, timestamp, body));
  const given = Buffer.from(signature);
  return expected.length === given.length && crypto.timingSafeEqual(expected, given);
}
